/**
 * Two-element loop array (issue 16): a driven full-wave loop and a parasitic reflector loop,
 * each a vertical diamond hung by its top corner from one of two supports that stand
 * REFLECTOR_SPACING_WAVELENGTHS apart (0.1–0.25 λ, the range the half-square arrays use). The
 * loops' planes stand across the line between the supports, so the beam runs along it, from the
 * reflector's support over the driven one. One direction; both ways round are proposed (either
 * support's loop driven), the planner keeps the better.
 *
 * The builder's form (common practice, no source): a diamond needs one support per loop (a square
 * loop would need two each), its side corners are pulled out by ropes to ground anchors and its
 * bottom corner tied down; fed at a side corner it radiates vertically polarised, which is what a
 * low-band loop at these heights is built for (fed at the bottom corner it would be horizontally
 * polarised and, at under half a wave up, radiate mostly upward). The feed impedance (some
 * 100–150 Ω alone, lower with the reflector close) is left to the designed match (core/match).
 *
 * Trim: the driven loop's side, to resonance at the design frequency (the planner's secant
 * trim, core/rank/evaluate.ts); the reflector is REFLECTOR_SIDE_RATIO times as large (a closed
 * loop, no stub), so it scales with the trim. Its top corner hangs at the same height as the
 * driven loop's, the lower of the two supports' usable heights (a rope up to the taller one), so
 * its bottom corner is the lowest point and must clear the end height.
 *
 * Canonical frame: the driven loop in the plane y = +s/2, the reflector in y = −s/2, both
 * centred on x = 0; each top corner at height h on its support; the driven loop's feed at its
 * +x side corner. The beam points toward canonical north.
 */
import type { Element, PreparedSite } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import type { XYZ } from '../site/geometry.ts';
import { bearingOf, dist2 } from '../site/geometry.ts';
import { arr, cut, lambdaOf, num, proposalList, round, supportPairs, wire } from './common.ts';
import { REFLECTOR_SPACING_WAVELENGTHS } from './halfSquareArrays.ts';
import type { BandPlan, Builder, Design, ModelWire, Proposal, WireModel } from './types.ts';

export const LOOP_ARRAY_TYPE = 'loop-reflector';
/**
 * Nominal side of the driven loop, wavelengths: a full-wave loop resonates a little above one
 * wavelength of perimeter (common practice, no source); the planner trims it.
 */
export const LOOP_SIDE_WAVELENGTHS = 0.255;
/** Trim limits of the side, wavelengths. */
export const LOOP_SIDE_LIMITS = { min: 0.22, max: 0.29 } as const;
/**
 * The reflector's side over the driven loop's: chosen from a sweep of the field solver (40 m,
 * average soil, top corners at 20 m, 0.15 λ apart, ratios 1.00 to 1.10, the driven loop trimmed
 * each time): 15° forward gain 5.29 dBi at 1.03 and 1.04, 5.07 at 1.05, 4.51 at 1.06; front-to-back
 * at 15° 10.3 dB at 1.03, 15.5 dB at 1.04, 31 dB at 1.05; feed 92, 113, 145 Ω. 1.04 keeps the
 * best forward gain with a 15 dB rear. test/unit/antennas/loopArray.test.ts checks the forward
 * gain and the front-to-back ratio.
 */
export const REFLECTOR_SIDE_RATIO = 1.04;
/** The side corners' ropes run outward and down at this angle below horizontal to ground anchors (a chosen value). */
export const SIDE_ROPE_DROOP_DEG = 60;
/** Proposals kept per band: the pairs nearest 0.15 λ apart, then the highest. */
export const LOOP_PROPOSALS_PER_BAND = 3;

/** The corners of a diamond of side `side` hung by its top corner at (0, y, h): top, +x side, bottom, −x side. */
function diamond(y: number, h: number, side: number): { top: XYZ; right: XYZ; bottom: XYZ; left: XYZ } {
  const a = side / Math.SQRT2;
  return { top: [0, y, h], right: [a, y, h - a], bottom: [0, y, h - 2 * a], left: [-a, y, h - a] };
}

/** The two diamonds of a design at driven side `side` (the trim). */
function loops(d: Design, side: number) {
  const s = num(d, 'spacingM');
  const h = num(d, 'heightM');
  return {
    driven: diamond(s / 2, h, side),
    reflector: diamond(-s / 2, h, side * num(d, 'reflectorRatio')),
  };
}

/** A diamond's four wires, the +x side corner first (the driven loop's feed is at wire 0's start). */
function loopWires(k: ReturnType<typeof diamond>, lambda: number, name: string): ModelWire[] {
  return [
    wire(k.right, k.bottom, lambda, `${name} lower right side`),
    wire(k.bottom, k.left, lambda, `${name} lower left side`),
    wire(k.left, k.top, lambda, `${name} upper left side`),
    wire(k.top, k.right, lambda, `${name} upper right side`),
  ];
}

function loopModel(d: Design, side: number): WireModel {
  const { driven, reflector } = loops(d, side);
  const lambda = lambdaOf(d);
  return {
    wires: [...loopWires(driven, lambda, 'driven loop'), ...loopWires(reflector, lambda, 'reflector loop')],
    feeds: [{ wire: 0, position: 0 }],
    radials: [],
  };
}

/** Where a side corner's rope meets the ground: outward from the corner at SIDE_ROPE_DROOP_DEG. */
function anchorOf(corner: XYZ, outward: number): XYZ {
  const run = corner[2] / Math.tan((SIDE_ROPE_DROOP_DEG * Math.PI) / 180);
  return [corner[0] + outward * run, corner[1], 0];
}

function loopElements(d: Design, side: number): Element[] {
  const { driven, reflector } = loops(d, side);
  const heights = arr(d, 'supportHeightsM');
  const one = (
    k: ReturnType<typeof diamond>,
    name: string,
    supportHeightM: number,
    id: string,
  ): Element[] => {
    const [ar, al] = [anchorOf(k.right, 1), anchorOf(k.left, -1)];
    const at: XY = [k.top[0], k.top[1]];
    return [
      { kind: 'wire', label: `${name} upper sides`, role: 'top-wire', from: k.left, to: k.top },
      { kind: 'wire', label: `${name} upper sides`, role: 'top-wire', from: k.top, to: k.right },
      { kind: 'wire', label: `${name} lower sides`, from: k.right, to: k.bottom },
      { kind: 'wire', label: `${name} lower sides`, from: k.bottom, to: k.left },
      { kind: 'end', label: `${name} bottom corner`, at: k.bottom },
      { kind: 'rope', label: `${name} bottom tie-down`, from: k.bottom, to: [k.bottom[0], k.bottom[1], 0] },
      { kind: 'rope', label: `${name} right corner rope`, from: k.right, to: ar },
      { kind: 'anchor', label: `${name} right corner anchor`, at: ar },
      { kind: 'rope', label: `${name} left corner rope`, from: k.left, to: al },
      { kind: 'anchor', label: `${name} left corner anchor`, at: al },
      { kind: 'support', label: `support of the ${name}`, supportId: id, at, heightM: supportHeightM },
      ...(supportHeightM - k.top[2] > 0.05
        ? [
            {
              kind: 'rope' as const,
              label: `${name} rope to its support`,
              from: k.top,
              to: [at[0], at[1], supportHeightM] as XYZ,
            },
          ]
        : []),
    ];
  };
  return [
    ...one(driven, 'driven loop', heights[0], 'D'),
    ...one(reflector, 'reflector loop', heights[1], 'R'),
  ];
}

/** Support height a pair needs: the reflector's bottom corner at the end height with the driven loop at its nominal side. */
export function loopHeightNeededM(lambda: number, endHeightM: number): number {
  return endHeightM + Math.SQRT2 * REFLECTOR_SIDE_RATIO * LOOP_SIDE_WAVELENGTHS * lambda;
}

function proposeLoops(site: PreparedSite, band: BandPlan): ReturnType<Builder['propose']> {
  const type = LOOP_ARRAY_TYPE;
  const out = proposalList(type, band);
  const st = site.site.settings;
  const lambda = band.wavelengthM;
  const { min, max } = REFLECTOR_SPACING_WAVELENGTHS;
  const need = loopHeightNeededM(lambda, st.minEndHeightM);
  const pairs = supportPairs(site.site.supports).map(([a, b]) => ({
    a,
    b,
    s: dist2(a.xy, b.xy),
    h: Math.min(a.heightM, b.heightM),
  }));
  const inRange = pairs.filter((p) => p.s >= min * lambda && p.s <= max * lambda);
  const apart = `${(min * lambda).toFixed(1)}–${(max * lambda).toFixed(1)} m (${min}–${max} λ) apart`;
  const needWords = `needs two supports of ${need.toFixed(1)} m standing ${apart} (a ${(LOOP_SIDE_WAVELENGTHS * lambda).toFixed(1)} m-sided diamond and a reflector ${REFLECTOR_SIDE_RATIO} times as large, bottom corner at the ${st.minEndHeightM.toFixed(1)} m end height)`;
  if (inRange.length === 0) {
    // the nearest miss by spacing, among pairs tall enough if any
    const tall = pairs.filter((p) => p.h >= need);
    const pool = tall.length ? tall : pairs;
    const off = (p: (typeof pairs)[number]) =>
      p.s < min * lambda ? (min * lambda - p.s) / (min * lambda) : (p.s - max * lambda) / (max * lambda);
    const near = pool.sort((p, q) => off(p) - off(q))[0];
    if (!near) out.reject([], 'two supports', `${needWords}; the lot has fewer than two supports`);
    else
      out.rejectBy(
        off(near),
        [near.a.id, near.b.id],
        `on ${near.a.name} and ${near.b.name}`,
        `${needWords}; no two supports here stand at that spacing (nearest: ${near.a.name} and ${near.b.name}, ${near.s.toFixed(1)} m apart)`,
      );
    return out.result();
  }
  const tallEnough = inRange.filter((p) => p.h >= need);
  if (tallEnough.length === 0) {
    const best = inRange.sort((p, q) => q.h - p.h)[0];
    out.rejectBy(
      (need - best.h) / need,
      [best.a.id, best.b.id],
      `on ${best.a.name} and ${best.b.name}`,
      `${needWords}; the tallest such pair here is ${best.h.toFixed(1)} m`,
    );
    return out.result();
  }
  tallEnough.sort((p, q) => Math.abs(p.s / lambda - 0.15) - Math.abs(q.s / lambda - 0.15) || q.h - p.h);
  for (const { a, b, s, h } of tallEnough.slice(0, LOOP_PROPOSALS_PER_BAND)) {
    const groupKey = `${type}:${[a.id, b.id].sort().join(':')}`;
    const maxSide = (h - st.minEndHeightM) / (Math.SQRT2 * REFLECTOR_SIDE_RATIO);
    // either support's loop driven: canonical +y from the reflector's support to the driven one's
    for (const [dr, rf] of [
      [a, b],
      [b, a],
    ]) {
      const rot = bearingOf(rf.xy, dr.xy);
      const design = out.design(
        {
          spacingM: round(s, 2),
          heightM: h,
          reflectorRatio: REFLECTOR_SIDE_RATIO,
          supportHeightsM: [dr.heightM, rf.heightM],
        },
        {
          name: "side of the driven loop (the reflector's follows)",
          nominalM: LOOP_SIDE_WAVELENGTHS * lambda,
          minM: LOOP_SIDE_LIMITS.min * lambda,
          maxM: Math.min(LOOP_SIDE_LIMITS.max * lambda, maxSide),
        },
      );
      const p: Proposal = {
        design,
        placement: { originXY: [(a.xy[0] + b.xy[0]) / 2, (a.xy[1] + b.xy[1]) / 2], rotationDeg: rot },
        supports: [dr.id, rf.id],
        groupKey,
        where: `driven loop on ${dr.name}, reflector loop on ${rf.name} ${s.toFixed(1)} m behind, beam toward ${rot.toFixed(0)}°`,
        broadsideDeg: [round(rot, 1)],
      };
      out.proposals.push(p);
    }
  }
  return out.result();
}

export const loopArrayBuilder: Builder = {
  type: LOOP_ARRAY_TYPE,
  label:
    'Two-element loop array: a driven full-wave diamond loop and a reflector loop, hung from two supports',
  array: true,
  elementCount: 2,
  propose: ({ site, band }) => proposeLoops(site, band),
  model: loopModel,
  elements: loopElements,
  heights(d, side) {
    const { driven, reflector } = loops(d, side);
    return [
      { label: 'top corners', heightM: driven.top[2] },
      { label: 'fed side corner', heightM: driven.right[2] },
      { label: 'bottom corner of the driven loop', heightM: driven.bottom[2] },
      { label: 'bottom corner of the reflector loop', heightM: reflector.bottom[2] },
    ];
  },
  cutList(d, side) {
    const r = side * num(d, 'reflectorRatio');
    return [
      cut('driven loop (one length round the four sides, both ends at the feed)', 1, 4 * side),
      cut('reflector loop (one length round the four sides, ends joined)', 1, 4 * r),
    ];
  },
};
