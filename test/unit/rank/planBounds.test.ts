/**
 * The enumeration stays bounded on the largest lot the schema allows (500 supports): counts of
 * placements checked and designs kept, not time (issue 15, point 7). And progress is reported
 * from the start, before the first evaluation.
 */
import { describe, expect, it } from 'vitest';
import { BUILDERS } from '../../../core/antennas/registry.ts';
import { enumeratePlan, planSite, PLAN_BOUNDS, type PlanProgress } from '../../../core/rank/plan.ts';
import { checkPlacement } from '../../../core/site/feasibility.ts';
import { lotWithSupports } from '../../helpers/manySupportLot.ts';
import { testEvaluator } from '../../helpers/testEvaluator.ts';

describe('enumeration bounds (PLAN_BOUNDS)', () => {
  it('checks and keeps a bounded number of placements and designs on a 500-support lot, and says so', () => {
    const project = lotWithSupports(500);
    expect(project.supports).toHaveLength(500);
    let checks = 0;
    const setup = enumeratePlan(project, {
      feasibility: (ps, els) => {
        checks++;
        return checkPlacement(ps, els);
      },
    });
    const types = BUILDERS.filter((b) => !b.array).length;
    expect(checks).toBeLessThanOrEqual(types * PLAN_BOUNDS.placements);
    expect(setup.jobs.length).toBeLessThanOrEqual(types * PLAN_BOUNDS.designs);
    const perType = new Map<string, number>();
    for (const j of setup.jobs) perType.set(j.design.type, (perType.get(j.design.type) ?? 0) + 1);
    for (const n of perType.values()) expect(n).toBeLessThanOrEqual(PLAN_BOUNDS.designs);
    // Every type still gets placements: the bounds choose, they do not empty the plan.
    expect([...perType.keys()].sort()).toEqual(
      BUILDERS.filter((b) => !b.array)
        .map((b) => b.type)
        .sort(),
    );
    // The cut is reported: supports given and placements considered, per type.
    expect(setup.cuts.length).toBe(types);
    for (const c of setup.cuts) {
      expect(c.supportsTotal).toBe(500);
      expect(c.supportsUsed).toBeLessThanOrEqual(PLAN_BOUNDS.supports);
      expect(c.considered).toBeLessThanOrEqual(Math.min(c.proposed, PLAN_BOUNDS.placements));
    }
  });

  it('leaves a lot within the bounds whole (no cut)', () => {
    const setup = enumeratePlan(lotWithSupports(8));
    expect(setup.cuts).toEqual([]);
  });

  it('reports enumeration progress from the start, before the first evaluation', () => {
    const events: PlanProgress[] = [];
    const evaluator = testEvaluator();
    let callsAtFirstEvaluate = -1;
    planSite(lotWithSupports(4), {
      evaluator: (req) => {
        if (callsAtFirstEvaluate < 0) callsAtFirstEvaluate = events.length;
        return evaluator(req);
      },
      onProgress: (p) => events.push(p),
    });
    expect(events[0]).toEqual({ phase: 'enumerate', done: 0, total: expect.any(Number) });
    expect(callsAtFirstEvaluate).toBeGreaterThan(0);
    const beforeSolver = events.slice(0, callsAtFirstEvaluate);
    expect(beforeSolver.every((e) => e.phase === 'enumerate')).toBe(true);
    expect(beforeSolver.at(-1)).toEqual({
      phase: 'enumerate',
      done: events[0].total,
      total: events[0].total,
    });
  });
});
