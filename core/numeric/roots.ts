/**
 * One-dimensional root finding and minimisation.
 *
 * References:
 *  - R. P. Brent, Algorithms for Minimization without Derivatives (1973), ch. 4 (zero, the
 *    bracketing method combining bisection, secant and inverse quadratic interpolation) and
 *    ch. 5 (localmin, golden section with parabolic interpolation).
 *  - W. H. Press et al., Numerical Recipes, 3rd ed. (2007), §9.3 and §10.3.
 */

export class NoBracketError extends Error {
  constructor(
    readonly a: number,
    readonly b: number,
    readonly fa: number,
    readonly fb: number,
  ) {
    super(`no sign change between ${a} (f = ${fa}) and ${b} (f = ${fb})`);
    this.name = 'NoBracketError';
  }
}

export interface RootResult {
  x: number;
  fx: number;
  evaluations: number;
}

/**
 * Brent's method (Brent 1973, ch. 4): a zero of f in [a, b] where f(a) and f(b) differ in sign.
 * Stops when the bracket is below `xTol` (absolute) or |f| is at most `fTol` (default: exactly 0).
 */
export function brentRoot(
  f: (x: number) => number,
  a0: number,
  b0: number,
  xTol: number,
  maxEvaluations = 100,
  fa0?: number,
  fb0?: number,
  fTol = 0,
): RootResult {
  let a = a0;
  let b = b0;
  let fa = fa0 ?? f(a);
  let fb = fb0 ?? f(b);
  let evaluations = (fa0 === undefined ? 1 : 0) + (fb0 === undefined ? 1 : 0);
  if (!Number.isFinite(fa) || !Number.isFinite(fb))
    throw new RangeError('function is not finite at the bracket');
  if (Math.abs(fa) <= fTol) return { x: a, fx: fa, evaluations };
  if (Math.abs(fb) <= fTol) return { x: b, fx: fb, evaluations };
  if (fa > 0 === fb > 0) throw new NoBracketError(a, b, fa, fb);
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  while (evaluations < maxEvaluations) {
    if (fb > 0 === fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xTol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || Math.abs(fb) <= fTol) break;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
    evaluations++;
    if (!Number.isFinite(fb)) throw new RangeError(`function is not finite at ${b}`);
  }
  return { x: b, fx: fb, evaluations };
}

export interface ResonanceSearch {
  /** Where the search starts, and the limits the parameter stays inside. */
  start: number;
  min: number;
  max: number;
  /** Resonant when |f| is below this. */
  fTol: number;
  /** The search ends when the parameter moves less than this. */
  xTol: number;
  maxEvaluations: number;
  /** The first step as a fraction of `start`, taken downward where f(start) > 0 (default 0.03). */
  firstStep?: number;
}

export interface ResonanceResult {
  /** Every evaluation, in order. */
  steps: { x: number; fx: number }[];
  /** Whether a zero was reached: |f| < fTol, or a bracket closed to xTol with |f| < 5·fTol. */
  resonant: boolean;
  /** Whether two evaluations of opposite sign were found inside the limits. */
  bracketed: boolean;
  /** Where Brent's method ended when bracketed, otherwise the evaluated parameter of smallest |f|. */
  x: number;
  fx: number;
}

/**
 * The one trim routine: the zero of f (a feed reactance against a trim dimension, or against
 * frequency) near `start` inside [min, max]. Secant steps from `start` until the zero is
 * bracketed, then Brent's method inside the bracket (Brent 1973, ch. 4, whose interpolation the
 * secant steps share), within `maxEvaluations` evaluations of f in all.
 */
export function trimToResonance(f: (x: number) => number, o: ResonanceSearch): ResonanceResult {
  const steps: { x: number; fx: number }[] = [];
  const at = (x: number): number => {
    const v = f(x);
    steps.push({ x, fx: v });
    return v;
  };
  const clamp = (v: number): number => Math.min(o.max, Math.max(o.min, v));
  let bracketed = false;
  const done = (resonant: boolean): ResonanceResult => {
    let best = steps[0];
    for (const s of steps) if (Math.abs(s.fx) < Math.abs(best.fx)) best = s;
    return { steps, resonant, bracketed, x: best.x, fx: best.fx };
  };
  let x0 = clamp(o.start);
  let f0 = at(x0);
  if (Math.abs(f0) < o.fTol) return done(true);
  let x1 = clamp(x0 * (1 + (f0 > 0 ? -1 : 1) * (o.firstStep ?? 0.03)));
  let f1 = at(x1);
  while (f0 > 0 === f1 > 0) {
    if (Math.abs(f1) < o.fTol) return done(true);
    if (steps.length >= o.maxEvaluations || f1 === f0) return done(false);
    const x2 = clamp(x1 - (f1 * (x1 - x0)) / (f1 - f0));
    if (Math.abs(x2 - x1) < o.xTol) return done(Math.abs(f1) < 5 * o.fTol);
    x0 = x1;
    f0 = f1;
    x1 = x2;
    f1 = at(x1);
  }
  bracketed = true;
  if (Math.abs(f1) < o.fTol) return done(true);
  const left = o.maxEvaluations - steps.length;
  if (left <= 0) return done(false);
  const [a, b, fa, fb] = x0 < x1 ? [x0, x1, f0, f1] : [x1, x0, f1, f0];
  const r = brentRoot(at, a, b, o.xTol, left, fa, fb, o.fTol);
  // Inside a bracket the answer is where Brent's method ended: at a pole its |f| stays large.
  return { steps, resonant: Math.abs(r.fx) < 5 * o.fTol, bracketed, x: r.x, fx: r.fx };
}

export interface MinResult {
  x: number;
  fx: number;
  evaluations: number;
}

/**
 * Brent's local minimiser (Brent 1973, ch. 5): golden-section search with parabolic steps on
 * [a, b]. Finds a local minimum to within `xTol`.
 */
export function brentMinimize(
  f: (x: number) => number,
  a0: number,
  b0: number,
  xTol: number,
  maxEvaluations = 100,
): MinResult {
  const golden = 0.5 * (3 - Math.sqrt(5));
  let a = Math.min(a0, b0);
  let b = Math.max(a0, b0);
  let x = a + golden * (b - a);
  let w = x;
  let v = x;
  let fx = f(x);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  let evaluations = 1;
  while (evaluations < maxEvaluations) {
    const xm = 0.5 * (a + b);
    const tol1 = Math.sqrt(Number.EPSILON) * Math.abs(x) + xTol / 3;
    const tol2 = 2 * tol1;
    if (Math.abs(x - xm) <= tol2 - 0.5 * (b - a)) break;
    let useGolden = true;
    if (Math.abs(e) > tol1) {
      const r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      const eTemp = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * eTemp) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = xm >= x ? tol1 : -tol1;
        useGolden = false;
      }
    }
    if (useGolden) {
      e = x >= xm ? a - x : b - x;
      d = golden * e;
    }
    const u = Math.abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
    const fu = f(u);
    evaluations++;
    if (fu <= fx) {
      if (u >= x) a = x;
      else b = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return { x, fx, evaluations };
}
