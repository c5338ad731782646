/**
 * Arrays of half-squares hung from the lot's supports (issue 16):
 *
 *  - `half-square-reflector`: two half-squares on four supports standing near a rectangle, one
 *    driven and one a parasitic reflector behind it, one direction. The reflector is an identical
 *    half-square whose corner gap is closed by a short shorted coax stub (an inductive load that
 *    makes it electrically longer: a reflector); the stub is built at the reflector's corner.
 *  - `half-square-switched`: the same two half-squares with a relay box on the ground between the
 *    two fed corners; each corner is joined to the box by coax of a whole number of electrical
 *    half waves (it repeats the corner's impedance at the box, so the stub at the box loads the
 *    reflector as if it were at its corner, and the station line meets the driven element's own
 *    impedance; common practice, no source). The relay connects one line to the station line and
 *    the other to the stub: either half-square drives, the other reflects (two directions).
 *  - `half-square-l`: two half-squares at 90° on three supports in an L (the corner support holds
 *    one end of each), a relay box at the corner support's base; the relay connects the station
 *    line to one element and leaves the other open at the box. Its line is a whole number of
 *    electrical half waves, so the idle element is open at its corner too (an open line of any
 *    other length would load the idle element and make it a parasitic element by accident).
 *
 * Why these arrangements: the corner feed of the single half-square (core/antennas/halfSquare.ts)
 * is kept, so each element is the registry's half-square; the relay box sits on the ground where
 * the coax from both fed corners meets (common practice, no source). The coax slopes from each fed
 * corner straight down to the box, pulled away from the fed drop; the model has the lines with their loss
 * (core/em/network.ts), the relay contacts are ideal, and common-mode current on the shields is
 * not modelled (as for every feed in the solver).
 *
 * Modelled geometry: the array is idealised to exact right angles (the rectangle's two top wires
 * parallel, the L's legs at 90°), both elements identical (top wire half a wave, at the lowest of
 * the supports' usable heights, drops the trim dimension). Each top wire really hangs on the line
 * between its two supports, tied by ropes; a placement is proposed only when every modelled top
 * wire end lies within PLACEMENT_TOL_WAVELENGTHS of that line (the error of the idealisation),
 * and every rope, end, drop and coax run passes the lot's feasibility rules.
 *
 * States: the switched pair is symmetric under the mirror across its centre line (the canonical
 * x axis), the L under the mirror across the bisector of its corner (canonical bearing 45°); one
 * solve serves both states (core/rank/states.ts `statePattern`).
 *
 * Canonical frames. Rectangle: element A (driven in state 1) along x at y = +s/2, element B
 * (reflector) at y = −s/2, both centred on x = 0 and fed at their −x corner; state 1 beams toward
 * canonical north (from B over A). L: corner support K at the origin; element 1 along +x from
 * x = c to c + T at y = 0 (fed at x = c), element 2 along +y (fed at y = c), the relay box on the
 * ground at (c/2, c/2) between the feet of the fed drops; state 1 drives element 1 (broadside
 * toward canonical north and south).
 */
import type { Element, PreparedSite } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { bearingOf, dist2, placeXY, type XYZ } from '../site/geometry.ts';
import type { NetworkSpec } from '../em/network.ts';
import { whereToChange } from '../project/settingLimits.ts';
import { arr, coaxCut, cut, lambdaOf, num, proposalList, round, supportPairs, wire } from './common.ts';
import { sides, TOP_FRACTION, type Side } from './halfSquare.ts';
import {
  COAX_LINE,
  COAX_VELOCITY_FACTOR,
  halfWaveCoaxM,
  linesNetwork,
  pairNetwork,
  stubLengthM,
} from './verticalPair.ts';
import type {
  AntennaTypeId,
  BandPlan,
  Builder,
  CutItem,
  Design,
  ModelWire,
  Proposal,
  Rejection,
  WireModel,
} from './types.ts';

/** Largest distance between a modelled top-wire end and its support line, in wavelengths (a chosen bound). */
export const PLACEMENT_TOL_WAVELENGTHS = 0.025;
/** Spacing of the rectangle's two top wires, wavelengths: the range a parasitic pair is built in (common practice, no source). */
export const REFLECTOR_SPACING_WAVELENGTHS = { min: 0.1, max: 0.25 } as const;
/**
 * Loading reactance of the reflector's stub at its corner, ohms, by spacing (wavelengths): near
 * the most 15° forward gain over very good ground, leaning toward the deeper rear null where the
 * gain differs by under 0.1 dB, found by a sweep of the field solver at 80 m (two identical
 * half-squares at 24 m; test/unit/antennas/halfSquareArrays.test.ts checks that the design stays
 * within 0.3 dB of the best in a fresh sweep). Linear between the points.
 */
export const REFLECTOR_REACTANCE_BY_SPACING: readonly (readonly [number, number])[] = [
  [0.1, 45],
  [0.15, 42],
  [0.2, 32],
  [0.25, 17],
];
/** Pairs of spans (or legs) further than this from parallel (or from a right angle) are not looked at; nearer ones are judged by PLACEMENT_TOL_WAVELENGTHS. */
export const MAX_SKEW_DEG = 20;
/** The L's inner drops keep at least this far apart, wavelengths (a chosen bound: their lower ends carry high voltage). */
export const L_INNER_GAP_WAVELENGTHS = 0.03;
/** Slack on each coax run between a fed corner and the relay box, metres (common practice, no source). */
export const COAX_RUN_SLACK_M = 1;
/** Proposals kept per band and type, best first (the nearest to 0.15 λ spacing and the highest). */
export const ARRAY_PROPOSALS_PER_BAND = 3;

const coax = COAX_LINE;

/** Two elements' wires, each fed at its first wire's start, joined by `network`. */
function twoFedElements(a: ModelWire[], b: ModelWire[], network: NetworkSpec): WireModel {
  return {
    wires: [...a, ...b],
    feeds: [
      { wire: 0, position: 0 },
      { wire: a.length, position: 0 },
    ],
    radials: [],
    network,
  };
}

/** Loading reactance for a spacing in wavelengths (REFLECTOR_REACTANCE_BY_SPACING, clamped). */
export function reflectorReactanceOhm(spacingWavelengths: number): number {
  const t = REFLECTOR_REACTANCE_BY_SPACING;
  if (spacingWavelengths <= t[0][0]) return t[0][1];
  for (let i = 1; i < t.length; i++) {
    if (spacingWavelengths <= t[i][0]) {
      const [x0, y0] = t[i - 1];
      const [x1, y1] = t[i];
      return y0 + ((y1 - y0) * (spacingWavelengths - x0)) / (x1 - x0);
    }
  }
  return t[t.length - 1][1];
}

/** Coax from a fed corner to the box: the smallest whole number of electrical half waves that reaches. */
export function halfWaveMultipleM(runM: number, freqHz: number): number {
  const half = halfWaveCoaxM(freqHz);
  return half * Math.max(1, Math.ceil((runM + COAX_RUN_SLACK_M) / half));
}

/** Where one half-square of the array sits: a map from the single half-square's frame (along x, y = 0). */
type Mapper = (p: XYZ) => XYZ;

const shiftY =
  (dy: number): Mapper =>
  (p) => [p[0], p[1] + dy, p[2]];
/** Along +y instead of +x, moved out by `dx` (the L's second element). */
const alongY =
  (dx: number): Mapper =>
  (p) => [p[1], p[0] + dx, p[2]];
const alongX =
  (dx: number): Mapper =>
  (p) => [p[0] + dx, p[1], p[2]];

/** One element's wires (fed drop first) in the array's frame. */
function elementWires(d: Design, dropM: number, m: Mapper, name: string): ModelWire[] {
  const lambda = lambdaOf(d);
  const { top, A, B } = sides(d, dropM);
  const w = (a: XYZ, b: XYZ, label: string): ModelWire => wire(m(a), m(b), lambda, `${name} ${label}`);
  const out = [
    w(A.corner, A.bottom, 'fed drop'),
    w(top[0], top[1], 'top wire'),
    w(B.corner, B.bottom, 'far drop'),
  ];
  if (A.bent) out.push(w(A.bottom, A.end, 'bent end (fed side)'));
  if (B.bent) out.push(w(B.bottom, B.end, 'bent end (far side)'));
  return out;
}

/** One element's wires, ends and tie-downs, and the ropes from its top-wire ends to its supports. */
function elementParts(
  d: Design,
  dropM: number,
  m: Mapper,
  name: string,
  supportsAt: readonly [XY, XY],
): Element[] {
  const { top, A, B } = sides(d, dropM);
  const part = (s: Side, which: string): Element[] => [
    { kind: 'wire', label: `${name} drop (${which})`, from: m(s.corner), to: m(s.bottom) },
    ...(s.bent
      ? [{ kind: 'wire' as const, label: `${name} bent end (${which})`, from: m(s.bottom), to: m(s.end) }]
      : []),
    { kind: 'end', label: `${name} lower end (${which})`, at: m(s.end) },
    { kind: 'rope', label: `${name} tie-down (${which})`, from: m(s.end), to: m([s.end[0], 0, 0]) },
  ];
  const h = top[0][2];
  const ends = [m(top[0]), m(top[1])];
  return [
    { kind: 'wire', label: `${name} top wire`, role: 'top-wire', from: ends[0], to: ends[1] },
    ...part(A, 'fed side'),
    ...part(B, 'far side'),
    ...supportsAt.flatMap((sxy, i): Element[] =>
      dist2(sxy, [ends[i][0], ends[i][1]]) > 0.05
        ? [{ kind: 'rope', label: `${name} rope to its support`, from: [sxy[0], sxy[1], h], to: ends[i] }]
        : [],
    ),
  ];
}

function supportsOf(d: Design): { at: XY; heightM: number }[] {
  const xy = arr(d, 'supportsXY');
  const hs = arr(d, 'supportHeightsM');
  return hs.map((h, i) => ({ at: [xy[2 * i], xy[2 * i + 1]], heightM: h }));
}

const supportElements = (d: Design, ids: readonly string[]): Element[] =>
  supportsOf(d).map((s, i) => ({
    kind: 'support',
    label: `support ${ids[i]}`,
    supportId: ids[i],
    at: s.at,
    heightM: s.heightM,
  }));

/** Coax from a fed corner straight to the box on the ground (sloping away from the fed drop). */
function coaxRun(corner: XYZ, box: XY, label: string): Element[] {
  return [{ kind: 'coax', label, from: corner, to: [box[0], box[1], 0] }];
}

const runLength = (corner: XYZ, box: XY): number =>
  Math.hypot(corner[0] - box[0], corner[1] - box[1], corner[2]);

/* ------------------------------------------------------------------------------------------ */
/* Rectangle: reflector (fixed) and switched pair                                             */

const RECT_IDS = ['A1', 'A2', 'B1', 'B2'] as const;

function rectMappers(d: Design): [Mapper, Mapper] {
  const s = num(d, 'spacingM');
  return [shiftY(s / 2), shiftY(-s / 2)];
}

function rectSupports(d: Design): [[XY, XY], [XY, XY]] {
  const at = supportsOf(d).map((x) => x.at);
  return [
    [at[0], at[1]],
    [at[2], at[3]],
  ];
}

/** The relay box of the switched pair: on the ground midway between the two fed corners. */
function rectBox(d: Design): XY {
  return [-num(d, 'topM') / 2, 0];
}

function rectModel(d: Design, dropM: number, switched: boolean): WireModel {
  const [ma, mb] = rectMappers(d);
  const a = elementWires(d, dropM, ma, 'front (A)');
  const b = elementWires(d, dropM, mb, 'rear (B)');
  const network = switched
    ? pairNetwork(d)
    : linesNetwork(['a', 'b'], 'a', coax, [['b', 'common', num(d, 'stubLengthM')]]);
  return twoFedElements(a, b, network);
}

function rectElements(d: Design, dropM: number, switched: boolean): Element[] {
  const [ma, mb] = rectMappers(d);
  const [sa, sb] = rectSupports(d);
  const els = [
    ...elementParts(d, dropM, ma, 'front (A)', sa),
    ...elementParts(d, dropM, mb, 'rear (B)', sb),
    ...supportElements(d, RECT_IDS),
  ];
  if (switched) {
    const { A } = sides(d, dropM);
    els.push(...coaxRun(ma(A.corner), rectBox(d), 'coax, box to front (A)'));
    els.push(...coaxRun(mb(A.corner), rectBox(d), 'coax, box to rear (B)'));
  }
  return els;
}

function halfSquareCuts(d: Design, dropM: number, count: number): CutItem[] {
  return [cut('top wire', count, num(d, 'topM')), cut('drop (including any bent end)', 2 * count, dropM)];
}

function rectCuts(d: Design, dropM: number, switched: boolean): CutItem[] {
  const items = halfSquareCuts(d, dropM, 2);
  if (switched) {
    items.push(
      coaxCut(
        `coax, relay box to each fed corner (${num(d, 'lineHalfWaves')} electrical half wave(s), VF ${COAX_VELOCITY_FACTOR})`,
        2,
        num(d, 'lineLengthM'),
      ),
      coaxCut('coax loading stub at the relay box, far end shorted', 1, num(d, 'stubLengthM')),
    );
  } else {
    items.push(
      coaxCut(
        "coax loading stub across the reflector's corner gap, far end shorted",
        1,
        num(d, 'stubLengthM'),
      ),
    );
  }
  return items;
}

/** A valid half-square span between two supports: the two ends in site metres and the lower height. */
interface Span {
  i: number;
  j: number;
  len: number;
}

function spansOf(site: PreparedSite, minLen: number): Span[] {
  const sup = site.site.supports;
  const maxLen = minLen + 2 * site.site.settings.maxRopeM;
  const index = new Map(sup.map((s, i) => [s.id, i]));
  return supportPairs(sup).flatMap(([a, b]) => {
    const len = dist2(a.xy, b.xy);
    return len >= minLen && len <= maxLen ? [{ i: index.get(a.id)!, j: index.get(b.id)!, len }] : [];
  });
}

interface RectFit {
  design: Design;
  placement: { originXY: XY; rotationDeg: number };
  ids: string[];
  names: string[];
  spacingWl: number;
}

/**
 * Fit the idealised rectangle to two spans, with the fed corners at canonical −x toward `wDir`'s
 * opposite; the front pair is the one on the +y side. Null when a rule fails (reasons appended).
 */
function fitRectangle(
  site: PreparedSite,
  band: BandPlan,
  p: Span,
  q: Span,
  type: AntennaTypeId,
  switched: boolean,
  flip: boolean,
  why: string[],
): RectFit | null {
  const sup = site.site.supports;
  const st = site.site.settings;
  const lambda = band.wavelengthM;
  const T = TOP_FRACTION * lambda;
  const tol = PLACEMENT_TOL_WAVELENGTHS * lambda;
  const unit = (a: XY, b: XY): XY => {
    const l = dist2(a, b);
    return [(b[0] - a[0]) / l, (b[1] - a[1]) / l];
  };
  let [pa, pb] = [sup[p.i], sup[p.j]];
  let [qa, qb] = [sup[q.i], sup[q.j]];
  const u = unit(pa.xy, pb.xy);
  let v = unit(qa.xy, qb.xy);
  if (u[0] * v[0] + u[1] * v[1] < 0) {
    [qa, qb] = [qb, qa];
    v = [-v[0], -v[1]];
  }
  let w: XY = [u[0] + v[0], u[1] + v[1]];
  const wl = Math.hypot(w[0], w[1]);
  w = [w[0] / wl, w[1] / wl];
  const o: XY = [
    (pa.xy[0] + pb.xy[0] + qa.xy[0] + qb.xy[0]) / 4,
    (pa.xy[1] + pb.xy[1] + qa.xy[1] + qb.xy[1]) / 4,
  ];
  // feed at the end nearer the station: canonical −x points toward it
  const st0 = site.site.station;
  // (turned half round when the other pair is to be the front one: the feed is then at the far end)
  if ((st0[0] - o[0]) * w[0] + (st0[1] - o[1]) * w[1] > 0 !== flip) {
    w = [-w[0], -w[1]];
    [pa, pb] = [pb, pa];
    [qa, qb] = [qb, qa];
  }
  const rot = bearingOf([0, 0], w) - 90;
  const can = (xy: XY): XY => placeXY([xy[0] - o[0], xy[1] - o[1]], -rot, [0, 0]);
  const P = [can(pa.xy), can(pb.xy)];
  const Q = [can(qa.xy), can(qb.xy)];
  // both top wires lie inside both spans along x
  const lo = Math.max(Math.min(P[0][0], P[1][0]), Math.min(Q[0][0], Q[1][0]));
  const hi = Math.min(Math.max(P[0][0], P[1][0]), Math.max(Q[0][0], Q[1][0]));
  if (hi - lo < T) {
    why.push(
      `the two spans overlap by ${Math.max(0, hi - lo).toFixed(1)} m along their length, less than the ${T.toFixed(1)} m top wire`,
    );
    return null;
  }
  const x0 = (lo + hi) / 2;
  const lineY = (L: XY[], x: number): number =>
    L[0][1] + ((L[1][1] - L[0][1]) * (x - L[0][0])) / (L[1][0] - L[0][0]);
  let yP = lineY(P, x0);
  let yQ = lineY(Q, x0);
  let front = { sup: [pa, pb], at: P };
  let back = { sup: [qa, qb], at: Q };
  if (yQ > yP) {
    [front, back] = [back, front];
    [yP, yQ] = [yQ, yP];
  }
  const s = yP - yQ;
  const spacingWl = s / lambda;
  if (spacingWl < REFLECTOR_SPACING_WAVELENGTHS.min || spacingWl > REFLECTOR_SPACING_WAVELENGTHS.max) {
    why.push(
      `the two spans stand ${s.toFixed(1)} m (${spacingWl.toFixed(2)} λ) apart, outside the ${REFLECTOR_SPACING_WAVELENGTHS.min}–${REFLECTOR_SPACING_WAVELENGTHS.max} λ a reflector is built at`,
    );
    return null;
  }
  const yc = (yP + yQ) / 2;
  const off = Math.max(
    ...[-T / 2, T / 2].flatMap((dx) => [
      Math.abs(lineY(front.at, x0 + dx) - yP),
      Math.abs(lineY(back.at, x0 + dx) - yQ),
    ]),
  );
  if (off > tol) {
    why.push(
      `the supports stand ${off.toFixed(1)} m off a rectangle (more than ${tol.toFixed(1)} m, ${PLACEMENT_TOL_WAVELENGTHS} λ): the two top wires would not be parallel`,
    );
    return null;
  }
  const ropes = [...front.at, ...back.at].map((xy, k) =>
    Math.abs(xy[0] - x0 - (k % 2 === 0 ? -T / 2 : T / 2)),
  );
  const longest = Math.max(...ropes);
  if (longest > st.maxRopeM) {
    why.push(
      `a rope of ${longest.toFixed(1)} m, over the ${st.maxRopeM} m rope limit${whereToChange('maxRopeM')}`,
    );
    return null;
  }
  const four = [...front.sup, ...back.sup];
  const h = Math.min(...four.map((x) => x.heightM));
  const e = st.minEndHeightM;
  if (h - e < 0.05 * lambda) {
    why.push(
      `the lowest support (${h.toFixed(1)} m) leaves too little height above the ${e.toFixed(1)} m end height`,
    );
    return null;
  }
  const originXY = placeXY([x0, yc], rot, o);
  const local = [...front.at, ...back.at].map((xy): XY => [round(xy[0] - x0, 2), round(xy[1] - yc, 2)]);
  const xReact = reflectorReactanceOhm(spacingWl);
  const params: Design['params'] = {
    spanM: round(dist2(front.sup[0].xy, front.sup[1].xy), 3),
    topM: round(T, 3),
    heightM: h,
    endHeightM: e,
    spacingM: round(s, 2),
    supportsXY: local.flat(),
    supportHeightsM: four.map((x) => x.heightM),
    reflectorReactanceOhm: round(xReact, 1),
    stubLengthM: round(stubLengthM(xReact, band.designFreqHz), 2),
  };
  if (switched) {
    const run = Math.hypot(h, s / 2);
    const line = halfWaveMultipleM(run, band.designFreqHz);
    params.lineLengthM = round(line, 2);
    params.lineHalfWaves = Math.round(line / halfWaveCoaxM(band.designFreqHz));
  }
  const design: Design = {
    type,
    band: band.band,
    designFreqHz: band.designFreqHz,
    params,
    trim: {
      name: 'length of every drop (all four alike)',
      nominalM: 0.245 * lambda,
      minM: 0.15 * lambda,
      maxM: Math.min(0.33 * lambda, h - e + T / 2 - 1),
    },
    ...(switched
      ? {
          states: [
            { name: 'front (A) driven, rear (B) reflects', rotationDeg: 0 },
            { name: 'rear (B) driven, front (A) reflects', rotationDeg: 0, mirrorAxisDeg: 90 },
          ],
        }
      : {}),
  };
  return {
    design,
    placement: { originXY, rotationDeg: rot },
    ids: four.map((x) => x.id),
    names: four.map((x) => x.name),
    spacingWl,
  };
}

/** Pairs of spans that may stand near a rectangle (midpoints within a quarter wave plus the spans' length). */
function rectangleCandidates(site: PreparedSite, band: BandPlan): [Span, Span][] {
  const T = TOP_FRACTION * band.wavelengthM;
  const spans = spansOf(site, T);
  const sup = site.site.supports;
  const mid = (s: Span): XY => [(sup[s.i].xy[0] + sup[s.j].xy[0]) / 2, (sup[s.i].xy[1] + sup[s.j].xy[1]) / 2];
  const reach = REFLECTOR_SPACING_WAVELENGTHS.max * band.wavelengthM + site.site.settings.maxRopeM;
  const cell = Math.max(reach, 1);
  const grid = new Map<string, number[]>();
  const key = (x: number, y: number) => `${x}:${y}`;
  spans.forEach((s, k) => {
    const m = mid(s);
    const gx = Math.floor(m[0] / cell);
    const gy = Math.floor(m[1] / cell);
    const g = grid.get(key(gx, gy));
    if (g) g.push(k);
    else grid.set(key(gx, gy), [k]);
  });
  const out: [Span, Span][] = [];
  spans.forEach((p, k) => {
    const m = mid(p);
    const gx = Math.floor(m[0] / cell);
    const gy = Math.floor(m[1] / cell);
    for (let dx = -1; dx <= 1; dx++)
      for (let dy = -1; dy <= 1; dy++)
        for (const l of grid.get(key(gx + dx, gy + dy)) ?? []) {
          if (l <= k) continue;
          const q = spans[l];
          if (q.i === p.i || q.i === p.j || q.j === p.i || q.j === p.j) continue;
          if (dist2(m, mid(q)) > reach) continue;
          const u = [sup[p.j].xy[0] - sup[p.i].xy[0], sup[p.j].xy[1] - sup[p.i].xy[1]];
          const v = [sup[q.j].xy[0] - sup[q.i].xy[0], sup[q.j].xy[1] - sup[q.i].xy[1]];
          const cos = Math.abs(u[0] * v[0] + u[1] * v[1]) / (p.len * q.len);
          if (cos < Math.cos((MAX_SKEW_DEG * Math.PI) / 180)) continue;
          out.push([p, q]);
        }
  });
  return out;
}

function proposeRect(
  site: PreparedSite,
  band: BandPlan,
  type: AntennaTypeId,
  switched: boolean,
): { proposals: Proposal[]; rejections: Rejection[] } {
  const list = proposalList(type, band);
  const sup = site.site.supports;
  const fits: RectFit[][] = [];
  for (const [p, q] of rectangleCandidates(site, band)) {
    const why: string[] = [];
    const fit = fitRectangle(site, band, p, q, type, switched, false, why);
    // the fixed reflector: either pair can be the driven one (two designs, the plan keeps the better)
    const other = fit && !switched ? fitRectangle(site, band, p, q, type, switched, true, []) : null;
    if (fit) fits.push(other ? [fit, other] : [fit]);
    else
      list.reject(
        [sup[p.i].id, sup[p.j].id, sup[q.i].id, sup[q.j].id],
        `on ${sup[p.i].name}–${sup[p.j].name} and ${sup[q.i].name}–${sup[q.j].name}`,
        ...why,
      );
  }
  if (fits.length === 0 && list.rejections.length === 0)
    list.reject(
      [],
      'four supports near a rectangle',
      `no two pairs of supports stand about parallel with spans of at least ${(TOP_FRACTION * band.wavelengthM).toFixed(1)} m and ${REFLECTOR_SPACING_WAVELENGTHS.min}–${REFLECTOR_SPACING_WAVELENGTHS.max} λ apart`,
    );
  fits.sort(
    ([a], [b]) =>
      Math.abs(a.spacingWl - 0.15) - Math.abs(b.spacingWl - 0.15) ||
      (b.design.params.heightM as number) - (a.design.params.heightM as number),
  );
  const norm = (d: number) => ((d % 360) + 360) % 360;
  for (const variants of fits.slice(0, ARRAY_PROPOSALS_PER_BAND)) {
    const groupKey = `${type}:${[...variants[0].ids].sort().join(':')}`;
    for (const f of variants) {
      const rot = f.placement.rotationDeg;
      const sM = (f.design.params.spacingM as number).toFixed(1);
      list.proposals.push({
        design: f.design,
        placement: f.placement,
        supports: f.ids,
        groupKey,
        where: switched
          ? `on ${f.names[0]}–${f.names[1]} and ${f.names[2]}–${f.names[3]}, ${sM} m apart, relay box between the fed corners`
          : `driven half-square on ${f.names[0]}–${f.names[1]}, reflector on ${f.names[2]}–${f.names[3]} ${sM} m behind`,
        broadsideDeg: switched ? [norm(rot), norm(rot + 180)] : [norm(rot)],
      });
    }
  }
  return list.result();
}

function rectBuilder(type: AntennaTypeId, label: string, switched: boolean): Builder {
  return {
    type,
    label,
    array: true,
    elementCount: 2,
    propose: ({ site, band }) => proposeRect(site, band, type, switched),
    model: (d, dropM) => rectModel(d, dropM, switched),
    elements: (d, dropM) => rectElements(d, dropM, switched),
    heights(d, dropM) {
      const { A } = sides(d, dropM);
      return [
        { label: 'top wires and fed corners', heightM: A.corner[2] },
        { label: 'lower ends', heightM: A.end[2] },
      ];
    },
    cutList: (d, dropM) => rectCuts(d, dropM, switched),
  };
}

export const halfSquareReflectorBuilder = rectBuilder(
  'half-square-reflector',
  'Half-square with a parasitic reflector (four supports)',
  false,
);
export const halfSquareSwitchedBuilder = rectBuilder(
  'half-square-switched',
  'Two half-squares, relay-switched: either one drives, the other reflects',
  true,
);

/* ------------------------------------------------------------------------------------------ */
/* L: two half-squares at 90° on three supports                                               */

const L_IDS = ['K', 'P1', 'P2'] as const;

/** The L's relay box: on the ground midway between the feet of the two fed drops. */
function lBox(d: Design): XY {
  const c = num(d, 'cornerGapM');
  return [c / 2, c / 2];
}

function lMappers(d: Design): [Mapper, Mapper] {
  const off = num(d, 'cornerGapM') + num(d, 'topM') / 2;
  return [alongX(off), alongY(off)];
}

function lModel(d: Design, dropM: number): WireModel {
  const [m1, m2] = lMappers(d);
  const a = elementWires(d, dropM, m1, 'leg 1');
  const b = elementWires(d, dropM, m2, 'leg 2');
  const line = num(d, 'lineLengthM');
  return twoFedElements(
    a,
    b,
    linesNetwork(['p1', 'p2'], 'box-1', coax, [
      ['box-1', 'p1', line],
      ['box-2', 'p2', line],
    ]),
  );
}

function lElements(d: Design, dropM: number): Element[] {
  const [m1, m2] = lMappers(d);
  const at = supportsOf(d).map((x) => x.at);
  const { A } = sides(d, dropM);
  return [
    ...elementParts(d, dropM, m1, 'leg 1', [at[0], at[1]]),
    ...elementParts(d, dropM, m2, 'leg 2', [at[0], at[2]]),
    ...supportElements(d, L_IDS),
    ...coaxRun(m1(A.corner), lBox(d), 'coax, box to leg 1'),
    ...coaxRun(m2(A.corner), lBox(d), 'coax, box to leg 2'),
  ];
}

function proposeL(site: PreparedSite, band: BandPlan): { proposals: Proposal[]; rejections: Rejection[] } {
  const type = 'half-square-l';
  const list = proposalList(type, band);
  const sup = site.site.supports;
  const st = site.site.settings;
  const lambda = band.wavelengthM;
  const T = TOP_FRACTION * lambda;
  const tol = PLACEMENT_TOL_WAVELENGTHS * lambda;
  const minGap = L_INNER_GAP_WAVELENGTHS * lambda;
  const minLeg = T + minGap / Math.SQRT2;
  const maxLeg = T + minGap / Math.SQRT2 + 2 * st.maxRopeM;
  const e = st.minEndHeightM;
  const fits: { p: Proposal; h: number }[] = [];
  for (let k = 0; k < sup.length; k++) {
    const K = sup[k];
    const legs = sup
      .map((s, i) => ({ i, len: dist2(K.xy, s.xy), brg: bearingOf(K.xy, s.xy) }))
      .filter((x) => x.i !== k && x.len >= minLeg && x.len <= maxLeg);
    for (const l1 of legs)
      for (const l2 of legs) {
        // leg 2 lies 90° counter-clockwise... in canonical terms: leg 1 along +x (bearing rot + 90), leg 2 along +y (bearing rot)
        const turn = (((l1.brg - l2.brg) % 360) + 360) % 360;
        const dev = Math.abs(turn - 90);
        if (dev > MAX_SKEW_DEG) continue;
        const P1 = sup[l1.i];
        const P2 = sup[l2.i];
        const ids = [K.id, P1.id, P2.id];
        const where = `on ${K.name} (corner), ${P1.name} and ${P2.name}`;
        const why: string[] = [];
        // canonical: bisector of the two legs at bearing rot + 45
        const bis = l2.brg + turn / 2;
        const rot = bis - 45;
        const can = (xy: XY): XY => placeXY([xy[0] - K.xy[0], xy[1] - K.xy[1]], -rot, [0, 0]);
        const c1 = can(P1.xy);
        const c2 = can(P2.xy);
        const shortLeg = Math.min(c1[0], c2[1]);
        const c = Math.max(minGap / Math.SQRT2, (shortLeg - T) / 2);
        if (c + T > shortLeg)
          why.push(
            `the shorter leg (${shortLeg.toFixed(1)} m) does not hold a ${T.toFixed(1)} m top wire clear of the corner`,
          );
        const off = Math.max(Math.abs(c1[1]) * ((c + T) / c1[0]), Math.abs(c2[0]) * ((c + T) / c2[1]));
        if (off > tol)
          why.push(
            `the legs are ${dev.toFixed(1)}° off a right angle: a wire end would hang ${off.toFixed(1)} m from where it is modelled (more than ${tol.toFixed(1)} m, ${PLACEMENT_TOL_WAVELENGTHS} λ)`,
          );
        const longest = Math.max(c, c1[0] - c - T, c2[1] - c - T);
        if (longest > st.maxRopeM)
          why.push(
            `a rope of ${longest.toFixed(1)} m, over the ${st.maxRopeM} m rope limit${whereToChange('maxRopeM')}`,
          );
        const h = Math.min(K.heightM, P1.heightM, P2.heightM);
        if (h - e < 0.05 * lambda)
          why.push(
            `the lowest support (${h.toFixed(1)} m) leaves too little height above the ${e.toFixed(1)} m end height`,
          );
        if (why.length) {
          list.reject(ids, where, ...why);
          continue;
        }
        const line = halfWaveMultipleM(Math.hypot(h, c / Math.SQRT2), band.designFreqHz);
        const design: Design = {
          type,
          band: band.band,
          designFreqHz: band.designFreqHz,
          params: {
            spanM: round(T, 3),
            topM: round(T, 3),
            heightM: h,
            endHeightM: e,
            cornerGapM: round(c, 2),
            supportsXY: [0, 0, round(c1[0], 2), 0, 0, round(c2[1], 2)],
            supportHeightsM: [K.heightM, P1.heightM, P2.heightM],
            lineLengthM: round(line, 2),
            lineHalfWaves: Math.round(line / halfWaveCoaxM(band.designFreqHz)),
          },
          trim: {
            name: 'length of every drop (all four alike)',
            nominalM: 0.245 * lambda,
            minM: 0.15 * lambda,
            maxM: Math.min(0.33 * lambda, h - e + T / 2 - 1),
          },
          states: [
            { name: 'leg 1 driven (beams both ways), leg 2 open', rotationDeg: 0 },
            { name: 'leg 2 driven (beams both ways), leg 1 open', rotationDeg: 0, mirrorAxisDeg: 45 },
          ],
        };
        const norm = (d: number) => ((d % 360) + 360) % 360;
        fits.push({
          h,
          p: {
            design,
            placement: { originXY: K.xy, rotationDeg: norm(rot) },
            supports: ids,
            groupKey: `${type}:${[...ids].sort().join(':')}`,
            where: `${where}, relay box near the base of ${K.name}`,
            broadsideDeg: [0, 90, 180, 270].map((b) => norm(rot + b)),
          },
        });
      }
  }
  if (fits.length === 0 && list.rejections.length === 0)
    list.reject(
      [],
      'three supports in an L',
      `no three supports stand in an L with legs of at least ${minLeg.toFixed(1)} m at about 90°`,
    );
  fits.sort((a, b) => b.h - a.h);
  for (const f of fits.slice(0, ARRAY_PROPOSALS_PER_BAND)) list.proposals.push(f.p);
  return list.result();
}

export const halfSquareLBuilder: Builder = {
  type: 'half-square-l',
  label: 'Two half-squares at 90° on three supports in an L, relay-switched',
  array: true,
  elementCount: 2,
  propose: ({ site, band }) => proposeL(site, band),
  model: lModel,
  elements: lElements,
  heights(d, dropM) {
    const { A } = sides(d, dropM);
    return [
      { label: 'top wires and fed corners', heightM: A.corner[2] },
      { label: 'lower ends', heightM: A.end[2] },
    ];
  },
  cutList(d, dropM) {
    return [
      ...halfSquareCuts(d, dropM, 2),
      coaxCut(
        `coax, relay box to each fed corner (${num(d, 'lineHalfWaves')} electrical half wave(s), VF ${COAX_VELOCITY_FACTOR})`,
        2,
        num(d, 'lineLengthM'),
      ),
    ];
  },
};

/** The relay box of a half-square array in its canonical frame (the build sheet and the map say where it goes). */
export function halfSquareArrayBox(d: Design): XY | null {
  if (d.type === 'half-square-switched') return rectBox(d);
  if (d.type === 'half-square-l') return lBox(d);
  return null;
}

/** The coax run from one fed corner to the box, metres (the line must reach it). */
export function coaxRunM(d: Design, dropM: number): number {
  const { A } = sides(d, dropM);
  if (d.type === 'half-square-l') return runLength(lMappers(d)[0](A.corner), lBox(d));
  return runLength(rectMappers(d)[0](A.corner), rectBox(d));
}
