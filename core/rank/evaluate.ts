/**
 * One design through the solver: trim to resonance at the design frequency, a three-point
 * impedance sweep for the 2:1 SWR bandwidth, and the pattern on the canonical grid.
 *
 * Trim: secant iterations on the feed reactance X(trim dimension) until |X| < TRIM_TOL_X_OHM or
 * the step is under TRIM_TOL_M; the trim value stays inside the design's limits. When no zero is
 * found inside the limits, the evaluated value of lowest SWR is kept and `resonant` is false.
 *
 * Bandwidth: R(f) and X(f) are fitted by quadratics through f0·(1 − δ), f0, f0·(1 + δ) with
 * δ = SWEEP_FRACTION, and the fitted SWR is followed outward from f0 in steps of 0.05 % up to
 * ±2δ. Beyond ±δ it is an extrapolation; the result says so when an edge lies there.
 */
import { evaluationModel } from '../antennas/conductors.ts';
import type { Design } from '../antennas/types.ts';
import { Z0_OHM, swrOf, type EvalGround, type EvalFrequency, type Evaluator } from './evaluator.ts';
import { PATTERN_GRID } from './pattern.ts';
import { feedRatios, type ArrayFeed } from '../antennas/arrayFeed.ts';

export const TRIM_TOL_X_OHM = 0.5;
export const TRIM_TOL_M = 0.001;
export const TRIM_MAX_EVALUATIONS = 8;
export const SWEEP_FRACTION = 0.02;

export interface PowerSplit {
  inputW: number;
  radiatedW: number;
  conductorLossW: number;
  groundLossW: number;
  /** radiated / input. */
  efficiency: number;
}

export interface EvaluationRecord {
  trimM: number;
  resonant: boolean;
  trimSteps: { trimM: number; zOhm: [number, number] }[];
  freqHz: number;
  zOhm: [number, number];
  swr: number;
  power: PowerSplit;
  bandwidth: { lowHz: number | null; highHz: number | null; widthHz: number; extrapolated: boolean };
  /** Gain on PATTERN_GRID, elevation-major. */
  gainDbi: number[];
  peak: { gainDbi: number; elevationDeg: number; azimuthDeg: number };
  diagnostics: string[];
  /**
   * The pattern over other soil classes (the soil range), at the trim found over the project's
   * soil: gain on PATTERN_GRID, one entry per class asked for. Absent when none was asked.
   */
  soilRange?: { soilId: string; gainDbi: number[] }[];
  /** Arrays: what the feed network achieves at f0 (core/antennas/arrayFeed.ts). */
  arrayFeed?: ArrayFeed;
}

function arrayFeedOf(
  design: Design,
  trimM: number,
  ports: NonNullable<EvalFrequency['ports']>,
  networkLossW: number,
  inputW: number,
): ArrayFeed {
  const model = evaluationModel(design, trimM);
  return {
    elements: feedRatios(
      model.feeds.map((f) => model.wires[f.wire].label),
      ports,
      model.referenceFeed ?? 0,
    ),
    networkLossShare: inputW > 0 ? networkLossW / inputW : 0,
  };
}

function fitQuadratic(xs: readonly number[], ys: readonly number[]): (x: number) => number {
  // Lagrange form through three points.
  const [x0, x1, x2] = xs;
  const [y0, y1, y2] = ys;
  return (x) =>
    (y0 * (x - x1) * (x - x2)) / ((x0 - x1) * (x0 - x2)) +
    (y1 * (x - x0) * (x - x2)) / ((x1 - x0) * (x1 - x2)) +
    (y2 * (x - x0) * (x - x1)) / ((x2 - x0) * (x2 - x1));
}

function one(
  evaluator: Evaluator,
  design: Design,
  trimM: number,
  ground: EvalGround,
  freqs: number[],
  pattern: boolean,
): EvalFrequency[] {
  const model = evaluationModel(design, trimM);
  return evaluator({
    model,
    ground,
    frequenciesHz: freqs,
    pattern: pattern
      ? { elevationsDeg: PATTERN_GRID.elevationsDeg, azimuthsDeg: PATTERN_GRID.azimuthsDeg }
      : null,
  });
}

/**
 * Only the soil range of a design already trimmed over the project's soil: one solve with pattern
 * per soil class at `trimM`. The other fields of the record are empty (it is kept in the cache
 * under its own key, beside the design's full record).
 */
function soilRangeRecord(
  design: Design,
  evaluator: Evaluator,
  soilRange: readonly string[],
  trimM: number,
): EvaluationRecord {
  const f0 = design.designFreqHz;
  return {
    trimM,
    resonant: false,
    trimSteps: [],
    freqHz: f0,
    zOhm: [0, 0],
    swr: Infinity,
    power: { inputW: 0, radiatedW: 0, conductorLossW: 0, groundLossW: 0, efficiency: 0 },
    bandwidth: { lowHz: null, highHz: null, widthHz: 0, extrapolated: false },
    gainDbi: [],
    peak: { gainDbi: -Infinity, elevationDeg: 0, azimuthDeg: 0 },
    diagnostics: [],
    soilRange: soilRange.map((soilId) => {
      const r = one(evaluator, design, trimM, { classId: soilId }, [f0], true)[0];
      return { soilId, gainDbi: r.gainDbi ? Array.from(r.gainDbi) : [] };
    }),
  };
}

/**
 * Trim, sweep and pattern of one design; with `soilRange` (soil class ids), also the pattern over
 * each of those soils at the same trim (the design as trimmed over the project's soil, which is
 * what the user would build; one solve with pattern per soil, no trim and no sweep).
 */
export function evaluateDesign(
  design: Design,
  ground: EvalGround,
  evaluator: Evaluator,
  soilRange: readonly string[] = [],
  soilOnly?: { trimM: number },
): EvaluationRecord {
  const f0 = design.designFreqHz;
  if (soilOnly) return soilRangeRecord(design, evaluator, soilRange, soilOnly.trimM);
  const { minM, maxM, nominalM } = design.trim;
  const clamp = (v: number): number => Math.min(maxM, Math.max(minM, v));
  const steps: { trimM: number; zOhm: [number, number] }[] = [];
  const at = (p: number): number => {
    const r = one(evaluator, design, p, ground, [f0], false)[0];
    steps.push({ trimM: p, zOhm: r.zOhm });
    return r.zOhm[1];
  };
  let p0 = clamp(nominalM);
  let x0 = at(p0);
  let p1 = clamp(p0 * (x0 > 0 ? 0.97 : 1.03));
  let x1 = at(p1);
  let resonant = Math.abs(x1) < TRIM_TOL_X_OHM || Math.abs(x0) < TRIM_TOL_X_OHM;
  while (!resonant && steps.length < TRIM_MAX_EVALUATIONS) {
    if (x1 === x0) break;
    const p2 = clamp(p1 - (x1 * (p1 - p0)) / (x1 - x0));
    if (Math.abs(p2 - p1) < TRIM_TOL_M) {
      resonant = Math.abs(x1) < 5 * TRIM_TOL_X_OHM;
      break;
    }
    p0 = p1;
    x0 = x1;
    p1 = p2;
    x1 = at(p1);
    if (Math.abs(x1) < TRIM_TOL_X_OHM) resonant = true;
  }
  let best = steps[0];
  for (const s of steps) {
    if (resonant ? Math.abs(s.zOhm[1]) < Math.abs(best.zOhm[1]) : swrOf(s.zOhm) < swrOf(best.zOhm)) best = s;
  }
  const trimM = best.trimM;
  const diagnostics: string[] = [];
  if (!resonant) {
    diagnostics.push(
      `no resonance within the ${design.trim.name} limits (${minM.toFixed(2)}–${maxM.toFixed(2)} m); kept the lowest SWR`,
    );
  }
  const fl = f0 * (1 - SWEEP_FRACTION);
  const fh = f0 * (1 + SWEEP_FRACTION);
  const sweep = one(evaluator, design, trimM, ground, [fl, fh], false);
  const main = one(evaluator, design, trimM, ground, [f0], true)[0];
  const { inputPowerW, radiatedPowerW, conductorLossW, groundLossW } = main;
  if (
    inputPowerW === undefined ||
    radiatedPowerW === undefined ||
    conductorLossW === undefined ||
    groundLossW === undefined
  ) {
    throw new Error('the evaluator left out the power split of a full (pattern) request');
  }
  for (const r of [...sweep, main]) diagnostics.push(...r.diagnostics);
  const fs = [fl, f0, fh];
  const R = fitQuadratic(fs, [sweep[0].zOhm[0], main.zOhm[0], sweep[1].zOhm[0]]);
  const X = fitQuadratic(fs, [sweep[0].zOhm[1], main.zOhm[1], sweep[1].zOhm[1]]);
  const swrAt = (f: number): number => swrOf([R(f), X(f)], Z0_OHM);
  const edge = (dir: 1 | -1): number | null => {
    if (swrAt(f0) > 2) return null;
    let prev = f0;
    for (let k = 1; k <= 800; k++) {
      const f = f0 * (1 + dir * k * 0.0005);
      if (Math.abs(f - f0) > 2 * SWEEP_FRACTION * f0) return null;
      if (swrAt(f) > 2) {
        // Linear interpolation of SWR between prev and f.
        const s0 = swrAt(prev);
        const s1 = swrAt(f);
        return prev + ((2 - s0) / (s1 - s0)) * (f - prev);
      }
      prev = f;
    }
    return null;
  };
  const lowHz = edge(-1);
  const highHz = edge(1);
  const swr0 = swrOf(main.zOhm);
  const widthHz =
    swr0 > 2 ? 0 : (highHz ?? f0 * (1 + 2 * SWEEP_FRACTION)) - (lowHz ?? f0 * (1 - 2 * SWEEP_FRACTION));
  const extrapolated = [lowHz, highHz].some((f) => f === null || Math.abs(f - f0) > SWEEP_FRACTION * f0);
  const g = main.gainDbi ? Array.from(main.gainDbi) : [];
  let pk = -Infinity;
  let pkI = 0;
  g.forEach((v, i) => {
    if (v > pk) {
      pk = v;
      pkI = i;
    }
  });
  const nAz = PATTERN_GRID.azimuthsDeg.length;
  const range = soilRange.length
    ? (soilRangeRecord(design, evaluator, soilRange, trimM).soilRange ?? [])
    : [];
  return {
    trimM,
    resonant,
    trimSteps: steps,
    freqHz: f0,
    zOhm: main.zOhm,
    swr: swr0,
    power: {
      inputW: inputPowerW,
      radiatedW: radiatedPowerW,
      conductorLossW,
      groundLossW,
      efficiency: inputPowerW > 0 ? radiatedPowerW / inputPowerW : 0,
    },
    bandwidth: { lowHz, highHz, widthHz, extrapolated: swr0 <= 2 && extrapolated },
    gainDbi: g,
    peak: {
      gainDbi: pk,
      elevationDeg: PATTERN_GRID.elevationsDeg[Math.floor(pkI / nAz)] ?? 0,
      azimuthDeg: PATTERN_GRID.azimuthsDeg[pkI % nAz] ?? 0,
    },
    diagnostics: [...new Set(diagnostics)],
    ...(range.length ? { soilRange: range } : {}),
    ...(main.ports
      ? { arrayFeed: arrayFeedOf(design, trimM, main.ports, main.networkLossW ?? 0, inputPowerW) }
      : {}),
  };
}
