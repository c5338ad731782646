/**
 * Switched pairs (issue 16, point 5): two separate antennas of the shortlist, selected by relays
 * (core/antennas/switchedPair.ts), modelled together: both antennas' wires and radial fields are
 * in one solver model, the idle one present with its feed open. Two states, A driven and B driven,
 * each solved (the two patterns are not related by a symmetry in general); each region is served
 * by its best state, as for the arrays (core/rank/states.ts).
 *
 * Which pairs (after the single antennas of a band are ranked; planned only when arrays are):
 *  - from PAIR_TOP_SINGLES single antennas of the band (one element, no feed network, no
 *    conducting support in their model), so at most 15 pairs per band: in turn the best by score
 *    and the best for each target region (pairPool), since the partner a pair needs serves the
 *    regions the first one misses and may rank low alone;
 *  - the two share no support (a simple, safe reading of "no support used in incompatible ways");
 *  - every wire of one is at least PAIR_MIN_SEPARATION_WAVELENGTHS (0.1 λ) from every wire of the
 *    other (3-D distance between the solver's wires), and two radial fields do not overlap
 *    (their bases at least the sum of their longest radials apart);
 *  - preferring pairs that look different ways: pairs whose broadside directions differ come
 *    first (two of the same broadside directions add little), then by the sum of the singles'
 *    scores.
 * A pair is listed only when its score beats the band's best single antenna by at least
 * `settings.pairMarginDb` (default 1 dB; core/project/schema.ts); listed pairs go ahead of the
 * singles (they beat every one of them). The listed pairs are then solved over the soil range
 * (both states, pattern only; core/rank/plan.ts soilRangeJobs, step 5) and ranked with the singles
 * over each soil; where that was not computed their `soilRange` holds the project's soil only and
 * the candidate's diagnostics say so.
 */
import { builderFor } from '../antennas/registry.ts';
import { pairRunM, SWITCHED_PAIR_TYPE } from '../antennas/switchedPair.ts';
import type { Design, WireModel } from '../antennas/types.ts';
import { placeXYZ, convexHull, type XYZ } from '../site/geometry.ts';
import type { XY } from '../site/frame.ts';
import { Z0_OHM, type EvalGround } from './evaluator.ts';
import type { EvaluationRecord } from './evaluate.ts';
import { efficiencySplit } from './lossSplit.ts';
import { candidateCautions, feedLineElement, feedPointsOf, groundSystemOf } from './candidate.ts';
import type { Candidate, EvaluationCache, Job } from './plan.ts';
import type { Band } from '../project/schema.ts';
import type { Site } from '../site/site.ts';

/** Single antennas of a band that pairs are formed from (a chosen bound: 6 → at most 15 pairs). */
export const PAIR_TOP_SINGLES = 6;
/** Least distance between any wire of one antenna and any of the other, wavelengths (a chosen bound). */
export const PAIR_MIN_SEPARATION_WAVELENGTHS = 0.1;
/** Default of settings.pairMarginDb (also in the schema). */
export const PAIR_MARGIN_DEFAULT_DB = 1;

/** A pair formed on one band: the pair's designs for both states and their evaluation keys. */
export interface PlannedPair {
  band: Band;
  a: Candidate;
  b: Candidate;
  designs: [Design, Design];
  keys: [string, string];
  separationM: number;
}

const segDist = (p1: XYZ, q1: XYZ, p2: XYZ, q2: XYZ): number => {
  // Closest distance between two segments (sampled finely: robust and plenty for a 0.1 λ test).
  let best = Infinity;
  const N = 24;
  const pt = (a: XYZ, b: XYZ, t: number): XYZ => [
    a[0] + (b[0] - a[0]) * t,
    a[1] + (b[1] - a[1]) * t,
    a[2] + (b[2] - a[2]) * t,
  ];
  for (let i = 0; i <= N; i++) {
    const u = pt(p1, q1, i / N);
    for (let j = 0; j <= N; j++) {
      const v = pt(p2, q2, j / N);
      best = Math.min(best, Math.hypot(u[0] - v[0], u[1] - v[1], u[2] - v[2]));
    }
  }
  return best;
};

function placedModel(c: Candidate): WireModel {
  return builderFor(c.design.type).model(c.design, c.trim.valueM);
}

/** Why two candidates cannot be a pair (null: they can), and their least wire separation. */
export function pairCollision(
  a: Candidate,
  b: Candidate,
  wavelengthM: number,
): { reason: string | null; separationM: number } {
  if (a.supports.some((s) => b.supports.some((t) => t.id === s.id)))
    return { reason: 'they share a support', separationM: 0 };
  const ma = placedModel(a);
  const mb = placedModel(b);
  const place = (m: WireModel, c: Candidate) =>
    m.wires.map((w) => ({
      from: placeXYZ(w.from, c.placement.rotationDeg, c.placement.originXY),
      to: placeXYZ(w.to, c.placement.rotationDeg, c.placement.originXY),
    }));
  const wa = place(ma, a);
  const wb = place(mb, b);
  let sep = Infinity;
  for (const x of wa) for (const y of wb) sep = Math.min(sep, segDist(x.from, x.to, y.from, y.to));
  if (sep < PAIR_MIN_SEPARATION_WAVELENGTHS * wavelengthM)
    return {
      reason: `their wires come within ${sep.toFixed(1)} m (less than ${PAIR_MIN_SEPARATION_WAVELENGTHS} λ)`,
      separationM: sep,
    };
  if (a.groundSystem.kind === 'radials' && b.groundSystem.kind === 'radials') {
    const d = Math.hypot(
      a.groundSystem.baseXY[0] - b.groundSystem.baseXY[0],
      a.groundSystem.baseXY[1] - b.groundSystem.baseXY[1],
    );
    const r = Math.max(...a.groundSystem.lengthsM) + Math.max(...b.groundSystem.lengthsM);
    if (d < r) return { reason: 'their radial fields overlap', separationM: sep };
  }
  return { reason: null, separationM: sep };
}

const norm = (d: number): number => ((d % 180) + 180) % 180;

/** Whether two candidates look different ways (broadside axes at least 30° apart, or one has none). */
function lookDifferentWays(a: Candidate, b: Candidate): boolean {
  if (!a.broadsideDeg.length || !b.broadsideDeg.length)
    return a.broadsideDeg.length !== b.broadsideDeg.length;
  const d = Math.abs(norm(a.broadsideDeg[0]) - norm(b.broadsideDeg[0]));
  return Math.min(d, 180 - d) >= 30;
}

/** The pair design of two candidates, state `driven` (0: A, 1: B); the pair's frame is the site's moved to A's origin. */
export function pairDesign(a: Candidate, b: Candidate, driven: 0 | 1): Design {
  const o = a.placement.originXY;
  const parts = [a, b].map((c) => ({
    design: c.design,
    trimM: c.trim.valueM,
    placement: {
      originXY: [c.placement.originXY[0] - o[0], c.placement.originXY[1] - o[1]] as XY,
      rotationDeg: c.placement.rotationDeg,
    },
  }));
  const fa = a.feedPoints[0].xyz;
  const fb = b.feedPoints[0].xyz;
  return {
    type: SWITCHED_PAIR_TYPE,
    band: a.band,
    designFreqHz: a.design.designFreqHz,
    params: { driven, runM: Math.round(pairRunM(fa, fb) * 100) / 100 },
    trim: { name: 'none: each antenna keeps its own trim', nominalM: 0, minM: 0, maxM: 0 },
    parts,
  };
}

/**
 * The singles pairs are formed from: in turn the best by score, the best for each region (by the
 * regions' weight), then the second of each, … until PAIR_TOP_SINGLES are chosen. A single that
 * serves one region well but the others badly ranks low alone and is just what a pair needs.
 */
export function pairPool(singles: readonly Candidate[]): Candidate[] {
  const eligible = singles.filter(
    (c) => c.elementCount === 1 && !c.conductingSupports.length && !c.arrayFeed,
  );
  const nRegions = eligible[0]?.regions.length ?? 0;
  const order = [...Array(nRegions).keys()].sort(
    (i, j) => eligible[0].regions[j].weight - eligible[0].regions[i].weight || i - j,
  );
  const lists = [
    [...eligible].sort((x, y) => y.score - x.score),
    ...order.map((k) => [...eligible].sort((x, y) => y.regions[k].gainDbi - x.regions[k].gainDbi)),
  ];
  const pool: Candidate[] = [];
  for (let depth = 0; pool.length < PAIR_TOP_SINGLES && depth < eligible.length; depth++)
    for (const l of lists) {
      const c = l[depth];
      if (c && !pool.includes(c) && pool.length < PAIR_TOP_SINGLES) pool.push(c);
    }
  return pool;
}

/** The pairs of one band's ranked single candidates (bounded, checked for collisions, ordered). */
export function formPairs(
  singles: readonly Candidate[],
  wavelengthM: number,
): { a: Candidate; b: Candidate; separationM: number }[] {
  const pool = pairPool(singles);
  const out: { a: Candidate; b: Candidate; separationM: number; differ: boolean; sum: number }[] = [];
  for (let i = 0; i < pool.length; i++)
    for (let j = i + 1; j < pool.length; j++) {
      const { reason, separationM } = pairCollision(pool[i], pool[j], wavelengthM);
      if (reason) continue;
      out.push({
        a: pool[i],
        b: pool[j],
        separationM,
        differ: lookDifferentWays(pool[i], pool[j]),
        sum: pool[i].score + pool[j].score,
      });
    }
  out.sort((x, y) => Number(y.differ) - Number(x.differ) || y.sum - x.sum);
  return out.map(({ a, b, separationM }) => ({ a, b, separationM }));
}

/** Jobs of the pairs: both states of each, keyed like any design. */
export function pairPlans(
  ranked: readonly Candidate[],
  bands: readonly { band: Band; wavelengthM: number }[],
  ground: EvalGround,
  keyOf: (d: Design, g: EvalGround) => string,
): { pairs: PlannedPair[]; jobs: Job[] } {
  const pairs: PlannedPair[] = [];
  const jobs: Job[] = [];
  for (const { band, wavelengthM } of bands) {
    const singles = ranked.filter((c) => c.band === band);
    for (const { a, b, separationM } of formPairs(singles, wavelengthM)) {
      const designs: [Design, Design] = [pairDesign(a, b, 0), pairDesign(a, b, 1)];
      const keys: [string, string] = [keyOf(designs[0], ground), keyOf(designs[1], ground)];
      pairs.push({ band, a, b, designs, keys, separationM });
      designs.forEach((design, k) => jobs.push({ key: keys[k], design, ground }));
    }
  }
  return { pairs, jobs };
}

type Scorer = (gainDbi: readonly number[], rot: number) => { score: number; regionGains: number[] };

/**
 * A pair's score from its two states' patterns (pair frame, no rotation): each region served by
 * its better state, the regions' gains weighted as for any candidate.
 */
export function pairScore(
  gains: readonly [readonly number[], readonly number[]],
  scoreOf: Scorer,
  weights: readonly number[],
): { st: { score: number; regionGains: number[] }[]; regionGains: number[]; score: number } {
  const st = gains.map((g) => scoreOf(g, 0));
  const regionGains = weights.map((_, k) => Math.max(st[0].regionGains[k], st[1].regionGains[k]));
  const total = weights.reduce((s, w) => s + w, 0);
  const score =
    total > 0
      ? regionGains.reduce((s, g, k) => s + g * weights[k], 0) / total
      : Math.max(st[0].score, st[1].score);
  return { st, regionGains, score };
}

/**
 * The pair candidates of one band that beat its best single by at least `marginDb`, best first.
 * `scoreOf` is the band's scorer; `weights` the regions' weights.
 */
export function pairCandidates(
  pairs: readonly PlannedPair[],
  bestSingleScore: number,
  marginDb: number,
  cache: EvaluationCache,
  scoreOf: Scorer,
  weights: readonly number[],
  site: Site,
  patterns: Record<string, number[]>,
): Candidate[] {
  const out: Candidate[] = [];
  for (const pr of pairs) {
    const recs = pr.keys.map((k) => cache.get(k));
    if (recs.some((r) => !r || r.unsolvable !== undefined || !r.gainDbi.length)) continue;
    const [ra, rb] = recs as [EvaluationRecord, EvaluationRecord];
    const { st, regionGains, score } = pairScore([ra.gainDbi, rb.gainDbi], scoreOf, weights);
    if (!(score >= bestSingleScore + marginDb)) continue;
    out.push(pairCandidate(pr, ra, rb, st, regionGains, score, site, patterns));
  }
  return out.sort((x, y) => y.score - x.score);
}

function pairCandidate(
  pr: PlannedPair,
  ra: EvaluationRecord,
  rb: EvaluationRecord,
  st: { score: number; regionGains: number[] }[],
  regionGains: number[],
  score: number,
  site: Site,
  patterns: Record<string, number[]>,
): Candidate {
  const { a, b } = pr;
  const design = pr.designs[0];
  const builder = builderFor(SWITCHED_PAIR_TYPE);
  const placement = { originXY: a.placement.originXY, rotationDeg: 0 };
  const model = builder.model(design, 0);
  const feedPoints = feedPointsOf(model, placement, site.frame);
  const els = builder.elements(design, 0);
  const coax = els
    .filter((e) => e.kind === 'coax')
    .map((e) => {
      const c = e as { label: string; from: XYZ; to: XYZ };
      return {
        role: 'coax' as const,
        label: c.label,
        from: placeXYZ(c.from, 0, placement.originXY),
        to: placeXYZ(c.to, 0, placement.originXY),
      };
    });
  // The relay box goes first among the coax (core/report/arrayWiring.ts takes the first ground end as the box).
  const placed = [
    ...a.elements.filter((e) => e.role !== 'feed-line'),
    ...b.elements.filter((e) => e.role !== 'feed-line'),
    ...coax,
    ...feedLineElement(site.station, { xyz: [coax[0].to[0], coax[0].to[1], 0], lonLat: [0, 0] }),
  ];
  const plan: XY[] = [];
  for (const e of placed) {
    if ('from' in e) plan.push([e.from[0], e.from[1]], [e.to[0], e.to[1]]);
    else if ('at' in e) plan.push([e.at[0], e.at[1]]);
  }
  const ringXY = convexHull(plan).map((q): XY => [
    Math.round(q[0] * 100) / 100,
    Math.round(q[1] * 100) / 100,
  ]);
  const names = ['A driven, B open at its feed', 'B driven, A open at its feed'];
  const beam = (r: EvaluationRecord): number => Math.round(((r.peak.azimuthDeg + 360) % 360) * 10) / 10;
  patterns[pr.keys[0]] = ra.gainDbi;
  patterns[pr.keys[1]] = rb.gainDbi;
  const supportIds = [...a.supports, ...b.supports].map((s) => s.id);
  return {
    ...a,
    id: `${a.band}-${SWITCHED_PAIR_TYPE}-${a.id.slice(a.band.length + 1)}+${b.id.slice(b.band.length + 1)}`,
    design,
    placement: { ...placement, frameOriginLonLat: site.frame.origin },
    rank: 0,
    type: SWITCHED_PAIR_TYPE,
    typeLabel: `${builder.label}: ${a.typeLabel} (A) and ${b.typeLabel} (B)`,
    where: `A: ${a.where}; B: ${b.where}; relay box at the foot of A’s feed, a relay at B’s feed`,
    adaptations: [...(a.adaptations ?? []), ...(b.adaptations ?? [])].map((x) => x),
    bestOfType: true,
    supports: [...a.supports, ...b.supports],
    broadsideDeg: [...new Set([...a.broadsideDeg, ...b.broadsideDeg])],
    rotationDeg: 0,
    heights: builder
      .heights(design, 0)
      .map((h) => ({ label: h.label, heightM: Math.round(h.heightM * 100) / 100 })),
    score,
    regions: a.regions.map((r, k) => ({ ...r, gainDbi: regionGains[k] })),
    elementCount: 2,
    states: [ra, rb].map((r, i) => ({
      name: names[i],
      beamDeg: beam(r),
      regions: a.regions.map((reg, k) => ({ id: reg.id, gainDbi: st[i].regionGains[k] })),
    })),
    ...(ra.arrayFeed
      ? {
          arrayFeed: {
            ...ra.arrayFeed,
            // direction 2 solved apart: what B's coax run gives the station's line at the box
            ...(rb.arrayFeed
              ? {
                  states: [
                    {
                      state: 2,
                      elements: rb.arrayFeed.elements,
                      networkLossShare: rb.arrayFeed.networkLossShare,
                      feedZOhm: rb.zOhm,
                      swr: rb.swr,
                    },
                  ],
                }
              : {}),
          },
        }
      : {}),
    peak: ra.peak.gainDbi >= rb.peak.gainDbi ? { ...ra.peak } : { ...rb.peak },
    feed: { zOhm: ra.zOhm, swr: ra.swr, z0Ohm: Z0_OHM, freqMHz: ra.freqHz / 1e6 },
    bandwidth2to1: {
      lowMHz: ra.bandwidth.lowHz === null ? null : ra.bandwidth.lowHz / 1e6,
      highMHz: ra.bandwidth.highHz === null ? null : ra.bandwidth.highHz / 1e6,
      widthKHz: ra.bandwidth.widthHz / 1e3,
      note: 'state A (A driven, B open) at its feed; each antenna keeps the trim it has alone',
    },
    efficiency: efficiencySplit(ra.power),
    trim: {
      dimension: `A's ${a.trim.dimension} (${a.trim.valueM.toFixed(2)} m) and B's ${b.trim.dimension} (${b.trim.valueM.toFixed(2)} m), each tuned with the other's feed open`,
      valueM: 0,
      resonant: ra.resonant && rb.resonant,
    },
    cutList: builder.cutList(design, 0).map((c) => ({
      ...c,
      lengthM: Math.round(c.lengthM * 100) / 100,
      cutLengthM: Math.round(c.cutLengthM * 100) / 100,
    })),
    footprint: { ringXY, ringLonLat: ringXY.map((q) => site.frame.toLonLat(q)) },
    wires: model.wires.map((w) => ({
      label: w.label,
      from: placeXYZ(w.from, 0, placement.originXY),
      to: placeXYZ(w.to, 0, placement.originXY),
    })),
    elements: placed,
    feedPoints,
    groundSystem: groundSystemOf(model, placement, site.frame),
    cautions: candidateCautions(SWITCHED_PAIR_TYPE, supportIds, placed, site),
    fits: [
      ...a.fits.map((f) => `A: ${f}`),
      ...b.fits.map((f) => `B: ${f}`),
      `the two antennas’ wires are at least ${pr.separationM.toFixed(1)} m apart (${PAIR_MIN_SEPARATION_WAVELENGTHS} λ or more) and share no support`,
    ],
    variants: 1,
    diagnostics: [
      ...new Set([...ra.diagnostics, ...rb.diagnostics]),
      `state A: feed ${fmtZ(ra.zOhm)} (SWR ${ra.swr.toFixed(2)}); state B at the relay box, through the coax run: ${fmtZ(rb.zOhm)} (SWR ${rb.swr.toFixed(2)})`,
    ],
    evaluationKey: pr.keys[0],
    stateKeys: [...pr.keys],
    conductingSupports: [],
    soilRange: {
      soils: [a.soilRange.soils[0] ?? ''],
      lowDbi: score,
      highDbi: score,
      scores: [],
      rankHolds: true,
    },
  };
}

const fmtZ = (z: readonly [number, number]): string =>
  `${z[0].toFixed(1)} ${z[1] < 0 ? '−' : '+'} j${Math.abs(z[1]).toFixed(1)} Ω`;

/** Pairs the field solver refused, as rejections (nothing is dropped without a word). */
export function unsolvedPairs(
  pairs: readonly PlannedPair[],
  cache: EvaluationCache,
): { where: string; supports: string[]; reasons: string[] }[] {
  const out: { where: string; supports: string[]; reasons: string[] }[] = [];
  for (const pr of pairs) {
    const reasons = pr.keys
      .map((k, i) => {
        const why = cache.get(k)?.unsolvable;
        return why === undefined
          ? null
          : `state ${i === 0 ? 'A' : 'B'}: the field solver cannot solve it: ${why}`;
      })
      .filter((r): r is string => r !== null);
    if (reasons.length)
      out.push({
        where: `A: ${pr.a.where}; B: ${pr.b.where}`,
        supports: [...pr.a.supports, ...pr.b.supports].map((x) => x.id),
        reasons,
      });
  }
  return out;
}
