/**
 * The contract between the planner and the field solver. The planner never computes fields: it
 * sends wire models to an Evaluator and reads back impedance, power balance and gain. The
 * adapter to the project's method-of-moments solver lives in ./solver.ts; tests of planning
 * mechanics may pass their own Evaluator.
 */
import type { Soil } from '../project/schema.ts';
import type { WireModel } from '../antennas/types.ts';
import { DEFAULT_REFERENCE_OHM } from '../em/swr.ts';

export type EvalGround = Soil | 'perfect' | 'free-space';

export interface PatternRequest {
  elevationsDeg: readonly number[];
  azimuthsDeg: readonly number[];
}

export interface EvalRequest {
  model: WireModel;
  ground: EvalGround;
  frequenciesHz: readonly number[];
  /** Pattern grid, or null when only the feed is wanted. */
  pattern: PatternRequest | null;
}

/**
 * One frequency of an evaluation. A feed-only request (pattern: null) needs only `zOhm`; the
 * evaluator may then leave out the power split (it costs a far-field integration).
 */
export interface EvalFrequency {
  freqHz: number;
  /** Feed-point impedance [R, X], ohms. */
  zOhm: [number, number];
  inputPowerW?: number;
  radiatedPowerW?: number;
  conductorLossW?: number;
  /** Loss in the model's lumped loads (loading coils), watts; absent when it has none. */
  loadLossW?: number;
  groundLossW?: number;
  /** Loss in the radial field(s) near the base; absent when no wire with radials touches the soil. */
  groundSystemLossW?: number;
  /** Loss where wires without radials (a grounded tower, a bare stake) meet the soil; absent when none do. */
  bareContactLossW?: number;
  /** Arrays (a model with a feed network), full requests: each feed's drive impedance and current. */
  ports?: { zOhm: [number, number]; currentA: [number, number] }[];
  /** Arrays, full requests: power dissipated in the feed network, watts. */
  networkLossW?: number;
  /** Total gain, dBi, on the requested grid: elevation-major (index = iEl·nAz + iAz). */
  gainDbi: Float64Array | null;
  diagnostics: string[];
}

/** Evaluates a wire model over ground at each frequency. Synchronous, deterministic. */
export type Evaluator = (request: EvalRequest) => EvalFrequency[];

/** Reference impedance of the feed line for SWR, ohms (50 Ω coax; the field solver's default). */
export const Z0_OHM = DEFAULT_REFERENCE_OHM;
