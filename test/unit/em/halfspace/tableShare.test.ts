/**
 * A remainder table built in one thread and handed to another (exportRemainderTables →
 * importRemainderTables, as the plan's workers share them) is found by the solver as if built
 * there: no second build, and the same solution to the last bit.
 */
import { describe, expect, it } from 'vitest';
import {
  cachedTableCount,
  clearRemainderTables,
  exportRemainderTables,
  importRemainderTables,
} from '../../../../core/em/halfspace/table.ts';
import { solverEvaluator, warmGround } from '../../../../core/rank/solver.ts';
import type { EvalRequest } from '../../../../core/rank/evaluator.ts';

const f = 3.55e6;
const ground = { classId: 'average' } as const;
const request: EvalRequest = {
  model: {
    wires: [{ from: [-20, 0, 12], to: [20, 0, 12], radiusM: 0.001, segments: 20, label: 'top' }],
    feeds: [{ wire: 0, position: 0.5 }],
    radials: [],
  },
  ground,
  frequenciesHz: [f],
  pattern: { elevationsDeg: [10, 30], azimuthsDeg: [0, 90] },
};

describe('sharing remainder tables between threads', () => {
  it('imports tables that the solver then uses instead of building its own, with the same results', () => {
    clearRemainderTables();
    warmGround(ground, [f]);
    const built = solverEvaluator(request)[0];
    const shared = structuredClone(exportRemainderTables());
    expect(shared.length).toBeGreaterThan(0);

    clearRemainderTables();
    importRemainderTables(shared);
    const count = cachedTableCount();
    const reused = solverEvaluator(request)[0];
    // Nothing built or replaced: the same tables, under the same keys (a build would widen and rename one).
    expect(cachedTableCount()).toBe(count);
    expect(exportRemainderTables().map((t) => t.key)).toEqual(shared.map((t) => t.key));
    expect(exportRemainderTables().map((t) => t.w)).toEqual(shared.map((t) => t.w));
    expect(reused.zOhm).toEqual(built.zOhm);
    expect(Array.from(reused.gainDbi ?? [])).toEqual(Array.from(built.gainDbi ?? []));
  });
});
