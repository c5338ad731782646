/**
 * Frequency sweeps, SWR bandwidth and trimming.
 *
 * A sweep meshes once (at the highest frequency) and reuses the mesh, the pair classification
 * and the work arrays for every frequency; only the frequency-dependent kernel, the ground
 * coefficients and the factorisation are redone. It reports feed impedances only (no pattern).
 *
 * Interpolated sweeps: with `anchorEvery = m`, only every m-th frequency (and the last) is
 * solved and the impedance between is interpolated by a cubic through the four nearest anchors
 * in the admittance, which is smoother than the impedance near a parallel resonance. The sweep
 * then solves the one frequency that lies farthest from any anchor and reports the relative
 * difference as `interpolationError`: the interpolation is used only where that number says it
 * is good enough for the purpose.
 *
 * SWR bandwidth: the N:1 crossings are bracketed between samples and located by Brent's method
 * (Brent 1973, ch. 4) with real solves. Trimming: a dimension set by a callback is adjusted by
 * Brent's root finder until the feed reactance is zero, or by Brent's minimiser until the SWR is
 * lowest, at one frequency; the segmentation is frozen at the start so that the function of the
 * dimension is smooth.
 */
import { brentMinimize, trimToResonance } from '../numeric/roots.ts';
import { c, cDiv, type Complex } from '../numeric/complex.ts';
import { ModelError } from './errors.ts';
import type { GroundModelChoice } from './ground.ts';
import { prepareFor } from './evaluate.ts';
import { DEFAULT_REFERENCE_OHM, swrEdges, swrOf } from './swr.ts';
import { createWorkspace, solveFrequency, type PreparedModel, type SolveWorkspace } from './solver.ts';
import type { AntennaModel, WireSpec } from './types.ts';

export interface SweepOptions {
  /** Reference impedance of the SWR, ohms; default DEFAULT_REFERENCE_OHM (50 Ω). */
  referenceImpedanceOhm?: number;
  segmentsPerWavelength?: number;
  /** Lossy soil: exact half-space (default) or the reflection-coefficient approximation. */
  groundModel?: GroundModelChoice;
  /** Solve every m-th frequency only and interpolate between (m ≥ 2); default 1 (solve all). */
  anchorEvery?: number;
  /** Which feed (index) to report; default 0. With a feed network: its first source's impedance. */
  feed?: number;
}

export interface SweepPoint {
  frequencyHz: number;
  impedanceOhm: Complex;
  swr: number;
  interpolated: boolean;
}

export interface SweepResult {
  points: SweepPoint[];
  solves: number;
  /** Max |Z_interp − Z_solved|/|Z_solved| at the check frequency; null when nothing is interpolated. */
  interpolationError: number | null;
}

function feedImpedance(pm: PreparedModel, f: number, ws: SolveWorkspace, feed: number): Complex {
  const sol = solveFrequency(pm, f, ws);
  // with a feed network the impedance that matters is the one its first source sees
  if (sol.network && sol.network.sources.length > 0) return sol.network.sources[0].impedance;
  const fr = sol.feeds[feed];
  if (!fr) throw new ModelError('feed', `there is no feed ${feed}`);
  return fr.impedance;
}

/** Cubic (Lagrange) interpolation of complex values y at nodes x. */
function lagrange(x: number[], y: Complex[], t: number): Complex {
  let re = 0;
  let im = 0;
  for (let i = 0; i < x.length; i++) {
    let w = 1;
    for (let j = 0; j < x.length; j++) if (j !== i) w *= (t - x[j]) / (x[i] - x[j]);
    re += w * y[i].re;
    im += w * y[i].im;
  }
  return c(re, im);
}

/** Feed impedance over a list of frequencies (ascending), meshing once. */
export function sweepImpedance(
  model: AntennaModel,
  frequenciesHz: readonly number[],
  opts: SweepOptions = {},
): SweepResult {
  const pm = prepareFor(model, frequenciesHz, opts.segmentsPerWavelength, opts.groundModel);
  return sweepPrepared(pm, frequenciesHz, opts);
}

export function sweepPrepared(
  pm: PreparedModel,
  frequenciesHz: readonly number[],
  opts: SweepOptions = {},
): SweepResult {
  const z0 = opts.referenceImpedanceOhm ?? DEFAULT_REFERENCE_OHM;
  const feed = opts.feed ?? 0;
  const ws = createWorkspace(pm);
  const m = Math.max(1, Math.floor(opts.anchorEvery ?? 1));
  const nF = frequenciesHz.length;
  const isAnchor = (i: number) => m === 1 || i % m === 0 || i === nF - 1;
  const anchors: number[] = [];
  const anchorY: Complex[] = [];
  const z: (Complex | null)[] = frequenciesHz.map(() => null);
  let solves = 0;
  frequenciesHz.forEach((f, i) => {
    if (!isAnchor(i)) return;
    const zi = feedImpedance(pm, f, ws, feed);
    solves++;
    z[i] = zi;
    anchors.push(f);
    anchorY.push(cDiv(c(1), zi));
  });
  const interp = (f: number): Complex => {
    // four nearest anchors
    let j = anchors.findIndex((a) => a >= f);
    if (j < 0) j = anchors.length - 1;
    const lo = Math.max(0, Math.min(anchors.length - 4, j - 2));
    const idx = anchors.slice(lo, lo + 4).map((_, q) => lo + q);
    const y = lagrange(
      idx.map((q) => anchors[q]),
      idx.map((q) => anchorY[q]),
      f,
    );
    return cDiv(c(1), y);
  };
  let interpolationError: number | null = null;
  if (m > 1 && anchors.length >= 2) {
    let worst = -1;
    let worstD = -1;
    frequenciesHz.forEach((f, i) => {
      if (isAnchor(i)) return;
      const d = Math.min(...anchors.map((a) => Math.abs(a - f)));
      if (d > worstD) {
        worstD = d;
        worst = i;
      }
    });
    frequenciesHz.forEach((f, i) => {
      if (z[i] === null) z[i] = interp(f);
    });
    if (worst >= 0) {
      const exact = feedImpedance(pm, frequenciesHz[worst], ws, feed);
      solves++;
      const est = z[worst]!;
      interpolationError = Math.hypot(est.re - exact.re, est.im - exact.im) / Math.hypot(exact.re, exact.im);
      z[worst] = exact;
    }
  }
  const points = frequenciesHz.map((f, i) => {
    const zi = z[i]!;
    return { frequencyHz: f, impedanceOhm: zi, swr: swrOf(zi.re, zi.im, z0), interpolated: !isAnchor(i) };
  });
  return { points, solves, interpolationError };
}

export interface BandwidthOptions {
  /** SWR limit N of the N:1 bandwidth; default 2. */
  ratio?: number;
  /** Reference impedance of the SWR, ohms; default DEFAULT_REFERENCE_OHM (50 Ω). */
  referenceImpedanceOhm?: number;
  segmentsPerWavelength?: number;
  /** Lossy soil: exact half-space (default) or the reflection-coefficient approximation. */
  groundModel?: GroundModelChoice;
  feed?: number;
  /** Relative frequency tolerance of the crossings; default 1e-5. */
  relTol?: number;
}

export interface BandwidthResult {
  /** Sample with the lowest SWR. */
  bestHz: number;
  bestSwr: number;
  lowerHz: number | null;
  upperHz: number | null;
  /** upper − lower when both crossings lie inside the samples. */
  bandwidthHz: number | null;
  solves: number;
}

/** N:1 SWR bandwidth around the best sample, crossings found by Brent's method between samples. */
export function swrBandwidth(
  model: AntennaModel,
  frequenciesHz: readonly number[],
  opts: BandwidthOptions = {},
): BandwidthResult {
  const N = opts.ratio ?? 2;
  const z0 = opts.referenceImpedanceOhm ?? DEFAULT_REFERENCE_OHM;
  const feed = opts.feed ?? 0;
  const pm = prepareFor(model, frequenciesHz, opts.segmentsPerWavelength, opts.groundModel);
  const ws = createWorkspace(pm);
  const fs = [...frequenciesHz].sort((a, b) => a - b);
  let solves = 0;
  const swrAt = (f: number): number => {
    solves++;
    const zz = feedImpedance(pm, f, ws, feed);
    return swrOf(zz.re, zz.im, z0);
  };
  const s = fs.map(swrAt);
  const tol = (opts.relTol ?? 1e-5) * fs[s.indexOf(Math.min(...s))];
  const { centre: ib, lowerHz, upperHz } = swrEdges(swrAt, fs, s, N, tol);
  return {
    bestHz: fs[ib],
    bestSwr: s[ib],
    lowerHz,
    upperHz,
    bandwidthHz: lowerHz !== null && upperHz !== null ? upperHz - lowerHz : null,
    solves,
  };
}

export interface TrimOptions {
  /**
   * Builds the antenna, or only its wires, for a value of the dimension being trimmed (a wire's
   * length, the top length of a shape, …). When it returns wires, `base` gives the rest.
   */
  build: (value: number) => AntennaModel | readonly WireSpec[];
  /** Feeds, loads, radials and ground for a `build` that returns wires only. */
  base?: Omit<AntennaModel, 'wires'>;
  /** Search range of the value. */
  range: readonly [number, number];
  frequencyHz: number;
  target: 'zero-reactance' | 'min-swr';
  /** Reference impedance of the SWR, ohms; default DEFAULT_REFERENCE_OHM (50 Ω). */
  referenceImpedanceOhm?: number;
  segmentsPerWavelength?: number;
  /** Lossy soil: exact half-space (default) or the reflection-coefficient approximation. */
  groundModel?: GroundModelChoice;
  feed?: number;
  /** Absolute tolerance on the value; default 1e-6 of the range's larger end. */
  tolerance?: number;
}

export interface TrimResult {
  value: number;
  impedanceOhm: Complex;
  swr: number;
  solves: number;
}

/** Freeze the segment counts of a model at those of its mesh. */
function frozen(model: AntennaModel, counts: number[]): AntennaModel {
  return {
    ...model,
    wires: model.wires.map((w: WireSpec, i): WireSpec =>
      w.segments === undefined && counts[i] ? { ...w, segments: counts[i] } : w,
    ),
  };
}

/** Above this |X| (ohms) at the end of a zero-reactance trim, the sign change was a pole. */
const POLE_REACTANCE_OHM = 100;

/** Trim a dimension until the reactance is zero or the SWR lowest at one frequency. */
export function trimDimension(opts: TrimOptions): TrimResult {
  const [lo, hi] = opts.range;
  if (!(hi > lo)) throw new ModelError('range', 'the range must run from a lower to a higher value');
  const buildModel = (v: number): AntennaModel => {
    const r = opts.build(v);
    if (!Array.isArray(r)) return r as AntennaModel;
    if (!opts.base)
      throw new ModelError('base', 'a build callback that returns wires needs `base` (feeds and ground)');
    return { ...opts.base, wires: r };
  };
  const z0 = opts.referenceImpedanceOhm ?? DEFAULT_REFERENCE_OHM;
  const feed = opts.feed ?? 0;
  const mid = prepareFor(
    buildModel(0.5 * (lo + hi)),
    [opts.frequencyHz],
    opts.segmentsPerWavelength,
    opts.groundModel,
  );
  const counts = Array.from(
    { length: mid.mesh.nWires },
    (_, w) => mid.mesh.wireSegStart[w + 1] - mid.mesh.wireSegStart[w],
  );
  let solves = 0;
  const zAt = (v: number): Complex => {
    solves++;
    const model = buildModel(v);
    const m = model.wires.length === counts.length ? frozen(model, counts) : model;
    const pm = prepareFor(m, [opts.frequencyHz], opts.segmentsPerWavelength, opts.groundModel);
    return feedImpedance(pm, opts.frequencyHz, createWorkspace(pm), feed);
  };
  const tol = opts.tolerance ?? 1e-6 * Math.max(Math.abs(lo), Math.abs(hi));
  let value: number;
  if (opts.target === 'zero-reactance') {
    // The one trim routine (core/numeric/roots.ts): secant steps from the middle of the range
    // until the zero is bracketed, then Brent's method to the tolerance.
    const r = trimToResonance((x) => zAt(x).im, {
      start: 0.5 * (lo + hi),
      min: lo,
      max: hi,
      fTol: 0,
      xTol: tol,
      maxEvaluations: 90,
    });
    // A sign change through a pole (antiresonance) is no zero: its reactance stays large.
    if (!r.bracketed || !(Math.abs(r.fx) < POLE_REACTANCE_OHM))
      throw new ModelError('range', 'the reactance does not change sign over the range: widen it');
    value = r.x;
  } else {
    value = brentMinimize(
      (x) => {
        const zz = zAt(x);
        return swrOf(zz.re, zz.im, z0);
      },
      lo,
      hi,
      tol,
      80,
    ).x;
  }
  const zf = zAt(value);
  return { value, impedanceOhm: zf, swr: swrOf(zf.re, zf.im, z0), solves };
}
