/**
 * evaluateAntenna: the field solver's public entry. Meshes once (at the highest frequency),
 * then for each frequency fills, solves, and reads off feed impedances, SWR, the split of the
 * input power, the pattern and its peak, and the average-gain model check.
 *
 * Gain is IEEE gain (IEEE Std 145-2013, 2.1 "gain"): 4πU/P_in, with P_in the power delivered to
 * the feeds, so conductor, load and ground losses all lower it. Average gain (a model check):
 * the mean of the gain over the sphere in free space, over the upper hemisphere over ground;
 * for a lossless antenna it is 1 and 2 respectively (power conservation), so
 *     averageGain = P_rad/P_in (free space),  2·P_rad/P_in (over ground).
 * Over lossy ground the ground loss is the input power not radiated into the upper half-space
 * and not lost in wires, loads or a feed network: P_in − P_rad − P_cond − P_load − P_net; its part in a radial system
 * (Wait–Pope) is reported separately. In free space and over perfect ground the same difference
 * should vanish; it is reported as a diagnostic when above 0.5 %. Over the exact ground, with
 * `groundPowerCheck`, the power into the ground is also computed on its own from the plane-wave
 * spectrum of the currents (halfspace/absorption.ts), and the balance is checked against it.
 */
import { brentMinimize } from '../numeric/roots.ts';
import { ETA0 } from './constants.ts';
import { ModelError, type Diagnostic } from './errors.ts';
import {
  integrateRadiatedPower,
  radiationIntensity,
  radiationIntensityGrid,
  type FarFieldSource,
} from './farfield.ts';
import type { GroundModel, GroundModelChoice } from './ground.ts';
import { groundAbsorption, groundAbsorptionWork } from './halfspace/absorption.ts';
import { ExactGroundAt, type ExactGroundModel } from './halfspace/ground.ts';
import { assertWork, GROUND_CHECK_S_PER_UNIT, MAX_GROUND_CHECK_WORK } from './limits.ts';
import { DEFAULT_SEGMENTS_PER_WAVELENGTH } from './mesh.ts';
import {
  createWorkspace,
  prepareModel,
  solveFrequency,
  type FrequencySolution,
  type PreparedModel,
} from './solver.ts';
import type { AntennaModel, ComplexPair } from './types.ts';
import type { Complex } from '../numeric/complex.ts';
import { swrOf } from './swr.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';

export { swrOf, SWR_CAP } from './swr.ts';

/** Gains below this are reported as this value (a null in the field), never as −∞ or NaN. */
export const GAIN_FLOOR_DBI = -150;
/** Default pattern step (degrees) over the upper half-space. */
export const DEFAULT_PATTERN_STEP_DEG = 2;

export interface PatternGrid {
  elevationsDeg: readonly number[];
  azimuthsDeg: readonly number[];
}

export interface EvaluateOptions {
  frequenciesHz: readonly number[];
  /** Pattern rows to report; default the upper half-space at 2° steps. Empty arrays: no rows. */
  pattern?: PatternGrid;
  referenceImpedanceOhm?: number;
  segmentsPerWavelength?: number;
  /** Include node currents per wire in the result. */
  includeCurrents?: boolean;
  /**
   * Lossy soil: 'exact' (default) uses the Sommerfeld half-space for segment pairs near the
   * ground (core/em/halfspace); 'approximate' the reflection-coefficient model everywhere.
   */
  groundModel?: GroundModelChoice;
  /**
   * Exact ground, no wire touching it: also compute the power into the ground on its own (the
   * plane-wave spectrum of the currents, halfspace/absorption.ts; tens of ms to seconds for very
   * low wires) and report the power balance against it.
   */
  groundPowerCheck?: boolean;
  /**
   * Only the total gain on the pattern grid, as one array (`gainGridDbi`, elevation-major), with no
   * point objects (`pattern` is then empty), and the peak taken as the largest of those gains
   * instead of searched for on the 2° grid and refined. For callers that read nothing else of the
   * pattern (the planner); the power split and every other figure are the same.
   */
  gainGridOnly?: boolean;
}

export interface PatternPoint {
  elevationDeg: number;
  azimuthDeg: number;
  gainDbi: number;
  verticalDbi: number;
  horizontalDbi: number;
}

export interface FeedOutput {
  wire: number;
  position: number;
  impedanceOhm: ComplexPair;
  currentA: ComplexPair;
  /** The gap voltage: the source voltage, or with a feed network the voltage it delivers. */
  voltageV: ComplexPair;
  swr: number;
}

export interface SourceOutput {
  node: string;
  kind: 'voltage' | 'current';
  voltageV: ComplexPair;
  currentA: ComplexPair;
  impedanceOhm: ComplexPair;
  swr: number;
  powerW: number;
}

export interface GroundSystemOutput {
  wire: number;
  radials: number;
  lossResistanceOhm: number;
  lossW: number;
  integrationLimitM: number;
  innerLimitM: number;
}

export interface FrequencyResult {
  frequencyHz: number;
  feeds: FeedOutput[];
  inputPowerW: number;
  radiatedPowerW: number;
  conductorLossW: number;
  loadLossW: number;
  /** Dissipated in the feed network's lines and impedances (core/em/network.ts); 0 without one. */
  networkLossW: number;
  /** The feed network's sources (the input power is theirs); empty without a network. */
  sources: SourceOutput[];
  /** All ground loss (radial system included); 0 in free space and over perfect ground. */
  groundLossW: number;
  groundSystems: GroundSystemOutput[];
  efficiency: number;
  averageGain: number;
  averageGainDb: number;
  peak: { elevationDeg: number; azimuthDeg: number; gainDbi: number };
  pattern: PatternPoint[];
  /** With `gainGridOnly`: the total gain, dBi, on the requested grid (index = iEl·nAz + iAz). */
  gainGridDbi?: Float64Array;
  /**
   * Power into the ground computed independently of the input power (exact ground with
   * `groundPowerCheck`, no wire touching the ground); null otherwise.
   */
  groundAbsorbedW: number | null;
  /**
   * P_in − (P_rad + losses), relative to P_in: free space and perfect ground, and lossy ground
   * when `groundAbsorbedW` is known (then the ground loss in the sum is that); null otherwise.
   */
  powerBalanceError: number | null;
  currents?: { wire: number; nodes: ComplexPair[] }[];
}

export interface EvaluationResult {
  frequencies: FrequencyResult[];
  segments: number;
  unknowns: number;
  groundModel: GroundModel['kind'];
  diagnostics: Diagnostic[];
}

export const toDbi = (g: number): number =>
  g > 0 ? Math.max(GAIN_FLOOR_DBI, 10 * Math.log10(g)) : GAIN_FLOOR_DBI;

const degs = (from: number, to: number, step: number): number[] => {
  const out: number[] = [];
  for (let v = from; v <= to + 1e-9; v += step) out.push(Math.round(v * 1e9) / 1e9);
  return out;
};

export const DEFAULT_PATTERN: PatternGrid = {
  elevationsDeg: degs(0, 90, DEFAULT_PATTERN_STEP_DEG),
  azimuthsDeg: degs(0, 360 - DEFAULT_PATTERN_STEP_DEG, DEFAULT_PATTERN_STEP_DEG),
};

const D2R = Math.PI / 180;

/** Gain (linear, total) for one direction. */
function gainAt(src: FarFieldSource, pin: number, elDeg: number, azDeg: number, tmp: Float64Array): number {
  radiationIntensity(src, elDeg * D2R, azDeg * D2R, ETA0, tmp);
  return (4 * Math.PI * (tmp[0] + tmp[1])) / pin;
}

/**
 * Peak over the default 2° grid (or the gains already computed on it; in free space also the
 * lower hemisphere), refined by Brent's minimiser in elevation and azimuth (± one step).
 */
function findPeak(
  src: FarFieldSource,
  pin: number,
  hasGround: boolean,
  gridGains: Float64Array | null,
): FrequencyResult['peak'] {
  const tmp = new Float64Array(2);
  const grid = DEFAULT_PATTERN;
  let best = -1;
  let bel = 0;
  let baz = 0;
  let idx = 0;
  for (const el of grid.elevationsDeg)
    for (const az of grid.azimuthsDeg) {
      const g = gridGains ? gridGains[idx++] : gainAt(src, pin, el, az, tmp);
      if (g > best) {
        best = g;
        bel = el;
        baz = az;
      }
    }
  const step = DEFAULT_PATTERN_STEP_DEG;
  const elLo = hasGround ? 0 : -90;
  if (!hasGround)
    // free space: the lower hemisphere too
    for (let el = -90; el < 0; el += step)
      for (const az of grid.azimuthsDeg) {
        const g = gainAt(src, pin, el, az, tmp);
        if (g > best) {
          best = g;
          bel = el;
          baz = az;
        }
      }
  for (let pass = 0; pass < 2; pass++) {
    const re = brentMinimize(
      (el) => -gainAt(src, pin, el, baz, tmp),
      Math.max(elLo, bel - step),
      Math.min(90, bel + step),
      1e-4,
      40,
    );
    if (-re.fx > best) {
      best = -re.fx;
      bel = re.x;
    }
    if (Math.abs(bel) < 90 - 1e-6) {
      const ra = brentMinimize((az) => -gainAt(src, pin, bel, az, tmp), baz - step, baz + step, 1e-4, 40);
      if (-ra.fx > best) {
        best = -ra.fx;
        baz = ((ra.x % 360) + 360) % 360;
      }
    }
  }
  const r4 = (v: number) => Math.round(v * 1e4) / 1e4;
  return { elevationDeg: r4(bel), azimuthDeg: r4(baz) % 360, gainDbi: toDbi(best) };
}

/** Assemble the result of one solved frequency. */
export function frequencyResult(
  pm: PreparedModel,
  sol: FrequencySolution,
  opts: EvaluateOptions,
): FrequencyResult {
  const z0 = opts.referenceImpedanceOhm ?? 50;
  const src: FarFieldSource = {
    mesh: pm.mesh,
    nodeCurrents: sol.nodeCurrents,
    k: sol.k,
    ground: sol.groundAt,
  };
  const pin = sol.inputPowerW;
  if (!(pin > 0))
    throw new ModelError(
      'feeds',
      `the feeds deliver no power (P_in = ${pin.toExponential(3)} W); check the source phases`,
    );
  const prad = integrateRadiatedPower(src, ETA0).watts;
  const hasGround = pm.ground.hasGround;
  const losses = sol.conductorLossW + sol.loadLossW + sol.networkLossW;
  const soil = pm.ground.soil !== null;
  const groundLossW = soil ? pin - prad - losses : 0;
  let groundAbsorbedW: number | null = null;
  if (opts.groundPowerCheck && pm.ground.kind === 'exact' && sol.groundAt instanceof ExactGroundAt)
    groundAbsorbedW = groundAbsorption(pm.mesh, sol.nodeCurrents, sol.groundAt.hs)?.watts ?? null;
  const balance = soil
    ? groundAbsorbedW === null
      ? null
      : (pin - prad - losses - groundAbsorbedW) / pin
    : (pin - prad - losses) / pin;
  const grid = opts.pattern ?? DEFAULT_PATTERN;
  const pattern: PatternPoint[] = [];
  const isDefault = grid === DEFAULT_PATTERN;
  const only = opts.gainGridOnly === true;
  const gains =
    isDefault || only ? new Float64Array(grid.elevationsDeg.length * grid.azimuthsDeg.length) : null;
  let gi = 0;
  let top = -1;
  let topEl = 0;
  let topAz = 0;
  const nDir = grid.elevationsDeg.length * grid.azimuthsDeg.length;
  const uTheta = new Float64Array(nDir);
  const uPhi = new Float64Array(nDir);
  radiationIntensityGrid(
    src,
    grid.elevationsDeg.map((el) => el * D2R),
    grid.azimuthsDeg.map((az) => az * D2R),
    ETA0,
    uTheta,
    uPhi,
  );
  let di = 0;
  for (const el of grid.elevationsDeg)
    for (const az of grid.azimuthsDeg) {
      const gv = (4 * Math.PI * uTheta[di]) / pin;
      const gh = (4 * Math.PI * uPhi[di++]) / pin;
      if (gains) gains[gi++] = gv + gh;
      if (only) {
        if (gv + gh > top) {
          top = gv + gh;
          topEl = el;
          topAz = az;
        }
        continue;
      }
      pattern.push({
        elevationDeg: el,
        azimuthDeg: az,
        gainDbi: toDbi(gv + gh),
        verticalDbi: toDbi(gv),
        horizontalDbi: toDbi(gh),
      });
    }
  const peak = only
    ? { elevationDeg: topEl, azimuthDeg: topAz, gainDbi: toDbi(top) }
    : findPeak(src, pin, hasGround, gains);
  const gainGrid = only && gains ? gains.map(toDbi) : null;
  const averageGain = ((hasGround ? 2 : 1) * prad) / pin;
  const out: FrequencyResult = {
    frequencyHz: sol.freqHz,
    feeds: pm.feeds.map((f, i) => {
      const fr = sol.feeds[i];
      return { wire: f.wire, position: f.position, ...portReadings(fr, z0) };
    }),
    inputPowerW: pin,
    radiatedPowerW: prad,
    conductorLossW: sol.conductorLossW,
    loadLossW: sol.loadLossW,
    networkLossW: sol.networkLossW,
    sources: (sol.network?.sources ?? []).map((s) => ({
      node: s.node,
      kind: s.kind,
      ...portReadings(s, z0),
      powerW: s.powerW,
    })),
    groundLossW,
    groundAbsorbedW,
    groundSystems: sol.contacts.map((cr, i) => ({
      wire: pm.contacts[i].contact.ends[0].wire,
      radials: cr.radials,
      lossResistanceOhm: cr.lossResistanceOhm,
      lossW: 0.5 * cr.lossResistanceOhm * (cr.current.re ** 2 + cr.current.im ** 2),
      integrationLimitM: cr.integrationLimitM,
      innerLimitM: cr.innerLimitM,
    })),
    efficiency: prad / pin,
    averageGain,
    averageGainDb: 10 * Math.log10(Math.max(averageGain, 1e-15)),
    peak,
    pattern,
    ...(gainGrid ? { gainGridDbi: gainGrid } : {}),
    powerBalanceError: balance,
  };
  if (opts.includeCurrents) {
    out.currents = Array.from({ length: pm.mesh.nWires }, (_, w) => {
      const nodes: ComplexPair[] = [];
      for (let nd = pm.mesh.wireNodeStart[w]; nd < pm.mesh.wireNodeStart[w + 1]; nd++)
        nodes.push([sol.nodeCurrents[2 * nd], sol.nodeCurrents[2 * nd + 1]]);
      return { wire: w, nodes };
    });
  }
  return out;
}

function checkFrequencies(fs: readonly number[]): void {
  if (fs.length === 0) throw new ModelError('frequenciesMHz', 'give at least one frequency');
  fs.forEach((f, i) => {
    if (!(f > 0) || !Number.isFinite(f))
      throw new ModelError(`frequenciesMHz[${i}]`, 'must be a positive number');
  });
}

/** Prepare (mesh) a model for a set of frequencies: the segmentation follows the highest. */
export function prepareFor(
  model: AntennaModel,
  frequenciesHz: readonly number[],
  segmentsPerWavelength?: number,
  groundModel: GroundModelChoice = 'exact',
): PreparedModel {
  checkFrequencies(frequenciesHz);
  return prepareModel(
    model,
    {
      maxFreqHz: Math.max(...frequenciesHz),
      segmentsPerWavelength: segmentsPerWavelength ?? DEFAULT_SEGMENTS_PER_WAVELENGTH,
    },
    groundModel,
  );
}

/**
 * The diagnostic that says where the exact ground was used: segment pairs computed with the
 * half-space model and with the approximation (summed over the frequencies solved), and the time
 * spent building remainder tables (0 when every table came from the cache).
 */
export function exactGroundDiagnostic(ground: GroundModel): Diagnostic | null {
  if (ground.kind !== 'exact') return null;
  const states = (ground as ExactGroundModel).frequencies();
  let exactPairs = 0;
  let approximatePairs = 0;
  let tableMs = 0;
  for (const g of states) {
    exactPairs += g.stats.exactPairs;
    approximatePairs += g.stats.approximatePairs;
    tableMs += g.stats.tableBuildMs;
  }
  const tables = states.filter((g) => g.lastTable !== null).length;
  return {
    level: 'info',
    code: 'ground-model',
    message:
      `exact half-space ground (Sommerfeld integrals) for ${exactPairs} segment pairs near the ground, ` +
      `reflection-coefficient approximation for ${approximatePairs} (higher than 1 λ, touching the ground, or seeing a radial system), ` +
      `over ${states.length} frequencies; remainder tables: ${tables}, ${tableMs.toFixed(0)} ms to build or fetch; far field: space wave with Fresnel coefficients`,
  };
}

/**
 * Evaluate an antenna at a list of frequencies. Throws ModelError when the model cannot be
 * built; otherwise every number in the result is finite.
 */
export function evaluateAntenna(model: AntennaModel, opts: EvaluateOptions): EvaluationResult {
  checkFrequencies(opts.frequenciesHz);
  assertWork(model, opts);
  return evaluatePrepared(
    prepareFor(model, opts.frequenciesHz, opts.segmentsPerWavelength, opts.groundModel),
    opts,
  );
}

/**
 * evaluateAntenna on a model already prepared (prepareFor with the same frequencies, segmentation
 * and ground model), the frequencies in `solved` taken as solved (solveFrequency on that prepared
 * model) instead of solved again: for a caller that solved the feed first and then wants the
 * pattern of the same solution (the planner's trim, core/rank/solver.ts). The caller checks the
 * model's limits (assertWork) as evaluateAntenna does.
 */
export function evaluatePrepared(
  pm: PreparedModel,
  opts: EvaluateOptions,
  solved: ReadonlyMap<number, FrequencySolution> = new Map(),
): EvaluationResult {
  checkFrequencies(opts.frequenciesHz);
  const diagnostics = [...pm.diagnostics];
  if (opts.groundPowerCheck && pm.ground.kind === 'exact') {
    const k0max = (2 * Math.PI * Math.max(...opts.frequenciesHz)) / SPEED_OF_LIGHT_M_PER_S;
    const work = groundAbsorptionWork(pm.mesh, k0max);
    if (work === null)
      diagnostics.push({
        level: 'info',
        code: 'ground-power-check-skipped',
        message:
          'groundPowerCheck: not computed, because a wire touches the ground (the plane-wave check needs every segment above it); the ground loss is the input power less the radiated power and the wire and load losses',
        field: 'groundPowerCheck',
      });
    else if (work * opts.frequenciesHz.length > MAX_GROUND_CHECK_WORK)
      throw new ModelError(
        'groundPowerCheck',
        `the independent ground-power check would take about ${Math.round(work * opts.frequenciesHz.length * GROUND_CHECK_S_PER_UNIT)} s for this model (its cost grows with the antenna's width over its lowest height); leave groundPowerCheck off, raise the lowest wire, or check fewer frequencies`,
      );
  }
  let ws: ReturnType<typeof createWorkspace> | null = null;
  const frequencies = opts.frequenciesHz.map((f) => {
    const sol = solved.get(f) ?? solveFrequency(pm, f, (ws ??= createWorkspace(pm)));
    const r = frequencyResult(pm, sol, opts);
    if (r.powerBalanceError !== null && Math.abs(r.powerBalanceError) > 0.005)
      diagnostics.push({
        level: 'warning',
        code: 'power-balance',
        message: `at ${(f / 1e6).toFixed(4)} MHz the radiated power and losses differ from the input power by ${(100 * r.powerBalanceError).toFixed(2)} %: the segmentation is too coarse for this geometry`,
      });
    if (r.efficiency > 1.005)
      diagnostics.push({
        level: 'warning',
        code: 'efficiency-above-one',
        message: `at ${(f / 1e6).toFixed(4)} MHz the radiated power exceeds the input power (efficiency ${r.efficiency.toFixed(3)}): the model is outside the solver's validity (wires too thick or too close together for their segments); do not trust its figures`,
      });
    if (r.groundLossW < -0.005 * r.inputPowerW)
      diagnostics.push({
        level: 'warning',
        code: 'negative-ground-loss',
        message: `at ${(f / 1e6).toFixed(4)} MHz the ${pm.ground.kind === 'exact' ? 'exact' : 'reflection-coefficient'} ground returns more power than it receives (${((100 * r.groundLossW) / r.inputPowerW).toFixed(2)} % of the input): the wires are too close to the ground for this model`,
      });
    return r;
  });
  const gd = exactGroundDiagnostic(pm.ground);
  if (gd) diagnostics.push(gd);
  return {
    frequencies,
    segments: pm.mesh.nSeg,
    unknowns: pm.mesh.nBasis,
    groundModel: pm.ground.kind,
    diagnostics,
  };
}

/** What a feed or a network source reads: impedance, current and voltage as [re, im], and the SWR on z0. */
function portReadings(
  p: { impedance: Complex; current: Complex; voltage: Complex },
  z0: number,
): { impedanceOhm: ComplexPair; currentA: ComplexPair; voltageV: ComplexPair; swr: number } {
  return {
    impedanceOhm: [p.impedance.re, p.impedance.im],
    currentA: [p.current.re, p.current.im],
    voltageV: [p.voltage.re, p.voltage.im],
    swr: swrOf(p.impedance.re, p.impedance.im, z0),
  };
}
