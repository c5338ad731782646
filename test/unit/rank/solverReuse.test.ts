/**
 * The planner's solver adapter keeps its one-frequency feed solves (core/rank/solver.ts) and
 * reads the pattern request of the same model at the same frequency from that solution. The
 * figures must be those of a fresh solve, to the last digit, and a request for another model
 * must not read a kept solution.
 */
import { describe, expect, it } from 'vitest';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import type { EvalRequest } from '../../../core/rank/evaluator.ts';
import type { WireModel } from '../../../core/antennas/types.ts';

const F = 3.55e6;
const vertical = (heightM: number): WireModel => ({
  wires: [{ label: 'radiator', from: [0, 0, 0], to: [0, 0, heightM], radiusM: 0.001, segments: 8 }],
  feeds: [{ wire: 0, position: 0 }],
  radials: [{ wire: 0, count: 8, lengthsM: [10, 12, 14, 16, 18, 20, 20, 20], radiusM: 0.001 }],
});
const grid = { elevationsDeg: [10, 30, 60], azimuthsDeg: [0, 45, 90, 180] };
const req = (model: WireModel, pattern: EvalRequest['pattern']): EvalRequest => ({
  model,
  ground: { classId: 'average' },
  frequenciesHz: [F],
  pattern,
});

describe('solver adapter: pattern from the kept feed solve', () => {
  it('gives the same impedance, powers and gains as a solve without the kept one', () => {
    const fresh = solverEvaluator(req(vertical(19.5), grid))[0];
    const feed = solverEvaluator(req(vertical(19.5), null))[0];
    const reused = solverEvaluator(req(vertical(19.5), grid))[0];
    expect(feed.zOhm).toEqual(fresh.zOhm);
    expect(reused.zOhm).toEqual(fresh.zOhm);
    expect(reused.radiatedPowerW).toBe(fresh.radiatedPowerW);
    expect(reused.groundSystemLossW).toBe(fresh.groundSystemLossW);
    expect(Array.from(reused.gainDbi!)).toEqual(Array.from(fresh.gainDbi!));
  });

  it('does not read a kept solution for another model', () => {
    solverEvaluator(req(vertical(19.5), null));
    const other = solverEvaluator(req(vertical(21), grid))[0];
    const fresh = solverEvaluator(req(vertical(19.5), grid))[0];
    expect(other.zOhm[1]).not.toBeCloseTo(fresh.zOhm[1], 0);
  });
});
