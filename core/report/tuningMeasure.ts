/**
 * The tuning measurement through the field solver: the design re-solved with its trim dimension
 * a little shorter and a little longer, the resonance at each, and the rate between them. The
 * caller decides where the solver runs (an Evaluator); the texts are in ./tuning.ts.
 */
import type { Design } from '../antennas/types.ts';
import { evaluationModel } from '../antennas/conductors.ts';
import type { EvalGround, Evaluator } from '../rank/evaluator.ts';

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

/** Zero of X(f) from a quadratic through three points, nearest f1. */
function reactanceZero(fs: [number, number, number], xs: [number, number, number]): number {
  const [f0, f1, f2] = fs;
  const [x0, x1, x2] = xs;
  // X(f) = a (f − f1)² + b (f − f1) + x1
  const d0 = f0 - f1;
  const d2 = f2 - f1;
  const a = ((x0 - x1) / d0 - (x2 - x1) / d2) / (d0 - d2);
  const b = (x0 - x1) / d0 - a * d0;
  if (Math.abs(a) < 1e-30) return f1 - x1 / b;
  const disc = b * b - 4 * a * x1;
  if (disc < 0) return f1 - x1 / b;
  const r1 = (-b + Math.sqrt(disc)) / (2 * a);
  const r2 = (-b - Math.sqrt(disc)) / (2 * a);
  return f1 + (Math.abs(r1) < Math.abs(r2) ? r1 : r2);
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
