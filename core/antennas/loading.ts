/**
 * Shortening a wire antenna to fit (issue 19): ends folded back along the wire, and loading coils.
 * Shared by the dipole and the inverted-V builders.
 *
 * Fold-back: the last part of each half turns back along the wire, FOLD_GAP_M below it (a short
 * link at the turn), toward the feed. Near the ends the current is small, so the folded part
 * cancels little of the radiation; it lengthens the wire electrically where there is no room.
 * The gap keeps the two parallel conductors 300 wire radii apart, well clear of the few radii
 * where the thin-wire kernel loses accuracy (core/em/mesh.ts warns there).
 *
 * Loading coils: a series coil in each half at COIL_POSITION_FRACTION of the way from the feed
 * to the end; the wire beyond the coil is the trim. The coil's loss resistance at its stated Q is
 * R = ωL/Q (the definition of a coil's quality factor, Q = ωL/R), put in series with it in the
 * solver's model, so its dissipation comes back as the load loss of the loss split.
 */
import type { LoadSpec } from '../em/types.ts';

/** Gap between a wire and its folded-back end, metres (common practice, no source; ≥ 0.2 m for the solver). */
export const FOLD_GAP_M = 0.3;
/** Longest fold-back, as a fraction of the half it folds back along (a choice of this planner, no source). */
export const FOLD_MAX_FRACTION = 0.6;
/** Shortest fold-back modelled, metres (below it the end is left as a short turn down). */
export const FOLD_MIN_M = 0.05;
/** Q of a loading coil: a typical air-wound coil at these frequencies (common practice, no source). */
export const LOADING_COIL_Q = 200;
/** Where the coil sits in each half, as a fraction of the way from the feed to the end (common practice, no source). */
export const COIL_POSITION_FRACTION = 0.5;

/**
 * Average characteristic impedance of a thin wire of half-length hM and radius rM seen as a
 * transmission line, 60·(ln(2h/r) − 1) Ω (Schelkunoff's average characteristic impedance of a
 * cylindrical antenna; from memory, used only for a starting estimate).
 */
export function averageZ0Ohm(hM: number, radiusM: number): number {
  return 60 * (Math.log((2 * hM) / radiusM) - 1);
}

/**
 * Reactance of the coil that brings a half of innerM (feed to coil) plus outerM (coil to end)
 * to a quarter wave, from the transmission-line picture of each half: the open wire beyond the
 * coil shows −jZ0·cot(β·outer), and the section below the coil must see what an open line of
 * λ/4 − inner shows, −jZ0·tan(β·inner), so X = Z0·(cot(β·outer) − tan(β·inner)) (the usual
 * loading-coil estimate of the trade; from memory). A starting point only: the solver trims the
 * wire beyond the coil to resonance.
 */
export function loadingReactanceOhm(
  innerM: number,
  outerM: number,
  lambdaM: number,
  radiusM: number,
): number {
  const beta = (2 * Math.PI) / lambdaM;
  const z0 = averageZ0Ohm(innerM + outerM, radiusM);
  return z0 * (1 / Math.tan(beta * outerM) - Math.tan(beta * innerM));
}

/** Series loss resistance of a coil of inductance lH at freqHz and quality factor q: R = ωL/Q. */
export function coilLossOhm(lH: number, freqHz: number, q: number = LOADING_COIL_Q): number {
  return (2 * Math.PI * freqHz * lH) / q;
}

/** The solver's load for a loading coil at a wire position: L in series with ωL/Q at the design frequency. */
export function coilLoad(
  wire: number,
  position: number,
  lH: number,
  freqHz: number,
  q: number = LOADING_COIL_Q,
): LoadSpec {
  return { wire, position, kind: 'series-rlc', lH, rOhm: coilLossOhm(lH, freqHz, q) };
}

/** Microhenries, for the words of an adaptation. */
export const microhenries = (lH: number): string => `${(lH * 1e6).toFixed(lH < 1e-5 ? 1 : 0)} µH`;
