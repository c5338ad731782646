/**
 * Regression guard, not a reference check: the golden shortlist for the demo lot on 80 m, the
 * planner over the project's field solver compared with the reviewed fixture
 * test/fixtures/plan/demo-80m.json (see its README). Regenerate on purpose after a reviewed
 * change, the one way every golden file is regenerated: YARDWIRE_UPDATE_GOLDEN=1 npx vitest run test/regression
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { planSite, type Shortlist } from '../../../core/rank/plan.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { buildDemoProject } from '../../../core/demo/demoProject.ts';
import { expectClose } from '../../helpers/expectClose.ts';

const FIXTURE = new URL('../../fixtures/plan/demo-80m.json', import.meta.url);
const SRC = 'reviewed golden fixture test/fixtures/plan/demo-80m.json';
/** Tolerances per quantity (the solver may change in its last digits between platforms). */
const TOL = { scoreDb: 0.05, gainDb: 0.1, trimM: 0.02, elevationDeg: 1.01, ohm: 0.5 };

interface GoldenCandidate {
  id: string;
  rank: number;
  type: string;
  score: number;
  trimM: number;
  peakGainDbi: number;
  peakElevationDeg: number;
  zOhm: [number, number];
  regions: Record<string, number>;
  /** Score range over the soil range (added with metal supports and the soil range, issue 13). */
  soilRangeDbi?: [number, number];
  /** Ids of the conducting supports in the candidate's model. */
  metal?: string[];
}
interface Golden {
  candidates: GoldenCandidate[];
  rejected: { type: string; where: string; reason: string }[];
}

const r = (v: number, d = 3): number => Math.round(v * 10 ** d) / 10 ** d;

function summarise(s: Shortlist): Golden {
  return {
    candidates: s.candidates.map((c) => ({
      id: c.id,
      rank: c.rank,
      type: c.type,
      score: r(c.score),
      trimM: r(c.trim.valueM),
      peakGainDbi: r(c.peak.gainDbi),
      peakElevationDeg: r(c.peak.elevationDeg, 1),
      zOhm: [r(c.feed.zOhm[0], 2), r(c.feed.zOhm[1], 2)],
      regions: Object.fromEntries(c.regions.map((g) => [g.id, r(g.gainDbi)])),
      soilRangeDbi: [r(c.soilRange.lowDbi), r(c.soilRange.highDbi)],
      metal: c.conductingSupports.map((m) => m.id),
    })),
    rejected: s.rejected.map((x) => ({ type: x.type, where: x.where, reason: x.reasons[0] ?? '' })),
  };
}

describe('golden shortlist of the demo lot (80 m, regression guard)', () => {
  const got = summarise(planSite(buildDemoProject(), { evaluator: solverEvaluator, bands: ['80m'] }));
  if (process.env.YARDWIRE_UPDATE_GOLDEN) writeFileSync(FIXTURE, JSON.stringify(got, null, 2) + '\n');
  const want = JSON.parse(readFileSync(FIXTURE, 'utf8')) as Golden;

  it('ranks the same placements in the same order', () => {
    expect(got.candidates.map((c) => c.id)).toEqual(want.candidates.map((c) => c.id));
  });

  it('gives each placement the same score, trim, peak and feed within tolerance', () => {
    want.candidates.forEach((w, i) => {
      const g = got.candidates[i];
      expectClose(g.score, w.score, TOL.scoreDb, `${SRC}: ${w.id} score`);
      expectClose(g.trimM, w.trimM, TOL.trimM, `${SRC}: ${w.id} trim`);
      expectClose(g.peakGainDbi, w.peakGainDbi, TOL.gainDb, `${SRC}: ${w.id} peak gain`);
      expectClose(g.peakElevationDeg, w.peakElevationDeg, TOL.elevationDeg, `${SRC}: ${w.id} peak elevation`);
      expectClose(g.zOhm[0], w.zOhm[0], TOL.ohm, `${SRC}: ${w.id} R`);
      expectClose(g.zOhm[1], w.zOhm[1], TOL.ohm, `${SRC}: ${w.id} X`);
      for (const [id, v] of Object.entries(w.regions))
        expectClose(g.regions[id], v, TOL.gainDb, `${SRC}: ${w.id} ${id}`);
      if (w.soilRangeDbi) {
        expectClose(g.soilRangeDbi![0], w.soilRangeDbi[0], TOL.scoreDb, `${SRC}: ${w.id} soil range low`);
        expectClose(g.soilRangeDbi![1], w.soilRangeDbi[1], TOL.scoreDb, `${SRC}: ${w.id} soil range high`);
      }
      if (w.metal) expect(g.metal, `${SRC}: ${w.id} metal supports`).toEqual(w.metal);
    });
  });

  it('rejects the same placements for the same first reason', () => {
    expect(got.rejected).toEqual(want.rejected);
  });
});
