/**
 * Estimates for loading a vertical shorter than a quarter wave (issue 19): the top hat or T top
 * arm length and the loading coil that bring it near resonance, and the coil's inductance from
 * its winding. They only set the nominal of each design's trim and its limits; the planner's one
 * trim routine (core/rank/evaluate.ts) finds the resonance with the field solver.
 *
 * Line model (from memory: Schelkunoff and Friis, Antennas: Theory and Practice, 1952, the
 * monopole as an open line of average characteristic impedance Z0 = 60(ln(2h/a) − 1) Ω): a
 * vertical of height h loaded at its top by a reactance X is resonant at its base when
 * X = −Z0·tan(βh) (input impedance of a lossless line terminated by jX). A coil at height hc with
 * u = h − hc of wire above it needs X_L = Z0·(cot βu − tan βhc).
 */
import { WIRE_RADIUS_M } from './common.ts';

/** Average characteristic impedance of a vertical wire of height h (Ω; line model above, from memory). */
export function monopoleZ0(heightM: number, radiusM = WIRE_RADIUS_M): number {
  return 60 * (Math.log((2 * heightM) / radiusM) - 1);
}

/**
 * Length of each of `count` equal wires from the top of a vertical of height h that brings it to
 * resonance (line model: each wire an open line of the same Z0, the wires in parallel at the top).
 */
export function hatArmEstimateM(heightM: number, wavelengthM: number, count: number): number {
  const beta = (2 * Math.PI) / wavelengthM;
  if (beta * heightM >= Math.PI / 2) return 0;
  // (Z0/n)·cot(βℓ) = Z0·tan(βh)  ⇒  βℓ = arccot(n·tan βh)
  return Math.atan(1 / (count * Math.tan(beta * heightM))) / beta;
}

/** Reactance (Ω) of the coil at height hc on a vertical of height h that brings it to resonance (line model). */
export function coilReactanceEstimateOhm(heightM: number, coilHeightM: number, wavelengthM: number): number {
  const beta = (2 * Math.PI) / wavelengthM;
  const z0 = monopoleZ0(heightM);
  const u = heightM - coilHeightM;
  return z0 * (1 / Math.tan(beta * u) - Math.tan(beta * coilHeightM));
}

/** Former of the loading coil: 110 mm outside diameter (a plastic drain pipe; common practice, no source). */
export const COIL_FORMER_DIAMETER_M = 0.11;
/** Winding pitch: 2 mm wire at twice its diameter, space-wound for Q (common practice, no source). */
export const COIL_PITCH_M = 0.004;
/** Unloaded Q of such a coil at 1.8–7 MHz (common practice, no source); its loss is R = ωL/Q. */
export const COIL_Q = 200;

/** Turns on the former for a winding of `windingM` metres of wire. */
export function coilTurns(windingM: number): number {
  return windingM / (Math.PI * COIL_FORMER_DIAMETER_M);
}

/**
 * Inductance (H) of a single-layer coil of N turns, radius r and length ℓ = N·pitch: Wheeler's
 * formula L[µH] = r²N²/(9r + 10ℓ) with r, ℓ in inches (H. A. Wheeler, "Simple inductance formulas
 * for radio coils", Proc. IRE 16 (1928) 1398; within about 1 % for ℓ > 0.8r; from memory), here
 * in metres: L = 1e-6·r²N² / (0.0254·(9r + 10ℓ)).
 */
export function coilInductanceH(windingM: number): number {
  const n = coilTurns(windingM);
  const r = COIL_FORMER_DIAMETER_M / 2;
  const len = n * COIL_PITCH_M;
  return (1e-6 * r * r * n * n) / (0.0254 * (9 * r + 10 * len));
}

/** The winding (metres of wire on the former) whose inductance is `lH` (bisection on the monotone formula). */
export function windingForInductanceM(lH: number): number {
  let lo = 0;
  let hi = 1;
  while (coilInductanceH(hi) < lH) hi *= 2;
  for (let k = 0; k < 60; k++) {
    const mid = (lo + hi) / 2;
    if (coilInductanceH(mid) < lH) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** Loss resistance (Ω) of a coil of inductance lH at frequency f and Q COIL_Q: R = ωL/Q. */
export function coilLossOhm(lH: number, freqHz: number): number {
  return (2 * Math.PI * freqHz * lH) / COIL_Q;
}
