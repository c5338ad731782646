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
