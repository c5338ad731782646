import { describe, expect, it } from 'vitest';
import { builderFor } from '../../../core/antennas/registry.ts';
import { placeXYZ } from '../../../core/site/geometry.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { PATTERN_GRID, gainAt } from '../../../core/rank/pattern.ts';
import { compareCandidates, enumeratePlan, memoryCache, planSite } from '../../../core/rank/plan.ts';
import { wavelengthM } from '../../../core/units/index.ts';
import { buildDemoProject, demoLonLat } from '../../../data/demo/demoProject.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { resonantAt, testEvaluator } from '../../helpers/testEvaluator.ts';

describe('trim loop', () => {
  /** The demo's first dipole trimmed over the test evaluator resonant at L0 = `wavelengths`·λ (design frequency). */
  const trimAt = (wavelengths: number) => {
    const job = enumeratePlan(buildDemoProject(), { types: ['dipole'] }).jobs[0];
    const L0 = wavelengths * wavelengthM(job.design.designFreqHz);
    return { L0, rec: evaluateDesign(job.design, job.ground, testEvaluator({ resonantM: () => L0 })) };
  };

  it('lands on the length where the reactance is zero', () => {
    const { L0, rec } = trimAt(0.471);
    expect(rec.resonant).toBe(true);
    expect(Math.abs(rec.zOhm[1])).toBeLessThan(0.5);
    expectClose(rec.trimM, L0, 0.5 / 20, 'X = 20 Ω/m·(L − L0) by construction');
  });

  it('says so when no resonance lies inside the limits', () => {
    const { rec } = trimAt(10);
    expect(rec.resonant).toBe(false);
    expect(rec.diagnostics.join(' ')).toMatch(/no resonance within/);
  });
});

describe('planSite mechanics', () => {
  const project = buildDemoProject();
  const types = ['dipole', 'inverted-v', 'half-square'] as const;

  it('ranks distinct placements, one per group, and keeps rejections with reasons', () => {
    const ev = testEvaluator({ resonantM: resonantAt(0.47) });
    const s = planSite(project, { evaluator: ev, types });
    expect(s.candidates.length).toBeGreaterThan(3);
    const groups = s.candidates.map((c) => c.id);
    expect(new Set(groups).size).toBe(groups.length);
    const scores = s.candidates.filter((c) => !c.bestOfType || c.rank <= 10).map((c) => c.score);
    for (let i = 1; i < Math.min(scores.length, 10); i++)
      expect(scores[i]).toBeLessThanOrEqual(scores[i - 1]);
    expect(s.rejected.length).toBeGreaterThan(0);
    for (const r of s.rejected) expect(r.reasons.length).toBeGreaterThan(0);
    // Every shortlisted placement states its closest approach to the demo's road line, and keeps it.
    for (const c of s.candidates) {
      const line = c.fits.find((f) => f.startsWith('closest to "Distribution line along the road"'));
      const m = line?.match(/at ([0-9.]+) m, needs ([0-9.]+) m/);
      expect(m, c.fits.join('; ')).toBeTruthy();
      if (m) expect(Number(m[1])).toBeGreaterThanOrEqual(Number(m[2]));
    }
    for (const c of s.candidates) {
      expect(c.fits.length).toBeGreaterThan(0);
      expect(c.cutList.length).toBeGreaterThan(0);
      expect(c.footprint.ringXY.length).toBeGreaterThanOrEqual(3);
      expect(c.regions.map((r) => r.id)).toEqual(['europe', 'japan', 'south-america']);
    }
  });

  it('serves a second plan from the cache and re-evaluates only what moved', () => {
    const ev = testEvaluator({ resonantM: resonantAt(0.47) });
    const cache = memoryCache();
    const a = planSite(project, { evaluator: ev, cache, types });
    const calls = ev.calls;
    const b = planSite(project, { evaluator: ev, cache, types });
    expect(ev.calls).toBe(calls);
    expect(b.stats.evaluations).toBe(0);
    expect(b.candidates.map((c) => [c.id, c.score])).toEqual(a.candidates.map((c) => [c.id, c.score]));
    // Move one support 3 m: only designs using it change.
    const moved = structuredClone(project);
    const s = moved.supports.find((x) => x.id === 'mast-field');
    if (!s) throw new Error('demo support missing');
    s.position = demoLonLat(104, 46);
    const c = planSite(moved, { evaluator: ev, cache, types });
    expect(c.stats.evaluations).toBeGreaterThan(0);
    expect(c.stats.evaluations).toBeLessThan(c.stats.evaluations + c.stats.cacheHits);
    expect(c.stats.cacheHits).toBeGreaterThan(0);
  });

  it("reads a placed antenna's gain from its rotated canonical pattern", () => {
    const ev = testEvaluator({ resonantM: resonantAt(0.47) });
    const setup = enumeratePlan(project, { types: ['inverted-v'] });
    const prop = setup.bands[0].proposed.find((p) => p.proposal.placement.rotationDeg === 35);
    if (!prop) throw new Error('no inverted-V at 35°');
    const { design, placement } = prop.proposal;
    const rec = evaluateDesign(design, project.soil, ev);
    const model = builderFor(design.type).model(design, rec.trimM);
    const placed = {
      ...model,
      wires: model.wires.map((w) => ({
        ...w,
        from: placeXYZ(w.from, placement.rotationDeg, placement.originXY),
        to: placeXYZ(w.to, placement.rotationDeg, placement.originXY),
      })),
    };
    const direct = ev({
      model: placed,
      ground: project.soil,
      frequenciesHz: [design.designFreqHz],
      pattern: PATTERN_GRID,
    })[0].gainDbi;
    if (!direct) throw new Error('no pattern');
    const nAz = PATTERN_GRID.azimuthsDeg.length;
    for (const [ie, ia] of [
      [3, 10],
      [10, 44],
      [20, 100],
      [0, 170],
    ]) {
      const el = PATTERN_GRID.elevationsDeg[ie];
      const az = PATTERN_GRID.azimuthsDeg[ia];
      // 35° is not a multiple of the 2° grid, so the rotated read interpolates; the double is smooth.
      expectClose(
        gainAt(rec.gainDbi, placement.rotationDeg, az, el),
        direct[ie * nAz + ia],
        0.05,
        'rotation of the canonical frame by construction',
      );
    }
  });

  it('compares two candidates over the whole circle', () => {
    const ev = testEvaluator({ resonantM: resonantAt(0.47) });
    const s = planSite(project, { evaluator: ev, types });
    const [a, b] = s.candidates;
    const r = compareCandidates(s, a.id, b.id, 15);
    expect(r.aBetterDeg + r.bBetterDeg + r.tiedDeg).toBe(360);
    const self = compareCandidates(s, a.id, a.id, 15);
    expect(self.tiedDeg).toBe(360);
  });
});

describe('rejections through the whole plan', () => {
  it('rejects a dipole whose wire would cross a power-line clearance, with the reason', async () => {
    const { testLot, powerLine, supportPair } = await import('../site/lot.ts');
    const project = testLot({
      halfX: 60,
      halfY: 40,
      supports: supportPair(50, 14, 14, -20),
      keepOuts: [powerLine('Line', -35, 10, 80)],
    });
    const ev = testEvaluator({ resonantM: resonantAt(0.47) });
    const s = planSite(project, { evaluator: ev, types: ['dipole'] });
    expect(s.candidates).toHaveLength(0);
    const r = s.rejected.find((x) => x.type === 'dipole');
    // Wire at 14 m, 15 m from the line: needs 14 + 3 = 17 m, misses by 2 m.
    expect(r?.reasons.join(' ')).toMatch(/crosses the power-line clearance of "Line" by 2\.0 m/);
  });
});
