/**
 * Gauss–Legendre quadrature on [0, 1].
 *
 * Nodes are the roots of the Legendre polynomial P_n, found by Newton's iteration from the
 * asymptotic first guess cos(π(i − 1/4)/(n + 1/2)); weights w_i = 2/((1 − x_i²) P_n'(x_i)²),
 * then mapped from [−1, 1] to [0, 1]. An n-point rule integrates polynomials of degree 2n − 1
 * exactly.
 *
 * References:
 *  - M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions (1964), eq. 25.4.29
 *    (weights) and 22.7.10 (three-term recurrence of P_n).
 *  - P. J. Davis and P. Rabinowitz, Methods of Numerical Integration, 2nd ed. (1984), §2.7.
 */
export interface GaussRule {
  /** Abscissae in (0, 1), ascending. */
  readonly x: Float64Array;
  /** Weights, summing to 1. */
  readonly w: Float64Array;
}

const cache = new Map<number, GaussRule>();

/** The n-point Gauss–Legendre rule on [0, 1] (cached; 1 ≤ n ≤ 200). */
export function gaussLegendre01(n: number): GaussRule {
  if (!Number.isInteger(n) || n < 1 || n > 200) throw new RangeError(`Gauss rule order ${n} out of range`);
  const hit = cache.get(n);
  if (hit) return hit;
  const x = new Float64Array(n);
  const w = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let z = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 0;
    for (let it = 0; it < 100; it++) {
      // P_n(z) by the recurrence (A&S 22.7.10), P_n' from A&S 22.8.5.
      let p0 = 1;
      let p1 = z;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      if (n === 1) {
        p1 = z;
        p0 = 1;
      }
      dp = (n * (z * p1 - p0)) / (z * z - 1);
      const dz = p1 / dp;
      z -= dz;
      if (Math.abs(dz) < 1e-16) break;
    }
    if (n === 1) {
      z = 0;
      dp = 1;
    }
    const wi = 2 / ((1 - z * z) * dp * dp);
    // map [−1, 1] → [0, 1]
    x[i] = 0.5 * (1 - z);
    x[n - 1 - i] = 0.5 * (1 + z);
    w[i] = 0.5 * wi;
    w[n - 1 - i] = 0.5 * wi;
  }
  const rule = { x, w };
  cache.set(n, rule);
  return rule;
}
