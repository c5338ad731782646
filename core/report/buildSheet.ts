/**
 * The station report's build sheet: everything needed to put one shortlisted candidate up on the
 * lot. A pure function of the candidate (which carries its design, placement, elements, feed
 * points, ground system, cut list and cautions), the project's lot and station settings, and
 * what the caller measured (the tuning rate through the field solver, ./tuningMeasure.ts).
 * Nothing here finds the design again.
 *
 * The subjects live in their own modules: materials tables with their sources (./materials.ts),
 * the bill of materials (./bom.ts), the feed run (./feedRun.ts), the tuning measurement
 * (./tuningMeasure.ts), the drawings (./drawings.ts) and the document (./html.ts); the one
 * function every view calls is ./stationReport.ts.
 */
import type { Project } from '../project/schema.ts';
import { operatingFit, operatingSpan } from '../bands.ts';
import type { Candidate, Shortlist } from '../rank/plan.ts';
import { gainAt } from '../rank/pattern.ts';
import { servingState, statePatterns } from '../rank/candidateStates.ts';
import { buildSite } from '../site/site.ts';
import type { XY } from '../site/frame.ts';
import type { XYZ } from '../site/geometry.ts';
import { lengthsInText, type UnitSystem } from '../units/index.ts';
import { CUT_ALLOWANCE_PER_END_M } from '../antennas/common.ts';
import { candidateMatching, type CandidateMatching } from '../match/candidateMatch.ts';
import { materialsOf, type BomItem, type Materials } from './bom.ts';
import { arrayBom, arrayWiring, type ArrayWiring } from './arrayWiring.ts';
import type { Caution } from './cautions.ts';
import { estimateExposure, type ExposureEstimate, type Mode } from './exposure.ts';
import { exposureOnLot, type ExposureOnLot } from './exposureZones.ts';
import { feedLineOf, type FeedLine } from './feedRun.ts';
import { sheetLengths } from './format.ts';
import type { CoaxType } from './materials.ts';
import { trimHow } from './tuning.ts';
import type { TuningMeasurement } from './tuningMeasure.ts';
import { isOnTimeFraction, STATION_DEFAULTS } from '../project/station.ts';

// The subjects' exports, for callers that take them from here.
export * from './materials.ts';
export { feedRun, FEED_SLACK, type FeedLine } from './feedRun.ts';
export { ROPE_MARGIN_M, type BomItem } from './bom.ts';
export { TUNING_STEP, measureTuning, type TuningMeasurement } from './tuningMeasure.ts';

export interface StationOptions {
  powerW: number;
  mode: Mode;
  onTimeFraction: number;
  coax: CoaxType;
}

/** A new project's station (core/project/station.ts, the one place of these defaults). */
export const DEFAULT_STATION: StationOptions = STATION_DEFAULTS;

/** One radial as laid: its compass bearing from the base and its length. */
export interface RadialRow {
  /** Number of the radial at its base (1, 2, … in bearing order; per vertical in an array). */
  n: number;
  bearingDeg: number;
  lengthM: number;
  /** The vertical whose base it leaves ("vertical F", "A: vertical radiator"); '' for a single antenna's one field. */
  vertical: string;
  /** Where it ends when not at full length: on the line midway to another base (bonded there), or cut short by the lot. */
  end: string;
}

/** A radial end nearer than this to the line midway between two bases ends on it, metres (the lengths are rounded to 1 cm). */
export const MIDLINE_TOL_M = 0.05;

/**
 * Every radial of every base (one table, grouped by vertical and in bearing order within each),
 * with where each ends: at full length, on the line midway to another vertical where the fields
 * are bonded, or shortened where the lot or a keep-out ends it.
 */
export function radialRows(
  g: Candidate['groundSystem'],
  /** Name each row's vertical even when there is one field (an array with one vertical among its antennas). */
  named = false,
): RadialRow[] {
  if (g.kind !== 'radials') return [];
  const fields = g.fields?.length
    ? g.fields
    : [{ label: '', baseXY: g.baseXY, lengthsM: g.lengthsM, bearingsDeg: g.bearingsDeg }];
  const many = fields.length > 1 || named;
  return fields.flatMap((f, i) => {
    const full = Math.max(...f.lengthsM);
    return f.lengthsM
      .map((lengthM, k) => ({ bearingDeg: f.bearingsDeg[k], lengthM }))
      .sort((a, b) => a.bearingDeg - b.bearingDeg)
      .map((r, k): RadialRow => {
        const b = (r.bearingDeg * Math.PI) / 180;
        const end: XY = [f.baseXY[0] + r.lengthM * Math.sin(b), f.baseXY[1] + r.lengthM * Math.cos(b)];
        const meets = fields.find((o, j) => {
          if (j === i) return false;
          const d = Math.hypot(o.baseXY[0] - f.baseXY[0], o.baseXY[1] - f.baseXY[1]);
          const u: XY = [(o.baseXY[0] - f.baseXY[0]) / d, (o.baseXY[1] - f.baseXY[1]) / d];
          const m: XY = [(o.baseXY[0] + f.baseXY[0]) / 2, (o.baseXY[1] + f.baseXY[1]) / 2];
          return Math.abs((end[0] - m[0]) * u[0] + (end[1] - m[1]) * u[1]) < MIDLINE_TOL_M;
        });
        const endText =
          meets && g.bonded
            ? `ends on the line midway to ${meets.label}: bond it there`
            : r.lengthM < full - MIDLINE_TOL_M
              ? 'shortened where the lot or a keep-out ends it'
              : '';
        return { n: k + 1, ...r, vertical: many ? f.label : '', end: endText };
      });
  });
}

export interface BuildSheet {
  projectName: string;
  candidate: Candidate;
  station: StationOptions;
  /** The unit system every length on the sheet is printed in. */
  units: UnitSystem;
  /** The part of the band the user operates in (core/bands.ts) and whether the 2:1 band covers it. */
  operating: { lowMHz: number; highMHz: number; designMHz: number; label: string; covered: boolean };
  cutList: Candidate['cutList'];
  cutAllowance: string;
  bom: BomItem[];
  wire: Materials['wire'];
  radials: Materials['radials'];
  /** Each radial with its bearing and length, in bearing order (empty without radials). */
  radialTable: RadialRow[];
  insulators: Materials['insulators'];
  ropes: Materials['ropes'];
  feedLine: FeedLine;
  choke: string | null;
  tuning: { measured: TuningMeasurement | null; instruction: string };
  /** The designed match (core/match), or null when the SWR needs none. */
  matching: CandidateMatching | null;
  exposure: ExposureEstimate;
  /** The estimate's distances on the lot: the places each zone reaches and the zone outlines. */
  exposureOnLot: ExposureOnLot;
  cautions: Caution[];
  /** Arrays: the relay box, relays, control wiring, each direction and what the feed network achieves. */
  array: ArrayWiring | null;
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
    /** Compass bearing of each radial, degrees (same order as radialLengthsM). */
    radialBearingsDeg: number[];
    /** The base each radial leaves (same order; an array of verticals has several). */
    radialBasesXY: XY[];
    /** Ropes from the wire ends to their supports or ground anchors (the candidate's rope elements), site frame. */
    ropes: { label: string; from: XYZ; to: XYZ }[];
    /** Arrays: the coax between the elements and the relay box, site frame. */
    arrayCoax: { label: string; from: XYZ; to: XYZ }[];
  };
  /**
   * Elevation cuts: toward each target region (its centre bearing, with its elevation window),
   * or toward the peak bearing without targets; and the azimuth cut at the peak elevation.
   */
  pattern: {
    elevation: { deg: number; gainDbi: number }[];
    towardTargets: {
      name: string;
      bearingDeg: number;
      windowDeg: { min: number; max: number };
      gainDbi: number;
      cut: { deg: number; gainDbi: number }[];
      /** The same elevations toward the opposite bearing (drawn on the left half). */
      back: { deg: number; gainDbi: number }[];
    }[];
    azimuth: { deg: number; gainDbi: number }[];
    /**
     * A switched array (several directions) whose every direction's pattern is in the shortlist:
     * per target region (or, without targets, the peak bearing), each direction's elevation cut
     * toward it and azimuth cut at its median take-off angle, and the direction that serves it.
     * Null for a fixed antenna.
     */
    directions: {
      states: { n: number; name: string; beamDeg: number }[];
      toward: {
        /** The region's name; null: no target regions (the peak bearing and elevation). */
        name: string | null;
        bearingDeg: { from: number; to: number; center: number };
        windowDeg: { min: number; max: number } | null;
        /** Elevation of the azimuth cuts: the region's median take-off, or the peak's. */
        elevationDeg: number;
        /** Number (from 1) of the direction that serves it, and its gain there. */
        servedBy: number;
        gainDbi: number;
        /** Per direction, in order. */
        elevation: { cut: { deg: number; gainDbi: number }[]; back: { deg: number; gainDbi: number }[] }[];
        azimuth: { deg: number; gainDbi: number }[][];
      }[];
    } | null;
  } | null;
  notes: string[];
}

export interface BuildSheetInput {
  project: Project;
  shortlist: Pick<Shortlist, 'paths' | 'patterns'>;
  candidate: Candidate;
  station?: Partial<StationOptions>;
  /** Unit system of the sheet; the project's choice when not given. */
  units?: UnitSystem;
  /** From measureTuning; without it the tuning section gives the method only. */
  tuning?: TuningMeasurement | null;
  /** Gain lookup for the pattern cuts; by default the shortlist's pattern of the candidate (core/rank/pattern.ts gainAt). */
  gainAt?: (azimuthDeg: number, elevationDeg: number) => number;
}

export function buildSheet(input: BuildSheetInput): BuildSheet {
  const { project, candidate: c } = input;
  const station: StationOptions = { ...DEFAULT_STATION, ...project.settings.station, ...input.station };
  if (!isOnTimeFraction(station.onTimeFraction)) throw new RangeError('on-time must be between 0 and 1');
  const units: UnitSystem = input.units ?? project.settings.units;
  const L = sheetLengths(units);
  const site = buildSite(project);
  const notes: string[] = [];

  // Feed point: the candidate's own (site frame).
  let feedXYZ: XYZ;
  const fp = c.feedPoints[0];
  if (fp) feedXYZ = fp.xyz;
  else {
    feedXYZ = c.wires[0].from;
    notes.push('The candidate carries no feed point: the feed is taken at the start of its first wire.');
  }
  // An array with a relay box: the station's line ends at the box, on the ground.
  const array = arrayWiring(c, new Map(c.regions.map((r) => [r.id, r.name])), station.powerW);
  if (array?.boxXY) feedXYZ = [array.boxXY[0], array.boxXY[1], 0];
  const bends = (project.feedRoutes[c.id] ?? []).map((q) => site.frame.toLocal(q));
  const feedLine = feedLineOf(site.station, bends, feedXYZ, station.coax, c.feed.freqMHz);

  const supports = site.supports.map((s) => ({ id: s.id, name: s.name, xy: s.xy, heightM: s.heightM }));
  const m = materialsOf(c, supports, feedLine, L, array?.boxXY ? 'the relay box' : undefined);
  const bom = [...m.bom, ...arrayBom(c, array, feedLine.lengthM, L)];

  const g = c.groundSystem;
  const radialTable = radialRows(c.groundSystem, c.elementCount > 1);

  const measured = input.tuning ?? null;
  const how = trimHow(c.type);
  const instruction = measured
    ? `Measure where the SWR is lowest. If resonance is low, shorten the ${measured.dimension} by ${L.small(Math.abs(measured.cmPer10kHzUp) / 100)} for each 10 kHz it must move up (lengthen by as much to move it down). ${how} Trim in small steps and measure again.`
    : `Measure where the SWR is lowest and shorten the ${c.trim.dimension} to move resonance up (lengthen to move it down). ${how} Trim in small steps and measure again.`;

  const exposure = estimateExposure({
    peakEnvelopePowerW: station.powerW,
    mode: station.mode,
    onTimeFraction: station.onTimeFraction,
    feedLossDb: 0,
    gainDbi: c.peak.gainDbi,
    freqMhz: feedLine.freqMHz,
  });
  exposure.notes.push(
    `Worst case: the feed-line loss (${feedLine.lossDb.toFixed(2)} dB) is not subtracted, and the candidate's peak gain (${c.peak.gainDbi.toFixed(1)} dBi) is used in every direction.`,
  );
  exposure.notes = exposure.notes.map((n) => lengthsInText(n, units));
  const onLot = exposureOnLot(c.wires, site, exposure);
  onLot.notes = onLot.notes.map((n) => lengthsInText(n, units));

  let pattern: BuildSheet['pattern'] = null;
  const canonical = input.shortlist.patterns[c.evaluationKey];
  const gain =
    input.gainAt ?? (canonical ? (az: number, el: number) => gainAt(canonical, c.rotationDeg, az, el) : null);
  if (gain) {
    pattern = {
      elevation: elevationCutOf(gain, c.peak.azimuthDeg),
      towardTargets: c.regions.map((r) => ({
        name: r.name,
        bearingDeg: r.bearingDeg.center,
        windowDeg: r.elevationWindowDeg,
        gainDbi: r.gainDbi,
        cut: elevationCutOf(gain, r.bearingDeg.center),
        back: elevationCutOf(gain, (r.bearingDeg.center + 180) % 360),
      })),
      azimuth: azimuthCutOf(gain, c.peak.elevationDeg),
      directions: directionsOf(c, input.shortlist),
    };
  } else if (c.states.length > 1)
    notes.push('The shortlist holds no pattern of this candidate: the sheet draws none of its directions.');

  if (!c.trim.resonant)
    notes.push('The solver found no resonance inside the design limits: expect a matching network.');
  notes.push(...c.diagnostics.map((d) => lengthsInText(d, units)));

  return {
    projectName: project.name,
    candidate: c,
    station,
    units,
    operating: operatingOf(c, project),
    cutList: c.cutList,
    cutAllowance: `Cut lengths include ${L.small(CUT_ALLOWANCE_PER_END_M, 0)} per end for the loop through an insulator or the connection; trim after a first measurement.`,
    bom,
    wire: m.wire,
    radials: m.radials,
    radialTable,
    insulators: m.insulators,
    ropes: m.ropes,
    feedLine,
    choke: m.choke,
    tuning: { measured, instruction },
    matching: candidateMatching(c),
    exposure,
    exposureOnLot: onLot,
    // The candidate's own list (core/report/cautions.ts through the planner): the same the app shows.
    cautions: c.cautions,
    array,
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
      radialBase: g.kind === 'radials' ? g.baseXY : null,
      radialLengthsM: g.kind === 'radials' ? g.lengthsM : [],
      radialBearingsDeg: g.kind === 'radials' ? g.bearingsDeg : [],
      radialBasesXY:
        g.kind === 'radials'
          ? g.fields?.length
            ? g.fields.flatMap((f) => f.lengthsM.map(() => f.baseXY))
            : g.lengthsM.map(() => g.baseXY)
          : [],
      ropes: c.elements.flatMap((e) =>
        e.role === 'rope' ? [{ label: e.label, from: e.from, to: e.to }] : [],
      ),
      arrayCoax: c.elements.flatMap((e) =>
        e.role === 'coax' ? [{ label: e.label, from: e.from, to: e.to }] : [],
      ),
    },
    pattern,
    notes,
  };
}

type Cut = { deg: number; gainDbi: number }[];

/** Gain against elevation (1–90°) at one site bearing. */
function elevationCutOf(gain: (az: number, el: number) => number, azDeg: number): Cut {
  const out: Cut = [];
  for (let el = 1; el <= 90; el++) out.push({ deg: el, gainDbi: gain(azDeg, el) });
  return out;
}

/** Gain against site bearing, every 2°, at one elevation. */
function azimuthCutOf(gain: (az: number, el: number) => number, elDeg: number): Cut {
  const out: Cut = [];
  for (let az = 0; az < 360; az += 2) out.push({ deg: az, gainDbi: gain(az, elDeg) });
  return out;
}

/**
 * Every direction of a switched array toward each target region (core/rank/candidateStates.ts:
 * the same placed patterns the app plots and the same serving direction the shortlist marks);
 * null for a fixed antenna or when the shortlist lacks a direction's pattern.
 */
function directionsOf(
  c: Candidate,
  shortlist: Pick<Shortlist, 'patterns'>,
): NonNullable<BuildSheet['pattern']>['directions'] {
  if (c.states.length < 2) return null;
  const placed = statePatterns(shortlist, c);
  if (placed.length !== c.states.length) return null;
  const gains = placed.map(
    ({ p }) =>
      (az: number, el: number) =>
        gainAt(p.gainDbi, p.rotationDeg, az, el),
  );
  const targets = c.regions.length
    ? c.regions.map((r) => {
        const served = servingState(c, r.id);
        return {
          name: r.name,
          bearingDeg: r.bearingDeg,
          windowDeg: r.elevationWindowDeg,
          elevationDeg: r.takeoff.medianDeg,
          servedBy: served?.n ?? 1,
          gainDbi: r.gainDbi,
        };
      })
    : [
        {
          name: null,
          bearingDeg: { from: c.peak.azimuthDeg, to: c.peak.azimuthDeg, center: c.peak.azimuthDeg },
          windowDeg: null,
          elevationDeg: c.peak.elevationDeg,
          servedBy:
            1 +
            Math.max(
              0,
              c.states.findIndex((s) => s.beamDeg === c.peak.azimuthDeg),
            ),
          gainDbi: c.peak.gainDbi,
        },
      ];
  return {
    states: c.states.map((s, i) => ({ n: i + 1, name: s.name, beamDeg: s.beamDeg })),
    toward: targets.map((t) => ({
      ...t,
      elevation: gains.map((g) => ({
        cut: elevationCutOf(g, t.bearingDeg.center),
        back: elevationCutOf(g, (t.bearingDeg.center + 180) % 360),
      })),
      azimuth: gains.map((g) => azimuthCutOf(g, t.elevationDeg)),
    })),
  };
}

/** The user's operating span on the candidate's band, and whether the candidate's 2:1 band covers it. */
function operatingOf(c: Candidate, project: Project): BuildSheet['operating'] {
  const span = operatingSpan(c.band, project.settings.operating?.[c.band]);
  return { ...span, covered: operatingFit(c, span) === 'inside' };
}
