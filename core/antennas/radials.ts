/**
 * Radials of ground-mounted radiators (verticals, the inverted-L): their lengths as the lot clips
 * them, their elements on the site, the solver's radial set and the cut list.
 */
import type { Element } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import type { XYZ } from '../site/geometry.ts';
import { cut, round } from './common.ts';
import type { CutItem, ModelRadials, ModelWire, WireModel } from './types.ts';

/** Radial wire radius: 1.6 mm diameter (common practice, no source). */
export const RADIAL_RADIUS_M = 0.0008;

/**
 * Radial elements of a ground system at `base` (canonical), lengths in canonical bearing order k·360°/N
 * (a length of 0 is a radial left out: it keeps its bearing's place and lays nothing).
 */
export function radialElements(lengthsM: readonly number[], base: XYZ = [0, 0, 0]): Element[] {
  const n = lengthsM.length;
  const out: Element[] = [];
  lengthsM.forEach((len, k) => {
    if (len <= 0) return;
    const b = (k * 2 * Math.PI) / n;
    out.push({
      kind: 'radial' as const,
      label: `radial ${k + 1}`,
      from: base,
      to: [base[0] + len * Math.sin(b), base[1] + len * Math.cos(b), 0] as XYZ,
    });
  });
  return out;
}

/** Shortest radial worth laying, metres; shorter clipped radials are left out (common practice, no source). */
export const MIN_RADIAL_M = 1;

/**
 * Radial lengths for a ground system at site point `baseXY`, `count` radials of `nominalM` at equal
 * bearings from canonical north (site bearing = canonical + rotationDeg), each clipped by the lot and
 * keep-outs. Radials shorter than MIN_RADIAL_M are left out: their length is 0, so that every
 * other radial keeps its bearing (the elements, the drawings and the build sheet read the bearing
 * from the position in the list).
 */
export function clippedRadials(
  clip: (bearingDeg: number, nominalM: number) => number,
  rotationDeg: number,
  count: number,
  nominalM: number,
): number[] {
  const out: number[] = [];
  for (let k = 0; k < count; k++) {
    const len = clip(rotationDeg + (k * 360) / count, nominalM);
    out.push(len >= MIN_RADIAL_M ? round(len, 2) : 0);
  }
  return out;
}

/** The solver's radial set at the base of wire `wireIndex` (none when every radial was clipped away). */
export function radialsOn(wireIndex: number, lengthsM: number[]): ModelRadials[] {
  const laid = lengthsM.filter((l) => l > 0);
  if (!laid.length) return [];
  const set: ModelRadials = { wire: wireIndex, count: laid.length, lengthsM: laid, radiusM: RADIAL_RADIUS_M };
  // Some left out: the others are not equally spaced; say where they lie.
  if (laid.length < lengthsM.length)
    set.bearingsDeg = lengthsM.flatMap((l, k) => (l > 0 ? [(k * 360) / lengthsM.length] : []));
  return [set];
}

/** A ground-mounted radiator: fed at the base of its first wire, against radials of these lengths there. */
export function baseFedModel(wires: ModelWire[], radialLengthsM: number[]): WireModel {
  return { wires, feeds: [{ wire: 0, position: 0 }], radials: radialsOn(0, radialLengthsM) };
}

/** Cut-list rows of buried radials: one row per length, longest first. */
export function radialCuts(lengthsM: readonly number[]): CutItem[] {
  const byLen = new Map<number, number>();
  for (const l of lengthsM) if (l > 0) byLen.set(l, (byLen.get(l) ?? 0) + 1);
  return [...byLen.entries()]
    .sort((p, q) => q[0] - p[0])
    .map(([l, n]) => cut('buried radial', n, l, 1, 'radial'));
}

/**
 * Radial lengths at one base (canonical `base`), in canonical bearing order k·360°/N: a quarter
 * wave unless the lot clips it (`clip` takes the site bearing), and cut where it meets the line
 * midway to any other element (`others`, canonical), where the fields are bonded.
 */
export function radialsCutAtMidlines(
  clip: (bearingDeg: number, nominalM: number) => number,
  rotationDeg: number,
  base: XY,
  others: readonly XY[],
  count: number,
  nominalM: number,
): number[] {
  const out: number[] = [];
  for (let k = 0; k < count; k++) {
    const b = (2 * Math.PI * k) / count;
    const ux = Math.sin(b);
    const uy = Math.cos(b);
    let meet = Infinity;
    for (const o of others) {
      const dx = o[0] - base[0];
      const dy = o[1] - base[1];
      const along = ux * dx + uy * dy;
      if (along > 1e-9) meet = Math.min(meet, (dx * dx + dy * dy) / (2 * along));
    }
    const len = Math.min(clip(rotationDeg + (k * 360) / count, nominalM), meet);
    out.push(len >= MIN_RADIAL_M ? round(len, 2) : 0);
  }
  return out;
}
