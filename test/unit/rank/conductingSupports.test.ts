/**
 * Planning mechanics of metal supports and of the soil range, with the test double of the solver
 * (testEvaluator: not physics; the physics of a tower next to a vertical is checked in
 * test/reference/plan/conductingSupport.test.ts).
 */
import { describe, expect, it } from 'vitest';
import {
  STANDOFF_M,
  conductorsNear,
  evaluationModel,
  latticeEquivalentRadiusM,
  segmentDistance,
  supportMetal,
} from '../../../core/antennas/conductors.ts';
import { builderFor } from '../../../core/antennas/registry.ts';
import { neighbourSoils } from '../../../core/em/soils.ts';
import type { EvalRequest, Evaluator } from '../../../core/rank/evaluator.ts';
import { conductorJobs, designKey, enumeratePlan, planSite, soilRangeOf } from '../../../core/rank/plan.ts';
import { placeXY } from '../../../core/site/geometry.ts';
import { wavelengthM } from '../../../core/units/index.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { resonantAt, testEvaluator } from '../../helpers/testEvaluator.ts';

/** The fake solver, its gain shifted per soil class so that the soil range has something to show. */
function soilAware(): Evaluator & { calls: number } {
  const base = testEvaluator({ resonantM: resonantAt(0.47) });
  const shift: Record<string, number> = { 'very-good': 2, average: 0, poor: -1.5 };
  const ev = ((req: EvalRequest) => {
    ev.calls++;
    const g = req.ground;
    const id = typeof g === 'object' && 'classId' in g ? g.classId : 'average';
    // Verticals gain more from wet soil than the rest (only the direction of this matters here).
    const k = req.model.radials.length ? 2 : 0.5;
    return base(req).map((r) => ({
      ...r,
      gainDbi: r.gainDbi ? r.gainDbi.map((v) => v + k * (shift[id] ?? 0)) : null,
    }));
  }) as Evaluator & { calls: number };
  ev.calls = 0;
  return ev;
}

describe('support metal', () => {
  it('models towers by default, masts only when their metal is set, trees never', () => {
    const p = buildDemoProject();
    const tower = p.supports.find((s) => s.kind === 'tower')!;
    const mast = p.supports.find((s) => s.kind === 'mast')!;
    const setup = enumeratePlan(p);
    const byId = new Map(setup.site.supports.map((s) => [s.id, s]));
    expect(byId.get(tower.id)!.conducts).toBe(true);
    expect(byId.get(tower.id)!.metal?.grounded).toBe(true);
    expect(byId.get(mast.id)!.conducts).toBe(null);
    expect(byId.get(mast.id)!.metal).toBe(null);
    for (const s of setup.site.supports.filter((x) => x.kind === 'tree')) expect(s.conducts).toBe(false);
  });

  it('gives a lattice tower the three-leg bundle radius and a mast half its diameter', () => {
    // ∛(c·w²) for c = 16 mm, w = 0.3 m: ∛(0.016·0.09) = 0.1129 m (arithmetic).
    expectClose(latticeEquivalentRadiusM(0.3), 0.1129, 1e-4, 'a_eq = ∛(c·w²), arithmetic');
    const m = supportMetal({
      kind: 'mast',
      conducts: true,
      material: 'aluminium',
      usableHeightM: 12,
      diameterM: 0.06,
    });
    expect(m).toEqual({ material: 'aluminium', heightM: 12, radiusM: 0.03, grounded: true });
    expect(supportMetal({ kind: 'mast', conducts: null, usableHeightM: 12 })).toBe(null);
  });

  it('measures the distance between segments', () => {
    expectClose(segmentDistance([0, 0, 0], [0, 0, 10], [3, 4, 5], [3, 4, 8]), 5, 1e-12, 'parallel, 3-4-5');
    expectClose(
      segmentDistance([0, 0, 0], [10, 0, 0], [5, -5, 2], [5, 5, 2]),
      2,
      1e-12,
      'crossing, 2 m over',
    );
  });
});

describe('metal supports in the plan', () => {
  const project = buildDemoProject();
  const ev = testEvaluator({ resonantM: resonantAt(0.47) });
  // Every placement listed (no cap per type), so that one on the field mast is among them.
  const s = planSite(project, {
    evaluator: ev,
    types: ['inverted-v', 'dipole', 'vertical'],
    shortlistPerType: 10,
  });
  const lambda = wavelengthM(3.55e6);

  it('puts the tower into every candidate within 0.5 λ of it, and into one hung from it', () => {
    const tower = project.supports.find((x) => x.kind === 'tower')!;
    const towerXY = enumeratePlan(project).site.supports.find((x) => x.id === tower.id)!.xy;
    for (const c of s.candidates) {
      const near = c.wires.some((w) => {
        const dx = w.to[0] - w.from[0];
        const dy = w.to[1] - w.from[1];
        const l2 = dx * dx + dy * dy;
        const t = l2
          ? Math.max(0, Math.min(1, ((towerXY[0] - w.from[0]) * dx + (towerXY[1] - w.from[1]) * dy) / l2))
          : 0;
        return Math.hypot(w.from[0] + t * dx - towerXY[0], w.from[1] + t * dy - towerXY[1]) <= 0.5 * lambda;
      });
      expect(
        c.conductingSupports.some((x) => x.id === tower.id),
        c.id,
      ).toBe(near);
      if (c.supports.some((x) => x.id === tower.id)) {
        const t = c.conductingSupports.find((x) => x.id === tower.id)!;
        expect(t.heightM).toBe(tower.usableHeightM);
        expect(t.grounded).toBe(true);
      }
      // The candidate's placed elements carry each modelled support as a vertical axis, at the
      // support (or STANDOFF_M from it, on a stand-off arm), as tall as the support.
      const axes = c.elements.filter((e) => e.role === 'conducting-support');
      expect(axes.length, c.id).toBe(c.conductingSupports.length);
      for (const e of axes) {
        if (e.role !== 'conducting-support') continue;
        const own = c.conductingSupports.find((x) => x.id === e.supportId)!;
        expect(e.to[2] - e.from[2]).toBeCloseTo(own.heightM, 6);
        expect(e.from[0]).toBeCloseTo(e.to[0], 9);
        if (e.supportId === tower.id)
          expect(Math.hypot(e.from[0] - towerXY[0], e.from[1] - towerXY[1])).toBeLessThanOrEqual(
            (own.standoff ? STANDOFF_M : 0) + 1e-3, // within 1 mm
          );
      }
    }
    expect(s.candidates.some((c) => c.conductingSupports.length > 0)).toBe(true);
  });

  it('names a nearby mast of unknown material instead of guessing', () => {
    const withMast = s.candidates.find((c) => c.supports.some((x) => x.id === 'mast-field'));
    expect(withMast, 'a candidate on the field mast').toBeTruthy();
    expect(withMast!.diagnostics.join(' ')).toMatch(/Field mast is within 0.5 λ but its material is not set/);
  });

  it('solves again only the best orientation of each group near a tower (canonical-frame key)', () => {
    const setup = enumeratePlan(project, { types: ['inverted-v'] });
    const near = setup.bands[0].proposed.filter((q) => q.withConductors);
    const groups = new Set(near.map((q) => q.proposal.groupKey));
    expect(near.length).toBeGreaterThan(groups.size);
    const cache = new Map();
    for (const j of setup.jobs) cache.set(j.key, { ...evaluate(j), trimM: j.design.trim.nominalM });
    const second = conductorJobs(setup, cache, project);
    expect(second.length).toBeLessThanOrEqual(groups.size);
    expect(second.length).toBeGreaterThan(0);
    for (const j of second) {
      expect(j.design.conductors?.length).toBeGreaterThan(0);
      expect(j.key).not.toBe(designKey({ ...j.design, conductors: undefined }, project.soil));
      // The model the solver sees: the antenna's wires, then the supports.
      const n = builderFor(j.design.type).model(j.design, j.design.trim.nominalM).wires.length;
      const m = evaluationModel(j.design, j.design.trim.nominalM);
      expect(m.wires.length).toBe(n + j.design.conductors!.length);
      expect(m.wires[n].from[2]).toBe(0);
    }
    function evaluate(j: { design: { designFreqHz: number } }) {
      const g = new Array(PATTERN_SIZE).fill(0);
      return { gainDbi: g, soilRange: [], freqHz: j.design.designFreqHz };
    }
  });

  it('hangs a wire on the target side of a tower, the stand-off in the canonical frame', () => {
    const setup = enumeratePlan(project, { types: ['inverted-v'] });
    const q = setup.bands[0].proposed.find((x) =>
      x.withConductors?.design.conductors?.some((c) => c.standoff),
    );
    expect(q, 'an inverted-V from the tower').toBeTruthy();
    const c = q!.withConductors!.design.conductors!.find((x) => x.standoff)!;
    const tower = setup.site.supports.find((x) => x.id === c.supportId)!;
    const site = placeXY(c.xy, q!.proposal.placement.rotationDeg, q!.proposal.placement.originXY);
    expectClose(
      Math.hypot(site[0] - tower.xy[0], site[1] - tower.xy[1]),
      STANDOFF_M,
      1e-3,
      'stand-off by construction',
    );
    // Away bearing: opposite the weighted main target (the demo's targets lie north-east to north-west).
    const again = conductorsNear(
      q!.proposal.design,
      q!.proposal.placement,
      [{ id: tower.id, name: tower.name, xy: tower.xy, metal: tower.metal! }],
      180,
    );
    const moved = placeXY(
      again.conductors[0].xy,
      q!.proposal.placement.rotationDeg,
      q!.proposal.placement.originXY,
    );
    expectClose(moved[1] - tower.xy[1], -STANDOFF_M, 1e-3, 'moved due south by construction');
  });
});

const PATTERN_SIZE = 180 * 51;

describe('soil range', () => {
  it('takes the classes next to the project soil, or the user range', () => {
    expect(neighbourSoils({ classId: 'average' })).toEqual({ wetter: 'very-good', drier: 'poor' });
    expect(neighbourSoils({ classId: 'very-good' })).toEqual({ wetter: null, drier: 'average' });
    expect(neighbourSoils({ classId: 'salt-water' })).toEqual({ wetter: null, drier: null });
    expect(neighbourSoils({ permittivity: 10, conductivitySPerM: 0.003 })).toEqual({
      wetter: 'average',
      drier: 'poor',
    });
    const p = buildDemoProject();
    expect(soilRangeOf(p)).toEqual(['poor', 'very-good']);
    expect(soilRangeOf({ ...p, settings: { ...p.settings, soilRange: ['itu-dry', 'average'] } })).toEqual([
      'itu-dry',
    ]);
  });

  it('brackets the score and says when a rank does not hold', () => {
    const project = buildDemoProject();
    const ev = soilAware();
    const s = planSite(project, { evaluator: ev, types: ['dipole', 'vertical'] });
    for (const c of s.candidates) {
      expect(c.soilRange.soils).toEqual(['average', 'poor', 'very-good']);
      expect(c.soilRange.lowDbi).toBeLessThanOrEqual(c.score);
      expect(c.soilRange.highDbi).toBeGreaterThanOrEqual(c.score);
      expect(c.soilRange.scores[0]).toEqual({ soil: 'average', scoreDbi: c.score, rank: c.rank });
      expect(c.soilRange.rankHolds).toBe(c.soilRange.scores.every((x) => x.rank === c.rank));
    }
    // Verticals gain more from wet soil in this double, so some rank must move over the range.
    expect(s.candidates.some((c) => !c.soilRange.rankHolds)).toBe(true);
    // Only the pattern of each shortlisted design is solved over the other soils: one request each.
    const plain = testEvaluator({ resonantM: resonantAt(0.47) });
    planSite(
      { ...project, settings: { ...project.settings, soilRange: ['average'] } },
      { evaluator: plain, types: ['dipole'] },
    );
    const withRange = soilAware();
    const r = planSite(project, { evaluator: withRange, types: ['dipole'] });
    expect(withRange.calls - plain.calls).toBe(2 * new Set(r.candidates.map((c) => c.evaluationKey)).size);
  });
});
