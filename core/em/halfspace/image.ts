/**
 * Closed-form parts of the reflected field (the quasi-static split of sommerfeld.ts), and the
 * assembly of a Cartesian dyadic from cylindrical components.
 *
 * Layout of a dyadic: 18 doubles, row-major 3×3 of complex (re, im): D[i][j] at 2(3i + j),
 * i the field component (x, y, z), j the source-current component. The reflected field of a
 * current element p = I·dl along ŝ at r' is E(r) = (p/(4πjωε0)) D(r, r')·ŝ  (units of D: m⁻³).
 *
 * 1. Perfect-conductor image (C. A. Balanis, Antenna Theory, 3rd ed. (2005), §4.7; the image of
 *    ŝ at (x', y', −z') is (−sx, −sy, sz)), with the free-space dyadic Green's function
 *      (k²g δij + ∂i∂j g) = g/R² [(k²R² − 1 − jkR) δij + (3 + 3jkR − k²R²) R̂i R̂j],
 *      g = e^{−jkR}/R, R from the image point to the observer
 *    (J. D. Jackson, Classical Electrodynamics, 3rd ed. (1999), eq. 9.18 written as a dyadic;
 *    C.-T. Tai, Dyadic Green Functions in Electromagnetic Theory, 2nd ed. (1994), ch. 2).
 *    The split in sommerfeld.ts takes K·(this) as the quasi-static image part.
 * 2. The TE counterpart term K k0²·T: the K part above carries R_TE = −K, the true R_TE decays,
 *    so K·(R_TE = 1) is added back in closed form using the Sommerfeld identity
 *      ∫ J0 e^{−u0ζ} λ/u0 dλ = g(R1)                 (Sommerfeld 1909; Chew 1990 eq. 2.2.27)
 *    and its consequence  ∫ J1(λρ) e^{−u0ζ} dλ/u0 = (e^{−jk0ζ} − e^{−jk0R1})/(jk0ρ)  (obtained
 *    from the identity by (1/ρ)∂ρ(ρ·): d/dρ [ρ J1(λρ)] = λρ J0(λρ), A&S 9.1.30), giving
 *      Tφφ = g(R1) − F/ρ,  Tρρ = F/ρ,  F/ρ = (e^{−jk0ζ} − e^{−jk0R1})/(jk0ρ²),
 *    evaluated without cancellation as e^{−jk0ζ}/(R1 + ζ)·[sinc x − j(x/2) sinc²(x/2)],
 *    x = k0(R1 − ζ) = k0ρ²/(R1 + ζ).
 */
import type { HalfSpace } from './medium.ts';

/** Adds s·(the perfect-image dyadic) into out (18 doubles); s = (sr, si) complex weight. */
export function addPerfectImageDyadic(
  k: number,
  dx: number,
  dy: number,
  zeta: number,
  sr: number,
  si: number,
  out: Float64Array,
): void {
  const R2 = dx * dx + dy * dy + zeta * zeta;
  const R = Math.sqrt(R2);
  const kR = k * R;
  const gr = Math.cos(kR) / R;
  const gi = -Math.sin(kR) / R;
  // g/R²·(a δ + b R̂R̂): a = k²R² − 1 − jkR, b = 3 + 3jkR − k²R²
  const ar = kR * kR - 1;
  const ai = -kR;
  const br = 3 - kR * kR;
  const bi = 3 * kR;
  // multiply by s·g/R²
  const wr = (sr * gr - si * gi) / R2;
  const wi = (sr * gi + si * gr) / R2;
  const Ar = wr * ar - wi * ai;
  const Ai = wr * ai + wi * ar;
  const Br = wr * br - wi * bi;
  const Bi = wr * bi + wi * br;
  const u0 = dx / R;
  const u1 = dy / R;
  const u2 = zeta / R;
  const uh = [u0, u1, u2];
  const m = [-1, -1, 1];
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      const rr = uh[i] * uh[j];
      const o = 2 * (3 * i + j);
      const delta = i === j ? 1 : 0;
      out[o] += m[j] * (Ar * delta + Br * rr);
      out[o + 1] += m[j] * (Ai * delta + Bi * rr);
    }
  }
}

/** K k0²·(Tρρ, Tφφ) written into cyl[0…3] as additions to Gρρ, Gφφ (see the module note). */
export function addTeCounterpart(hs: HalfSpace, rho: number, zeta: number, cyl: Float64Array): void {
  const k = hs.k0;
  const R = Math.hypot(rho, zeta);
  const x = (k * rho * rho) / (R + zeta);
  const sincx = x < 1e-8 ? 1 - (x * x) / 6 : Math.sin(x) / x;
  const hx = 0.5 * x;
  const sinch = hx < 1e-8 ? 1 - (hx * hx) / 6 : Math.sin(hx) / hx;
  // bracket = sinc x − j (x/2) sinc²(x/2)
  const br = sincx;
  const bi = -hx * sinch * sinch;
  // e^{−jkζ}/(R + ζ)
  const pr = Math.cos(k * zeta) / (R + zeta);
  const pi = -Math.sin(k * zeta) / (R + zeta);
  const fr = pr * br - pi * bi;
  const fi = pr * bi + pi * br;
  // g(R1)
  const gr = Math.cos(k * R) / R;
  const gi = -Math.sin(k * R) / R;
  // weight K k0²
  const wr = hs.kRe * k * k;
  const wi = hs.kIm * k * k;
  cyl[0] += wr * fr - wi * fi;
  cyl[1] += wr * fi + wi * fr;
  const tr = gr - fr;
  const ti = gi - fi;
  cyl[2] += wr * tr - wi * ti;
  cyl[3] += wr * ti + wi * tr;
}

/**
 * Adds the Cartesian dyadic of cylindrical components (Gρρ, Gφφ, Gρz, Gzz; Gzρ = −Gρz) about the
 * horizontal unit vector ρ̂ = (cx, cy) into out (18 doubles).
 */
export function addCylindricalDyadic(cyl: Float64Array, cx: number, cy: number, out: Float64Array): void {
  const rh = [cx, cy];
  const ph = [-cy, cx];
  for (let i = 0; i < 2; i++) {
    for (let j = 0; j < 2; j++) {
      const a = rh[i] * rh[j];
      const b = ph[i] * ph[j];
      const o = 2 * (3 * i + j);
      out[o] += cyl[0] * a + cyl[2] * b;
      out[o + 1] += cyl[1] * a + cyl[3] * b;
    }
    // D[i][z] = Gρz ρ̂i ; D[z][i] = Gzρ ρ̂i = −Gρz ρ̂i
    const oiz = 2 * (3 * i + 2);
    out[oiz] += cyl[4] * rh[i];
    out[oiz + 1] += cyl[5] * rh[i];
    const ozi = 2 * (6 + i);
    out[ozi] -= cyl[4] * rh[i];
    out[ozi + 1] -= cyl[5] * rh[i];
  }
  out[16] += cyl[6];
  out[17] += cyl[7];
}
