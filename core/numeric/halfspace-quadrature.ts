/**
 * Numerical tools for the half-space (Sommerfeld-integral) ground model: an adaptive
 * Gauss–Kronrod rule for vector-valued integrands, and Wynn's ε algorithm for accelerating
 * the partial sums of an oscillating tail.
 *
 *  - Gauss–Kronrod 7/15 pair: the 15-point Kronrod extension of the 7-point Gauss rule; the
 *    difference of the two estimates is the local error indicator. Nodes and weights as
 *    tabulated in R. Piessens, E. de Doncker-Kapenga, C. Überhuber, D. Kahaner, QUADPACK
 *    (Springer, 1983), routine QK15 (reproduced from that table; checked by the exactness test
 *    in test/unit/em/halfspace/numeric.test.ts: degree 22 for the Kronrod rule, 13 for Gauss).
 *  - Wynn's ε algorithm: P. Wynn, "On a device for computing the e_m(S_n) transformation",
 *    Math. Tables Aids Comput. 10 (1956) 91–96, eq. (4); the one-diagonal ("moving lozenge")
 *    storage as in E. J. Weniger, "Nonlinear sequence transformations for the acceleration of
 *    convergence and the summation of divergent series", Comput. Phys. Rep. 10 (1989) 189,
 *    §4.2. Its use on Sommerfeld tails: K. A. Michalski, "Extrapolation methods for Sommerfeld
 *    integral tails", IEEE Trans. Antennas Propag. 46 (1998) 1405–1418.
 */

/** Kronrod nodes on [−1, 1] (non-negative half; odd indices are the Gauss nodes). */
const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
  0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
  0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0.0,
];
/** Kronrod weights for XGK. */
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204,
  0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
  0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
/** Gauss weights for XGK[1], XGK[3], XGK[5], XGK[7]. */
const WG = [
  0.129484966168869693270611432679082, 0.27970539148927666790146777142378,
  0.381830050505118944950369775488975, 0.417959183673469387755102040816327,
];

/** Vector integrand: writes f(x) (n reals) into `out`. */
export type VectorIntegrand = (x: number, out: Float64Array) => void;

export interface AdaptiveOptions {
  /** Relative tolerance on the vector's max-norm. */
  relTol: number;
  /** Absolute tolerance on the max-norm (floor). */
  absTol: number;
  /** Maximum number of sub-intervals. */
  maxIntervals: number;
  /** Initial equal sub-intervals. */
  initialPieces?: number;
}

export interface AdaptiveResult {
  /** Estimated max-norm error of the sum. */
  error: number;
  /** Integrand evaluations used. */
  evaluations: number;
  /** False when maxIntervals was reached before the tolerance. */
  converged: boolean;
}

/** Scratch buffers for one vector dimension n. */
class Workspace {
  readonly f: Float64Array;
  readonly k: Float64Array;
  readonly g: Float64Array;
  constructor(readonly n: number) {
    this.f = new Float64Array(n);
    this.k = new Float64Array(n);
    this.g = new Float64Array(n);
  }
}
const workspaces = new Map<number, Workspace>();
function workspace(n: number): Workspace {
  let w = workspaces.get(n);
  if (!w) {
    w = new Workspace(n);
    workspaces.set(n, w);
  }
  return w;
}

/**
 * One G7/K15 panel on [a, b]: Kronrod estimate into `res`, returns the max-norm of the
 * Kronrod–Gauss difference (QUADPACK's raw indicator, without its heuristic rescaling).
 */
export function gaussKronrod15(
  f: VectorIntegrand,
  a: number,
  b: number,
  n: number,
  res: Float64Array,
): number {
  const ws = workspace(n);
  const half = 0.5 * (b - a);
  const mid = 0.5 * (a + b);
  const K = ws.k;
  const G = ws.g;
  const F = ws.f;
  f(mid, F);
  for (let i = 0; i < n; i++) {
    K[i] = WGK[7] * F[i];
    G[i] = WG[3] * F[i];
  }
  for (let j = 0; j < 7; j++) {
    const dx = half * XGK[j];
    const wk = WGK[j];
    const gauss = (j & 1) === 1;
    const wg = gauss ? WG[j >> 1] : 0;
    f(mid - dx, F);
    for (let i = 0; i < n; i++) {
      K[i] += wk * F[i];
      if (gauss) G[i] += wg * F[i];
    }
    f(mid + dx, F);
    for (let i = 0; i < n; i++) {
      K[i] += wk * F[i];
      if (gauss) G[i] += wg * F[i];
    }
  }
  let err = 0;
  for (let i = 0; i < n; i++) {
    res[i] = K[i] * half;
    const e = Math.abs((K[i] - G[i]) * half);
    if (e > err) err = e;
  }
  return err;
}

/** Panel storage, reused between calls (the integrand never calls integrateAdaptive itself). */
interface Panels {
  lo: Float64Array;
  hi: Float64Array;
  err: Float64Array;
  val: Float64Array;
  tmp: Float64Array;
  total: Float64Array;
}
let shared: Panels | null = null;
function panels(cap: number, n: number): Panels {
  if (!shared || shared.lo.length < cap || shared.tmp.length !== n || shared.val.length < cap * n) {
    const c = Math.max(cap, shared?.lo.length ?? 0);
    shared = {
      lo: new Float64Array(c),
      hi: new Float64Array(c),
      err: new Float64Array(c),
      val: new Float64Array(c * n),
      tmp: new Float64Array(n),
      total: new Float64Array(n),
    };
  }
  return shared;
}

/**
 * Adaptive Gauss–Kronrod (7/15) integration of a vector integrand over [a, b], bisecting the
 * panel with the largest error until the summed error is below max(absTol, relTol·‖I‖∞).
 * The result is ADDED into `acc` (length n).
 */
export function integrateAdaptive(
  f: VectorIntegrand,
  a: number,
  b: number,
  n: number,
  opts: AdaptiveOptions,
  acc: Float64Array,
): AdaptiveResult {
  const pieces = Math.max(1, opts.initialPieces ?? 1);
  const cap = Math.max(opts.maxIntervals, pieces);
  const { lo, hi, err, val, tmp, total } = panels(cap, n);
  let count = 0;
  let evaluations = 0;
  const h = (b - a) / pieces;
  for (let p = 0; p < pieces; p++) {
    const x0 = a + p * h;
    const x1 = p === pieces - 1 ? b : x0 + h;
    err[count] = gaussKronrod15(f, x0, x1, n, tmp);
    evaluations += 15;
    val.set(tmp, count * n);
    lo[count] = x0;
    hi[count] = x1;
    count++;
  }
  let converged = false;
  for (;;) {
    total.fill(0);
    let errSum = 0;
    let worst = 0;
    for (let p = 0; p < count; p++) {
      for (let i = 0; i < n; i++) total[i] += val[p * n + i];
      errSum += err[p];
      if (err[p] > err[worst]) worst = p;
    }
    let norm = 0;
    for (let i = 0; i < n; i++) norm = Math.max(norm, Math.abs(total[i]));
    if (errSum <= Math.max(opts.absTol, opts.relTol * norm)) {
      converged = true;
      for (let i = 0; i < n; i++) acc[i] += total[i];
      return { error: errSum, evaluations, converged };
    }
    if (count >= cap) {
      for (let i = 0; i < n; i++) acc[i] += total[i];
      return { error: errSum, evaluations, converged };
    }
    // bisect the worst panel: left half replaces it, right half appended
    const x0 = lo[worst];
    const x1 = hi[worst];
    const xm = 0.5 * (x0 + x1);
    err[worst] = gaussKronrod15(f, x0, xm, n, tmp);
    val.set(tmp, worst * n);
    hi[worst] = xm;
    err[count] = gaussKronrod15(f, xm, x1, n, tmp);
    val.set(tmp, count * n);
    lo[count] = xm;
    hi[count] = x1;
    count++;
    evaluations += 30;
  }
}

/**
 * Wynn's ε algorithm for a complex sequence, one new partial sum at a time (Wynn 1956 eq. 4;
 * Weniger 1989 §4.2 storage). `push(s)` returns the current best estimate: ε_{2k}^{(n−2k)}
 * from the last counter-diagonal.
 */
export class WynnEpsilon {
  private readonly re: Float64Array;
  private readonly im: Float64Array;
  private n = 0;
  constructor(readonly capacity: number) {
    this.re = new Float64Array(capacity);
    this.im = new Float64Array(capacity);
  }
  get length(): number {
    return this.n;
  }
  /** Adds partial sum s = sr + j si; returns the estimate in out[0], out[1]. */
  push(sr: number, si: number, out: Float64Array): void {
    if (this.n >= this.capacity) throw new RangeError('WynnEpsilon capacity exceeded');
    const n = this.n;
    const er = this.re;
    const ei = this.im;
    er[n] = sr;
    ei[n] = si;
    let a2r = 0;
    let a2i = 0;
    for (let j = n; j >= 1; j--) {
      const a1r = a2r;
      const a1i = a2i;
      a2r = er[j - 1];
      a2i = ei[j - 1];
      const dr = er[j] - a2r;
      const di = ei[j] - a2i;
      const d2 = dr * dr + di * di;
      if (d2 === 0 || !Number.isFinite(d2)) {
        // converged (or degenerate) column: a huge reciprocal; keep the row finite
        er[j - 1] = a1r + 1e300;
        ei[j - 1] = a1i;
      } else {
        er[j - 1] = a1r + dr / d2;
        ei[j - 1] = a1i - di / d2;
      }
    }
    this.n = n + 1;
    const idx = n % 2 === 0 ? 0 : 1;
    out[0] = er[idx];
    out[1] = ei[idx];
  }
}
