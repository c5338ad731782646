/**
 * Shared pieces of the ground-mounted verticals (the single vertical and the arrays of verticals):
 * the search for free spots on the lot, the radials of each base, and the wires, masts and radials
 * of a group of self-supporting verticals in the canonical frame.
 */
import { boundaryDistance, clearanceRule, clipRadial, keepOutDistance } from '../site/feasibility.ts';
import type { Element, PreparedSite } from '../site/feasibility.ts';
import { boxOf, type XY } from '../site/frame.ts';
import { placeXY } from '../site/geometry.ts';
import { arr, cut, lambdaOf, proposalList, wire } from './common.ts';
import { radialCuts, radialElements, radialsCutAtMidlines, radialsOn } from './radials.ts';
import type {
  AntennaTypeId,
  BuildContext,
  CutItem,
  Design,
  DesignParams,
  HeightItem,
  ModelFeed,
  ModelRadials,
  ModelWire,
  Proposal,
  Rejection,
} from './types.ts';

/** Grid step of the free-spot search, metres. */
export const SPOT_GRID_M = 4;
/** Radials per base counted when scoring a spot (the room for a radial field, not the user's count). */
export const SPOT_SCORE_RADIALS = 8;

/** Whether a mast reaching `heightM` at site point `p` keeps the setback and every keep-out's clearance. */
export function mastFits(site: PreparedSite, p: XY, heightM: number): boolean {
  return (
    boundaryDistance(site, p) >= site.site.settings.setbackM &&
    !site.site.keepOuts.some(
      (k, i) =>
        keepOutDistance(site, i, p) <
        (clearanceRule(k, 'mast', heightM, site.site.settings.buriedClearanceM)?.needM ?? 0),
    )
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
  const { min, max } = boxOf(site.site.boundary);
  const spots: Spot[] = [];
  for (let x = min[0]; x <= max[0]; x += SPOT_GRID_M)
    for (let y = min[1]; y <= max[1]; y += SPOT_GRID_M)
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
 * Where a group of self-supporting verticals goes: the `count` free spots (freeSpots, each mast
 * reaching `mastHeightM`) with the most room for radials of `radialM` (radialRoom), their origins
 * at least `minApartM` apart.
 */
export function arraySpots(
  site: PreparedSite,
  bases: readonly XY[],
  o: { axesDeg: readonly number[]; mastHeightM: number; radialM: number; count: number; minApartM: number },
): Spot[] {
  const spots = freeSpots(site, bases, o.axesDeg, o.mastHeightM, (at, rot) =>
    radialRoom(site, at, rot, o.radialM),
  );
  return pickSpots(spots, o.count, o.minApartM);
}

/** Design parameter holding the radial lengths at the vertical named `name`. */
export const radialKey = (name: string): string => `radialLengths${name}M`;

/**
 * Radial lengths at every base of a group placed at `spot`, as design parameters (radialKey of
 * each name, in order): radialsCutAtMidlines at each base, cut on the lines midway to all the
 * others, `count` radials of `nominalM` each.
 */
export function groupRadials(
  site: PreparedSite,
  spot: { xy: XY; rotationDeg: number },
  bases: readonly XY[],
  names: readonly string[],
  count: number,
  nominalM: number,
): Record<string, number[]> {
  const params: Record<string, number[]> = {};
  bases.forEach((c, i) => {
    params[radialKey(names[i])] = radialsCutAtMidlines(
      (bearingDeg, n) => clipRadial(site, placeXY(c, spot.rotationDeg, spot.xy), bearingDeg, n),
      spot.rotationDeg,
      c,
      bases.filter((_, j) => j !== i),
      count,
      nominalM,
    );
  });
  return params;
}

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

/** Heights of a group of verticals of height H, fed at their bases. */
export function groupHeights(H: number): HeightItem[] {
  return [
    { label: 'feed points (bases)', heightM: 0 },
    { label: 'top of each vertical', heightM: H },
  ];
}

/** Cut list of a group of verticals named `names`: the radiators in one row, then every base's buried radials. */
export function groupCuts(d: Design, H: number, names: readonly string[], radiatorLabel: string): CutItem[] {
  return [cut(radiatorLabel, names.length, H), ...radialCuts(names.flatMap((n) => arr(d, radialKey(n))))];
}

/** An array of self-supporting quarter-wave verticals, as its builder describes it to proposeVerticalArray. */
export interface VerticalArraySpec {
  /** The group in a reason's words ("two quarter-wave verticals"). */
  groupWords: string;
  /** Where it goes, in a rejection ("self-supporting pair at a free spot"). */
  where: string;
  /** Canonical bases and names of the verticals (the radial parameters are named after them). */
  bases: readonly XY[];
  names: readonly string[];
  /** Orientations tried at each spot, how many spots and how far apart their origins at least. */
  axesDeg: readonly number[];
  count: number;
  minApartM: number;
  /** The trim of the verticals' height; every mast must fit at trim.maxM. */
  trim: Design['trim'];
  /** Why nothing was proposed when no spot is free. */
  noSpotReason: string;
  /** The design's parameters other than the radials (which follow them). */
  params: DesignParams;
  states: Design['states'];
  /** The proposal's words and broadside bearings at a spot. */
  describe(spot: Spot): { where: string; broadsideDeg: number[] };
}

/**
 * Proposals of an array of self-supporting verticals: none (with the reason) when its masts
 * exceed the self-supporting limit or no spot is free; else one per spot (arraySpots), its
 * radials a quarter wave unless the lot clips them, cut and bonded midway between the bases.
 */
export function proposeVerticalArray(
  type: AntennaTypeId,
  { site, band }: BuildContext,
  a: VerticalArraySpec,
): { proposals: Proposal[]; rejections: Rejection[] } {
  const out = proposalList(type, band);
  const st = site.site.settings;
  const nominal = a.trim.nominalM;
  if (nominal > st.maxVerticalHeightM) {
    out.reject(
      [],
      a.where,
      `${a.groupWords} (about ${nominal.toFixed(1)} m) are taller than your ${st.maxVerticalHeightM.toFixed(1)} m self-supporting limit`,
    );
    return out.result();
  }
  const radialM = 0.25 * band.wavelengthM;
  const chosen = arraySpots(site, a.bases, {
    axesDeg: a.axesDeg,
    mastHeightM: a.trim.maxM,
    radialM,
    count: a.count,
    minApartM: a.minApartM,
  });
  if (chosen.length === 0) out.reject([], a.where, a.noSpotReason);
  chosen.forEach((spot, k) => {
    out.proposals.push({
      design: out.design(
        { ...a.params, ...groupRadials(site, spot, a.bases, a.names, st.radialCount, radialM) },
        { ...a.trim, maxM: Math.min(a.trim.maxM, st.maxVerticalHeightM) },
        a.states,
      ),
      placement: { originXY: spot.xy, rotationDeg: spot.rotationDeg },
      supports: [],
      groupKey: `${type}:free:${k}`,
      ...a.describe(spot),
    });
  });
  return out.result();
}
