/**
 * Standing-wave ratio, in one place: the SWR of a feed impedance on a line, and the N:1 SWR
 * band edges of any SWR curve (solved sweep or fitted curve alike). The solver's sweeps, the
 * planner's bandwidth and the plan host's SWR curve all use these.
 *
 * SWR = (1 + |Γ|)/(1 − |Γ|), Γ = (Z − Z0)/(Z + Z0) for a real line impedance Z0 (Pozar,
 * Microwave Engineering, 4th ed. (2012), eqs. 2.35 and 2.41).
 */
import { brentRoot } from '../numeric/roots.ts';

/** Largest SWR reported; a total reflection (|Γ| ≥ 1) reads as this value. */
export const SWR_CAP = 1e6;

/** Reference impedance of the SWR when the caller names none, ohms (50 Ω coax). */
export const DEFAULT_REFERENCE_OHM = 50;

/** SWR of impedance r + jx on a line of real impedance z0. */
export function swrOf(r: number, x: number, z0: number): number {
  const nr = r - z0;
  const dr = r + z0;
  const g = Math.sqrt((nr * nr + x * x) / (dr * dr + x * x));
  if (!(g < 1)) return SWR_CAP;
  return Math.min(SWR_CAP, (1 + g) / (1 - g));
}

export interface SwrEdges {
  /** Index of the sample the search walked out from. */
  centre: number;
  lowerHz: number | null;
  upperHz: number | null;
}

/**
 * The N:1 SWR band edges of a curve sampled at increasing frequencies `fs` (values `s`): from the
 * centre sample (the lowest SWR, or the one nearest `centreHz` when given) walk out to the first
 * sample at or above N on each side and find the crossing between it and its neighbour by
 * Brent's method to `tolHz`. An edge is null when the curve stays below N to the end of the
 * samples, and both are null when the centre itself is at or above N.
 */
export function swrEdges(
  swrAt: (fHz: number) => number,
  fs: readonly number[],
  s: readonly number[],
  ratio: number,
  tolHz: number,
  centreHz?: number,
): SwrEdges {
  let c = 0;
  fs.forEach((f, i) => {
    if (centreHz === undefined ? s[i] < s[c] : Math.abs(f - centreHz) < Math.abs(fs[c] - centreHz)) c = i;
  });
  let lowerHz: number | null = null;
  let upperHz: number | null = null;
  if (s[c] < ratio) {
    const cross = (i: number, j: number): number =>
      brentRoot((f) => swrAt(f) - ratio, fs[i], fs[j], tolHz, 60, s[i] - ratio, s[j] - ratio).x;
    for (let i = c; i > 0; i--)
      if (s[i - 1] >= ratio) {
        lowerHz = cross(i - 1, i);
        break;
      }
    for (let i = c; i + 1 < fs.length; i++)
      if (s[i + 1] >= ratio) {
        upperHz = cross(i, i + 1);
        break;
      }
  }
  return { centre: c, lowerHz, upperHz };
}
