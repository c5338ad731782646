import { describe, expect, it } from 'vitest';
import { commitFault, takeTestFault, TEST_FAULT_KEY } from './testFault.ts';

describe('the test fault hook', () => {
  it('takes a well-formed fault once', () => {
    const scope: Record<string, unknown> = {
      [TEST_FAULT_KEY]: { kind: 'hang', afterEvaluations: 3, stallMs: 500 },
    };
    expect(takeTestFault(scope)).toEqual({ kind: 'hang', afterEvaluations: 3, stallMs: 500 });
    expect(TEST_FAULT_KEY in scope).toBe(false);
    expect(takeTestFault(scope)).toBeNull();
  });

  it('ignores anything malformed (and clears it)', () => {
    for (const bad of [
      null,
      'throw',
      { kind: 'explode', afterEvaluations: 1 },
      { kind: 'throw', afterEvaluations: -1 },
      { kind: 'throw', afterEvaluations: 1.5 },
      { kind: 'close', afterEvaluations: 1, stallMs: 0 },
    ]) {
      const scope: Record<string, unknown> = { [TEST_FAULT_KEY]: bad };
      expect(takeTestFault(scope), JSON.stringify(bad)).toBeNull();
      expect(TEST_FAULT_KEY in scope).toBe(false);
    }
    expect(takeTestFault({})).toBeNull();
  });

  it('commits the fault only once due', () => {
    let closed = 0;
    const scope = { close: () => closed++ };
    expect(commitFault({ kind: 'throw', afterEvaluations: 2 }, 1, scope)).toBe('answer');
    expect(() => commitFault({ kind: 'throw', afterEvaluations: 2 }, 2, scope)).toThrow(/test fault/);
    expect(commitFault({ kind: 'close', afterEvaluations: 0 }, 0, scope)).toBe('silent');
    expect(closed).toBe(1);
    expect(commitFault({ kind: 'hang', afterEvaluations: 0 }, 5, scope)).toBe('silent');
  });
});
