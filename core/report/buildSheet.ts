/**
 * The station report's build sheet: everything needed to put one shortlisted candidate up on the
 * lot — cut list, bill of materials, feed line and its loss, how to tune it, RF exposure
 * distances and the cautions. Pure: the caller passes the project, the shortlist, the candidate,
 * the station's power, mode and on-time and the chosen coax; the tuning rate comes from the field
 * solver through an Evaluator (measureTuning), so the caller decides where it runs.
 *
 * Figures that are not computed here carry where they come from: "common practice, no source"
 * or "typical datasheet values, from memory".
 */
import { builderFor } from '../antennas/registry.ts';
import {
  CUT_ALLOWANCE_PER_END_M,
  RADIAL_RADIUS_M,
  WIRE_RADIUS_M,
  placeElements,
} from '../antennas/common.ts';
import type { Design, Proposal, WireModel } from '../antennas/types.ts';
import { COAX_TYPES, type Project } from '../project/schema.ts';
import { designKey, enumeratePlan, type Candidate, type Shortlist } from '../rank/plan.ts';
import { evaluationModel } from '../antennas/conductors.ts';
import type { EvalGround, Evaluator } from '../rank/evaluator.ts';
import { placeXYZ, type XYZ } from '../site/geometry.ts';
import { buildSite } from '../site/site.ts';
import type { XY } from '../site/frame.ts';
import { estimateExposure, type ExposureEstimate, type Mode } from './exposure.ts';
import { exposureOnLot, type ExposureOnLot } from './exposureZones.ts';
import type { Caution } from './cautions.ts';
import { trimHow } from './tuning.ts';

/* ----------------------------------------------------------------------------------------------
 * Coaxial cable loss
 * -------------------------------------------------------------------------------------------- */

export { COAX_TYPES };
export type CoaxType = (typeof COAX_TYPES)[number];

/** Frequencies of the loss table, MHz. */
export const COAX_TABLE_MHZ = [1.8, 3.5, 7] as const;

/**
 * Matched loss, dB per 100 m, at 1.8 / 3.5 / 7 MHz: typical datasheet values, from memory (not
 * checked against a particular maker's sheet; real cable varies by maker and age).
 */
export const COAX_LOSS_DB_PER_100M: Record<CoaxType, readonly [number, number, number]> = {
  'RG-58': [2.0, 2.8, 3.9],
  'RG-8X': [1.4, 2.0, 2.8],
  'RG-213': [0.85, 1.2, 1.7],
  'low-loss 10 mm foam': [0.55, 0.8, 1.1],
};
export const COAX_SOURCE = 'typical datasheet values, from memory';

export function isCoaxType(s: string): s is CoaxType {
  return (COAX_TYPES as readonly string[]).includes(s);
}

/**
 * Matched loss at `freqMhz`, dB/100 m: the table value at the nearest tabulated frequency scaled
 * by √(f / f_table) (conductor loss dominates at these frequencies and grows as √f).
 */
export function coaxLossDbPer100m(coax: CoaxType, freqMhz: number): number {
  if (!(freqMhz > 0)) throw new RangeError('freqMhz must be positive');
  let i = 0;
  for (let k = 1; k < COAX_TABLE_MHZ.length; k++)
    if (Math.abs(Math.log(freqMhz / COAX_TABLE_MHZ[k])) < Math.abs(Math.log(freqMhz / COAX_TABLE_MHZ[i])))
      i = k;
  return COAX_LOSS_DB_PER_100M[coax][i] * Math.sqrt(freqMhz / COAX_TABLE_MHZ[i]);
}

/* ----------------------------------------------------------------------------------------------
 * Wire gauge
 * -------------------------------------------------------------------------------------------- */

/** AWG diameter, mm: 0.127 mm · 92^((36 − n)/39) (the gauge's defining formula, from memory). */
export function awgDiameterMm(n: number): number {
  return 0.127 * 92 ** ((36 - n) / 39);
}

/** Nearest AWG number to a diameter in mm. */
export function nearestAwg(diameterMm: number): number {
  return Math.round(36 - (39 * Math.log(diameterMm / 0.127)) / Math.log(92));
}

export function gaugeText(radiusM: number): string {
  const d = radiusM * 2000;
  const n = nearestAwg(d);
  return `${d.toFixed(1)} mm diameter copper (≈ ${n} AWG, ${awgDiameterMm(n).toFixed(2)} mm; nearest gauge by the AWG formula)`;
}

/* ----------------------------------------------------------------------------------------------
 * Finding the candidate's design again
 * -------------------------------------------------------------------------------------------- */

/**
 * The proposal behind a shortlisted candidate: re-enumerated for its band and type (no solver
 * work) and matched by id, design key and rotation. Null when the project no longer yields it.
 */
export function resolveProposal(project: Project, candidate: Candidate): Proposal | null {
  const setup = enumeratePlan(project, { bands: [candidate.band], types: [candidate.type] });
  for (const b of setup.bands)
    for (const { proposal: p, key, withConductors } of b.proposed) {
      const id = `${candidate.band}-${p.groupKey.replace(/:/g, '-')}`;
      if (id !== candidate.id || p.placement.rotationDeg !== candidate.rotationDeg) continue;
      if (key === candidate.evaluationKey) return p;
      // A placement near a metal support: its design with the support in the model.
      if (withConductors?.key === candidate.evaluationKey) return { ...p, design: withConductors.design };
    }
  return null;
}

/* ----------------------------------------------------------------------------------------------
 * Tuning from the solver
 * -------------------------------------------------------------------------------------------- */

/** Relative change of the trim dimension for the tuning measurement (±0.5 %). */
export const TUNING_STEP = 0.005;

export interface TuningMeasurement {
  dimension: string;
  trimM: number;
  /** Resonant frequency (feed reactance zero) at trim·(1 − step) and trim·(1 + step), MHz. */
  resonanceMHz: { shorter: number; longer: number };
  /** Shift of resonance per centimetre of the trim dimension, kHz/cm (negative: longer → lower). */
  kHzPerCm: number;
  /** Length change of the trim dimension that moves resonance up by 10 kHz, cm (positive: shorten). */
  cmPer10kHzUp: number;
}

/** Zero of X(f) from a quadratic through three points, nearest f1. */
function reactanceZero(fs: [number, number, number], xs: [number, number, number]): number {
  const [f0, f1, f2] = fs;
  const [x0, x1, x2] = xs;
  // X(f) = a (f − f1)² + b (f − f1) + x1
  const d0 = f0 - f1;
  const d2 = f2 - f1;
  const a = ((x0 - x1) / d0 - (x2 - x1) / d2) / (d0 - d2);
  const b = (x0 - x1) / d0 - a * d0;
  if (Math.abs(a) < 1e-30) return f1 - x1 / b;
  const disc = b * b - 4 * a * x1;
  if (disc < 0) return f1 - x1 / b;
  const r1 = (-b + Math.sqrt(disc)) / (2 * a);
  const r2 = (-b - Math.sqrt(disc)) / (2 * a);
  return f1 + (Math.abs(r1) < Math.abs(r2) ? r1 : r2);
}

/**
 * Re-evaluate the design with its trim dimension at ±TUNING_STEP: at each length the feed
 * reactance at f0 and f0 ± 1 % (feed only), its zero by a quadratic fit, and the shift of that
 * resonance per centimetre.
 */
export function measureTuning(
  design: Design,
  trimM: number,
  ground: EvalGround,
  evaluator: Evaluator,
): TuningMeasurement {
  const f0 = design.designFreqHz;
  const fs: [number, number, number] = [f0 * 0.99, f0, f0 * 1.01];
  const resAt = (t: number): number => {
    const model = evaluationModel(design, t);
    const r = evaluator({ model, ground, frequenciesHz: fs, pattern: null });
    return reactanceZero(fs, [r[0].zOhm[1], r[1].zOhm[1], r[2].zOhm[1]]);
  };
  const lo = trimM * (1 - TUNING_STEP);
  const hi = trimM * (1 + TUNING_STEP);
  const fShort = resAt(lo);
  const fLong = resAt(hi);
  const kHzPerCm = (fLong - fShort) / 1e3 / ((hi - lo) * 100);
  return {
    dimension: design.trim.name,
    trimM,
    resonanceMHz: { shorter: fShort / 1e6, longer: fLong / 1e6 },
    kHzPerCm,
    cmPer10kHzUp: kHzPerCm !== 0 ? -10 / kHzPerCm : NaN,
  };
}

/* ----------------------------------------------------------------------------------------------
 * The build sheet
 * -------------------------------------------------------------------------------------------- */

export interface StationOptions {
  powerW: number;
  mode: Mode;
  onTimeFraction: number;
  coax: CoaxType;
}

export const DEFAULT_STATION: StationOptions = {
  powerW: 100,
  mode: 'ssb',
  onTimeFraction: 0.5,
  coax: 'RG-213',
};

/**
 * The feed-line run: plan length along the route (station point, the user's bend points, the
 * point under the feed), plus the rise to the feed point, plus FEED_SLACK.
 */
export function feedRun(
  stationXY: XY,
  bendsXY: readonly XY[],
  feedXYZ: XYZ,
): { planM: number; routeXY: XY[]; lengthM: number } {
  const routeXY: XY[] = [stationXY, ...bendsXY, [feedXYZ[0], feedXYZ[1]]];
  let planM = 0;
  for (let i = 0; i + 1 < routeXY.length; i++)
    planM += Math.hypot(routeXY[i + 1][0] - routeXY[i][0], routeXY[i + 1][1] - routeXY[i][1]);
  return { planM, routeXY, lengthM: (planM + Math.max(0, feedXYZ[2])) * (1 + FEED_SLACK) };
}

/** Rope margin beyond twice the support height, metres (common practice, no source). */
export const ROPE_MARGIN_M = 5;
/** Slack added to the feed-line run (common practice, no source). */
export const FEED_SLACK = 0.1;

export interface BomItem {
  item: string;
  quantity: number;
  unit: 'm' | 'pcs';
  detail: string;
  source: string;
}

export interface BuildSheet {
  projectName: string;
  candidate: Candidate;
  station: StationOptions;
  cutList: Candidate['cutList'];
  cutAllowance: string;
  bom: BomItem[];
  wire: { modelledM: number; allowanceM: number; totalM: number; gauge: string };
  radials: { count: number; totalM: number; gauge: string } | null;
  insulators: { count: number; where: string[] };
  ropes: { support: string; heightM: number; lengthM: number }[];
  feedLine: {
    coax: CoaxType;
    stationXY: XY;
    feedXYZ: XYZ;
    planDistanceM: number;
    /** The route drawn: station point, bend points, the point under the feed (site frame). */
    routeXY: XY[];
    /** True when the user drew the route; false for the straight run. */
    routed: boolean;
    lengthM: number;
    lossDbPer100m: number;
    lossDb: number;
    freqMHz: number;
    source: string;
    note: string;
  };
  choke: string | null;
  tuning: { measured: TuningMeasurement | null; instruction: string };
  exposure: ExposureEstimate;
  /** The estimate's distances on the lot: the places each zone reaches and the zone outlines. */
  exposureOnLot: ExposureOnLot;
  cautions: Caution[];
  /** Lot drawing in the site frame. */
  lot: {
    boundary: XY[];
    keepOuts: {
      name: string;
      kind: string;
      shape: { type: 'polygon'; ring: XY[] } | { type: 'line'; line: XY[] };
    }[];
    supports: { name: string; xy: XY; heightM: number; used: boolean }[];
    station: XY;
    radialBase: XY | null;
    radialLengthsM: number[];
    radialRotationDeg: number;
    /** Ropes from the wire ends to their supports or ground anchors (from the design), site frame. */
    ropes: { label: string; from: XYZ; to: XYZ }[];
  };
  /** Elevation cut at the peak azimuth and azimuth cut at the peak elevation, when the pattern is in the shortlist. */
  pattern: {
    elevation: { deg: number; gainDbi: number }[];
    azimuth: { deg: number; gainDbi: number }[];
  } | null;
  notes: string[];
}

const len3 = (a: XYZ, b: XYZ): number => Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
const near = (a: XYZ, b: XYZ, tol = 0.02): boolean => len3(a, b) < tol;

/** Centre-fed types that want a choke balun at the feed point (common practice, no source). */
const CENTRE_FED = new Set(['dipole', 'inverted-v']);

export interface BuildSheetInput {
  project: Project;
  shortlist: Pick<Shortlist, 'paths' | 'patterns'>;
  candidate: Candidate;
  station?: Partial<StationOptions>;
  /** The proposal behind the candidate (resolveProposal); without it the feed point is estimated. */
  proposal?: Proposal | null;
  /** From measureTuning; without it the tuning section gives the method only. */
  tuning?: TuningMeasurement | null;
  /** Gain lookup for the pattern cuts (core/rank/pattern.ts gainAt bound to the candidate), optional. */
  gainAt?: (azimuthDeg: number, elevationDeg: number) => number;
}

export function buildSheet(input: BuildSheetInput): BuildSheet {
  const { project, candidate: c } = input;
  const station: StationOptions = { ...DEFAULT_STATION, ...project.settings.station, ...input.station };
  if (!(station.onTimeFraction >= 0 && station.onTimeFraction <= 1))
    throw new RangeError('on-time must be between 0 and 1');
  const site = buildSite(project);
  const notes: string[] = [];
  const p = input.proposal ?? null;
  const model: WireModel | null = p ? builderFor(p.design.type).model(p.design, c.trim.valueM) : null;

  // Wire: the modelled wires plus the cut list's allowance on the wire pieces.
  const modelledM = c.wires.reduce((s, w) => s + len3(w.from, w.to), 0);
  const wireCuts = c.cutList.filter((i) => !/rope|radial/i.test(i.label));
  const allowanceM = wireCuts.reduce((s, i) => s + i.count * (i.cutLengthM - i.lengthM), 0);
  const wireRadius = model?.wires[0]?.radiusM ?? WIRE_RADIUS_M;
  const wire = { modelledM, allowanceM, totalM: modelledM + allowanceM, gauge: gaugeText(wireRadius) };

  // Radials: from the model when the design is known, else from the cut list.
  let radials: BuildSheet['radials'] = null;
  let radialLengthsM: number[] = [];
  if (model && model.radials.length) {
    radialLengthsM = model.radials.flatMap((r) => r.lengthsM);
    radials = {
      count: radialLengthsM.length,
      totalM: radialLengthsM.reduce((s, v) => s + v, 0),
      gauge: gaugeText(model.radials[0].radiusM),
    };
  } else {
    const rc = c.cutList.filter((i) => /radial/i.test(i.label));
    if (rc.length)
      radials = {
        count: rc.reduce((s, i) => s + i.count, 0),
        totalM: rc.reduce((s, i) => s + i.count * i.lengthM, 0),
        gauge: gaugeText(RADIAL_RADIUS_M),
      };
  }

  // Insulators: one per free wire end (not joined to another wire, above ground), plus one where
  // a support holds the antenna at a point that is not a free end.
  const ends: { at: XYZ; label: string }[] = [];
  for (const w of c.wires) ends.push({ at: w.from, label: w.label }, { at: w.to, label: w.label });
  const free = ends.filter(
    (e, i) =>
      e.at[2] > 0.05 &&
      !ends.some((o, j) => j !== i && Math.floor(j / 2) !== Math.floor(i / 2) && near(o.at, e.at)),
  );
  const where: string[] = free.map((e) => `free end of the ${e.label} (${e.at[2].toFixed(1)} m high)`);
  const usedSupports = site.supports.filter((s) => c.supports.some((u) => u.id === s.id));
  for (const s of usedSupports) {
    let best: { at: XYZ; d: number } | null = null;
    for (const e of ends) {
      const d = Math.hypot(e.at[0] - s.xy[0], e.at[1] - s.xy[1]);
      if (!best || d < best.d) best = { at: e.at, d };
    }
    if (best && !free.some((f) => near(f.at, best.at)) && best.at[2] > 0.05)
      where.push(`attachment at ${s.name}`);
  }
  const insulators = { count: where.length, where };

  // Ropes: a halyard through a pulley at each support used; end ropes from the cut list.
  const ropes = usedSupports.map((s) => ({
    support: s.name,
    heightM: s.heightM,
    lengthM: 2 * s.heightM + ROPE_MARGIN_M,
  }));
  const endRopes = c.cutList.filter((i) => /rope/i.test(i.label));
  const endRopeM = endRopes.reduce((s, i) => s + i.count * i.cutLengthM, 0);

  // Feed point in the site frame.
  let feedXYZ: XYZ;
  if (p && model && model.feeds.length) {
    const f = model.feeds[0];
    const w = model.wires[f.wire];
    const local: XYZ = [
      w.from[0] + (w.to[0] - w.from[0]) * f.position,
      w.from[1] + (w.to[1] - w.from[1]) * f.position,
      w.from[2] + (w.to[2] - w.from[2]) * f.position,
    ];
    feedXYZ = placeXYZ(local, p.placement.rotationDeg, p.placement.originXY);
  } else {
    const w = c.wires[0];
    feedXYZ = w.from;
    notes.push(
      'The design could not be rebuilt from the project: the feed point is taken at the start of the first wire.',
    );
  }
  const bends = (project.feedRoutes[c.id] ?? []).map((q) => site.frame.toLocal(q));
  const run = feedRun(site.station, bends, feedXYZ);
  const planDistanceM = run.planM;
  const lengthM = run.lengthM;
  const freqMHz = c.feed.freqMHz;
  const lossDbPer100m = coaxLossDbPer100m(station.coax, freqMHz);
  const feedLine = {
    coax: station.coax,
    stationXY: site.station,
    feedXYZ,
    planDistanceM,
    routeXY: run.routeXY,
    routed: bends.length > 0,
    lengthM,
    lossDbPer100m,
    lossDb: (lossDbPer100m * lengthM) / 100,
    freqMHz,
    source: COAX_SOURCE,
    note: bends.length
      ? `along your route (${bends.length} bend${bends.length === 1 ? '' : 's'}) from the station point, plus the feed height, plus ${FEED_SLACK * 100} % slack (common practice, no source)`
      : `straight-line plan distance from the station point plus the feed height, plus ${FEED_SLACK * 100} % slack (common practice, no source); draw your real route in the app and the length follows`,
  };

  const choke = CENTRE_FED.has(c.type)
    ? 'A common-mode choke (current balun) at the feed point, to keep RF off the outside of the coax (common practice, no source).'
    : null;

  const measured = input.tuning ?? null;
  const how = trimHow(c.type);
  const instruction = measured
    ? `Measure where the SWR is lowest. If resonance is low, shorten the ${measured.dimension} by ${Math.abs(measured.cmPer10kHzUp).toFixed(1)} cm for each 10 kHz it must move up (lengthen by as much to move it down). ${how} Trim in small steps and measure again.`
    : `Measure where the SWR is lowest and shorten the ${c.trim.dimension} to move resonance up (lengthen to move it down). ${how} Trim in small steps and measure again.`;

  const exposure = estimateExposure({
    peakEnvelopePowerW: station.powerW,
    mode: station.mode,
    onTimeFraction: station.onTimeFraction,
    feedLossDb: 0,
    gainDbi: c.peak.gainDbi,
    freqMhz: freqMHz,
  });
  exposure.notes.push(
    `Worst case: the feed-line loss (${feedLine.lossDb.toFixed(2)} dB) is not subtracted, and the candidate's peak gain (${c.peak.gainDbi.toFixed(1)} dBi) is used in every direction.`,
  );

  const onLot = exposureOnLot(c.wires, site, exposure);

  // The candidate's own list (core/report/cautions.ts through the planner): the same the app shows.
  const cautions = c.cautions;

  let pattern: BuildSheet['pattern'] = null;
  if (input.gainAt) {
    const g = input.gainAt;
    const elevation: { deg: number; gainDbi: number }[] = [];
    for (let el = 1; el <= 90; el++) elevation.push({ deg: el, gainDbi: g(c.peak.azimuthDeg, el) });
    const azimuth: { deg: number; gainDbi: number }[] = [];
    for (let az = 0; az < 360; az += 2) azimuth.push({ deg: az, gainDbi: g(az, c.peak.elevationDeg) });
    pattern = { elevation, azimuth };
  }

  const bom: BomItem[] = [
    {
      item: 'Antenna wire',
      quantity: wire.totalM,
      unit: 'm',
      detail: `${wire.modelledM.toFixed(2)} m as modelled + ${wire.allowanceM.toFixed(2)} m cut allowance (${CUT_ALLOWANCE_PER_END_M} m per end); ${wire.gauge}`,
      source: 'model wire radius; gauge: common practice, no source',
    },
  ];
  if (radials)
    bom.push({
      item: 'Radial wire',
      quantity: radials.totalM,
      unit: 'm',
      detail: `${radials.count} radials; ${radials.gauge}`,
      source: 'the candidate’s radial lengths as modelled (clipped by the lot)',
    });
  bom.push({
    item: 'Insulators',
    quantity: insulators.count,
    unit: 'pcs',
    detail: insulators.where.join('; ') || 'none needed at the wire ends',
    source: 'one per free wire end and per support attachment (common practice, no source)',
  });
  if (ropes.length) {
    bom.push({
      item: 'Halyard rope',
      quantity: ropes.reduce((s, r) => s + r.lengthM, 0) + endRopeM,
      unit: 'm',
      detail:
        ropes.map((r) => `${r.support}: 2 × ${r.heightM.toFixed(1)} m + ${ROPE_MARGIN_M} m`).join('; ') +
        (endRopeM > 0 ? `; end ropes from the cut list ${endRopeM.toFixed(1)} m` : ''),
      source: 'twice the support height plus a margin (common practice, no source); UV-resistant rope',
    });
    bom.push({
      item: 'Pulleys',
      quantity: ropes.length,
      unit: 'pcs',
      detail: `one per support used (${ropes.map((r) => r.support).join(', ')})`,
      source: 'common practice, no source',
    });
  }
  bom.push({
    item: `Coaxial cable ${station.coax}`,
    quantity: feedLine.lengthM,
    unit: 'm',
    detail: `station to feed point; matched loss ${feedLine.lossDb.toFixed(2)} dB at ${freqMHz.toFixed(2)} MHz`,
    source: `${feedLine.note}; loss: ${COAX_SOURCE}`,
  });
  if (choke)
    bom.push({
      item: 'Choke balun',
      quantity: 1,
      unit: 'pcs',
      detail: 'at the feed point',
      source: 'common practice, no source',
    });
  if (!c.trim.resonant)
    notes.push('The solver found no resonance inside the design limits: expect a matching network.');
  notes.push(...c.diagnostics);

  return {
    projectName: project.name,
    candidate: c,
    station,
    cutList: c.cutList,
    cutAllowance: c.cutAllowance,
    bom,
    wire,
    radials,
    insulators,
    ropes,
    feedLine,
    choke,
    tuning: { measured, instruction },
    exposure,
    exposureOnLot: onLot,
    cautions,
    lot: {
      boundary: site.boundary,
      keepOuts: site.keepOuts.map((k) => ({ name: k.name, kind: k.kind, shape: k.shape })),
      supports: site.supports.map((s) => ({
        name: s.name,
        xy: s.xy,
        heightM: s.heightM,
        used: c.supports.some((u) => u.id === s.id),
      })),
      station: site.station,
      radialBase: radialBaseXY(model, p),
      radialLengthsM,
      radialRotationDeg: p?.placement.rotationDeg ?? 0,
      ropes: p
        ? placeElements(builderFor(p.design.type).elements(p.design, c.trim.valueM), p.placement).flatMap(
            (e) => (e.kind === 'rope' ? [{ label: e.label, from: e.from, to: e.to }] : []),
          )
        : [],
    },
    pattern,
    notes,
  };
}

function radialBaseXY(model: WireModel | null, p: Proposal | null): XY | null {
  if (!model || !p || !model.radials.length) return null;
  const w = model.wires[model.radials[0].wire];
  const base = w.from[2] <= w.to[2] ? w.from : w.to;
  const q = placeXYZ(base, p.placement.rotationDeg, p.placement.originXY);
  return [q[0], q[1]];
}

/** Check that a proposal rebuilds the candidate (its design key); for callers that resolved it elsewhere. */
export function proposalMatches(project: Project, candidate: Candidate, proposal: Proposal): boolean {
  return designKey(proposal.design, project.soil) === candidate.evaluationKey;
}
