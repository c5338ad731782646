/**
 * Ratio of Bessel functions of complex argument, J₀(z)/J₁(z), as needed by the internal
 * impedance of a round conductor with skin effect.
 *
 * Method: J₁(z)/J₀(z) is the value of the continued fraction
 *     J_ν(z)/J_{ν−1}(z) = 1/(2ν/z − 1/(2(ν+1)/z − 1/(2(ν+2)/z − …)))
 * (Abramowitz & Stegun 9.1.73, from the recurrence 9.1.27), evaluated with the modified Lentz
 * algorithm (Press et al., Numerical Recipes, 3rd ed., 2007, §5.2). It converges for every
 * z ≠ 0 because J_ν is the minimal solution of the recurrence; the number of terms grows like
 * |z|. For |z| above `ASYMPTOTIC_ABS_Z` the Hankel asymptotic expansion (A&S 9.2.5–9.2.10, the
 * H⁽¹⁾ branch, dominant for Im z < 0) is used instead; the two agree to 1e-10 relative there.
 *
 * References:
 *  - M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions (1964), §9.1, §9.2.
 *  - W. H. Press, S. A. Teukolsky, W. T. Vetterling, B. P. Flannery, Numerical Recipes, 3rd ed.
 *    (2007), §5.2 (Lentz's method), §6.5.
 */
import { type Complex, cDiv, cMul, c } from './complex.ts';

export const ASYMPTOTIC_ABS_Z = 60;

/** J₀(z)/J₁(z) for complex z ≠ 0 (continued fraction or asymptotic form; see the module note). */
export function besselJ0OverJ1(z: Complex): Complex {
  const az = Math.hypot(z.re, z.im);
  if (!(az > 0)) throw new RangeError('J0/J1 needs z ≠ 0');
  if (az > ASYMPTOTIC_ABS_Z && z.im <= 0) return asymptoticJ0OverJ1(z);
  return cDiv(c(1), besselJ1OverJ0(z));
}

/** J₁(z)/J₀(z) by the continued fraction A&S 9.1.73 with the modified Lentz algorithm. */
export function besselJ1OverJ0(z: Complex): Complex {
  const tiny = 1e-300;
  const inv = cDiv(c(1), z); // 1/z
  // f = 1/(b1 − 1/(b2 − 1/(b3 − …))), b_m = 2(m)/z for m = 1, 2, …
  // Lentz on f' = b1 + a2/(b2 + a3/(b3 + …)) with a_m = −1, then f = 1/f'.
  let fr = 2 * inv.re;
  let fi = 2 * inv.im;
  if (fr === 0 && fi === 0) fr = tiny;
  let Cr = fr;
  let Ci = fi;
  let Dr = 0;
  let Di = 0;
  const maxTerms = 50 + Math.ceil(8 * Math.hypot(z.re, z.im));
  for (let m = 2; m < maxTerms; m++) {
    const br = 2 * m * inv.re;
    const bi = 2 * m * inv.im;
    // D = 1/(b + a·D), a = −1
    let dr = br - Dr;
    const di = bi - Di;
    if (dr === 0 && di === 0) dr = tiny;
    const dd = dr * dr + di * di;
    Dr = dr / dd;
    Di = -di / dd;
    // C = b + a/C
    const cc = Cr * Cr + Ci * Ci;
    Cr = br - Cr / cc;
    Ci = bi + Ci / cc;
    if (Cr === 0 && Ci === 0) Cr = tiny;
    // delta = C·D
    const delr = Cr * Dr - Ci * Di;
    const deli = Cr * Di + Ci * Dr;
    const nr = fr * delr - fi * deli;
    const ni = fr * deli + fi * delr;
    fr = nr;
    fi = ni;
    if (Math.abs(delr - 1) + Math.abs(deli) < 1e-15) return cDiv(c(1), c(fr, fi));
  }
  throw new RangeError(`J1/J0 continued fraction did not converge for z = ${z.re} + j${z.im}`);
}

/** Hankel asymptotic J₀/J₁ ≈ H₀⁽¹⁾/H₁⁽¹⁾ for large |z|, Im z ≤ 0 (A&S 9.2.5–9.2.10). */
function asymptoticJ0OverJ1(z: Complex): Complex {
  // H_ν⁽¹⁾(z) ∝ (P_ν + jQ_ν) e^{j(z − νπ/2 − π/4)}, so H₀/H₁ = j (P₀ + jQ₀)/(P₁ + jQ₁).
  const z2 = cMul(z, z);
  const i8z = cDiv(c(1), cMul(c(8), z));
  const i8z2 = cDiv(c(1), cMul(c(64), z2));
  const term = (mu: number): { P: Complex; Q: Complex } => {
    // P = 1 − (μ−1)(μ−9)/(2!(8z)²) + (μ−1)(μ−9)(μ−25)(μ−49)/(4!(8z)⁴) − …
    // Q = (μ−1)/(8z) − (μ−1)(μ−9)(μ−25)/(3!(8z)³) + …
    const a1 = mu - 1;
    const a2 = (mu - 1) * (mu - 9);
    const a3 = a2 * (mu - 25);
    const a4 = a3 * (mu - 49);
    const a5 = a4 * (mu - 81);
    const w2 = i8z2;
    const w4 = cMul(w2, w2);
    const P = c(1 - (a2 / 2) * w2.re + (a4 / 24) * w4.re, -(a2 / 2) * w2.im + (a4 / 24) * w4.im);
    const w3 = cMul(w2, i8z);
    const w5 = cMul(w4, i8z);
    const Q = c(
      a1 * i8z.re - (a3 / 6) * w3.re + (a5 / 120) * w5.re,
      a1 * i8z.im - (a3 / 6) * w3.im + (a5 / 120) * w5.im,
    );
    return { P, Q };
  };
  const t0 = term(0);
  const t1 = term(4);
  const num = c(t0.P.re - t0.Q.im, t0.P.im + t0.Q.re); // P + jQ
  const den = c(t1.P.re - t1.Q.im, t1.P.im + t1.Q.re);
  const r = cDiv(num, den);
  return c(-r.im, r.re); // j·r
}
