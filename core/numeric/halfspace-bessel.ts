/**
 * Bessel functions J₀(x), J₁(x) of real argument x ≥ 0, for the Sommerfeld integrals of the
 * half-space ground model (the integration path stays on the real axis, so only real
 * arguments occur).
 *
 * Method: the ascending series (Abramowitz & Stegun 9.1.10) for x < SERIES_LIMIT, the Hankel
 * asymptotic expansion (A&S 9.2.5, 9.2.9, 9.2.10) beyond, summed until the terms stop falling.
 * At the switch point (x = 14) the series loses about 4 digits to cancellation (largest term
 * ≈ 3e4) and the smallest asymptotic term is about e^{−2x} ≈ 7e-13, so both sides are good to
 * about 3e-12 absolute (checked against each other and against A&S Table 9.1 values in
 * test/unit/em/halfspace/numeric.test.ts).
 *
 * Reference: M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions (1964), §9.1,
 * §9.2.
 */

export const SERIES_LIMIT = 14;

/** J₀ and J₁ at x ≥ 0, written to out[0], out[1]. */
export function besselJ01(x: number, out: Float64Array): void {
  if (x < SERIES_LIMIT) {
    // A&S 9.1.10: J_ν(x) = (x/2)^ν Σ (−x²/4)^k / (k! Γ(ν+k+1))
    const q = -0.25 * x * x;
    let t0 = 1;
    let t1 = 1;
    let s0 = 1;
    let s1 = 1;
    for (let k = 1; k < 80; k++) {
      t0 *= q / (k * k);
      t1 *= q / (k * (k + 1));
      s0 += t0;
      s1 += t1;
      if (Math.abs(t0) < 1e-17 * Math.abs(s0) + 1e-300 && Math.abs(t1) < 1e-17 * Math.abs(s1) + 1e-300) break;
    }
    out[0] = s0;
    out[1] = 0.5 * x * s1;
    return;
  }
  // A&S 9.2.5: J_ν(x) = √(2/(πx)) [P cos χ − Q sin χ], χ = x − (ν/2 + 1/4)π,
  // P ~ Σ (−1)^k a_{2k}/x^{2k}, Q ~ Σ (−1)^k a_{2k+1}/x^{2k+1}, with
  // a_m(ν) = (μ−1)(μ−9)…(μ−(2m−1)²)/(m! 8^m), μ = 4ν² (A&S 9.2.9–9.2.10).
  const amp = Math.sqrt(2 / (Math.PI * x));
  const c = Math.cos(x);
  const s = Math.sin(x);
  // cos(x − π/4) = (c + s)/√2, sin(x − π/4) = (s − c)/√2; for ν = 1: χ1 = χ0 − π/2
  const r2 = Math.SQRT1_2;
  const cos0 = (c + s) * r2;
  const sin0 = (s - c) * r2;
  for (let nu = 0; nu <= 1; nu++) {
    const mu = 4 * nu * nu;
    let P = 1;
    let Q = 0;
    let term = 1;
    let last = Infinity;
    for (let m = 1; m < 60; m++) {
      const odd = 2 * m - 1;
      term *= (mu - odd * odd) / (m * 8 * x);
      const a = Math.abs(term);
      if (a > last) break;
      last = a;
      // m odd → Q with sign (−1)^{(m−1)/2}; m even → P with sign (−1)^{m/2}
      if (m % 2 === 1) Q += ((m - 1) / 2) % 2 === 0 ? term : -term;
      else P += (m / 2) % 2 === 0 ? term : -term;
      if (a < 1e-17) break;
    }
    if (nu === 0) out[0] = amp * (P * cos0 - Q * sin0);
    else {
      // χ1 = χ0 − π/2: cos χ1 = sin χ0, sin χ1 = −cos χ0
      out[1] = amp * (P * sin0 + Q * cos0);
    }
  }
}
