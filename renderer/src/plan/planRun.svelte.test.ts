// The plan runner over stand-in workers that run the real planning host (core enumerate, trim,
// rank) with a toy evaluator: the mechanics of progress, sharing work, caching and cancelling.
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import type { Evaluator } from '../../../core/rank/evaluator.ts';
import { PlanRunner } from './planRun.svelte.ts';
import { hostWorkers, until, type HostWorker } from './testWorkers.ts';
import { testEvaluator } from '../../../test/helpers/testEvaluator.ts';

const toyEvaluator = testEvaluator({ pattern: 'directional' });

function fakePool(n: number, counter: { calls: number }): () => HostWorker[] {
  const counting: Evaluator = (r) => {
    counter.calls++;
    return toyEvaluator(r);
  };
  return () => hostWorkers(n, counting);
}

const project = (() => {
  const p = buildDemoProject();
  return { ...p, targets: [{ regionId: 'europe', weight: 1 }], bands: ['80m' as const] };
})();

describe('PlanRunner', () => {
  it('spreads jobs over the workers, reports progress and ends with the ranked shortlist', async () => {
    const counter = { calls: 0 };
    let pool: HostWorker[] = [];
    const runner = new PlanRunner(() => (pool = fakePool(3, counter)()));
    runner.run(project, ['80m']);
    expect(runner.status).toBe('enumerating');
    const seen = new Set<number>();
    await until(() => {
      seen.add(runner.done);
      return !runner.running;
    });
    expect(runner.error).toBeNull();
    expect(runner.status).toBe('done');
    expect(runner.total).toBeGreaterThan(3);
    expect(runner.done).toBe(runner.total);
    expect(seen.size).toBeGreaterThan(2); // progress moved in steps
    expect(pool.every((w) => (w.posted.evaluate ?? 0) > 0)).toBe(true);
    const s = runner.shortlist!;
    expect(s.candidates.length).toBeGreaterThan(0);
    expect(s.candidates[0]!.rank).toBe(1);
    expect(s.stats.evaluations).toBe(runner.total);
    expect(s.stats.cacheHits).toBe(0);
  });

  it('re-runs after a target edit from the cache, solving only the soil range of new candidates', async () => {
    const counter = { calls: 0 };
    const runner = new PlanRunner(fakePool(2, counter));
    // No metal on the lot: with a metal support near a placement, which of its orientations is
    // solved again with the support depends on the targets (the next test).
    const noMetal = {
      ...project,
      supports: project.supports.map((s) =>
        s.kind === 'tower' ? { ...s, material: 'fibreglass' as const } : s,
      ),
    };
    runner.run(noMetal, ['80m']);
    await until(() => !runner.running);
    const calls = counter.calls;
    const edited = { ...noMetal, targets: [{ regionId: 'japan', weight: 2 }] };
    runner.run(edited, ['80m']);
    await until(() => !runner.running);
    expect(runner.status).toBe('done');
    expect(runner.total).toBe(0);
    expect(runner.cached).toBeGreaterThan(0);
    // No design is solved again; candidates new to the shortlist get their soil range (two soils,
    // one pattern solve each).
    expect(counter.calls - calls).toBeLessThanOrEqual(2 * runner.shortlist!.candidates.length);
    expect(runner.shortlist!.paths[0]!.name).toBe('Japan');
    expect(runner.shortlist!.stats.cacheHits).toBe(runner.cached);
  });

  it('after a target edit re-solves only the placements near a metal support', async () => {
    const counter = { calls: 0 };
    const runner = new PlanRunner(fakePool(2, counter));
    runner.run(project, ['80m']);
    await until(() => !runner.running);
    const first = counter.calls;
    const calls = counter.calls;
    runner.run({ ...project, targets: [{ regionId: 'japan', weight: 2 }] }, ['80m']);
    await until(() => !runner.running);
    expect(runner.status).toBe('done');
    expect(runner.total).toBe(0);
    // Steps 2 and 3 only: a few placements near the demo's tower and the soil range of new
    // candidates, far fewer solves than the first plan.
    expect(counter.calls - calls).toBeLessThan(first / 5);
  });

  it('cancels at once; the next run reuses what was finished', async () => {
    const counter = { calls: 0 };
    const runner = new PlanRunner(fakePool(1, counter));
    runner.run(project, ['80m']);
    await until(() => runner.done >= 3);
    runner.cancel();
    expect(runner.status).toBe('cancelled');
    expect(runner.running).toBe(false);
    const finished = runner.done;
    const total = runner.total;
    await new Promise((r) => setTimeout(r, 30));
    expect(runner.status).toBe('cancelled');
    runner.run(project, ['80m']);
    await until(() => !runner.running);
    expect(runner.status).toBe('done');
    expect(runner.cached).toBeGreaterThanOrEqual(finished);
    expect(runner.total).toBeLessThanOrEqual(total - finished);
  });

  it('reports an enumeration error in words (no lot boundary)', async () => {
    const runner = new PlanRunner(fakePool(1, { calls: 0 }));
    runner.run({ ...project, boundary: null }, ['80m']);
    await until(() => !runner.running);
    expect(runner.status).toBe('error');
    expect(runner.error).toMatch(/no lot boundary/);
  });

  it('sweeps the feed impedance of a shortlisted design', async () => {
    const runner = new PlanRunner(fakePool(2, { calls: 0 }));
    runner.run(project, ['80m']);
    await until(() => !runner.running);
    const c = runner.shortlist!.candidates[0]!;
    const pts = await runner.sweep(c.design, project.soil, c.trim.valueM, [3.5e6, 3.6e6, 3.7e6]);
    expect(pts.map((p) => p.freqHz)).toEqual([3.5e6, 3.6e6, 3.7e6]);
    expect(pts[0]!.zOhm[1]).toBeLessThan(pts[2]!.zOhm[1]);
  });

  it('sweeps a kept candidate with a fresh pool that never enumerated it (the candidate carries its design)', async () => {
    const first = new PlanRunner(fakePool(1, { calls: 0 }));
    first.run(project, ['80m']);
    await until(() => !first.running);
    const kept = JSON.parse(JSON.stringify(first.shortlist)) as typeof first.shortlist;
    first.dispose();
    const runner = new PlanRunner(fakePool(1, { calls: 0 }));
    runner.restore(kept!, { project, bands: ['80m'] });
    expect(runner.status).toBe('done');
    const c = runner.shortlist!.candidates[0]!;
    const pts = await runner.sweep(c.design, project.soil, c.trim.valueM, [3.5e6, 3.7e6]);
    expect(pts).toHaveLength(2);
    runner.clear();
    expect(runner.shortlist).toBeNull();
    expect(runner.madeFor).toBeNull();
  });
});

describe('candidates as drawn: their own elements and feed points', () => {
  it('every shortlisted candidate has a radiator or top wire and a feed point on one of its wires', async () => {
    const runner = new PlanRunner(fakePool(2, { calls: 0 }));
    runner.run(project, ['80m']);
    await until(() => !runner.running);
    const s = runner.shortlist!;
    for (const c of s.candidates) {
      expect(c.elements.some((e) => e.role === 'radiator' || e.role === 'top-wire')).toBe(true);
      // The feed lies on one of the candidate's placed wires (to a centimetre: each coordinate is
      // rounded to one, so it lies within √3·0.005 m of the wire).
      const f = c.feedPoints[0]!.xyz;
      const onWire = c.wires.some((w) => {
        const d = [0, 1, 2].map((k) => w.to[k] - w.from[k]);
        const q = [0, 1, 2].map((k) => f[k] - w.from[k]);
        const dd = d[0] * d[0] + d[1] * d[1] + d[2] * d[2];
        const t = Math.max(0, Math.min(1, (q[0] * d[0] + q[1] * d[1] + q[2] * d[2]) / dd));
        return Math.hypot(q[0] - t * d[0], q[1] - t * d[1], q[2] - t * d[2]) < 1e-2;
      });
      expect(onWire, c.id).toBe(true);
    }
  });
});
