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
import { scoreStates, type StateResult } from './states.ts';
import type { ArrayFeed } from '../antennas/arrayFeed.ts';
import {
  conductorsNear,
  NEARBY_WAVELENGTHS,
  STANDOFF_M,
  type NearbySupport,
} from '../antennas/conductors.ts';
import { neighbourSoils, soilById } from '../em/soils.ts';
import { bandPlan, placeElements, CUT_ALLOWANCE_PER_END_M } from '../antennas/common.ts';
import type {
  AntennaTypeId,
  CutKind,
  Design,
  Placement,
  Proposal,
  Rejection,
  WireModel,
} from '../antennas/types.ts';
import type { Caution } from '../report/cautions.ts';
import { relayBoxXY } from '../report/arrayWiring.ts';
import {
  candidateCautions,
  conductingSupportElements,
  elementsWithRoles,
  feedLineElement,
  feedPointsOf,
  groundSystemOf,
  type FeedPoint,
  type GroundSystem,
  type PlacedElement,
} from './candidate.ts';
import { planPaths, takeoffSummary, type RegionPath, type TakeoffSummary } from '../paths/index.ts';
import type { Band, LonLat, Project } from '../project/schema.ts';
import type { XY } from '../site/frame.ts';
import {
  checkPlacement,
  prepareSite,
  type Element,
  type FeasibilityResult,
  type PreparedSite,
} from '../site/feasibility.ts';
import { INVERTED_L_MAX_VERTICAL_FRACTION } from '../antennas/invertedL.ts';
import { closestMiss, type MissingType } from './missing.ts';
import { SHORT_SUPPORT_TYPES, isShortSupport } from '../antennas/shortVerticals.ts';
import { convexHull, placeXYZ } from '../site/geometry.ts';
import { buildSite, type Site } from '../site/site.ts';
import { evaluateDesign, type EvaluationRecord } from './evaluate.ts';
import type { EvalGround, Evaluator } from './evaluator.ts';
import { fnv1a64 } from './hash.ts';
import { efficiencySplit, type EfficiencySplit } from './lossSplit.ts';
import {
  PATTERN_GRID,
  averageGainDbi,
  azimuthAdvantage,
  compileDirections,
  compiledGainDbi,
  gainAt,
} from './pattern.ts';
import { Z0_OHM } from './evaluator.ts';
import {
  pairCandidates,
  pairScore,
  pairPlans,
  unsolvedPairs,
  PAIR_MARGIN_DEFAULT_DB,
  type PlannedPair,
} from './pairs.ts';

/** Version of the evaluation record and grid; part of every cache key. */
export const EVALUATION_VERSION = 2;

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
  /** Placements of one type among those (default SHORTLIST_PER_TYPE). */
  shortlistPerType?: number;
  layerHeightsM?: readonly number[];
  /** Only these antenna types (default: every registered type, arrays only with `arrays`, else the project's `settings.planArrays`). */
  types?: readonly AntennaTypeId[];
  /** Also plan the array types (several elements; slower). Default: the project's `settings.planArrays`. */
  arrays?: boolean;
  /**
   * Progress: 'enumerate' from the start (done 0 of the builders × bands, then after each), then
   * 'evaluate' per design and 'rank'.
   */
  onProgress?: (p: PlanProgress) => void;
  /** The feasibility check of a placement (default checkPlacement; a caller may memoise it across plans). */
  feasibility?: Feasibility;
}

/** Checks a placement's elements on the site (core/site/feasibility.ts checkPlacement or a memo of it). */
export type Feasibility = (ps: PreparedSite, elements: readonly Element[]) => FeasibilityResult;

/**
 * Bounds of the enumeration, per antenna type and band, so that a lot with many supports plans in
 * bounded time (the schema allows 500 supports). None binds on the demo lot.
 *  - supports: a builder is given at most this many supports, the most promising for its type
 *    (the tallest; for an inverted-L the tallest of those short enough for one);
 *  - placements: at most this many placements are checked on the site;
 *  - designs: at most this many distinct designs (evaluations) are kept.
 * Placements are taken most promising first: a ground-mounted type by the total length of its
 * radials, then every type by the mean height of its wires (0.5 m steps), then by how squarely its
 * broadside faces the weighted targets. What was left out is reported (`PlanCut`).
 */
/**
 * Placements of one antenna type among a band's first `shortlistSize` candidates (a chosen bound:
 * more near-equal variants of one type add little to a decision and crowd out the other types;
 * the placements passed over are not listed).
 */
export const SHORTLIST_PER_TYPE = 3;

export const PLAN_BOUNDS = { supports: 40, placements: 2000, designs: 32 } as const;

/** Where a bound of PLAN_BOUNDS left placements out, for the plan's output. */
export interface PlanCut {
  band: Band;
  type: AntennaTypeId;
  /** Supports given to the builder, of the lot's. */
  supportsUsed: number;
  supportsTotal: number;
  /** Placements checked on the site, of those the builder proposed from its supports. */
  considered: number;
  proposed: number;
  /** Distinct designs kept for evaluation (at most PLAN_BOUNDS.designs). */
  designs: number;
}

export interface Job {
  key: string;
  design: Design;
  ground: EvalGround;
  /** Soil classes over which the pattern is also computed (the soil range; evaluateDesign). */
  soilRange?: string[];
  /** Step 3: only the soil range, at this trim (the design's record over the project's soil has it). */
  soilOnly?: { trimM: number };
}

export interface Proposed {
  /** The builder's proposal (its design without conducting supports). */
  proposal: Proposal;
  /** Evaluation key of the design alone (shared by every orientation of it). */
  key: string;
  /** The design with the conducting supports near this placement, and its key (none near: absent). */
  withConductors?: { design: Design; key: string };
  /** Names of nearby masts whose material is not set (left out of the model). */
  unknownMetal?: string[];
}

export interface PlanSetup {
  site: Site;
  prepared: PreparedSite;
  paths: RegionPath[];
  bands: {
    band: Band;
    proposed: Proposed[];
    rejections: Rejection[];
    /** The types planned on this band (for the closest miss of each type without a candidate). */
    types?: AntennaTypeId[];
  }[];
  /** Step-1 jobs: every design alone, one evaluation for all its orientations. */
  jobs: Job[];
  /**
   * Step-2 jobs, set by conductorJobs once the step-1 jobs are evaluated: per placement group with
   * a conducting support near it, its best orientation again with the supports in the model.
   */
  conductorJobs?: Job[];
  /** Indices into `bands[b].proposed` of the orientations chosen for step 2, by band. */
  conductorChoice?: Map<Band, Set<number>>;
  /** Where the enumeration's bounds left placements out (empty when nothing was left out). */
  cuts: PlanCut[];
  /** The feasibility check used (PlanOptions.feasibility or checkPlacement). */
  check: Feasibility;
  /** Whether the array types (and switched pairs) are planned. */
  arrays?: boolean;
  /** Step 4 (arrays only), set by pairJobs: the switched pairs formed from the ranked singles, and their jobs. */
  pairs?: PlannedPair[];
  pairJobs?: Job[];
  /** Each placement's check at its trimmed dimensions, shared by the ranking passes of one plan. */
  trimmedChecks: WeakMap<Proposed, { trimM: number; metal: boolean; result: FeasibilityResult }[]>;
}

export interface RejectedPlacement {
  type: AntennaTypeId;
  band: Band;
  where: string;
  supports: string[];
  reasons: string[];
  /** How far from working, as a fraction of what it needs (the builder's measure; Rejection.shortfall). */
  shortfall?: number;
  /** Worst violation of the site rules, metres, for a placement the lot refused (Rejection.missByM). */
  missByM?: number;
}

export interface RegionResult {
  id: string;
  name: string;
  weight: number;
  gainDbi: number;
  bearingDeg: { from: number; to: number; center: number };
  distanceKm: { min: number; max: number };
  /** The 10–90 % span of the band's take-off distribution (`takeoff`). */
  elevationWindowDeg: { min: number; max: number };
  hops: { min: number; max: number };
  /** The band's take-off distribution the region gain is averaged over. */
  takeoff: TakeoffSummary;
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
  /** What was changed from the type's plain form to fit (Proposal.adaptations); absent when nothing. */
  adaptations?: string[];
  bestOfType: boolean;
  supports: { id: string; name: string; usableHeightM: number }[];
  broadsideDeg: number[];
  rotationDeg: number;
  heights: { label: string; heightM: number }[];
  score: number;
  /** Per region the gain of the best state (a switched array) or of the one fixed pattern. */
  regions: RegionResult[];
  /** Radiating elements, driven and parasitic (1 for a single antenna). */
  elementCount: number;
  /** Arrays: each element's drive impedance and the current ratios the feed network achieves. */
  arrayFeed?: ArrayFeed;
  /**
   * A switched pair: each state's own evaluation key (its pattern in `Shortlist.patterns`), since
   * its states are solved apart, not turned copies of one pattern; absent otherwise.
   */
  stateKeys?: string[];
  /** Switchable directions (relay states); one state, 'fixed', for a fixed antenna. */
  states: { name: string; beamDeg: number; regions: { id: string; gainDbi: number }[] }[];
  peak: { gainDbi: number; elevationDeg: number; azimuthDeg: number };
  feed: { zOhm: [number, number]; swr: number; z0Ohm: number; freqMHz: number };
  bandwidth2to1: { lowMHz: number | null; highMHz: number | null; widthKHz: number; note: string };
  /** Power split with the ground-system (radial) loss apart from the reflection loss (lossSplit.ts). */
  efficiency: EfficiencySplit;
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
  /**
   * Conducting supports in this candidate's model (within about 0.5 λ of its wires): a grounded
   * (unless marked otherwise) vertical conductor each (core/antennas/conductors.ts).
   */
  conductingSupports: {
    id: string;
    name: string;
    heightM: number;
    grounded: boolean;
    equivalentRadiusM: number;
    /** The wire hangs from a stand-off arm: the support's axis is modelled 1 m from it. */
    standoff: boolean;
  }[];
  /**
   * The score over the project's soil and the soil range (the trimmed design re-solved over
   * each; pattern only). lowDbi ≤ score ≤ highDbi. `rankHolds` is false when the candidate's
   * rank in its band's shortlist differs over any soil of the range.
   */
  soilRange: {
    soils: string[];
    lowDbi: number;
    highDbi: number;
    scores: { soil: string; scoreDbi: number; rank: number }[];
    rankHolds: boolean;
    /** Set when the range has soils but this candidate was not solved over them (a switched pair without step 5). */
    notComputed?: true;
  };
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
    /** Take-off angles of the fewest-hop geometry alone (hops.ts). */
    elevationWindowDeg: { min: number; max: number };
    hops: { min: number; max: number };
    /** The take-off distribution of the first planned band. */
    takeoff: TakeoffSummary;
    /** The take-off distribution of every planned band. */
    takeoffByBand: Partial<Record<Band, TakeoffSummary>>;
  }[];
  candidates: Candidate[];
  rejected: RejectedPlacement[];
  /**
   * One entry per planned type and band without a candidate in the shortlist: the single closest
   * miss in plain words (closestMiss, core/rank/missing.ts).
   */
  missing: MissingType[];
  stats: {
    proposals: number;
    feasibleAtNominal: number;
    evaluations: number;
    cacheHits: number;
    /** Where the enumeration's bounds (PLAN_BOUNDS) left placements out; empty when none did. */
    cuts: PlanCut[];
  };
  /**
   * Canonical patterns by evaluation key (for comparisons; large, left out of compact output); an
   * array's other phasings under variantPatternKey(key, k).
   */
  patterns: Record<string, number[]>;
}

function groundOf(project: Project): EvalGround {
  return project.soil;
}

/** Name of the project's soil in a soil range: its class id, or `custom` for soil given by values. */
export function projectSoilId(project: Project): string {
  return 'classId' in project.soil ? project.soil.classId : 'custom';
}

/**
 * The soil classes each candidate is also scored over: the user's range (settings.soilRange) or,
 * unset, the classes next to the project's soil (one drier, one wetter), without the project's own.
 */
export function soilRangeOf(project: Project): string[] {
  const own = projectSoilId(project);
  const n = neighbourSoils(project.soil);
  const ids = project.settings.soilRange ?? [n.drier, n.wetter].filter((v): v is string => v !== null);
  return ids.filter((id) => id !== own && soilById(id) !== undefined);
}

/**
 * Site bearing, degrees, the main target lies on: the weight-averaged unit vector of the paths'
 * centre bearings (north with no targets). Used to put a wire on the target side of a tower.
 */
function mainTargetBearing(paths: readonly RegionPath[]): number {
  let x = 0;
  let y = 0;
  for (const p of paths) {
    const b = (p.azimuthSpan.centerDeg * Math.PI) / 180;
    x += p.weight * Math.sin(b);
    y += p.weight * Math.cos(b);
  }
  if (Math.hypot(x, y) < 1e-9) return 0;
  return ((Math.atan2(x, y) * 180) / Math.PI + 360) % 360;
}

const r3 = (v: number): number => Math.round(v * 1000) / 1000;

/**
 * Types whose solver model is fixed by its wire geometry at the shortest, nominal and longest trim
 * (checked for each builder: a dipole's slope and end drops, an inverted-V's apex and legs, a
 * half-square's top, drops and bent ends, a vertical's or inverted-L's wires and radials show
 * there). Their evaluation key holds that geometry instead of the design's parameters, so that
 * designs differing only in what the solver never sees (a half-square's span and support
 * heights, which only place its ropes) share one evaluation, trim included. Other types (arrays)
 * keep their parameters in the key.
 */
const KEY_BY_GEOMETRY: ReadonlySet<AntennaTypeId> = new Set([
  'dipole',
  'inverted-v',
  'half-square',
  'vertical',
  'inverted-l',
]);

const wireGeometry = (model: WireModel): unknown[] =>
  model.wires.map((w) => [w.from.map(r3), w.to.map(r3), w.radiusM, w.segments ?? 0, w.material ?? '']);

/**
 * Cache key of a design over a ground: hash of its solver model (wire geometry to the millimetre,
 * feeds, radials, lumped loads such as loading coils, feed network), trim limits, conducting supports (canonical frame), ground and
 * frequency, and, for types not in KEY_BY_GEOMETRY, its parameters. A design with no conducting
 * support near it has one key for every placement (its pattern is read rotated); with one, the
 * key holds the supports' positions relative to the placement.
 */
export function designKey(design: Design, ground: EvalGround): string {
  const builder = builderFor(design.type);
  const model = builder.model(design, design.trim.nominalM);
  const byGeometry = KEY_BY_GEOMETRY.has(design.type);
  return fnv1a64(
    JSON.stringify({
      v: EVALUATION_VERSION,
      t: design.type,
      ...(byGeometry
        ? {
            ends: [
              wireGeometry(builder.model(design, design.trim.minM)),
              wireGeometry(builder.model(design, design.trim.maxM)),
            ],
          }
        : { p: design.params }),
      trim: [r3(design.trim.minM), r3(design.trim.nominalM), r3(design.trim.maxM)],
      geom: wireGeometry(model),
      feeds: model.feeds,
      radials: model.radials,
      ...(model.loads?.length ? { loads: model.loads } : {}),
      ...(model.network ? { net: model.network, bonded: model.radialsBonded === true } : {}),
      ground,
      ...(design.conductors?.length ? { sc: design.conductors } : {}),
      f: design.designFreqHz,
      grid: [PATTERN_GRID.elevationsDeg.length, PATTERN_GRID.azimuthsDeg.length],
    }),
  );
}

/** How promising a design looks before any solver work (PLAN_BOUNDS): radial length, then mean wire height. */
function designPromise(design: Design): [number, number] {
  const model = builderFor(design.type).model(design, design.trim.nominalM);
  let radials = 0;
  for (const r of model.radials) for (const l of r.lengthsM) radials += l;
  let len = 0;
  let moment = 0;
  for (const w of model.wires) {
    const l = Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]);
    len += l;
    moment += (l * (w.from[2] + w.to[2])) / 2;
  }
  return [Math.round(radials), Math.round((2 * moment) / Math.max(len, 1e-9)) / 2];
}

/** How squarely a placement's broadside faces the targets: weighted mean of cos² of the smallest miss, 0..1. */
function facing(broadsideDeg: readonly number[], paths: readonly RegionPath[]): number {
  if (!broadsideDeg.length) return 0;
  let sum = 0;
  let w = 0;
  for (const path of paths) {
    let best = 0;
    for (const b of broadsideDeg)
      best = Math.max(best, Math.cos(((b - path.azimuthSpan.centerDeg) * Math.PI) / 180) ** 2);
    sum += path.weight * best;
    w += path.weight;
  }
  return w > 0 ? sum / w : 0;
}

/**
 * The supports a builder of `type` is given on a lot with more than PLAN_BOUNDS.supports: the
 * tallest (for an inverted-L, the tallest of those short enough for its vertical part first; for
 * the loaded and sloping verticals, of those shorter than a quarter wave), in
 * the lot's order.
 */
/** Shortest support an inverted-L is proposed on, as a fraction of the wavelength (core/antennas/invertedL.ts). */
const INVERTED_L_MIN_FRACTION = 0.08;

function supportsFor(prepared: PreparedSite, type: AntennaTypeId, wavelengthM: number): PreparedSite {
  const all = prepared.site.supports;
  if (all.length <= PLAN_BOUNDS.supports) return prepared;
  const usable = (h: number): number =>
    type === 'inverted-l'
      ? Number(
          h < INVERTED_L_MAX_VERTICAL_FRACTION * wavelengthM && h >= INVERTED_L_MIN_FRACTION * wavelengthM,
        )
      : SHORT_SUPPORT_TYPES.has(type)
        ? Number(isShortSupport(type, h, wavelengthM))
        : 1;
  const chosen = new Set(
    all
      .map((s, i) => ({ s, i }))
      .sort((a, b) => usable(b.s.heightM) - usable(a.s.heightM) || b.s.heightM - a.s.heightM || a.i - b.i)
      .slice(0, PLAN_BOUNDS.supports)
      .map((x) => x.i),
  );
  return { ...prepared, site: { ...prepared.site, supports: all.filter((_, i) => chosen.has(i)) } };
}

function placedElements(p: Proposal, trimM: number): Element[] {
  return placeElements(builderFor(p.design.type).elements(p.design, trimM), p.placement);
}

/** Step 1: site, paths, proposals checked at nominal dimensions, unique jobs. */
export function enumeratePlan(project: Project, options: Omit<PlanOptions, 'evaluator'> = {}): PlanSetup {
  const arrays = options.arrays ?? project.settings.planArrays === true;
  const builders = BUILDERS.filter((b) =>
    options.types ? options.types.includes(b.type) : !b.array || arrays,
  );
  const bandList = options.bands ?? project.bands;
  const steps = bandList.length * builders.length;
  let step = 0;
  options.onProgress?.({ phase: 'enumerate', done: 0, total: steps });
  const check = options.feasibility ?? checkPlacement;
  const site = buildSite(project);
  const prepared = prepareSite(site);
  const paths = planPaths(
    site.stationLonLat,
    project.targets,
    options.layerHeightsM ? { layerHeightsM: options.layerHeightsM } : {},
  );
  const ground = groundOf(project);
  const away = (mainTargetBearing(paths) + 180) % 360;
  const metalSupports: NearbySupport[] = site.supports
    .filter((s) => s.conducts !== false && s.conducts !== undefined)
    .map((s) => ({ id: s.id, name: s.name, xy: s.xy, metal: s.metal ?? null }));
  const jobs = new Map<string, Job>();
  const cuts: PlanCut[] = [];
  // Key and promise of each design, by its content: the orientations of one design share them.
  const known = new Map<string, { key: string; promise: [number, number] }>();
  const designInfo = (d: Design): { key: string; promise: [number, number] } => {
    const id = JSON.stringify([d.type, d.params, d.trim, d.designFreqHz]);
    let k = known.get(id);
    if (!k) {
      k = { key: designKey(d, ground), promise: designPromise(d) };
      known.set(id, k);
    }
    return k;
  };
  const bands = bandList.map((band) => {
    const bp = bandPlan(band, project.settings.operating?.[band]);
    const proposed: Proposed[] = [];
    const rejections: Rejection[] = [];
    for (const b of builders) {
      const given = supportsFor(prepared, b.type, bp.wavelengthM);
      const out = b.propose({ site: given, band: bp, check });
      for (const r of out.rejections) rejections.push(r); // no spread: a large lot has 1e5+ of them
      // Most promising first, within the bounds; the rest of the work in the builder's order.
      const n = out.proposals.length;
      const info = out.proposals.map((p) => designInfo(p.design));
      const face = out.proposals.map((p) => facing(p.broadsideDeg, paths));
      const order = Array.from({ length: n }, (_, i) => i).sort(
        (i, j) =>
          info[j].promise[0] - info[i].promise[0] ||
          info[j].promise[1] - info[i].promise[1] ||
          face[j] - face[i] ||
          i - j,
      );
      const results: (FeasibilityResult | undefined)[] = new Array(n);
      const kept = new Set<string>();
      let considered = 0;
      for (const i of order) {
        if (considered >= PLAN_BOUNDS.placements) break;
        if (!kept.has(info[i].key) && kept.size >= PLAN_BOUNDS.designs) continue;
        const p = out.proposals[i];
        const res = check(prepared, placedElements(p, p.design.trim.nominalM));
        considered++;
        results[i] = res;
        if (res.ok) kept.add(info[i].key);
      }
      if (considered < n || given !== prepared)
        cuts.push({
          band,
          type: b.type,
          supportsUsed: given.site.supports.length,
          supportsTotal: site.supports.length,
          considered,
          proposed: n,
          designs: kept.size,
        });
      const failedByGroup = new Map<string, { p: Proposal; reasons: string[]; worst: number }>();
      const okGroups = new Set<string>();
      out.proposals.forEach((p, i) => {
        const res = results[i];
        if (!res) return;
        if (res.ok) {
          const near = metalSupports.length
            ? conductorsNear(p.design, p.placement, metalSupports, away)
            : { conductors: [], unknown: [] };
          const key = info[i].key;
          if (!jobs.has(key)) jobs.set(key, { key, design: p.design, ground });
          let withConductors: Proposed['withConductors'];
          if (near.conductors.length) {
            const design = { ...p.design, conductors: near.conductors };
            withConductors = { design, key: designKey(design, ground) };
          }
          proposed.push({
            proposal: p,
            key,
            ...(withConductors ? { withConductors } : {}),
            ...(near.unknown.length ? { unknownMetal: near.unknown } : {}),
          });
          okGroups.add(p.groupKey);
        } else {
          const worst = Math.max(...res.violations.map((v) => v.byM));
          const prev = failedByGroup.get(p.groupKey);
          if (!prev || worst < prev.worst) {
            failedByGroup.set(p.groupKey, { p, reasons: res.violations.map((v) => v.message), worst });
          }
        }
      });
      for (const [g, f] of failedByGroup) {
        if (okGroups.has(g)) continue;
        rejections.push({
          type: f.p.design.type,
          band,
          supports: f.p.supports,
          where: f.p.where,
          reasons: f.reasons,
          missByM: f.worst,
        });
      }
      options.onProgress?.({ phase: 'enumerate', done: ++step, total: steps });
    }
    return { band, proposed, rejections, types: builders.map((b) => b.type) };
  });
  return {
    site,
    prepared,
    paths,
    bands,
    jobs: [...jobs.values()],
    cuts,
    check,
    arrays,
    trimmedChecks: new WeakMap(),
  };
}

/**
 * The check of a proposed placement at its trimmed dimensions (with the metal near it or not),
 * computed once per plan: the ranking runs more than once (step 3 ranks before the soil range).
 */
function trimmedCheck(
  setup: PlanSetup,
  q: Proposed,
  p: Proposal,
  trimM: number,
  metal: boolean,
): FeasibilityResult {
  let list = setup.trimmedChecks.get(q);
  if (!list) setup.trimmedChecks.set(q, (list = []));
  const hit = list.find((c) => c.trimM === trimM && c.metal === metal);
  if (hit) return hit.result;
  const result = setup.check(setup.prepared, placedElements(p, trimM));
  list.push({ trimM, metal, result });
  return result;
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
    cache.set(j.key, evaluateDesign(j.design, j.ground, evaluator, j.soilRange, j.soilOnly));
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

type Scorer = (gainDbi: readonly number[], rot: number) => { score: number; regionGains: number[] };

/**
 * Score of a pattern placed with rotation `rot` over the paths, and its region gains: per region,
 * the gain averaged in power over the band's take-off distribution (core/paths/takeoff.ts).
 */
function scorerFor(paths: readonly RegionPath[], band: Band): Scorer {
  let byBand = scorers.get(paths);
  if (!byBand) scorers.set(paths, (byBand = new Map()));
  const known = byBand.get(band);
  if (known) return known;
  // The same paths in another plan (a re-plan after a support moved: the station and the targets
  // are where they were) score the same patterns the same way: the scorer is found by content.
  const text = JSON.stringify([band, paths.map((p) => [p.weight, p.takeoff[band].directions])]);
  const same = scorersByContent.get(text);
  if (same) {
    scorersByContent.delete(text);
    scorersByContent.set(text, same);
    byBand.set(band, same);
    return same;
  }
  const totalWeight = paths.reduce((s, p) => s + p.weight, 0);
  const compiled = paths.map((path) => compileDirections(path.takeoff[band].directions));
  // A pattern (an evaluation record's, by identity) at a rotation is scored once: the
  // conducting-support choice, the soil-range shortlist and the final ranking score the same
  // placements again, and a re-plan with the cache of the plan before scores most of them again.
  const memo = new WeakMap<readonly number[], Map<number, { score: number; regionGains: number[] }>>();
  const scorer: Scorer = (gainDbi, rot) => {
    let byRot = memo.get(gainDbi);
    if (!byRot) memo.set(gainDbi, (byRot = new Map()));
    const hit = byRot.get(rot);
    if (hit) return hit;
    const regionGains = compiled.map((c) => compiledGainDbi(gainDbi, rot, c));
    const score =
      totalWeight > 0
        ? regionGains.reduce((s, g, i) => s + g * paths[i].weight, 0) / totalWeight
        : averageGainDbi(gainDbi, rot, LOW_ANGLE_DIRECTIONS);
    const out = { score, regionGains };
    byRot.set(rot, out);
    return out;
  };
  byBand.set(band, scorer);
  scorersByContent.set(text, scorer);
  while (scorersByContent.size > SCORERS_KEPT) scorersByContent.delete(scorersByContent.keys().next().value!);
  return scorer;
}

/** Scorers kept by the content of their paths and band (the last few), for the plans that follow. */
const SCORERS_KEPT = 4;
const scorersByContent = new Map<string, Scorer>();

/** The scorers of a plan's paths (PlanSetup.paths, by identity), per band. */
const scorers = new WeakMap<readonly RegionPath[], Map<Band, Scorer>>();

/**
 * Step 2 of a plan with conducting supports near some placements (call after the step-1 jobs are
 * in the cache). A support near a placement breaks the "one evaluation per design, rotated"
 * reuse: every orientation would need its own solve. So the orientations of a placement group are
 * compared without the supports (step 1), and only the best one that still fits after trimming is
 * solved again with them. Returns those jobs (and keeps them and the choice on the setup);
 * idempotent.
 */
export function conductorJobs(setup: PlanSetup, cache: EvaluationCache, project: Project): Job[] {
  if (setup.conductorJobs) return setup.conductorJobs;
  const ground = groundOf(project);
  const jobs = new Map<string, Job>();
  const choice = new Map<Band, Set<number>>();
  for (const b of setup.bands) {
    const scoreOf = scorerFor(setup.paths, b.band);
    const best = new Map<string, { i: number; score: number }>();
    b.proposed.forEach((q, i) => {
      if (!q.withConductors) return;
      const rec = cache.get(q.key);
      if (!rec) throw new Error(`conductorJobs: evaluation ${q.key} missing from the cache`);
      if (rec.unsolvable !== undefined) return;
      if (!trimmedCheck(setup, q, q.proposal, rec.trimM, false).ok) return;
      const { score } = scoreStates(
        scoreOf,
        setup.paths.map((path) => path.weight),
        rec.gainDbi,
        q.proposal.placement.rotationDeg,
        q.proposal.design,
        0,
        variantPatterns(rec),
      );
      const prev = best.get(q.proposal.groupKey);
      if (!prev || score > prev.score) best.set(q.proposal.groupKey, { i, score });
    });
    const set = new Set<number>();
    for (const { i } of best.values()) {
      set.add(i);
      const w = b.proposed[i].withConductors!;
      if (!jobs.has(w.key)) jobs.set(w.key, { key: w.key, design: w.design, ground });
    }
    choice.set(b.band, set);
  }
  setup.conductorJobs = [...jobs.values()];
  setup.conductorChoice = choice;
  return setup.conductorJobs;
}

/** The patterns of an array's other phasings (EvaluationRecord.variants), in order. */
export function variantPatterns(rec: EvaluationRecord): number[][] {
  return (rec.variants ?? []).map((v) => v.gainDbi);
}

/** Key in Shortlist.patterns of variant k's pattern of the design of evaluation key `key`. */
export function variantPatternKey(key: string, k: number): string {
  return `${key}~variant~${k}`;
}

/** Cache key of the soil-range record of the design of evaluation key `key`. */
export function soilRangeKey(key: string, soils: readonly string[]): string {
  return `${key}~soils~${soils.join(',')}`;
}

/**
 * Step 3 (after steps 1 and 2 are in the cache): the soil range, for the shortlisted candidates
 * only. Each shortlisted design, as trimmed over the project's soil, is solved once more per soil
 * class of the range, pattern only. Ranking without the range first is cheap (no solver work).
 * Step 5 is this again once step 4 is in: the listed switched pairs, both states (the singles'
 * jobs it repeats are in the cache already).
 */
export function soilRangeJobs(
  setup: PlanSetup,
  cache: EvaluationCache,
  project: Project,
  shortlistSize = 10,
  perType = SHORTLIST_PER_TYPE,
): Job[] {
  const soils = soilRangeOf(project);
  if (!soils.length) return [];
  const ranked = rankPlan(setup, cache, project, shortlistSize, perType);
  const designs = new Map<string, Design>();
  for (const j of [...allJobs(setup), ...(setup.pairJobs ?? [])]) designs.set(j.key, j.design);
  const jobs = new Map<string, Job>();
  // a listed switched pair (step 5, once step 4 is in): each state as built
  for (const k of ranked.candidates.flatMap((c) => c.stateKeys ?? [c.evaluationKey])) {
    const key = soilRangeKey(k, soils);
    const design = designs.get(k);
    const rec = cache.get(k);
    if (!design || !rec || jobs.has(key)) continue;
    jobs.set(key, {
      key,
      design,
      ground: groundOf(project),
      soilRange: soils,
      soilOnly: { trimM: rec.trimM },
    });
  }
  return [...jobs.values()];
}

/**
 * Step 4 (only when arrays are planned; after steps 1–3 are in the cache): switched pairs of the
 * ranked single antennas of each band (core/rank/pairs.ts), both states of each as a job. Keeps
 * the pairs and jobs on the setup; idempotent.
 */
export function pairJobs(setup: PlanSetup, cache: EvaluationCache, project: Project): Job[] {
  if (!setup.arrays) return [];
  if (setup.pairJobs) return setup.pairJobs;
  // Every scored placement of each band (no shortlist cut): pairPool picks from them by score
  // and by region.
  const ranked = rankPlan(setup, cache, project, Infinity, Infinity);
  const { pairs, jobs } = pairPlans(
    ranked.candidates,
    setup.bands.map((b) => ({
      band: b.band,
      wavelengthM: bandPlan(b.band, project.settings.operating?.[b.band]).wavelengthM,
    })),
    groundOf(project),
    designKey,
  );
  setup.pairs = pairs;
  setup.pairJobs = jobs;
  return jobs;
}

/** Every job of a setup: step 1, and step 2 when known. */
export function allJobs(setup: PlanSetup): Job[] {
  return [...setup.jobs, ...(setup.conductorJobs ?? [])];
}

/** Step 3: re-check at trimmed dimensions, score, group, rank and describe. */
export function rankPlan(
  setup: PlanSetup,
  cache: EvaluationCache,
  project: Project,
  shortlistSize = 10,
  perType = SHORTLIST_PER_TYPE,
): Omit<Shortlist, 'stats'> {
  const { site, paths } = setup;
  const supportById = new Map(site.supports.map((s) => [s.id, s]));
  const candidates: Candidate[] = [];
  const rejected: RejectedPlacement[] = [];
  const missing: MissingType[] = [];
  const patterns: Record<string, number[]> = {};
  const pathWeights = paths.map((path) => path.weight);
  const ownSoil = projectSoilId(project);
  const rangeSoils = soilRangeOf(project);
  for (const b of setup.bands) {
    const scoreOf = scorerFor(paths, b.band);
    for (const r of b.rejections) rejected.push({ ...r });
    type Scored = {
      p: Proposal;
      key: string;
      rec: EvaluationRecord;
      score: number;
      regionGains: number[];
      states: StateResult[];
      fits: string[];
      elements: Element[];
      unknownMetal: string[];
    };
    const byGroup = new Map<string, { best: Scored; count: number }>();
    const postTrimFail = new Map<string, { p: Proposal; reasons: string[]; missByM?: number }>();
    const pendingVariants = new Map<string, number>();
    const chosenForConductors = setup.conductorChoice?.get(b.band);
    const groupsWithChoice = new Set(
      [...(chosenForConductors ?? [])].map((i) => b.proposed[i].proposal.groupKey),
    );
    for (const [qi, q] of b.proposed.entries()) {
      const { unknownMetal } = q;
      let p = q.proposal;
      let key = q.key;
      if (q.withConductors) {
        if (!chosenForConductors)
          throw new Error('rankPlan: conductorJobs(setup, …) must run first (a metal support is near)');
        if (!chosenForConductors.has(qi) && groupsWithChoice.has(p.groupKey)) {
          // An orientation not chosen for step 2: counted as a variant of its group only.
          const g = byGroup.get(p.groupKey);
          if (g) g.count++;
          else pendingVariants.set(p.groupKey, (pendingVariants.get(p.groupKey) ?? 0) + 1);
          continue;
        }
        if (chosenForConductors.has(qi)) {
          p = { ...p, design: q.withConductors.design };
          key = q.withConductors.key;
        }
      }
      const rec = cache.get(key);
      if (!rec) throw new Error(`rankPlan: evaluation ${key} missing from the cache`);
      if (rec.unsolvable !== undefined) {
        if (!postTrimFail.has(p.groupKey))
          postTrimFail.set(p.groupKey, {
            p,
            reasons: [`the field solver cannot solve it: ${rec.unsolvable}`],
          });
        continue;
      }
      const elements = placedElements(p, rec.trimM);
      const check = trimmedCheck(setup, q, p, rec.trimM, p !== q.proposal);
      if (!check.ok) {
        if (!postTrimFail.has(p.groupKey)) {
          postTrimFail.set(p.groupKey, {
            p,
            reasons: check.violations.map(
              (v) => `after trimming (${p.design.trim.name} ${rec.trimM.toFixed(2)} m): ${v.message}`,
            ),
            missByM: Math.max(...check.violations.map((v) => v.byM)),
          });
        }
        continue;
      }
      const rot = p.placement.rotationDeg;
      const { score, regionGains, states } = scoreStates(
        scoreOf,
        pathWeights,
        rec.gainDbi,
        rot,
        p.design,
        rec.peak.azimuthDeg,
        variantPatterns(rec),
      );
      const s: Scored = {
        p,
        key,
        rec,
        score,
        regionGains,
        states,
        fits: check.fits,
        elements,
        unknownMetal: unknownMetal ?? [],
      };
      const g = byGroup.get(p.groupKey);
      if (!g) byGroup.set(p.groupKey, { best: s, count: 1 + (pendingVariants.get(p.groupKey) ?? 0) });
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
          ...(f.missByM !== undefined ? { missByM: f.missByM } : {}),
        });
    }
    const groups = [...byGroup.values()].sort(
      (x, y) => y.best.score - x.best.score || (x.best.p.groupKey < y.best.p.groupKey ? -1 : 1),
    );
    // At most `perType` placements of one type among the first shortlistSize, so that near-equal
    // variants of one type (nine inverted-Ls within 0.4 dB) do not crowd out the other types; the
    // order stays the solver's.
    const ofType = new Map<string, number>();
    const chosen: typeof groups = [];
    const passedOver: typeof groups = [];
    for (const g of groups) {
      const t = g.best.p.design.type;
      const n = ofType.get(t) ?? 0;
      if (chosen.length < shortlistSize && n < perType) {
        chosen.push(g);
        ofType.set(t, n + 1);
      } else passedOver.push(g);
    }
    const types = new Set(chosen.map((g) => g.best.p.design.type));
    const extra = passedOver.filter((g) => {
      if (types.has(g.best.p.design.type)) return false;
      types.add(g.best.p.design.type);
      return true;
    });
    const bandStart = candidates.length;
    const soilScores: Map<string, number>[] = [];
    [...chosen, ...extra].forEach((g, i) => {
      const { p, rec, key, regionGains, states, fits, elements, unknownMetal } = g.best;
      const perSoil = new Map<string, number>([[ownSoil, g.best.score]]);
      for (const id of rangeSoils) {
        const alt = cache.get(soilRangeKey(key, rangeSoils))?.soilRange?.find((r) => r.soilId === id);
        if (alt && alt.gainDbi.length)
          perSoil.set(
            id,
            scoreStates(
              scoreOf,
              pathWeights,
              alt.gainDbi,
              p.placement.rotationDeg,
              p.design,
              0,
              alt.variants ?? [],
            ).score,
          );
      }
      soilScores.push(perSoil);
      const nAntennaWires = builderFor(p.design.type).model(p.design, rec.trimM).wires.length;
      const conductorDiagnostics = (p.design.conductors ?? []).map(
        (c, k) => [`wire ${nAntennaWires + k} meets the lossy ground without radials`, c] as const,
      );
      const builder = builderFor(p.design.type);
      patterns[key] = rec.gainDbi;
      variantPatterns(rec).forEach((g, k) => (patterns[variantPatternKey(key, k + 1)] = g));
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
      const withRoles = elementsWithRoles(elements);
      // an array's station line ends at its relay box, on the ground (core/report/arrayWiring.ts)
      const box =
        (builder.elementCount ?? 1) >= 2 ? relayBoxXY(p.design.type, withRoles, p.placement.originXY) : null;
      const placed = [
        ...withRoles,
        ...feedLineElement(
          site.station,
          box ? { xyz: [box[0], box[1], 0], lonLat: site.frame.toLonLat(box) } : feedPoints[0],
        ),
        ...conductingSupportElements(p.design.conductors ?? [], p.placement),
      ];
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
        ...(p.adaptations?.length ? { adaptations: p.adaptations } : {}),
        bestOfType:
          i >= chosen.length || !chosen.slice(0, i).some((c) => c.best.p.design.type === p.design.type),
        supports: p.supports.map((id) => {
          const s = supportById.get(id);
          return { id, name: s?.name ?? id, usableHeightM: s?.heightM ?? 0 };
        }),
        broadsideDeg: p.broadsideDeg.map((v) => Math.round(v * 10) / 10),
        rotationDeg: p.placement.rotationDeg,
        heights: builder
          .heights(
            p.design,
            rec.trimM,
            p.supports.map((id) => supportById.get(id)?.name ?? id),
          )
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
          elevationWindowDeg: { min: path.takeoff[b.band].p10Deg, max: path.takeoff[b.band].p90Deg },
          hops: path.hopRange,
          takeoff: takeoffSummary(path.takeoff[b.band]),
        })),
        elementCount: builder.elementCount ?? 1,
        ...(rec.arrayFeed ? { arrayFeed: rec.arrayFeed } : {}),
        states: states.map((st) => ({
          name: st.name,
          beamDeg: st.beamDeg,
          regions: paths.map((path, k) => ({ id: path.id, gainDbi: st.regionGains[k] })),
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
        efficiency: efficiencySplit(rec.power),
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
        fits: [
          ...fits,
          ...(p.design.conductors ?? []).map(
            (c) =>
              `${c.name} is in the model as a ${c.grounded ? 'grounded' : 'ungrounded'} ${c.material} conductor ` +
              `${c.heightM.toFixed(1)} m tall (equivalent radius ${(c.radiusM * 100).toFixed(1)} cm)` +
              (c.standoff ? `, the wire hung ${STANDOFF_M} m out on its side toward the targets` : ''),
          ),
        ],
        variants: g.count,
        diagnostics: [
          ...rec.diagnostics.map((d) => {
            const hit = conductorDiagnostics.find(([prefix]) => d.startsWith(prefix));
            return hit
              ? `${hit[1].name}, a grounded metal support, is part of the model: the ground loss at its base is that of its bare footing (it has no radials of its own)`
              : d;
          }),
          ...unknownMetal.map(
            (n) =>
              `${n} is within ${NEARBY_WAVELENGTHS} λ but its material is not set: left out of the model (set it in the support's inspector)`,
          ),
        ],
        evaluationKey: key,
        conductingSupports: (p.design.conductors ?? []).map((c) => ({
          id: c.supportId,
          name: c.name,
          heightM: c.heightM,
          grounded: c.grounded,
          equivalentRadiusM: c.radiusM,
          standoff: c.standoff,
        })),
        soilRange: { soils: [], lowDbi: g.best.score, highDbi: g.best.score, scores: [], rankHolds: true },
      });
    });
    // Ranks over each soil of the range, among this band's shortlisted candidates.
    const bandCands = candidates.slice(bandStart);
    const shown = new Set(bandCands.map((c) => c.type));
    const planned = b.types ?? [
      ...new Set([...b.proposed.map((q) => q.proposal.design.type), ...b.rejections.map((r) => r.type)]),
    ];
    for (const type of planned)
      if (!shown.has(type))
        missing.push(
          closestMiss(
            type,
            b.band,
            rejected.filter((r) => r.type === type && r.band === b.band),
            SHORT_SUPPORT_TYPES.has(type)
              ? 'not tried: it is for a support shorter than a full-size quarter-wave vertical on this band but at least 0.05 λ tall, and no support here is of that height'
              : undefined,
          ),
        );
    // Each candidate's scores over the soils all of `cands` were scored on, and its rank there.
    const rankOverSoils = (cands: readonly Candidate[], perSoil: readonly Map<string, number>[]): void => {
      const soils = [ownSoil, ...rangeSoils.filter((id) => perSoil.every((m) => m.has(id)))];
      const rankAt = new Map<string, number[]>();
      for (const soil of soils) {
        const order = cands
          .map((_, i) => i)
          .sort((x, y) => perSoil[y].get(soil)! - perSoil[x].get(soil)! || x - y);
        const ranks: number[] = [];
        order.forEach((ci, r) => (ranks[ci] = r + 1));
        rankAt.set(soil, ranks);
      }
      cands.forEach((c, i) => {
        const scores = soils.map((soil) => ({
          soil,
          scoreDbi: perSoil[i].get(soil)!,
          rank: rankAt.get(soil)![i],
        }));
        const values = scores.map((x) => x.scoreDbi);
        c.soilRange = {
          soils,
          lowDbi: Math.min(...values),
          highDbi: Math.max(...values),
          scores,
          rankHolds: scores.every((x) => x.rank === c.rank),
        };
      });
    };
    rankOverSoils(bandCands, soilScores);
    // Step 4: switched pairs that beat the band's best single by the margin go first.
    const bandPairs = setup.pairs?.filter((pr) => pr.band === b.band) ?? [];
    for (const u of unsolvedPairs(bandPairs, cache))
      rejected.push({ type: 'switched-pair', band: b.band, ...u });
    if (bandPairs.length && bandCands.length) {
      const pcs = pairCandidates(
        bandPairs,
        Math.max(...bandCands.map((c) => c.score)),
        project.settings.pairMarginDb ?? PAIR_MARGIN_DEFAULT_DB,
        cache,
        scoreOf,
        pathWeights,
        site,
        patterns,
      );
      // The pairs' scores over the soil range (step 5, soilRangeJobs again), each region from its better state.
      const pairSoils = pcs.map((c) => {
        const perSoil = new Map<string, number>([[ownSoil, c.score]]);
        for (const id of rangeSoils) {
          const g = (c.stateKeys ?? []).map(
            (k) => cache.get(soilRangeKey(k, rangeSoils))?.soilRange?.find((r) => r.soilId === id)?.gainDbi,
          );
          if (g.length === 2 && g.every((x) => x?.length))
            perSoil.set(id, pairScore([g[0]!, g[1]!], scoreOf, pathWeights).score);
        }
        return perSoil;
      });
      pcs.forEach((c, i) => {
        c.rank = i + 1;
        c.bestOfType = i === 0;
      });
      for (const c of bandCands) c.rank += pcs.length;
      if (rangeSoils.length && pairSoils.every((m) => rangeSoils.every((id) => m.has(id))))
        rankOverSoils([...pcs, ...bandCands], [...pairSoils, ...soilScores]);
      else {
        // not computed for the pairs: their range holds the project's soil only, said in words
        rankOverSoils(
          pcs,
          pairSoils.map((m) => new Map([[ownSoil, m.get(ownSoil)!]])),
        );
        if (rangeSoils.length)
          for (const c of pcs) {
            c.soilRange.notComputed = true;
            c.diagnostics.push(
              'not scored over the soil range (the pair was not solved over the other soils)',
            );
          }
        for (const c of bandCands) for (const x of c.soilRange.scores) x.rank += pcs.length;
      }
      candidates.splice(bandStart, 0, ...pcs);
    }
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
      takeoff: takeoffSummary(p.takeoff[setup.bands[0]?.band ?? project.bands[0] ?? '80m']),
      takeoffByBand: Object.fromEntries(setup.bands.map((b) => [b.band, takeoffSummary(p.takeoff[b.band])])),
    })),
    candidates,
    rejected,
    missing,
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
  let evaluations = evaluateJobs(setup.jobs, options.evaluator, cache, options.onProgress);
  const second = conductorJobs(setup, cache, project);
  evaluations += evaluateJobs(second, options.evaluator, cache, options.onProgress);
  const third = soilRangeJobs(setup, cache, project, options.shortlistSize ?? 10, options.shortlistPerType);
  evaluateJobs(third, options.evaluator, cache, options.onProgress);
  const fourth = pairJobs(setup, cache, project);
  evaluations += evaluateJobs(fourth, options.evaluator, cache, options.onProgress);
  const fifth = soilRangeJobs(setup, cache, project, options.shortlistSize ?? 10, options.shortlistPerType);
  evaluateJobs(fifth, options.evaluator, cache, options.onProgress);
  const ranked = rankPlan(setup, cache, project, options.shortlistSize ?? 10, options.shortlistPerType);
  const feasible = setup.bands.reduce((s, b) => s + b.proposed.length, 0);
  return {
    ...ranked,
    stats: {
      proposals: feasible + setup.bands.reduce((s, b) => s + b.rejections.length, 0),
      feasibleAtNominal: feasible,
      evaluations,
      cacheHits: before,
      cuts: setup.cuts,
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
