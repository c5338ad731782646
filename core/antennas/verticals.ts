/**
 * Shared pieces of the ground-mounted verticals (the single vertical and the arrays of verticals):
 * the search for free spots on the lot, the radials of each base, and the wires, masts and radials
 * of a group of self-supporting verticals in the canonical frame.
 */
import { boundaryDistance, clipRadial, keepOutDistance, requiredClearance } from '../site/feasibility.ts';
import type { Element, PreparedSite } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { placeXY } from '../site/geometry.ts';
import { MIN_RADIAL_M, arr, lambdaOf, radialElements, radialsOn, round, wire } from './common.ts';
import type { Design, ModelFeed, ModelRadials, ModelWire } from './types.ts';

/** Grid step of the free-spot search, metres. */
export const SPOT_GRID_M = 4;
/** Radials per base counted when scoring a spot (the room for a radial field, not the user's count). */
export const SPOT_SCORE_RADIALS = 8;

/** Whether a mast reaching `heightM` at site point `p` keeps the setback and every keep-out's clearance. */
export function mastFits(site: PreparedSite, p: XY, heightM: number): boolean {
  return (
    boundaryDistance(site, p) >= site.site.settings.setbackM &&
    !site.site.keepOuts.some((k, i) => keepOutDistance(site, i, p) < requiredClearance(k, heightM))
  );
}

export interface Spot {
  /** Site point of the group's canonical origin. */
  xy: XY;
  /** Compass rotation of the group's canonical frame. */
  rotationDeg: number;
  score: number;
}

/**
 * Free spots for a group of masts: each point of a SPOT_GRID_M grid over the lot's bounding box,
 * turned by each of `axesDeg`, where every base of `bases` (canonical) fits a mast of `heightM`;
 * scored by `score` (the bases on the site, the rotation), best first (grid order among equals).
 */
export function freeSpots(
  site: PreparedSite,
  bases: readonly XY[],
  axesDeg: readonly number[],
  heightM: number,
  score: (at: XY[], rotationDeg: number) => number,
): Spot[] {
  const xs = site.site.boundary.map((p) => p[0]);
  const ys = site.site.boundary.map((p) => p[1]);
  const spots: Spot[] = [];
  for (let x = Math.min(...xs); x <= Math.max(...xs); x += SPOT_GRID_M)
    for (let y = Math.min(...ys); y <= Math.max(...ys); y += SPOT_GRID_M)
      for (const rotationDeg of axesDeg) {
        const xy: XY = [x, y];
        const at = bases.map((c) => placeXY(c, rotationDeg, xy));
        if (!at.every((p) => mastFits(site, p, heightM))) continue;
        spots.push({ xy, rotationDeg, score: score(at, rotationDeg) });
      }
  return spots.sort((p, q) => q.score - p.score);
}

/** The first `count` spots (best first) whose origins lie at least `minApartM` from every one taken. */
export function pickSpots(spots: readonly Spot[], count: number, minApartM: number): Spot[] {
  const chosen: Spot[] = [];
  for (const sp of spots) {
    if (chosen.length >= count) break;
    if (chosen.some((c) => Math.hypot(c.xy[0] - sp.xy[0], c.xy[1] - sp.xy[1]) < minApartM)) continue;
    chosen.push(sp);
  }
  return chosen;
}

/** Spot score of an array: the radial reach the lot leaves at every base, SPOT_SCORE_RADIALS bearings each. */
export function radialRoom(
  site: PreparedSite,
  at: readonly XY[],
  rotationDeg: number,
  nominalM: number,
): number {
  let total = 0;
  for (const p of at)
    for (let k = 0; k < SPOT_SCORE_RADIALS; k++)
      total += clipRadial(site, p, rotationDeg + (k * 360) / SPOT_SCORE_RADIALS, nominalM);
  return total;
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
    if (len >= MIN_RADIAL_M) out.push(round(len, 2));
  }
  return out;
}

/**
 * Radial lengths at every base of a group placed at `spot` (radialsCutAtMidlines at each base,
 * cut on the lines midway to all the others), `count` radials of `nominalM` each.
 */
export function groupRadials(
  site: PreparedSite,
  spot: { xy: XY; rotationDeg: number },
  bases: readonly XY[],
  count: number,
  nominalM: number,
): number[][] {
  return bases.map((c, i) =>
    radialsCutAtMidlines(
      (bearingDeg, n) => clipRadial(site, placeXY(c, spot.rotationDeg, spot.xy), bearingDeg, n),
      spot.rotationDeg,
      c,
      bases.filter((_, j) => j !== i),
      count,
      nominalM,
    ),
  );
}

/** Design parameter holding the radial lengths at the vertical named `name`. */
export const radialKey = (name: string): string => `radialLengths${name}M`;

/**
 * Wires of verticals of height H at canonical `bases` (named `vertical <name>`), each fed at its
 * base against its radials (design parameter radialKey(name)).
 */
export function verticalsModel(
  d: Design,
  H: number,
  bases: readonly XY[],
  names: readonly string[],
): { wires: ModelWire[]; feeds: ModelFeed[]; radials: ModelRadials[] } {
  const lambda = lambdaOf(d);
  return {
    wires: bases.map((c, i) => wire([c[0], c[1], 0], [c[0], c[1], H], lambda, `vertical ${names[i]}`)),
    feeds: bases.map((_, i) => ({ wire: i, position: 0 })),
    radials: names.flatMap((n, i) => radialsOn(i, arr(d, radialKey(n)))),
  };
}

/** The wire, the mast and the radials of the self-supporting vertical `name` of height H at canonical `base`. */
export function verticalParts(
  d: Design,
  H: number,
  base: XY,
  name: string,
): { wire: Element; mast: Element; radials: Element[] } {
  return {
    wire: { kind: 'wire', label: `vertical ${name}`, from: [base[0], base[1], 0], to: [base[0], base[1], H] },
    mast: { kind: 'mast', label: `self-supporting vertical ${name}`, at: base, heightM: H },
    radials: radialElements(arr(d, radialKey(name)), [base[0], base[1], 0]).map((e) => ({
      ...e,
      label: `${name} ${e.label}`,
    })),
  };
}
