/**
 * planSite(project, options) → Shortlist: the whole planning flow as one pure function.
 *
 *  1. enumeratePlan: the site in metres, the paths to the targets, every builder's proposals per
 *     band, each checked on the site at its nominal dimensions; the unique designs to evaluate
 *     (jobs), keyed by a hash of the design's geometry, the soil and the frequency.
 *  2. evaluateJobs: each job not in the cache goes through the solver (trim, sweep, pattern).
 *     The cache is passed in and filled; the command line fills it from worker threads first.
 *  3. rankPlan: each proposal re-checked at its trimmed dimensions, scored over the target paths,
 *     grouped into distinct placements, ranked, and written out with everything a builder needs.
 *
 * Score: for each region, the gain averaged in power over its (azimuth, elevation) samples; the
 * score is the weighted mean of those region gains in dB (a weighted mean in dB keeps one strong
 * region from hiding a weak one). With no targets the score is the power-average gain over all
 * azimuths at 5–25° elevation.
 */
import { BUILDERS, builderFor } from '../antennas/registry.ts';
import { bandPlan, placeElements, CUT_ALLOWANCE_PER_END_M } from '../antennas/common.ts';
import type { AntennaTypeId, CutKind, Design, Placement, Proposal, Rejection } from '../antennas/types.ts';
import type { Caution } from '../report/cautions.ts';
import {
  candidateCautions,
  elementsWithRoles,
  feedLineElement,
  feedPointsOf,
  groundSystemOf,
  type FeedPoint,
  type GroundSystem,
  type PlacedElement,
} from './candidate.ts';
import { planPaths, type RegionPath } from '../paths/index.ts';
import type { Band, LonLat, Project } from '../project/schema.ts';
import type { XY } from '../site/frame.ts';
import { checkPlacement, prepareSite, type Element, type PreparedSite } from '../site/feasibility.ts';
import { convexHull, placeXYZ } from '../site/geometry.ts';
import { buildSite, type Site } from '../site/site.ts';
import { evaluateDesign, type EvaluationRecord } from './evaluate.ts';
import type { EvalGround, Evaluator } from './evaluator.ts';
import { fnv1a64 } from './hash.ts';
import { PATTERN_GRID, averageGainDbi, azimuthAdvantage, gainAt } from './pattern.ts';
import { Z0_OHM } from './evaluator.ts';

/** Version of the evaluation record and grid; part of every cache key. */
export const EVALUATION_VERSION = 1;

export interface EvaluationCache {
  get(key: string): EvaluationRecord | undefined;
  set(key: string, record: EvaluationRecord): void;
  has(key: string): boolean;
}

export interface PlanProgress {
  phase: 'enumerate' | 'evaluate' | 'rank';
  done: number;
  total: number;
}

export interface PlanOptions {
  evaluator: Evaluator;
  cache?: EvaluationCache;
  bands?: readonly Band[];
  /** Number of placements in the shortlist per band before the best of each missing type is added (default 10). */
  shortlistSize?: number;
  layerHeightsM?: readonly number[];
  /** Only these antenna types (default: every registered type). */
  types?: readonly AntennaTypeId[];
  onProgress?: (p: PlanProgress) => void;
}

export interface Job {
  key: string;
  design: Design;
  ground: EvalGround;
}

interface Proposed {
  proposal: Proposal;
  key: string;
}

export interface PlanSetup {
  site: Site;
  prepared: PreparedSite;
  paths: RegionPath[];
  bands: { band: Band; proposed: Proposed[]; rejections: Rejection[] }[];
  jobs: Job[];
}

export interface RejectedPlacement {
  type: AntennaTypeId;
  band: Band;
  where: string;
  supports: string[];
  reasons: string[];
}

export interface RegionResult {
  id: string;
  name: string;
  weight: number;
  gainDbi: number;
  bearingDeg: { from: number; to: number; center: number };
  distanceKm: { min: number; max: number };
  elevationWindowDeg: { min: number; max: number };
  hops: { min: number; max: number };
}

/**
 * One shortlisted antenna, complete: everything a view needs is here, so that no view re-runs the
 * enumeration, re-derives the frame or parses labels. `design` and `placement` rebuild the solver
 * model exactly (builderFor(design.type).model(design, trim.valueM)).
 */
export interface Candidate {
  id: string;
  /** The design as evaluated (type, band, parameters, trim limits). */
  design: Design;
  /** Canonical frame → site: rotation and origin in the site frame, and the site frame's origin on the map. */
  placement: Placement & { frameOriginLonLat: LonLat };
  rank: number;
  band: Band;
  type: AntennaTypeId;
  typeLabel: string;
  where: string;
  bestOfType: boolean;
  supports: { id: string; name: string; usableHeightM: number }[];
  broadsideDeg: number[];
  rotationDeg: number;
  heights: { label: string; heightM: number }[];
  score: number;
  regions: RegionResult[];
  peak: { gainDbi: number; elevationDeg: number; azimuthDeg: number };
  feed: { zOhm: [number, number]; swr: number; z0Ohm: number; freqMHz: number };
  bandwidth2to1: { lowMHz: number | null; highMHz: number | null; widthKHz: number; note: string };
  efficiency: {
    percent: number;
    radiatedW: number;
    inputW: number;
    conductorLossW: number;
    groundLossW: number;
    conductorLossDb: number;
    groundLossDb: number;
  };
  trim: { dimension: string; valueM: number; resonant: boolean };
  cutList: { kind: CutKind; label: string; count: number; lengthM: number; cutLengthM: number }[];
  cutAllowance: string;
  footprint: { ringXY: XY[]; ringLonLat: LonLat[] };
  /** The modelled conductors in the site frame (the solver's wires, radials aside). */
  wires: { label: string; from: [number, number, number]; to: [number, number, number] }[];
  /** Every placed element with its role: radiators, top wires, radials, ropes, ends, anchors, supports, masts, the feed line. */
  elements: PlacedElement[];
  /** Feed points in the site frame and on the map (one for every type today). */
  feedPoints: FeedPoint[];
  groundSystem: GroundSystem;
  /** The safety cautions that apply (core/report/cautions.ts): the one list every view shows. */
  cautions: Caution[];
  fits: string[];
  variants: number;
  diagnostics: string[];
  evaluationKey: string;
}

export interface Shortlist {
  projectId: string;
  origin: LonLat;
  station: LonLat;
  soil: Project['soil'];
  paths: {
    id: string;
    name: string;
    weight: number;
    bearingDeg: { from: number; to: number; center: number };
    distanceKm: { min: number; max: number };
    elevationWindowDeg: { min: number; max: number };
    hops: { min: number; max: number };
  }[];
  candidates: Candidate[];
  rejected: RejectedPlacement[];
  stats: { proposals: number; feasibleAtNominal: number; evaluations: number; cacheHits: number };
  /** Canonical patterns by evaluation key (for comparisons; large, left out of compact output). */
  patterns: Record<string, number[]>;
}

function groundOf(project: Project): EvalGround {
  return project.soil;
}

const r3 = (v: number): number => Math.round(v * 1000) / 1000;

/** Cache key of a design over a ground: hash of its parameters, trim limits, nominal wire model, ground and frequency. */
export function designKey(design: Design, ground: EvalGround): string {
  const model = builderFor(design.type).model(design, design.trim.nominalM);
  const geom = model.wires.map((w) => [
    w.from.map(r3),
    w.to.map(r3),
    w.radiusM,
    w.segments ?? 0,
    w.material ?? '',
  ]);
  return fnv1a64(
    JSON.stringify({
      v: EVALUATION_VERSION,
      t: design.type,
      p: design.params,
      trim: [r3(design.trim.minM), r3(design.trim.nominalM), r3(design.trim.maxM)],
      geom,
      feeds: model.feeds,
      radials: model.radials,
      ground,
      f: design.designFreqHz,
      grid: [PATTERN_GRID.elevationsDeg.length, PATTERN_GRID.azimuthsDeg.length],
    }),
  );
}

function placedElements(p: Proposal, trimM: number): Element[] {
  return placeElements(builderFor(p.design.type).elements(p.design, trimM), p.placement);
}

/** Step 1: site, paths, proposals checked at nominal dimensions, unique jobs. */
export function enumeratePlan(project: Project, options: Omit<PlanOptions, 'evaluator'> = {}): PlanSetup {
  const site = buildSite(project);
  const prepared = prepareSite(site);
  const paths = planPaths(
    site.stationLonLat,
    project.targets,
    options.layerHeightsM ? { layerHeightsM: options.layerHeightsM } : {},
  );
  const ground = groundOf(project);
  const builders = BUILDERS.filter((b) => !options.types || options.types.includes(b.type));
  const jobs = new Map<string, Job>();
  const bands = (options.bands ?? project.bands).map((band) => {
    const ctx = { site: prepared, band: bandPlan(band) };
    const proposed: Proposed[] = [];
    const rejections: Rejection[] = [];
    for (const b of builders) {
      const out = b.propose(ctx);
      rejections.push(...out.rejections);
      const failedByGroup = new Map<string, { p: Proposal; reasons: string[]; worst: number }>();
      const okGroups = new Set<string>();
      for (const p of out.proposals) {
        const res = checkPlacement(prepared, placedElements(p, p.design.trim.nominalM));
        if (res.ok) {
          const key = designKey(p.design, ground);
          if (!jobs.has(key)) jobs.set(key, { key, design: p.design, ground });
          proposed.push({ proposal: p, key });
          okGroups.add(p.groupKey);
        } else {
          const worst = Math.max(...res.violations.map((v) => v.byM));
          const prev = failedByGroup.get(p.groupKey);
          if (!prev || worst < prev.worst) {
            failedByGroup.set(p.groupKey, { p, reasons: res.violations.map((v) => v.message), worst });
          }
        }
      }
      for (const [g, f] of failedByGroup) {
        if (okGroups.has(g)) continue;
        rejections.push({
          type: f.p.design.type,
          band,
          supports: f.p.supports,
          where: f.p.where,
          reasons: f.reasons,
        });
      }
    }
    return { band, proposed, rejections };
  });
  return { site, prepared, paths, bands, jobs: [...jobs.values()] };
}

/** Step 2: evaluate every job missing from the cache. Returns the number of evaluations made. */
export function evaluateJobs(
  jobs: readonly Job[],
  evaluator: Evaluator,
  cache: EvaluationCache,
  onProgress?: (p: PlanProgress) => void,
): number {
  const todo = jobs.filter((j) => !cache.has(j.key));
  todo.forEach((j, i) => {
    cache.set(j.key, evaluateDesign(j.design, j.ground, evaluator));
    onProgress?.({ phase: 'evaluate', done: i + 1, total: todo.length });
  });
  return todo.length;
}

const LOW_ANGLE_DIRECTIONS = (() => {
  const out: { azimuthDeg: number; elevationDeg: number }[] = [];
  for (let el = 5; el <= 25; el += 5)
    for (let az = 0; az < 360; az += 10) out.push({ azimuthDeg: az, elevationDeg: el });
  return out;
})();

function lossDb(lossW: number, inputW: number): number {
  // dB lost to one mechanism: 10·log10(input / (input − loss)).
  return inputW > 0 && lossW < inputW ? 10 * Math.log10(inputW / (inputW - lossW)) : Infinity;
}

/** Step 3: re-check at trimmed dimensions, score, group, rank and describe. */
export function rankPlan(
  setup: PlanSetup,
  cache: EvaluationCache,
  project: Project,
  shortlistSize = 10,
): Omit<Shortlist, 'stats'> {
  const { site, prepared, paths } = setup;
  const supportById = new Map(site.supports.map((s) => [s.id, s]));
  const candidates: Candidate[] = [];
  const rejected: RejectedPlacement[] = [];
  const patterns: Record<string, number[]> = {};
  const totalWeight = paths.reduce((s, p) => s + p.weight, 0);
  for (const b of setup.bands) {
    rejected.push(...b.rejections.map((r) => ({ ...r })));
    type Scored = {
      p: Proposal;
      key: string;
      rec: EvaluationRecord;
      score: number;
      regionGains: number[];
      fits: string[];
      elements: Element[];
    };
    const byGroup = new Map<string, { best: Scored; count: number }>();
    const postTrimFail = new Map<string, { p: Proposal; reasons: string[] }>();
    for (const { proposal: p, key } of b.proposed) {
      const rec = cache.get(key);
      if (!rec) throw new Error(`rankPlan: evaluation ${key} missing from the cache`);
      const elements = placedElements(p, rec.trimM);
      const check = checkPlacement(prepared, elements);
      if (!check.ok) {
        if (!postTrimFail.has(p.groupKey)) {
          postTrimFail.set(p.groupKey, {
            p,
            reasons: check.violations.map(
              (v) => `after trimming (${p.design.trim.name} ${rec.trimM.toFixed(2)} m): ${v.message}`,
            ),
          });
        }
        continue;
      }
      const rot = p.placement.rotationDeg;
      const regionGains = paths.map((path) => averageGainDbi(rec.gainDbi, rot, path.directions));
      const score =
        totalWeight > 0
          ? regionGains.reduce((s, g, i) => s + g * paths[i].weight, 0) / totalWeight
          : averageGainDbi(rec.gainDbi, rot, LOW_ANGLE_DIRECTIONS);
      const s: Scored = { p, key, rec, score, regionGains, fits: check.fits, elements };
      const g = byGroup.get(p.groupKey);
      if (!g) byGroup.set(p.groupKey, { best: s, count: 1 });
      else {
        g.count++;
        if (s.score > g.best.score) g.best = s;
      }
    }
    for (const [g, f] of postTrimFail) {
      if (!byGroup.has(g))
        rejected.push({
          type: f.p.design.type,
          band: b.band,
          where: f.p.where,
          supports: f.p.supports,
          reasons: f.reasons,
        });
    }
    const groups = [...byGroup.values()].sort(
      (x, y) => y.best.score - x.best.score || (x.best.p.groupKey < y.best.p.groupKey ? -1 : 1),
    );
    const chosen = groups.slice(0, shortlistSize);
    const types = new Set(chosen.map((g) => g.best.p.design.type));
    const extra = groups.slice(shortlistSize).filter((g) => {
      if (types.has(g.best.p.design.type)) return false;
      types.add(g.best.p.design.type);
      return true;
    });
    [...chosen, ...extra].forEach((g, i) => {
      const { p, rec, key, regionGains, fits, elements } = g.best;
      const builder = builderFor(p.design.type);
      patterns[key] = rec.gainDbi;
      const plan: XY[] = [];
      for (const e of elements) {
        if ('from' in e) plan.push([e.from[0], e.from[1]], [e.to[0], e.to[1]]);
        else if (e.kind === 'support' || e.kind === 'mast') plan.push(e.at);
        else plan.push([e.at[0], e.at[1]]);
      }
      const ringXY = convexHull(plan).map((q): XY => [
        Math.round(q[0] * 100) / 100,
        Math.round(q[1] * 100) / 100,
      ]);
      const model = builder.model(p.design, rec.trimM);
      const feedPoints = feedPointsOf(model, p.placement, site.frame);
      const placed = [...elementsWithRoles(elements), ...feedLineElement(site.station, feedPoints[0])];
      const peakAz = (rec.peak.azimuthDeg + p.placement.rotationDeg + 360) % 360;
      const bw = rec.bandwidth;
      candidates.push({
        id: `${b.band}-${p.groupKey.replace(/:/g, '-')}`,
        design: p.design,
        placement: { ...p.placement, frameOriginLonLat: site.frame.origin },
        rank: i + 1,
        band: b.band,
        type: p.design.type,
        typeLabel: builder.label,
        where: p.where,
        bestOfType:
          i >= chosen.length || !chosen.slice(0, i).some((c) => c.best.p.design.type === p.design.type),
        supports: p.supports.map((id) => {
          const s = supportById.get(id);
          return { id, name: s?.name ?? id, usableHeightM: s?.heightM ?? 0 };
        }),
        broadsideDeg: p.broadsideDeg.map((v) => Math.round(v * 10) / 10),
        rotationDeg: p.placement.rotationDeg,
        heights: builder
          .heights(p.design, rec.trimM)
          .map((h) => ({ label: h.label, heightM: Math.round(h.heightM * 100) / 100 })),
        score: g.best.score,
        regions: paths.map((path, k) => ({
          id: path.id,
          name: path.name,
          weight: path.weight,
          gainDbi: regionGains[k],
          bearingDeg: {
            from: path.azimuthSpan.fromDeg,
            to: path.azimuthSpan.toDeg,
            center: path.azimuthSpan.centerDeg,
          },
          distanceKm: path.distanceKm,
          elevationWindowDeg: path.elevationWindowDeg,
          hops: path.hopRange,
        })),
        peak: { gainDbi: rec.peak.gainDbi, elevationDeg: rec.peak.elevationDeg, azimuthDeg: peakAz },
        feed: { zOhm: rec.zOhm, swr: rec.swr, z0Ohm: Z0_OHM, freqMHz: rec.freqHz / 1e6 },
        bandwidth2to1: {
          lowMHz: bw.lowHz === null ? null : bw.lowHz / 1e6,
          highMHz: bw.highHz === null ? null : bw.highHz / 1e6,
          widthKHz: bw.widthHz / 1e3,
          note:
            rec.swr > 2
              ? `SWR ${rec.swr.toFixed(2)} at the design frequency: needs a matching network for 2:1`
              : bw.extrapolated
                ? 'an edge lies beyond the ±2 % sweep: extrapolated from the quadratic fit, or wider than shown'
                : 'from a quadratic fit of the feed impedance at f0 and f0 ± 2 %',
        },
        efficiency: {
          percent: rec.power.efficiency * 100,
          radiatedW: rec.power.radiatedW,
          inputW: rec.power.inputW,
          conductorLossW: rec.power.conductorLossW,
          groundLossW: rec.power.groundLossW,
          conductorLossDb: lossDb(rec.power.conductorLossW, rec.power.inputW),
          groundLossDb: lossDb(rec.power.groundLossW, rec.power.inputW),
        },
        trim: {
          dimension: p.design.trim.name,
          valueM: Math.round(rec.trimM * 1000) / 1000,
          resonant: rec.resonant,
        },
        cutList: builder.cutList(p.design, rec.trimM).map((c) => ({
          ...c,
          lengthM: Math.round(c.lengthM * 100) / 100,
          cutLengthM: Math.round(c.cutLengthM * 100) / 100,
        })),
        cutAllowance: `cut lengths include ${CUT_ALLOWANCE_PER_END_M} m per end for the loop through an insulator or the connection; trim after a first measurement`,
        footprint: { ringXY, ringLonLat: ringXY.map((q) => site.frame.toLonLat(q)) },
        wires: model.wires.map((w) => ({
          label: w.label,
          from: placeXYZ(w.from, p.placement.rotationDeg, p.placement.originXY),
          to: placeXYZ(w.to, p.placement.rotationDeg, p.placement.originXY),
        })),
        elements: placed,
        feedPoints,
        groundSystem: groundSystemOf(model, p.placement, site.frame),
        cautions: candidateCautions(p.design.type, p.supports, placed, site),
        fits,
        variants: g.count,
        diagnostics: rec.diagnostics,
        evaluationKey: key,
      });
    });
  }
  return {
    projectId: project.id,
    origin: site.frame.origin,
    station: site.stationLonLat,
    soil: project.soil,
    paths: paths.map((p) => ({
      id: p.id,
      name: p.name,
      weight: p.weight,
      bearingDeg: { from: p.azimuthSpan.fromDeg, to: p.azimuthSpan.toDeg, center: p.azimuthSpan.centerDeg },
      distanceKm: p.distanceKm,
      elevationWindowDeg: p.elevationWindowDeg,
      hops: p.hopRange,
    })),
    candidates,
    rejected,
    patterns,
  };
}

/** A cache in a Map, for callers that do not keep one. */
export function memoryCache(): EvaluationCache {
  return new Map<string, EvaluationRecord>();
}

/** Steps 2 and 3 on a setup from enumeratePlan (callers that evaluate elsewhere pass a filled cache). */
export function planFromSetup(setup: PlanSetup, project: Project, options: PlanOptions): Shortlist {
  const cache = options.cache ?? memoryCache();
  const before = setup.jobs.filter((j) => cache.has(j.key)).length;
  const evaluations = evaluateJobs(setup.jobs, options.evaluator, cache, options.onProgress);
  const ranked = rankPlan(setup, cache, project, options.shortlistSize ?? 10);
  const feasible = setup.bands.reduce((s, b) => s + b.proposed.length, 0);
  return {
    ...ranked,
    stats: {
      proposals: feasible + setup.bands.reduce((s, b) => s + b.rejections.length, 0),
      feasibleAtNominal: feasible,
      evaluations,
      cacheHits: before,
    },
  };
}

/** The whole plan: pure in and out (the cache, when given, is filled with new evaluations). */
export function planSite(project: Project, options: PlanOptions): Shortlist {
  return planFromSetup(enumeratePlan(project, options), project, options);
}

/** Over how many degrees of azimuth candidate A beats candidate B at `elevationDeg`. */
export function compareCandidates(
  shortlist: Shortlist,
  idA: string,
  idB: string,
  elevationDeg: number,
  marginDb = 0,
): { aBetterDeg: number; bBetterDeg: number; tiedDeg: number } {
  const get = (id: string): { gainDbi: number[]; rotationDeg: number } => {
    const c = shortlist.candidates.find((x) => x.id === id);
    if (!c) throw new Error(`no candidate "${id}" in the shortlist`);
    return { gainDbi: shortlist.patterns[c.evaluationKey], rotationDeg: c.rotationDeg };
  };
  return azimuthAdvantage(get(idA), get(idB), elevationDeg, marginDb);
}

/** Gain of a shortlisted candidate in a site direction. */
export function candidateGainAt(
  shortlist: Shortlist,
  id: string,
  azimuthDeg: number,
  elevationDeg: number,
): number {
  const c = shortlist.candidates.find((x) => x.id === id);
  if (!c) throw new Error(`no candidate "${id}" in the shortlist`);
  return gainAt(shortlist.patterns[c.evaluationKey], c.rotationDeg, azimuthDeg, elevationDeg);
}
