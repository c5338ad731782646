/**
 * What the plots draw, read from the planning core: pattern cuts of a placed candidate through
 * the core's own interpolation (gainAt on the canonical grid, rotated by the placement), the
 * band the SWR plot spans, and the degrees of azimuth where each of two candidates wins.
 */
import { BAND_INFO } from '../../../core/bands.ts';
import { PATTERN_GRID, azimuthAdvantage, gainAt } from '../../../core/rank/pattern.ts';
import type { Candidate, Shortlist } from '../../../core/rank/plan.ts';
import type { Band } from '../../../core/project/schema.ts';

export { statePatterns, type PlacedPattern } from '../../../core/rank/candidateStates.ts';
import type { PlacedPattern } from '../../../core/rank/candidateStates.ts';

/** The pattern of a shortlisted candidate, placed on the site; null when the shortlist lacks it. */
export function placedPattern(shortlist: Shortlist, c: Candidate): PlacedPattern | null {
  const g = shortlist.patterns[c.evaluationKey];
  return g && g.length > 0 ? { gainDbi: g, rotationDeg: c.rotationDeg } : null;
}

/** Gain against elevation at one site bearing, on the core's elevation grid (1–90°). */
export function elevationCut(
  p: PlacedPattern,
  azimuthDeg: number,
): { elevationDeg: number; gainDbi: number }[] {
  return PATTERN_GRID.elevationsDeg.map((el) => ({
    elevationDeg: el,
    gainDbi: gainAt(p.gainDbi, p.rotationDeg, azimuthDeg, el),
  }));
}

/** Gain against site bearing at one elevation, every `stepDeg` degrees. */
export function azimuthCut(
  p: PlacedPattern,
  elevationDeg: number,
  stepDeg = 2,
): { azimuthDeg: number; gainDbi: number }[] {
  const out: { azimuthDeg: number; gainDbi: number }[] = [];
  for (let az = 0; az < 360; az += stepDeg) {
    out.push({ azimuthDeg: az, gainDbi: gainAt(p.gainDbi, p.rotationDeg, az, elevationDeg) });
  }
  return out;
}

/** Degrees of azimuth (1° steps) where A beats B, B beats A, or they tie within `marginDb`, from the core. */
export function azimuthWins(a: PlacedPattern, b: PlacedPattern, elevationDeg: number, marginDb = 0.5) {
  return azimuthAdvantage(a, b, elevationDeg, marginDb);
}

/**
 * The span of the SWR plot for each band, MHz: the band's edges from core/bands.ts (the widest
 * amateur allocation among the three IARU regions). Your own licence may allow less.
 */
export const BAND_SPAN_MHZ: Record<Band, [number, number]> = {
  '160m': BAND_INFO['160m'].edgesMHz,
  '80m': BAND_INFO['80m'].edgesMHz,
  '40m': BAND_INFO['40m'].edgesMHz,
};

/** Frequencies for an SWR sweep across a band, Hz: `count` evenly spaced, edges included. */
export function sweepFrequenciesHz(band: Band, count = 26): number[] {
  const [lo, hi] = BAND_SPAN_MHZ[band];
  return Array.from({ length: count }, (_, i) => (lo + ((hi - lo) * i) / (count - 1)) * 1e6);
}

/** The elevation to show the azimuth pattern at first: the first target's median take-off angle, else the peak's. */
export function defaultElevationDeg(c: Candidate): number {
  const r = c.regions[0];
  const el = r ? r.takeoff.medianDeg : c.peak.elevationDeg;
  return Math.max(1, Math.min(60, Math.round(el)));
}

export interface ElevationSeries {
  label: string;
  colour: string;
  points: { elevationDeg: number; gainDbi: number }[];
}

export interface ElevationWindow {
  name: string;
  colour: string;
  /** The 10–90 % span of the take-off distribution, degrees. */
  min: number;
  max: number;
  /** The distribution in 1° bins (weights summing to 1), shaded by weight; median marked. */
  weights?: readonly { elevationDeg: number; weight: number }[];
  medianDeg?: number;
}

export interface AzimuthSeries {
  label: string;
  colour: string;
  points: { azimuthDeg: number; gainDbi: number }[];
}

export interface BearingMark {
  name: string;
  colour: string;
  fromDeg: number;
  toDeg: number;
  centerDeg: number;
}

export interface SwrSeries {
  label: string;
  colour: string;
  points: { freqMHz: number; swr: number }[];
  /** The 2:1 edges the planning core found, MHz (null where no edge lies inside its sweep). */
  lowMHz: number | null;
  highMHz: number | null;
  /** The core's 2:1 width, kHz (0 when the SWR at the design frequency is over 2). */
  widthKHz: number;
  designMHz: number;
}
