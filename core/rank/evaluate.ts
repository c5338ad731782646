/**
 * One design through the solver: trim to resonance at the design frequency, a three-point
 * impedance sweep for the 2:1 SWR bandwidth, and the pattern on the canonical grid.
 *
 * Trim: the one trim routine (trimToResonance, core/numeric/roots.ts) on the feed reactance
 * X(trim dimension) until |X| < TRIM_TOL_X_OHM or the step is under TRIM_TOL_M; the trim value
 * stays inside the design's limits. When no zero is found inside the limits, the evaluated value
 * of lowest SWR is kept and `resonant` is false.
 *
 * Bandwidth: R(f) and X(f) are fitted by quadratics through f0·(1 − δ), f0, f0·(1 + δ) with
 * δ = SWEEP_FRACTION; the 2:1 edges of the fitted SWR are found from f0 outward up to ±2δ by the
 * one SWR-edge routine (swrEdges, core/em/swr.ts). Beyond ±δ it is an extrapolation; the result
 * says so when an edge lies there.
 */
import { evaluationModel } from '../antennas/conductors.ts';
import { ModelError } from '../em/errors.ts';
import type { Design, WireModel } from '../antennas/types.ts';
import { swrEdges, swrOf } from '../em/swr.ts';
import { quadraticThrough } from '../numeric/fit.ts';
import { trimToResonance } from '../numeric/roots.ts';
import { Z0_OHM, type EvalGround, type EvalFrequency, type Evaluator } from './evaluator.ts';
import { PATTERN_GRID } from './pattern.ts';
import { feedRatios, type ArrayFeed } from '../antennas/arrayFeed.ts';
import type { PowerSplitIn } from './lossSplit.ts';

export const TRIM_TOL_X_OHM = 0.5;
export const TRIM_TOL_M = 0.001;
export const TRIM_MAX_EVALUATIONS = 8;
export const SWEEP_FRACTION = 0.02;

/** Where the input power goes (the fields of lossSplit.ts's PowerSplitIn) and the efficiency. */
export interface PowerSplit extends PowerSplitIn {
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
  soilRange?: { soilId: string; gainDbi: number[]; variants?: number[][] }[];
  /**
   * Set when the field solver refused the design (core/em ModelError: coincident wires from
   * supports at one place, a wire on the ground, …): the reason. The plan rejects the placement
   * with it instead of failing; every other field then holds a neutral value.
   */
  unsolvable?: string;
  /** Arrays: what the feed network achieves at f0 (core/antennas/arrayFeed.ts). */
  arrayFeed?: ArrayFeed;
  /**
   * Arrays with states of another phasing (Design.states[].variant): each variant's network
   * (WireModel.stateNetworks) solved at f0 at the same trim, with its pattern, the impedance the
   * station's line sees and what the network achieves. Variant k is variants[k − 1].
   */
  variants?: VariantRecord[];
}

/** One variant of an array's feed network, solved at the design's trim (EvaluationRecord.variants). */
export interface VariantRecord {
  gainDbi: number[];
  zOhm: [number, number];
  swr: number;
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

/** The record of a design the solver cannot solve: the reason, and neutral values elsewhere. */
export function unsolvableRecord(design: Design, reason: string): EvaluationRecord {
  return {
    trimM: design.trim.nominalM,
    resonant: false,
    trimSteps: [],
    freqHz: design.designFreqHz,
    zOhm: [0, 0],
    swr: 0,
    power: { inputW: 0, radiatedW: 0, conductorLossW: 0, groundLossW: 0, efficiency: 0 },
    bandwidth: { lowHz: null, highHz: null, widthHz: 0, extrapolated: false },
    gainDbi: [],
    peak: { gainDbi: -150, elevationDeg: 0, azimuthDeg: 0 },
    diagnostics: [reason],
    unsolvable: reason,
  };
}

function one(
  evaluator: Evaluator,
  design: Design,
  trimM: number,
  ground: EvalGround,
  freqs: number[],
  pattern: boolean,
  variant = 0,
): EvalFrequency[] {
  const model = variantModel(evaluationModel(design, trimM), variant);
  return evaluator({
    model,
    ground,
    frequenciesHz: freqs,
    pattern: pattern
      ? { elevationsDeg: PATTERN_GRID.elevationsDeg, azimuthsDeg: PATTERN_GRID.azimuthsDeg }
      : null,
  });
}

/** The model with variant k's network in place of its own (k = 0: the model itself). */
function variantModel(model: WireModel, k: number): WireModel {
  if (k === 0) return model;
  const net = model.stateNetworks?.[k - 1];
  if (!net) throw new Error(`the model has no network for variant ${k}`);
  return { ...model, network: net };
}

/** How many variants (other phasings) the design's model has. */
function variantCount(design: Design): number {
  return evaluationModel(design, design.trim.nominalM).stateNetworks?.length ?? 0;
}

/** Each variant of the design solved at f0 at `trimM`, with pattern (EvaluationRecord.variants). */
function variantRecords(
  design: Design,
  trimM: number,
  ground: EvalGround,
  evaluator: Evaluator,
): VariantRecord[] {
  const out: VariantRecord[] = [];
  for (let k = 1; k <= variantCount(design); k++) {
    const r = one(evaluator, design, trimM, ground, [design.designFreqHz], true, k)[0];
    out.push({
      gainDbi: r.gainDbi ? Array.from(r.gainDbi) : [],
      zOhm: r.zOhm,
      swr: swrOf(r.zOhm[0], r.zOhm[1], Z0_OHM),
      ...(r.ports
        ? { arrayFeed: arrayFeedOf(design, trimM, r.ports, r.networkLossW ?? 0, r.inputPowerW ?? 0) }
        : {}),
    });
  }
  return out;
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
      const variants = variantRecords(design, trimM, { classId: soilId }, evaluator).map((v) => v.gainDbi);
      return {
        soilId,
        gainDbi: r.gainDbi ? Array.from(r.gainDbi) : [],
        ...(variants.length ? { variants } : {}),
      };
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
  try {
    return evaluateDesignOrThrow(design, ground, evaluator, soilRange, soilOnly);
  } catch (e) {
    // One design the solver refuses is a rejected placement, never the end of the plan.
    if (e instanceof ModelError) return unsolvableRecord(design, e.message);
    throw e;
  }
}

function evaluateDesignOrThrow(
  design: Design,
  ground: EvalGround,
  evaluator: Evaluator,
  soilRange: readonly string[],
  soilOnly: { trimM: number } | undefined,
): EvaluationRecord {
  const f0 = design.designFreqHz;
  if (soilOnly) return soilRangeRecord(design, evaluator, soilRange, soilOnly.trimM);
  const { minM, maxM, nominalM } = design.trim;
  const steps: { trimM: number; zOhm: [number, number] }[] = [];
  const trimAt = (p: number): number => {
    const r = one(evaluator, design, p, ground, [f0], false)[0];
    steps.push({ trimM: p, zOhm: r.zOhm });
    return r.zOhm[1];
  };
  // A design with nothing left to trim (minM = maxM: a switched pair of antennas already trimmed)
  // is solved as it is.
  const fixed = minM === maxM;
  const { resonant } = fixed
    ? { resonant: Math.abs(trimAt(nominalM)) < TRIM_TOL_X_OHM }
    : trimToResonance(trimAt, {
        start: nominalM,
        min: minM,
        max: maxM,
        fTol: TRIM_TOL_X_OHM,
        xTol: TRIM_TOL_M,
        maxEvaluations: TRIM_MAX_EVALUATIONS,
      });
  const swr = (z: readonly [number, number]): number => swrOf(z[0], z[1], Z0_OHM);
  let best = steps[0];
  for (const s of steps) {
    if (resonant ? Math.abs(s.zOhm[1]) < Math.abs(best.zOhm[1]) : swr(s.zOhm) < swr(best.zOhm)) best = s;
  }
  const trimM = best.trimM;
  const diagnostics: string[] = [];
  if (!resonant && !fixed) {
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
  const R = quadraticThrough(fs, [sweep[0].zOhm[0], main.zOhm[0], sweep[1].zOhm[0]]);
  const X = quadraticThrough(fs, [sweep[0].zOhm[1], main.zOhm[1], sweep[1].zOhm[1]]);
  const swrAt = (f: number): number => swrOf(R(f), X(f), Z0_OHM);
  // The fitted curve sampled every 0.05 % out to ±2δ, its 2:1 edges found from f0 outward.
  const fsFit = Array.from({ length: 161 }, (_, k) => f0 * (1 + (k - 80) * 0.0005));
  const edges = swrEdges(swrAt, fsFit, fsFit.map(swrAt), 2, 1e-6 * f0, f0);
  const { lowerHz: lowHz, upperHz: highHz } = edges;
  const swr0 = swr(main.zOhm);
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
  const variants = variantRecords(design, trimM, ground, evaluator);
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
      ...(main.groundSystemLossW !== undefined ? { groundSystemLossW: main.groundSystemLossW } : {}),
      ...(main.bareContactLossW !== undefined ? { bareContactLossW: main.bareContactLossW } : {}),
      ...(main.loadLossW !== undefined ? { loadLossW: main.loadLossW } : {}),
      ...(main.networkLossW !== undefined ? { networkLossW: main.networkLossW } : {}),
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
      ? {
          arrayFeed: {
            ...arrayFeedOf(design, trimM, main.ports, main.networkLossW ?? 0, inputPowerW),
            ...(variants.length
              ? {
                  variants: variants.map((v) => ({
                    elements: v.arrayFeed?.elements ?? [],
                    networkLossShare: v.arrayFeed?.networkLossShare ?? 0,
                    feedZOhm: v.zOhm,
                    swr: v.swr,
                  })),
                }
              : {}),
          },
        }
      : {}),
    ...(variants.length ? { variants } : {}),
  };
}
