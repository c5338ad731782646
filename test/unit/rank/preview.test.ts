// The provisional plan of live re-ranking: with every evaluation at hand it is the plan itself;
// with a support moved it solves nothing, writes nothing to the cache, and ranks the placements
// whose design changed with the most similar evaluated design's record, saying so.
import { describe, expect, it } from 'vitest';
import { buildDemoProject, demoLonLat } from '../../../core/demo/demoProject.ts';
import { enumeratePlan, memoryCache, planFromSetup } from '../../../core/rank/plan.ts';
import { BORROWED_NOTE, DesignIndex, paramDistance, previewPlan } from '../../../core/rank/preview.ts';
import { testEvaluator } from '../../helpers/testEvaluator.ts';

const types = ['inverted-v', 'vertical', 'dipole'] as const;

describe('previewPlan', () => {
  it('equals the plan when every evaluation is cached, and borrows without solving when a support moved', () => {
    const demo = { ...buildDemoProject(), bands: ['80m' as const] };
    const evaluator = testEvaluator({ pattern: 'directional' });
    const cache = memoryCache();
    const index = new DesignIndex();
    const setup = enumeratePlan(demo, { types });
    const plan = planFromSetup(setup, demo, { evaluator, cache });
    for (const j of setup.jobs) index.add(j);

    const same = previewPlan(enumeratePlan(demo, { types }), demo, cache, index);
    expect(same.borrowed).toBe(0);
    expect(same.shortlist.candidates.map((c) => [c.id, c.score])).toEqual(
      plan.candidates.map((c) => [c.id, c.score]),
    );

    const moved = structuredClone(demo);
    moved.supports.find((s) => s.id === 'oak-west')!.position = demoLonLat(44, 66);
    const size = [...(cache as Map<string, unknown>).keys()].length;
    const calls = evaluator.calls;
    const out = previewPlan(enumeratePlan(moved, { types }), moved, cache, index);
    expect(evaluator.calls).toBe(calls);
    expect([...(cache as Map<string, unknown>).keys()].length).toBe(size);
    expect(out.borrowed).toBeGreaterThan(0);
    expect(out.shortlist.candidates.length).toBeGreaterThan(0);
    const borrowedRows = out.shortlist.candidates.filter((c) => c.diagnostics.includes(BORROWED_NOTE));
    expect(borrowedRows.every((c) => c.supports.some((s) => s.id === 'oak-west'))).toBe(true);
    for (const c of out.shortlist.candidates) {
      const t = c.design.trim;
      expect(c.trim.valueM).toBeGreaterThanOrEqual(t.minM - 1e-3);
      expect(c.trim.valueM).toBeLessThanOrEqual(t.maxM + 1e-3);
    }
  });

  it('measures how far apart two designs are by their parameters', () => {
    expect(paramDistance({ a: 10, b: [1, 2] }, { a: 10, b: [1, 2] })).toBe(0);
    expect(paramDistance({ a: 10 }, { a: 12 })).toBeCloseTo(2 / 12, 12);
    expect(paramDistance({ a: 10 }, { a: 10, b: 1 })).toBe(1);
    expect(paramDistance({ b: [1, 2] }, { b: [1] })).toBe(1);
  });
});
