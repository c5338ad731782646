/**
 * The fault-injection hook for tests. A test (and only a test: nothing in the interface sets it)
 * puts a fault on the window under TEST_FAULT_KEY before it starts a run; the runner takes it once
 * (the next run is healthy again) and sends it with that run's evaluations, and the worker then
 * fails on purpose (plan.worker.ts). Anything malformed under the key is ignored.
 */
import type { TestFault } from './protocol.ts';

export const TEST_FAULT_KEY = '__yardwireTestFault__';

const KINDS: readonly TestFault['kind'][] = ['throw', 'close', 'hang'];

/** The fault under the key, if well formed; the key is cleared either way. */
export function takeTestFault(scope: object = globalThis): TestFault | null {
  const bag = scope as Record<string, unknown>;
  if (!(TEST_FAULT_KEY in bag)) return null;
  const raw = bag[TEST_FAULT_KEY];
  delete bag[TEST_FAULT_KEY];
  if (typeof raw !== 'object' || raw === null) return null;
  const f = raw as Record<string, unknown>;
  const kind = f['kind'];
  const after = f['afterEvaluations'];
  const stall = f['stallMs'];
  if (typeof kind !== 'string' || !KINDS.includes(kind as TestFault['kind'])) return null;
  if (typeof after !== 'number' || !Number.isInteger(after) || after < 0) return null;
  if (stall !== undefined && (typeof stall !== 'number' || !(stall >= 10))) return null;
  return {
    kind: kind as TestFault['kind'],
    afterEvaluations: after,
    ...(stall === undefined ? {} : { stallMs: stall }),
  };
}

/**
 * What a worker does with a faulted evaluation: 'answer' (not yet due), or the fault committed.
 * `seen` is how many faulted evaluations this worker had before this one.
 */
export function commitFault(fault: TestFault, seen: number, scope: { close(): void }): 'answer' | 'silent' {
  if (seen < fault.afterEvaluations) return 'answer';
  switch (fault.kind) {
    case 'throw':
      throw new Error(`test fault: thrown after ${seen} evaluations`);
    case 'close':
      scope.close();
      return 'silent';
    case 'hang':
      return 'silent';
  }
}
