/**
 * Inverted-V from one support: fed at the apex, two legs sloping down to anchors at the lowest
 * allowed end height.
 *
 * Canonical frame: the support at the origin, apex height h. A short horizontal feed wire of
 * APEX_WIRE_M is centred on the apex along x (the feed sits at its middle); the legs run from its
 * ends. In plan the legs point at bearings ±φ/2 from canonical north... for φ = 180° they point east
 * and west (a straight inverted-V), for smaller plan angles φ the legs bend toward north (a V in plan
 * too, to fit a lot). Each leg drops from h to the end height e = minEndHeight; its plan reach is
 * √(ℓ² − (h − e)²). When the legs are too short to reach the end height at an included angle of at
 * least 90°, the ends stay higher at that angle. Trim dimension: the total wire length L.
 *
 * A lot too small for the legs (issue 19): when no orientation of a plan angle leaves room for
 * the legs' plan reach (rays from the support to the lot line, less the setback, checked every
 * ORIENTATION_STEP_DEG), a second design of that plan angle is proposed (same group, so the
 * better-scoring one is kept) whose legs reach only `reachM` in plan (95 % of the room found),
 * ending at the end height or, when the reach is less than the drop, higher on a 45° leg. The
 * wire they lack is made up by ends folded back along each leg, FOLD_GAP_M above it in the
 * leg's vertical plane (`endForm` 1, when a fold of at most FOLD_MAX_FRACTION of the leg is
 * enough), or else by a loading coil in each leg at COIL_POSITION_FRACTION of it from the apex
 * (`endForm` 2; the wire beyond the coil is the trim, the coil is fixed; core/antennas/loading.ts).
 */
import type { Element } from '../site/feasibility.ts';
import type { XYZ } from '../site/geometry.ts';
import { cut, lambdaOf, num, proposalList, round, wire, WIRE_RADIUS_M } from './common.ts';
import type { Builder, Design, ModelWire, WireModel } from './types.ts';
import type { XY } from '../site/frame.ts';
import {
  COIL_POSITION_FRACTION,
  coilLoad,
  FOLD_GAP_M,
  FOLD_MAX_FRACTION,
  LOADING_COIL_Q,
  loadingReactanceOhm,
  microhenries,
} from './loading.ts';

/** Nominal total wire length, in wavelengths (common practice, no source). */
const NOMINAL_FRACTION = 0.47;
/** A folded inverted-V's nominal wire over the straight one's (as the dipole's, core/antennas/dipole.ts). */
const FOLDED_LENGTH_FACTOR = 1.15;
/** Shortest piece of a folded end modelled, metres (shorter ones are left out; the wire grows continuously). */
const TINY_M = 0.02;
/** Shortest plan reach of a leg for the reach-limited design, in wavelengths (a choice, no source). */
export const MIN_REACH_FRACTION = 0.06;
/** The loaded design's coil is sized for a tip this share of the room beyond it (trim both ways). */
const COIL_TIP_SHARE = 0.8;

/** Distance from p along compass bearing `deg` to the first crossing of the closed ring, metres (Infinity if none). */
export function roomAlong(p: XY, deg: number, ring: readonly XY[]): number {
  const dx = Math.sin((deg * Math.PI) / 180);
  const dy = Math.cos((deg * Math.PI) / 180);
  let best = Infinity;
  for (let i = 0; i + 1 < ring.length; i++) {
    const [ax, ay] = ring[i];
    const ex = ring[i + 1][0] - ax;
    const ey = ring[i + 1][1] - ay;
    const den = dx * ey - dy * ex;
    if (Math.abs(den) < 1e-12) continue;
    const wx = ax - p[0];
    const wy = ay - p[1];
    const t = (wx * ey - wy * ex) / den;
    const u = (wx * dy - wy * dx) / den;
    if (t >= 0 && u >= 0 && u <= 1) best = Math.min(best, t);
  }
  return best;
}

/** Distance from p to the nearest edge of a closed ring, metres. */
function ringDistance(p: XY, ring: readonly XY[]): number {
  let best = Infinity;
  for (let i = 0; i + 1 < ring.length; i++) {
    const [ax, ay] = ring[i];
    const ex = ring[i + 1][0] - ax;
    const ey = ring[i + 1][1] - ay;
    const l2 = ex * ex + ey * ey;
    const t = l2 > 0 ? Math.min(1, Math.max(0, ((p[0] - ax) * ex + (p[1] - ay) * ey) / l2)) : 0;
    best = Math.min(best, Math.hypot(ax + t * ex - p[0], ay + t * ey - p[1]));
  }
  return best;
}

/**
 * How far from p along compass bearing `deg` a point stays inside the ring and at least
 * `clearM` from its edges, metres (0 when p itself is not): bisection below the first crossing.
 */
export function clearRoomAlong(p: XY, deg: number, ring: readonly XY[], clearM: number): number {
  const hit = roomAlong(p, deg, ring);
  if (!Number.isFinite(hit)) return 0;
  const dx = Math.sin((deg * Math.PI) / 180);
  const dy = Math.cos((deg * Math.PI) / 180);
  const ok = (t: number): boolean => ringDistance([p[0] + dx * t, p[1] + dy * t], ring) >= clearM;
  if (!ok(0)) return 0;
  let lo = 0;
  let hi = hit;
  for (let k = 0; k < 30 && hi - lo > 0.01; k++) {
    const mid = (lo + hi) / 2;
    if (ok(mid)) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Plan reach of each leg of the plain design at wire length L, metres. */
function plainReach(h: number, e: number, L: number): number {
  const leg = Math.max(0, L / 2 - APEX_WIRE_M / 2);
  const drop = Math.min(h - e, leg * Math.cos(((MIN_INCLUDED_ANGLE_DEG / 2) * Math.PI) / 180));
  return Math.sqrt(Math.max(0, leg * leg - drop * drop));
}

/** Length of the horizontal feed wire at the apex, metres (a modelling detail, common practice, no source). */
export const APEX_WIRE_M = 1;
/** Plan angles between the legs that are tried, degrees. */
export const PLAN_ANGLES_DEG = [180, 140, 100] as const;
/** Orientation step, degrees. */
export const ORIENTATION_STEP_DEG = 5;
/** Smallest included angle between the legs in their own plane, degrees (common practice, no source). */
export const MIN_INCLUDED_ANGLE_DEG = 90;

interface Leg {
  /** The straight leg from the apex end. */
  from: XYZ;
  to: XYZ;
  /** Folded end: the turn at the leg's end and the fold back toward the apex. */
  fold?: { link: [XYZ, XYZ]; back?: [XYZ, XYZ] };
  /** Loaded: the coil's place on the leg (the leg is split there). */
  coil?: XYZ;
  /** The free end of the wire (high voltage: at or above the end height). */
  end: XYZ;
  /** Where the anchor rope leaves the wire. */
  tie: XYZ;
}

interface Shape {
  apexL: XYZ;
  apexR: XYZ;
  L: Leg;
  R: Leg;
}

const endFormOf = (d: Design): number => (typeof d.params.endForm === 'number' ? d.params.endForm : 0);

function shape(d: Design, L: number): Shape {
  const h = num(d, 'heightM');
  const e = num(d, 'endHeightM');
  const phi = (num(d, 'planAngleDeg') * Math.PI) / 180;
  const leg = Math.max(0, L / 2 - APEX_WIRE_M / 2);
  // Leg plan directions: bearings −φ/2 and +φ/2 from canonical north.
  const uL: [number, number] = [-Math.sin(phi / 2), Math.cos(phi / 2)];
  const uR: [number, number] = [Math.sin(phi / 2), Math.cos(phi / 2)];
  const a = APEX_WIRE_M / 2;
  const apexL: XYZ = [-a, 0, h];
  const apexR: XYZ = [a, 0, h];
  const form = endFormOf(d);
  const mk = (apex: XYZ, u: [number, number]): Leg => {
    const along = (reach: number, z: number): XYZ => [apex[0] + u[0] * reach, apex[1] + u[1] * reach, z];
    if (typeof d.params.reachM !== 'number') {
      let drop = h - e;
      const minHalf = ((MIN_INCLUDED_ANGLE_DEG / 2) * Math.PI) / 180;
      // Legs at least minHalf from vertical: drop ≤ leg·cos(minHalf).
      if (drop > leg * Math.cos(minHalf)) drop = leg * Math.cos(minHalf);
      const reach = Math.sqrt(Math.max(0, leg * leg - drop * drop));
      const end = along(reach, h - drop);
      return { from: apex, to: end, end, tie: end };
    }
    // Reach-limited: the straight leg to plan reach R, down to e or (45° legs) h − R.
    const R = num(d, 'reachM');
    const zEnd = Math.max(e, h - R);
    const straight = Math.hypot(R, h - zEnd);
    const legEnd = along(R, zEnd);
    const dir: XYZ = [
      (apex[0] - legEnd[0]) / straight,
      (apex[1] - legEnd[1]) / straight,
      (h - zEnd) / straight,
    ];
    if (form === 2) {
      const inner = num(d, 'coilFromApexM');
      const tip = Math.min(straight, Math.max(inner + 0.05, leg));
      const at = (t: number): XYZ => [apex[0] - dir[0] * t, apex[1] - dir[1] * t, h - dir[2] * t];
      const end = at(tip);
      return { from: apex, to: end, coil: at(inner), end, tie: end };
    }
    // Folded: up by FOLD_GAP_M across the leg (in its vertical plane), then back toward the apex.
    // The wire grows continuously with the trim: first the straight leg, then the turn, then the fold.
    if (leg <= straight + TINY_M) {
      const end: XYZ = [apex[0] - dir[0] * leg, apex[1] - dir[1] * leg, h - dir[2] * leg];
      return { from: apex, to: end, end, tie: end };
    }
    const horiz = Math.hypot(dir[0], dir[1]);
    const n: XYZ = [(-dir[0] * dir[2]) / horiz, (-dir[1] * dir[2]) / horiz, horiz];
    const up = Math.min(FOLD_GAP_M, leg - straight);
    const turn: XYZ = [legEnd[0] + n[0] * up, legEnd[1] + n[1] * up, legEnd[2] + n[2] * up];
    const f = leg - straight - FOLD_GAP_M;
    if (f <= TINY_M)
      return { from: apex, to: legEnd, fold: { link: [legEnd, turn] }, end: turn, tie: legEnd };
    const tipF: XYZ = [turn[0] + dir[0] * f, turn[1] + dir[1] * f, turn[2] + dir[2] * f];
    return {
      from: apex,
      to: legEnd,
      fold: { link: [legEnd, turn], back: [turn, tipF] },
      end: tipF,
      tie: legEnd,
    };
  };
  return { apexL, apexR, L: mk(apexL, uL), R: mk(apexR, uR) };
}

export const invertedVBuilder: Builder = {
  type: 'inverted-v',
  label: 'Inverted-V from one support',
  propose({ site, band }) {
    const out = proposalList('inverted-v', band);
    const e = site.site.settings.minEndHeightM;
    const lambda = band.wavelengthM;
    const nominalL = NOMINAL_FRACTION * lambda;
    const trim = { name: 'total wire length', nominalM: nominalL, minM: 0.38 * lambda, maxM: 0.56 * lambda };
    const ring = site.site.boundary;
    const setback = site.site.settings.setbackM;
    for (const s of site.site.supports) {
      if (s.heightM <= e + 1) {
        out.rejectBy(
          (e + 1 - s.heightM) / (e + 1),
          [s.id],
          `from ${s.name}`,
          `${s.name} at ${s.heightM.toFixed(1)} m is not above the ${e.toFixed(1)} m end height by the 1 m an inverted-V needs at least`,
        );
        continue;
      }
      // Room for each leg along every bearing: its end and a fold's turn clear of the setback.
      const room = (deg: number): number =>
        clearRoomAlong(s.xy, deg, ring, setback + FOLD_GAP_M + 0.1) - APEX_WIRE_M / 2;
      for (const phiDeg of PLAN_ANGLES_DEG) {
        const full = phiDeg === 180 ? 180 : 360;
        const orient = (beta: number) => ({
          placement: { originXY: s.xy, rotationDeg: beta },
          supports: [s.id],
          groupKey: `inverted-v:${s.id}:${phiDeg}`,
          where:
            phiDeg === 180
              ? `from ${s.name}, wire along ${((beta + 90) % 180).toFixed(0)}°`
              : `from ${s.name}, legs ${phiDeg}° apart in plan, opening toward ${beta.toFixed(0)}°`,
          broadsideDeg: [beta % 360, (beta + 180) % 360],
        });
        const plain = out.design({ heightM: s.heightM, endHeightM: e, planAngleDeg: phiDeg }, trim);
        for (let beta = 0; beta < full; beta += ORIENTATION_STEP_DEG) {
          // Canonical legs bend toward north; rotation by beta turns canonical north to bearing beta.
          out.proposals.push({ design: plain, ...orient(beta) });
        }
        // A lot too small for these legs in every orientation: a reach-limited design as well.
        let best = 0;
        for (let beta = 0; beta < full; beta += ORIENTATION_STEP_DEG)
          best = Math.max(best, Math.min(room(beta - phiDeg / 2), room(beta + phiDeg / 2)));
        const need = plainReach(s.heightM, e, 1.05 * nominalL);
        if (best >= need) continue;
        const reach = 0.95 * best;
        const minReach = MIN_REACH_FRACTION * lambda;
        if (reach < minReach) {
          out.rejectBy(
            (minReach - reach) / minReach,
            [s.id],
            `from ${s.name}, legs ${phiDeg}° apart in plan`,
            `the lot leaves each leg at most ${Math.max(0, best).toFixed(1)} m in plan from ${s.name}; even folded or with ` +
              `loading coils an inverted-V needs legs reaching ${minReach.toFixed(1)} m (${MIN_REACH_FRACTION} λ)`,
          );
          continue;
        }
        const zEnd = Math.max(e, s.heightM - reach);
        const straight = Math.hypot(reach, s.heightM - zEnd);
        const legNeed = (FOLDED_LENGTH_FACTOR * nominalL - APEX_WIRE_M) / 2;
        const base = { heightM: s.heightM, endHeightM: e, planAngleDeg: phiDeg, reachM: round(reach, 3) };
        let design: Design;
        let words: string;
        if (straight * (1 + FOLD_MAX_FRACTION) + FOLD_GAP_M >= 1.1 * legNeed) {
          const L = APEX_WIRE_M + 2 * legNeed;
          design = out.design(
            { ...base, endForm: 1 },
            {
              name: 'total wire length (folds included)',
              nominalM: L,
              minM: APEX_WIRE_M + 2 * 0.8 * straight,
              maxM: APEX_WIRE_M + 2 * (straight * (1 + FOLD_MAX_FRACTION) + FOLD_GAP_M),
            },
          );
          words =
            `legs shortened to reach ${reach.toFixed(1)} m in plan (the room the lot leaves), each end folded back ` +
            `along its leg, ${FOLD_GAP_M} m above it (about ${(legNeed - straight - FOLD_GAP_M).toFixed(1)} m, trimmed)`;
        } else {
          const inner = COIL_POSITION_FRACTION * straight;
          const roomBeyond = straight - inner;
          const x = loadingReactanceOhm(
            inner + APEX_WIRE_M / 2,
            COIL_TIP_SHARE * roomBeyond,
            lambda,
            WIRE_RADIUS_M,
          );
          const coilH = round(x / (2 * Math.PI * band.designFreqHz), 9);
          design = out.design(
            { ...base, endForm: 2, coilFromApexM: round(inner, 3), coilH, coilQ: LOADING_COIL_Q },
            {
              name: 'total wire length (coils fixed)',
              nominalM: APEX_WIRE_M + 2 * (inner + COIL_TIP_SHARE * roomBeyond),
              minM: APEX_WIRE_M + 2 * (inner + 0.3 * roomBeyond),
              maxM: APEX_WIRE_M + 2 * straight,
            },
          );
          words =
            `legs shortened to reach ${reach.toFixed(1)} m in plan (the room the lot leaves), with loading coils of ` +
            `${microhenries(coilH)} (Q ${LOADING_COIL_Q}) ${inner.toFixed(1)} m down each leg from the apex ` +
            `(${Math.round(COIL_POSITION_FRACTION * 100)} % of it); the wire beyond the coils is trimmed`;
        }
        for (let beta = 0; beta < full; beta += ORIENTATION_STEP_DEG)
          out.proposals.push({ design, ...orient(beta), adaptations: [words] });
      }
    }
    return out.result();
  },
  model(d, L): WireModel {
    const lambda = lambdaOf(d);
    const sh = shape(d, L);
    const wires: ModelWire[] = [wire(sh.apexL, sh.apexR, lambda, 'feed wire at the apex', true)];
    const loads: WireModel['loads'] = [];
    for (const [name, leg] of [
      ['L', sh.L],
      ['R', sh.R],
    ] as const) {
      if (leg.coil) {
        wires.push(wire(leg.from, leg.coil, lambda, `leg ${name} to the loading coil`));
        wires.push(wire(leg.coil, leg.to, lambda, `leg ${name} beyond the loading coil`));
        loads.push(coilLoad(wires.length - 1, 0, num(d, 'coilH'), d.designFreqHz, num(d, 'coilQ')));
      } else wires.push(wire(leg.from, leg.to, lambda, `leg ${name}`));
      if (leg.fold) {
        wires.push(wire(leg.fold.link[0], leg.fold.link[1], lambda, `leg ${name} turn`));
        if (leg.fold.back)
          wires.push(wire(leg.fold.back[0], leg.fold.back[1], lambda, `leg ${name} folded back`));
      }
    }
    return {
      wires,
      feeds: [{ wire: 0, position: 0.5 }],
      radials: [],
      ...(loads.length ? { loads } : {}),
    };
  },
  elements(d, L): Element[] {
    const sh = shape(d, L);
    const legs = [
      ['L', sh.L],
      ['R', sh.R],
    ] as const;
    const els: Element[] = [{ kind: 'wire', label: 'apex', from: sh.apexL, to: sh.apexR }];
    // Wires first, then ends, ropes and anchors (the order the reasons of a misfit list them in).
    for (const [name, leg] of legs) {
      if (leg.coil) {
        els.push({ kind: 'wire', label: `leg ${name} to the loading coil`, from: leg.from, to: leg.coil });
        els.push({ kind: 'wire', label: `leg ${name} beyond the loading coil`, from: leg.coil, to: leg.to });
      } else els.push({ kind: 'wire', label: `leg ${name}`, from: leg.from, to: leg.to });
    }
    for (const [name, leg] of legs)
      if (leg.fold) {
        els.push({ kind: 'wire', label: `leg ${name} turn`, from: leg.fold.link[0], to: leg.fold.link[1] });
        const back = leg.fold.back;
        if (back) els.push({ kind: 'wire', label: `leg ${name} folded back`, from: back[0], to: back[1] });
      }
    const ground = (leg: Leg): XYZ => [leg.tie[0], leg.tie[1], 0];
    for (const [name, leg] of legs) els.push({ kind: 'end', label: `end of leg ${name}`, at: leg.end });
    for (const [name, leg] of legs)
      els.push({ kind: 'rope', label: `anchor rope ${name}`, from: leg.tie, to: ground(leg) });
    for (const [name, leg] of legs) els.push({ kind: 'anchor', label: `anchor ${name}`, at: ground(leg) });
    els.push({ kind: 'support', label: 'support', supportId: 'S', at: [0, 0], heightM: num(d, 'heightM') });
    return els;
  },
  heights(d, L) {
    const sh = shape(d, L);
    const hs = [
      { label: 'apex (feed point)', heightM: sh.apexL[2] },
      { label: 'leg ends', heightM: sh.L.end[2] },
    ];
    if (sh.L.coil) hs.push({ label: 'loading coils', heightM: sh.L.coil[2] });
    return hs;
  },
  cutList(d, L) {
    const form = endFormOf(d);
    if (form === 2) {
      const inner = num(d, 'coilFromApexM');
      return [
        cut('inverted-V leg, apex insulator to loading coil', 2, inner + APEX_WIRE_M / 2),
        cut('inverted-V leg, loading coil to end', 2, L / 2 - APEX_WIRE_M / 2 - inner),
      ];
    }
    return [
      cut(
        form === 1
          ? `inverted-V leg (apex insulator to end, folded back ${FOLD_GAP_M} m above the leg at its end)`
          : 'inverted-V leg (apex insulator to end)',
        2,
        L / 2,
      ),
    ];
  },
};
