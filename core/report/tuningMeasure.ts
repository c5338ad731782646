/**
 * The tuning measurement through the field solver: the design re-solved with its trim dimension
 * a little shorter and a little longer, the resonance at each, and the rate between them. The
 * caller decides where the solver runs (an Evaluator); the texts are in ./tuning.ts.
 */
import type { Design } from '../antennas/types.ts';
import { evaluationModel } from '../antennas/conductors.ts';
import type { EvalGround, Evaluator } from '../rank/evaluator.ts';
import { quadraticThrough } from '../numeric/fit.ts';
import { trimToResonance } from '../numeric/roots.ts';

/** Relative change of the trim dimension for the tuning measurement (each side of the design). */
export const TUNING_STEP = 0.005;

/** The step as the sheet prints it, e.g. "±0.5 %". */
export const TUNING_STEP_TEXT = `±${+(TUNING_STEP * 100).toFixed(3)} %`;

export interface TuningMeasurement {
  dimension: string;
  trimM: number;
  /** Resonant frequency (feed reactance zero) at trim·(1 − step) and trim·(1 + step), MHz. */
  resonanceMHz: { shorter: number; longer: number };
  /** Shift of resonance per centimetre of the trim dimension, kHz/cm (negative: longer → lower). */
  kHzPerCm: number;
  /** Length change of the trim dimension that moves resonance up by 10 kHz, cm (positive: shorten). */
  cmPer10kHzUp: number;
}

/**
 * Resonance (X = 0) of the quadratic through three reactances, found by the one trim routine
 * from the middle frequency, within ±50 % of it (a fit over ±1 %, so far from the middle it is an
 * extrapolation; a design the trim left far from resonance gets a tuning problem, ./tuning.ts).
 */
function reactanceZero(fs: [number, number, number], xs: [number, number, number]): number {
  const X = quadraticThrough(fs, xs);
  const f1 = fs[1];
  return trimToResonance(X, {
    start: f1,
    min: 0.5 * f1,
    max: 1.5 * f1,
    fTol: 1e-6,
    xTol: 1e-3,
    maxEvaluations: 60,
    firstStep: 0.001,
  }).x;
}

/**
 * Re-evaluate the design with its trim dimension at ±TUNING_STEP: at each length the feed
 * reactance at f0 and f0 ± 1 % (feed only), its zero by a quadratic fit, and the shift of that
 * resonance per centimetre.
 */
export function measureTuning(
  design: Design,
  trimM: number,
  ground: EvalGround,
  evaluator: Evaluator,
): TuningMeasurement {
  const f0 = design.designFreqHz;
  const fs: [number, number, number] = [f0 * 0.99, f0, f0 * 1.01];
  const resAt = (t: number): number => {
    const model = evaluationModel(design, t);
    const r = evaluator({ model, ground, frequenciesHz: fs, pattern: null });
    return reactanceZero(fs, [r[0].zOhm[1], r[1].zOhm[1], r[2].zOhm[1]]);
  };
  const lo = trimM * (1 - TUNING_STEP);
  const hi = trimM * (1 + TUNING_STEP);
  const fShort = resAt(lo);
  const fLong = resAt(hi);
  const kHzPerCm = (fLong - fShort) / 1e3 / ((hi - lo) * 100);
  return {
    dimension: design.trim.name,
    trimM,
    resonanceMHz: { shorter: fShort / 1e6, longer: fLong / 1e6 },
    kHzPerCm,
    cmPer10kHzUp: kHzPerCm !== 0 ? -10 / kHzPerCm : NaN,
  };
}
