/**
 * The canonical pattern grid and reading gain from it for a placed antenna.
 *
 * Grid: azimuth 0–358° every 2°; elevation 1–30° every 1°, 32–60° every 2°, 65–90° every 5°
 * (fine where long-distance paths leave). Gain between grid points is interpolated bilinearly in
 * dB; a low-band wire pattern changes by well under 0.1 dB per degree except in deep nulls.
 * Directions below 1° read the 1° row (the pattern is not sampled lower).
 *
 * A placement rotates the canonical frame clockwise by ρ; over laterally uniform ground the
 * pattern rotates with it: G_site(az, el) = G_canonical(az − ρ, el).
 */
import { dbToLinear, linearToDb } from '../units/index.ts';

function range(from: number, to: number, step: number): number[] {
  const out: number[] = [];
  for (let v = from; v <= to + 1e-9; v += step) out.push(v);
  return out;
}

export const PATTERN_GRID = {
  azimuthsDeg: range(0, 358, 2),
  elevationsDeg: [...range(1, 30, 1), ...range(32, 60, 2), ...range(65, 90, 5)],
} as const;

const AZ_STEP = 2;

function elIndex(el: number): [number, number] {
  const e = PATTERN_GRID.elevationsDeg;
  if (el <= e[0]) return [0, 0];
  if (el >= e[e.length - 1]) return [e.length - 1, 0];
  let lo = 0;
  let hi = e.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (e[mid] <= el) lo = mid;
    else hi = mid;
  }
  return [lo, (el - e[lo]) / (e[lo + 1] - e[lo])];
}

/** Gain in dBi at site direction (az, el) of a canonical pattern placed with rotation ρ. */
export function gainAt(
  gainDbi: readonly number[],
  rotationDeg: number,
  azimuthDeg: number,
  elevationDeg: number,
): number {
  const nAz = PATTERN_GRID.azimuthsDeg.length;
  let a = (azimuthDeg - rotationDeg) % 360;
  if (a < 0) a += 360;
  const ia = Math.floor(a / AZ_STEP) % nAz;
  const ib = (ia + 1) % nAz;
  const ta = (a - ia * AZ_STEP) / AZ_STEP;
  const [ie, te] = elIndex(elevationDeg);
  const ie2 = Math.min(ie + 1, PATTERN_GRID.elevationsDeg.length - 1);
  const g = (i: number, j: number): number => gainDbi[i * nAz + j];
  const row0 = g(ie, ia) * (1 - ta) + g(ie, ib) * ta;
  const row1 = g(ie2, ia) * (1 - ta) + g(ie2, ib) * ta;
  return row0 * (1 - te) + row1 * te;
}

/** Power average, in dBi, of the gain over the given directions. */
export function averageGainDbi(
  gainDbi: readonly number[],
  rotationDeg: number,
  directions: readonly { azimuthDeg: number; elevationDeg: number }[],
): number {
  let sum = 0;
  for (const d of directions) sum += dbToLinear(gainAt(gainDbi, rotationDeg, d.azimuthDeg, d.elevationDeg));
  return linearToDb(sum / directions.length);
}

/**
 * Gain averaged in power over a weighted distribution of directions, dBi: 10·log10 Σ w·g(az, el)
 * with the weights as given (a take-off distribution, core/paths/takeoff.ts, has them summing to
 * 1; they are normalised here in case they do not). An empty or zero-weight set throws.
 */
export function distributionGainDbi(
  gainDbi: readonly number[],
  rotationDeg: number,
  directions: readonly { azimuthDeg: number; elevationDeg: number; weight: number }[],
): number {
  let sum = 0;
  let wsum = 0;
  for (const d of directions) {
    if (d.weight <= 0) continue;
    sum += d.weight * dbToLinear(gainAt(gainDbi, rotationDeg, d.azimuthDeg, d.elevationDeg));
    wsum += d.weight;
  }
  if (!(wsum > 0)) throw new Error('distributionGainDbi: no direction carries weight');
  return linearToDb(sum / wsum);
}

/**
 * A weighted direction set prepared for repeated reading (one per region and band in a plan):
 * directions grouped by azimuth, each elevation's grid rows and fraction found once, weights
 * normalised. `compiledGainDbi` then gives exactly what distributionGainDbi gives.
 */
export interface CompiledDirections {
  azimuthsDeg: Float64Array;
  /** For azimuth group k, entries start[k] … start[k+1] − 1 of the arrays below. */
  start: Int32Array;
  row0: Int32Array;
  row1: Int32Array;
  frac: Float64Array;
  weight: Float64Array;
}

export function compileDirections(
  directions: readonly { azimuthDeg: number; elevationDeg: number; weight: number }[],
): CompiledDirections {
  const used = directions.filter((d) => d.weight > 0);
  const wsum = used.reduce((s, d) => s + d.weight, 0);
  if (!(wsum > 0)) throw new Error('compileDirections: no direction carries weight');
  const byAz = new Map<number, { elevationDeg: number; weight: number }[]>();
  for (const d of used) {
    const list = byAz.get(d.azimuthDeg) ?? [];
    list.push(d);
    byAz.set(d.azimuthDeg, list);
  }
  const n = used.length;
  const out: CompiledDirections = {
    azimuthsDeg: new Float64Array(byAz.size),
    start: new Int32Array(byAz.size + 1),
    row0: new Int32Array(n),
    row1: new Int32Array(n),
    frac: new Float64Array(n),
    weight: new Float64Array(n),
  };
  const last = PATTERN_GRID.elevationsDeg.length - 1;
  let k = 0;
  let i = 0;
  for (const [az, list] of byAz) {
    out.azimuthsDeg[k] = az;
    out.start[k] = i;
    for (const d of list) {
      const [ie, te] = elIndex(d.elevationDeg);
      out.row0[i] = ie;
      out.row1[i] = Math.min(ie + 1, last);
      out.frac[i] = te;
      out.weight[i] = d.weight / wsum;
      i++;
    }
    k++;
  }
  out.start[k] = i;
  return out;
}

/** Gain averaged in power over a compiled direction set, dBi (the same value as distributionGainDbi). */
export function compiledGainDbi(
  gainDbi: readonly number[],
  rotationDeg: number,
  c: CompiledDirections,
): number {
  const nAz = PATTERN_GRID.azimuthsDeg.length;
  let sum = 0;
  for (let k = 0; k < c.azimuthsDeg.length; k++) {
    let a = (c.azimuthsDeg[k] - rotationDeg) % 360;
    if (a < 0) a += 360;
    const ia = Math.floor(a / AZ_STEP) % nAz;
    const ib = (ia + 1) % nAz;
    const ta = (a - ia * AZ_STEP) / AZ_STEP;
    for (let i = c.start[k]; i < c.start[k + 1]; i++) {
      const r0 = c.row0[i] * nAz;
      const r1 = c.row1[i] * nAz;
      const g0 = gainDbi[r0 + ia] * (1 - ta) + gainDbi[r0 + ib] * ta;
      const g1 = gainDbi[r1 + ia] * (1 - ta) + gainDbi[r1 + ib] * ta;
      const te = c.frac[i];
      sum += c.weight[i] * dbToLinear(g0 * (1 - te) + g1 * te);
    }
  }
  return linearToDb(sum);
}

/**
 * Over how many degrees of azimuth (1° steps) pattern A beats pattern B by more than `marginDb`
 * at `elevationDeg`, and the reverse.
 */
export function azimuthAdvantage(
  a: { gainDbi: readonly number[]; rotationDeg: number },
  b: { gainDbi: readonly number[]; rotationDeg: number },
  elevationDeg: number,
  marginDb = 0,
): { aBetterDeg: number; bBetterDeg: number; tiedDeg: number } {
  let aBetter = 0;
  let bBetter = 0;
  for (let az = 0; az < 360; az++) {
    const d =
      gainAt(a.gainDbi, a.rotationDeg, az, elevationDeg) - gainAt(b.gainDbi, b.rotationDeg, az, elevationDeg);
    if (d > marginDb) aBetter++;
    else if (d < -marginDb) bBetter++;
  }
  return { aBetterDeg: aBetter, bBetterDeg: bBetter, tiedDeg: 360 - aBetter - bBetter };
}
