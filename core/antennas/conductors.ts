/**
 * Metal supports as conductors. A steel or aluminium tower or mast near an antenna carries
 * induced current and changes the antenna's feed impedance and pattern, so the planner puts
 * every conducting support within NEARBY_WAVELENGTHS of a candidate's wires into that candidate's
 * model as one vertical conductor of an equivalent radius (grounded at its base unless the user
 * says it is not). The antenna's own support, when it conducts, is always within that distance.
 *
 * Equivalent radius:
 *  - a tubular mast: half its outside diameter;
 *  - a lattice tower of face width w: its three legs (radius c, at the corners of an equilateral
 *    triangle of side w) replaced by one cylinder of the same capacitance per unit length, the
 *    equivalent radius of a bundle of conductors, a_eq = ∛(c·w²) for three conductors (the
 *    "bundled conductors" result of power-line theory: J. J. Grainger and W. D. Stevenson,
 *    Power System Analysis, 1994, the chapter on line capacitance; formula from memory, not
 *    checked against the book here). The bracing is left out (it makes the tower look fatter,
 *    so a_eq is, if anything, small). The leg radius is not asked of the user:
 *    LATTICE_LEG_RADIUS_M.
 *
 * A wire hung from a conducting support cannot lie on the support's axis in the model (two
 * conductors in one place). Where an antenna's wire comes closer than STANDOFF_M to the axis,
 * the support's conductor is moved STANDOFF_M away, to the side opposite the main target
 * bearing: the wire hangs from a stand-off arm on the support's face toward the targets (common
 * practice, no source; a support taller than resonance acts as a reflector, so that is the
 * better side). The model stays honest about the coupling, which falls off slowly with distance
 * at these spacings; the exact mounting is the builder's choice.
 */
import { builderFor } from './registry.ts';
import { segmentsFor, lambdaOf } from './common.ts';
import type { Design, ModelWire, WireModel } from './types.ts';
import type { XY } from '../site/frame.ts';
import type { XYZ } from '../site/geometry.ts';
import { placeXYZ } from '../site/geometry.ts';
import type { SupportMetal } from './supportMetal.ts';

export {
  DEFAULT_FACE_WIDTH_M,
  DEFAULT_MAST_DIAMETER_M,
  LATTICE_LEG_RADIUS_M,
  latticeEquivalentRadiusM,
  supportMetal,
  type SupportMetal,
} from './supportMetal.ts';

/** Conducting supports within this many wavelengths (in plan) of a candidate's wires are modelled. */
export const NEARBY_WAVELENGTHS = 0.5;
/** Distance from a support's axis to a wire hung from it (a stand-off arm), metres (common practice, no source). */
export const STANDOFF_M = 1;
/**
 * Base of an ungrounded metal support above the ground in the model, metres: an insulated base
 * or a non-conducting footing (a modelling choice; at least five equivalent radii, so that the
 * thin-wire image kernel stays accurate, core/em/mesh.ts).
 */
export const UNGROUNDED_BASE_M = 0.5;

/** One conducting support as it goes into a candidate's model, in the design's canonical frame. */
export interface SupportConductor {
  supportId: string;
  name: string;
  /** Axis position in the canonical frame, metres (after any stand-off move). */
  xy: XY;
  heightM: number;
  radiusM: number;
  grounded: boolean;
  material: 'steel' | 'aluminium';
  /** True when the axis was moved STANDOFF_M off the support's surveyed position. */
  standoff: boolean;
}

/** Wires of the conductors (canonical frame), appended after the antenna's own wires. */
export function conductorWires(conductors: readonly SupportConductor[], lambdaM: number): ModelWire[] {
  return conductors.map((c) => {
    const base = c.grounded ? 0 : Math.max(UNGROUNDED_BASE_M, 5 * c.radiusM);
    const len = c.heightM - base;
    return {
      from: [c.xy[0], c.xy[1], base],
      to: [c.xy[0], c.xy[1], c.heightM],
      radiusM: c.radiusM,
      segments: segmentsFor(len, lambdaM),
      material: c.material,
      label: `${c.name} (${c.grounded ? 'grounded' : 'ungrounded'} metal support)`,
    };
  });
}

/**
 * The model the solver sees: the builder's wires at `trimM` plus the design's conducting
 * supports. The antenna's wires keep their indices (feeds and radials are unchanged).
 */
export function evaluationModel(design: Design, trimM: number): WireModel {
  const model = builderFor(design.type).model(design, trimM);
  if (!design.conductors?.length) return model;
  return { ...model, wires: [...model.wires, ...conductorWires(design.conductors, lambdaOf(design))] };
}

/** Closest distance between segment p0–p1 and segment q0–q1 (3-D), metres. */
export function segmentDistance(p0: XYZ, p1: XYZ, q0: XYZ, q1: XYZ): number {
  const d1 = [p1[0] - p0[0], p1[1] - p0[1], p1[2] - p0[2]];
  const d2 = [q1[0] - q0[0], q1[1] - q0[1], q1[2] - q0[2]];
  const r = [p0[0] - q0[0], p0[1] - q0[1], p0[2] - q0[2]];
  const dot = (a: number[], b: number[]): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
  const a = dot(d1, d1);
  const e = dot(d2, d2);
  const f = dot(d2, r);
  const clamp = (v: number): number => Math.min(1, Math.max(0, v));
  let s: number;
  let t: number;
  // Closest points of two segments (the standard clamped solution of the 2×2 system).
  if (a <= 1e-12 && e <= 1e-12) {
    s = 0;
    t = 0;
  } else if (a <= 1e-12) {
    s = 0;
    t = clamp(f / e);
  } else {
    const cc = dot(d1, r);
    if (e <= 1e-12) {
      t = 0;
      s = clamp(-cc / a);
    } else {
      const b = dot(d1, d2);
      const den = a * e - b * b;
      s = den > 1e-12 ? clamp((b * f - cc * e) / den) : 0;
      t = (b * s + f) / e;
      if (t < 0) {
        t = 0;
        s = clamp(-cc / a);
      } else if (t > 1) {
        t = 1;
        s = clamp((b - cc) / a);
      }
    }
  }
  const x = [r[0] + d1[0] * s - d2[0] * t, r[1] + d1[1] * s - d2[1] * t, r[2] + d1[2] * s - d2[2] * t];
  return Math.sqrt(dot(x, x));
}

/** Plan distance from point q to segment a–b (horizontal projection), metres. */
function planDistance(q: XY, a: XYZ, b: XYZ): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  const t = l2 > 0 ? Math.min(1, Math.max(0, ((q[0] - a[0]) * dx + (q[1] - a[1]) * dy) / l2)) : 0;
  return Math.hypot(a[0] + t * dx - q[0], a[1] + t * dy - q[1]);
}

export interface NearbySupport {
  id: string;
  name: string;
  /** Site frame position, metres. */
  xy: XY;
  /** The metal, or null for a mast whose material is not set (reported, not modelled). */
  metal: SupportMetal | null;
}

/**
 * The conducting supports near a placed design, in its canonical frame, sorted by id; and the
 * names of nearby masts whose material is unknown. `awayBearingDeg`: site bearing toward which a
 * support's conductor moves when a wire is hung on its axis (opposite the main target).
 */
export function conductorsNear(
  design: Design,
  placement: { originXY: XY; rotationDeg: number },
  supports: readonly NearbySupport[],
  awayBearingDeg: number,
): { conductors: SupportConductor[]; unknown: string[] } {
  const lambda = lambdaOf(design);
  const model = builderFor(design.type).model(design, design.trim.nominalM);
  const placed = model.wires.map((w) => ({
    from: placeXYZ(w.from, placement.rotationDeg, placement.originXY),
    to: placeXYZ(w.to, placement.rotationDeg, placement.originXY),
  }));
  const conductors: SupportConductor[] = [];
  const unknown: string[] = [];
  const rad = (placement.rotationDeg * Math.PI) / 180;
  const toCanonical = (p: XY): XY => {
    // Inverse of placeXY: translate back, then rotate counter-clockwise by the rotation.
    const dx = p[0] - placement.originXY[0];
    const dy = p[1] - placement.originXY[1];
    return [dx * Math.cos(rad) - dy * Math.sin(rad), dx * Math.sin(rad) + dy * Math.cos(rad)];
  };
  const r4 = (v: number): number => Math.round(v * 1e4) / 1e4;
  for (const s of [...supports].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0))) {
    const near = placed.some((w) => planDistance(s.xy, w.from, w.to) <= NEARBY_WAVELENGTHS * lambda);
    if (!near) continue;
    if (!s.metal) {
      unknown.push(s.name);
      continue;
    }
    const m = s.metal;
    const axisTop: XYZ = [s.xy[0], s.xy[1], m.heightM];
    const axisBase: XYZ = [s.xy[0], s.xy[1], 0];
    const closest = Math.min(...placed.map((w) => segmentDistance(axisBase, axisTop, w.from, w.to)));
    let xy: XY = s.xy;
    const standoff = closest < STANDOFF_M;
    if (standoff) {
      const b = (awayBearingDeg * Math.PI) / 180;
      xy = [s.xy[0] + STANDOFF_M * Math.sin(b), s.xy[1] + STANDOFF_M * Math.cos(b)];
    }
    const c = toCanonical(xy);
    conductors.push({
      supportId: s.id,
      name: s.name,
      xy: [r4(c[0]), r4(c[1])],
      heightM: m.heightM,
      radiusM: r4(m.radiusM),
      grounded: m.grounded,
      material: m.material,
      standoff,
    });
  }
  return { conductors, unknown };
}
