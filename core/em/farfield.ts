/**
 * Far field of the solved currents, with the ground-reflected wave.
 *
 * The current on a segment is linear between its node currents, so the radiation vector of a
 * segment, N = t̂ ∫ I(s) e^{jk r̂·r(s)} ds, is integrated in closed form:
 *     ∫₀¹ (I_a(1−u) + I_b u) e^{jψu} du = I_a(E0 − E1) + I_b E1,   ψ = kΔ r̂·t̂,
 *     E0 = (e^{jψ} − 1)/(jψ),  E1 = e^{jψ}/(jψ) − (e^{jψ} − 1)/(jψ)²   (series for small ψ).
 * Along a straight wire with equal segments the node phases e^{jk r̂·r_n} form a geometric
 * sequence, so each wire costs two complex exponentials per direction.
 * Field: E = −jωμ e^{−jkr}/(4πr) (N_θ θ̂ + N_φ φ̂), radiation intensity
 *     U = η k² (|N_θ|² + |N_φ|²) / (32π²),  gain G = 4πU / P_in
 * (Balanis, Antenna Theory, 3rd ed., 2005, §6.6 and eq. 2.16 with the vector potential of §3.6).
 * Over ground the image currents radiate too (perfect-conductor image, ground.ts), their θ part
 * weighted by Rv and their φ part by −Rh at the elevation angle (core/REFERENCES.md §3 rule).
 *
 * Directions: elevation el up from the horizon, azimuth az clockwise from north (y), so
 * r̂ = (cos el sin az, cos el cos az, sin el); θ̂ = (sin el sin az, sin el cos az, −cos el) is the
 * vertical polarisation and φ̂ = (cos az, −sin az, 0) the horizontal one.
 */
import { gaussLegendre01 } from '../numeric/quadrature.ts';
import type { GroundAtFrequency } from './ground.ts';
import type { Mesh } from './mesh.ts';

export interface FarFieldSource {
  mesh: Mesh;
  /** Node currents along each wire's direction, interleaved (re, im), length 2·nNodes. */
  nodeCurrents: Float64Array;
  k: number;
  ground: GroundAtFrequency | null;
}

const refl = new Float64Array(4);
let reflSinPsi = NaN;
let reflGround: GroundAtFrequency | null = null;

/** Series coefficients of E0 and E1 with the sign of j^m folded in (m = 0 … 11). */
const C0 = new Float64Array(12);
const C1 = new Float64Array(12);
{
  let fact = 1;
  for (let m = 0; m < 12; m++) {
    if (m > 0) fact *= m;
    const sign = Math.floor(m / 2) % 2 === 0 ? 1 : -1; // Re/Im part of j^m
    C0[m] = sign / (fact * (m + 1));
    C1[m] = sign / (fact * (m + 2));
  }
}

/** Result of wireSum: (re, im). */
const ws = new Float64Array(2);

/**
 * One straight wire's radiation integral Δ Σ ∫ I(s) e^{j(ph0 + ψ s/Δ)} ds over its nS equal
 * segments of length d (node currents from node n0 of I), ψ = kΔ r̂·t̂: writes (re, im) to ws.
 */
function wireSum(I: Float64Array, n0: number, nS: number, d: number, psi: number, ph0: number): void {
  const cp = Math.cos(psi);
  const sp = Math.sin(psi);
  // A = Σ I_n P_n with P_n = e^{j(ph0 + nψ)}, summed in four interleaved chains (P_n,
  // P_{n+1}, P_{n+2}, P_{n+3} each rotated by e^{4jψ}) so that the recurrence does not
  // serialise the loop.
  const p0r = Math.cos(ph0);
  const p0i = Math.sin(ph0);
  const c2 = cp * cp - sp * sp;
  const s2 = 2 * cp * sp;
  const c4 = c2 * c2 - s2 * s2;
  const s4 = 2 * c2 * s2;
  let qr0 = p0r;
  let qi0 = p0i;
  let qr1 = p0r * cp - p0i * sp;
  let qi1 = p0r * sp + p0i * cp;
  let qr2 = p0r * c2 - p0i * s2;
  let qi2 = p0r * s2 + p0i * c2;
  let qr3 = qr1 * c2 - qi1 * s2;
  let qi3 = qr1 * s2 + qi1 * c2;
  let ar0 = 0,
    ai0 = 0,
    ar1 = 0,
    ai1 = 0;
  let n = 0;
  const base = 2 * n0;
  for (; n + 4 <= nS; n += 4) {
    const o2 = base + 2 * n;
    const i0r = I[o2];
    const i0i = I[o2 + 1];
    const i1r = I[o2 + 2];
    const i1i = I[o2 + 3];
    const i2r = I[o2 + 4];
    const i2i = I[o2 + 5];
    const i3r = I[o2 + 6];
    const i3i = I[o2 + 7];
    ar0 += i0r * qr0 - i0i * qi0 + (i2r * qr2 - i2i * qi2);
    ai0 += i0r * qi0 + i0i * qr0 + (i2r * qi2 + i2i * qr2);
    ar1 += i1r * qr1 - i1i * qi1 + (i3r * qr3 - i3i * qi3);
    ai1 += i1r * qi1 + i1i * qr1 + (i3r * qi3 + i3i * qr3);
    let t = qr0 * c4 - qi0 * s4;
    qi0 = qr0 * s4 + qi0 * c4;
    qr0 = t;
    t = qr1 * c4 - qi1 * s4;
    qi1 = qr1 * s4 + qi1 * c4;
    qr1 = t;
    t = qr2 * c4 - qi2 * s4;
    qi2 = qr2 * s4 + qi2 * c4;
    qr2 = t;
    t = qr3 * c4 - qi3 * s4;
    qi3 = qr3 * s4 + qi3 * c4;
    qr3 = t;
  }
  // remaining nodes n … nS (one to four), continuing from chain 0, so P ends at P_N
  let pr = qr0;
  let pi = qi0;
  let ar = ar0 + ar1;
  let ai = ai0 + ai1;
  for (; n <= nS; n++) {
    const ir = I[base + 2 * n];
    const ii = I[base + 2 * n + 1];
    ar += ir * pr - ii * pi;
    ai += ir * pi + ii * pr;
    if (n < nS) {
      const t = pr * cp - pi * sp;
      pi = pr * sp + pi * cp;
      pr = t;
    }
  }
  // pr, pi now P_N
  let e0r: number, e0i: number, e1r: number, e1i: number;
  if (Math.abs(psi) < 0.5) {
    // E0 = Σ (jψ)^m/(m+1)!, E1 = Σ (jψ)^m/((m+2)·m!): even powers real, odd imaginary (Horner in ψ²)
    const p2 = psi * psi;
    e0r = C0[0] + p2 * (C0[2] + p2 * (C0[4] + p2 * (C0[6] + p2 * (C0[8] + p2 * C0[10]))));
    e0i = psi * (C0[1] + p2 * (C0[3] + p2 * (C0[5] + p2 * (C0[7] + p2 * (C0[9] + p2 * C0[11])))));
    e1r = C1[0] + p2 * (C1[2] + p2 * (C1[4] + p2 * (C1[6] + p2 * (C1[8] + p2 * C1[10]))));
    e1i = psi * (C1[1] + p2 * (C1[3] + p2 * (C1[5] + p2 * (C1[7] + p2 * (C1[9] + p2 * C1[11])))));
  } else {
    // jψ = (0, ψ); (e^{jψ} − 1)/(jψ) = (sin ψ, 1 − cos ψ)/ψ
    e0r = sp / psi;
    e0i = (1 - cp) / psi;
    // e^{jψ}/(jψ) = (cos ψ + j sin ψ)(−j/ψ) = (sin ψ, −cos ψ)/ψ ; E0/(jψ) = E0·(−j/ψ)
    e1r = sp / psi - e0i / psi;
    e1i = -cp / psi + e0r / psi;
  }
  // S = Δ[(E0 − E1)(A − I_N P_N) + E1 e^{−jψ}(A − I_0 P_0)]
  const iNr = I[2 * (n0 + nS)];
  const iNi = I[2 * (n0 + nS) + 1];
  const i0r = I[2 * n0];
  const i0i = I[2 * n0 + 1];
  const xr = ar - (iNr * pr - iNi * pi);
  const xi = ai - (iNr * pi + iNi * pr);
  const yr0 = ar - (i0r * p0r - i0i * p0i);
  const yi0 = ai - (i0r * p0i + i0i * p0r);
  // e^{−jψ}(…)
  const yr = yr0 * cp + yi0 * sp;
  const yi = yi0 * cp - yr0 * sp;
  const fr = e0r - e1r;
  const fi = e0i - e1i;
  ws[0] = d * (fr * xr - fi * xi + e1r * yr - e1i * yi);
  ws[1] = d * (fr * xi + fi * xr + e1r * yi + e1i * yr);
}

/**
 * Chebyshev series of each wire's radiation integral, per source (built on first use).
 *
 * About its midpoint a wire's integral is h(x) = Δ ∫₀^N I(u) e^{jkΔx(u − N/2)} du with
 * x = r̂·t̂ ∈ [−1, 1]: a function of one variable of exponential type b = kL/2 (L = NΔ, the wire's
 * length). Its Chebyshev coefficients are a_m = 2jᵐ Δ ∫ I(u) J_m(kΔ(u − N/2)) du, so
 * |a_m| ≤ 2 Δ∫|I| (b/2)ᵐ/m! by |J_m(β)| ≤ |β/2|ᵐ/m! (Abramowitz & Stegun, Handbook of
 * Mathematical Functions, 1964, eq. 9.1.62), and the interpolant at M + 1 Chebyshev points is
 * within 2 Σ_{m>M} |a_m| of h (Trefethen, Approximation Theory and Approximation Practice, 2013,
 * Thm 8.2). M is the smallest order that makes that bound ≤ SERIES_TOL · Δ∫|I|; the values at the
 * points come from the closed-form sum (wireSum). A wire whose series would be longer than its
 * node count keeps the direct sum.
 */
const SERIES_TOL = 1e-15;
let seriesOn = true;
let series: { src: FarFieldSource; currents: Float64Array; coef: (Float64Array | null)[] } | null = null;

/** Use the wires' Chebyshev series (default) or the direct sum for every direction; returns the previous setting. */
export function useWireSeries(on: boolean): boolean {
  const was = seriesOn;
  seriesOn = on;
  series = null;
  return was;
}

/** The series order M for a wire of half-length kL/2 = b: 4 (b/2)^{M+1}/(M+1)! ≤ tol, terms falling by half. */
export function seriesOrder(b: number, tol = SERIES_TOL): number {
  const h = b / 2;
  let term = h; // (b/2)^{M+1}/(M+1)! for M = 0
  let m = 0;
  while (m < 200 && (4 * term > tol || h / (m + 2) > 0.5)) {
    m++;
    term *= h / (m + 1);
  }
  return m;
}

function wireSeries(src: FarFieldSource): {
  src: FarFieldSource;
  currents: Float64Array;
  coef: (Float64Array | null)[];
} {
  const { mesh, nodeCurrents: I, k } = src;
  const coef: (Float64Array | null)[] = [];
  for (let w = 0; w < mesh.nWires; w++) {
    const s0 = mesh.wireSegStart[w];
    const nS = mesh.wireSegStart[w + 1] - s0;
    const n0 = mesh.wireNodeStart[w];
    const d = mesh.len[s0];
    const m = seriesOrder((k * d * nS) / 2);
    if (m > nS + 8) {
      coef.push(null);
      continue;
    }
    // values at the Chebyshev points x_i = cos(π(i + ½)/(M + 1)), the midpoint's phase removed
    const np = m + 1;
    const vr = new Float64Array(np);
    const vi = new Float64Array(np);
    for (let i = 0; i < np; i++) {
      const x = Math.cos((Math.PI * (i + 0.5)) / np);
      const psi = k * d * x;
      wireSum(I, n0, nS, d, psi, -0.5 * nS * psi);
      vr[i] = ws[0];
      vi[i] = ws[1];
    }
    // c_m = (2/(M+1)) Σ_i v_i cos(πm(i + ½)/(M + 1)), c_0 halved
    const c = new Float64Array(2 * np);
    for (let j = 0; j < np; j++) {
      let cr = 0;
      let ci = 0;
      for (let i = 0; i < np; i++) {
        const t = Math.cos((Math.PI * j * (i + 0.5)) / np);
        cr += vr[i] * t;
        ci += vi[i] * t;
      }
      const f = (j === 0 ? 1 : 2) / np;
      c[2 * j] = f * cr;
      c[2 * j + 1] = f * ci;
    }
    coef.push(c);
  }
  return { src, currents: I, coef };
}

/** Radiation-vector sums of all wires (and images) for one direction: out = [Nx, Ny, Nz] real/imag for real and image parts. */
function radiationVectors(
  src: FarFieldSource,
  ux: number,
  uy: number,
  uz: number,
  withImage: boolean,
  out: Float64Array,
): void {
  const { mesh, nodeCurrents: I, k } = src;
  let coef: (Float64Array | null)[] | null = null;
  if (seriesOn) {
    if (series === null || series.src !== src || series.currents !== I) series = wireSeries(src);
    coef = series.coef;
  }
  out.fill(0);
  for (let w = 0; w < mesh.nWires; w++) {
    const s0 = mesh.wireSegStart[w];
    const horizontal = mesh.tz[s0] === 0;
    const passes = withImage && !horizontal ? 2 : 1;
    for (let pass = 0; pass < passes; pass++) {
      const zs = pass === 0 ? 1 : -1;
      const cs = pass === 0 ? 1 : -1; // image current −I along the mirrored direction
      const o = pass * 6;
      const nS = mesh.wireSegStart[w + 1] - s0;
      const n0 = mesh.wireNodeStart[w];
      const wtx = mesh.tx[s0];
      const wty = mesh.ty[s0];
      const wtz = zs * mesh.tz[s0];
      const d = mesh.len[s0];
      let sr: number, si: number;
      const tab = coef === null ? null : coef[w];
      if (tab) {
        // the wire's integral about its midpoint, h(x) with x = r̂·t̂, from its Chebyshev series
        // (Clenshaw's recurrence), times the midpoint's phase
        clenshaw(tab, ux * wtx + uy * wty + uz * wtz);
        const hr = cl[0];
        const hi = cl[1];
        const hl = 0.5 * nS * d;
        const phm =
          k *
          (ux * (mesh.sx[s0] + hl * wtx) +
            uy * (mesh.sy[s0] + hl * wty) +
            uz * zs * (mesh.sz[s0] + hl * mesh.tz[s0]));
        const mr = Math.cos(phm);
        const mi = Math.sin(phm);
        sr = cs * (hr * mr - hi * mi);
        si = cs * (hr * mi + hi * mr);
      } else {
        const psi = k * d * (ux * wtx + uy * wty + uz * wtz);
        const ph0 = k * (ux * mesh.sx[s0] + uy * mesh.sy[s0] + uz * zs * mesh.sz[s0]);
        wireSum(I, n0, nS, d, psi, ph0);
        sr = cs * ws[0];
        si = cs * ws[1];
      }
      out[o] += sr * wtx;
      out[o + 1] += si * wtx;
      out[o + 2] += sr * wty;
      out[o + 3] += si * wty;
      out[o + 4] += sr * wtz;
      out[o + 5] += si * wtz;

      if (withImage && horizontal) {
        // image of a horizontal wire: same nodes lowered to −z, so its sum is this one times
        // e^{−2jk uz z} with the current reversed (the mirrored direction equals t̂)
        const ph = -2 * k * uz * mesh.sz[s0];
        const c2 = Math.cos(ph);
        const s2 = Math.sin(ph);
        const jr = -(sr * c2 - si * s2);
        const ji = -(sr * s2 + si * c2);
        out[6] += jr * wtx;
        out[7] += ji * wtx;
        out[8] += jr * wty;
        out[9] += ji * wty;
      }
    }
  }
}

const nv = new Float64Array(12);

/**
 * Radiation intensity of the θ (vertical) and φ (horizontal) parts in one direction, in W/sr
 * for the solved currents: writes U_θ, U_φ into out[0], out[1].
 * Below the horizon over ground the field is zero.
 */
export function radiationIntensity(
  src: FarFieldSource,
  elRad: number,
  azRad: number,
  eta: number,
  out: Float64Array,
): void {
  const ce = Math.cos(elRad);
  const se = Math.sin(elRad);
  const sa = Math.sin(azRad);
  const ca = Math.cos(azRad);
  const ground = src.ground;
  if (ground && se < 0) {
    out[0] = 0;
    out[1] = 0;
    return;
  }
  const ux = ce * sa;
  const uy = ce * ca;
  const uz = se;
  radiationVectors(src, ux, uy, uz, ground !== null, nv);
  const thx = se * sa;
  const thy = se * ca;
  const thz = -ce;
  const phx = ca;
  const phy = -sa;
  let ntr = nv[0] * thx + nv[2] * thy + nv[4] * thz;
  let nti = nv[1] * thx + nv[3] * thy + nv[5] * thz;
  let npr = nv[0] * phx + nv[2] * phy;
  let npi = nv[1] * phx + nv[3] * phy;
  if (ground) {
    if (se !== reflSinPsi || ground !== reflGround) {
      ground.farFieldReflection(se, refl);
      reflSinPsi = se;
      reflGround = ground;
    }
    const itr = nv[6] * thx + nv[8] * thy + nv[10] * thz;
    const iti = nv[7] * thx + nv[9] * thy + nv[11] * thz;
    const ipr = nv[6] * phx + nv[8] * phy;
    const ipi = nv[7] * phx + nv[9] * phy;
    ntr += refl[0] * itr - refl[1] * iti;
    nti += refl[0] * iti + refl[1] * itr;
    npr += -(refl[2] * ipr - refl[3] * ipi);
    npi += -(refl[2] * ipi + refl[3] * ipr);
  }
  const f = (eta * src.k * src.k) / (32 * Math.PI * Math.PI);
  out[0] = f * (ntr * ntr + nti * nti);
  out[1] = f * (npr * npr + npi * npi);
}

/** Radius of the sphere around the phase centre that holds all nodes (and images). */
function electricalRadius(src: FarFieldSource): number {
  const m = src.mesh;
  let cx = 0;
  let cy = 0;
  let cz = 0;
  for (let s = 0; s < m.nSeg; s++) {
    cx += m.sx[s];
    cy += m.sy[s];
    cz += m.sz[s];
  }
  cx /= m.nSeg;
  cy /= m.nSeg;
  cz = src.ground ? 0 : cz / m.nSeg;
  let r = 0;
  for (let s = 0; s < m.nSeg; s++) {
    for (const u of [0, 1]) {
      const x = m.sx[s] + u * m.len[s] * m.tx[s] - cx;
      const y = m.sy[s] + u * m.len[s] * m.ty[s] - cy;
      const z = m.sz[s] + u * m.len[s] * m.tz[s] - cz;
      r = Math.max(r, Math.hypot(x, y, z));
    }
  }
  return r;
}

export interface RadiatedPower {
  watts: number;
  /** Directions used by the integration. */
  directions: number;
}

/**
 * Radiated power P = ∫ U dΩ over the upper half-space (or the whole sphere in free space):
 * Gauss–Legendre in sin(el) and the trapezoidal rule in azimuth, which is exact for the
 * trigonometric polynomial |N|² once the number of azimuths exceeds 2k·r_max; the orders follow
 * the antenna's electrical radius (|N|² is band-limited by it). Over lossy ground the
 * elevation range near the horizon, where the Fresnel coefficients change quickly, gets its own
 * panel.
 */
export function integrateRadiatedPower(src: FarFieldSource, eta: number): RadiatedPower {
  const kr = src.k * electricalRadius(src);
  const nAz = 2 * Math.ceil(kr) + 16;
  const nMu = Math.min(160, Math.ceil(kr) + 16);
  const panels: [number, number, number][] = src.ground
    ? src.ground.epsC
      ? [
          [0, 0.02, 12],
          [0.02, 0.25, Math.ceil(nMu / 2) + 4],
          [0.25, 1, nMu],
        ]
      : [[0, 1, nMu]]
    : 2 * nMu <= 200
      ? [[-1, 1, 2 * nMu]]
      : [
          [-1, 0, nMu],
          [0, 1, nMu],
        ];
  const azs = Array.from({ length: nAz }, (_, j) => (2 * Math.PI * j) / nAz);
  let sum = 0;
  let count = 0;
  for (const [mu0, mu1, n] of panels) {
    const g = gaussLegendre01(n);
    const els = Array.from({ length: n }, (_, i) => Math.asin(mu0 + (mu1 - mu0) * g.x[i]));
    const ut = new Float64Array(n * nAz);
    const up = new Float64Array(n * nAz);
    radiationIntensityGrid(src, els, azs, eta, ut, up);
    for (let i = 0; i < n; i++) {
      let ring = 0;
      for (let j = 0; j < nAz; j++) {
        ring += ut[i * nAz + j] + up[i * nAz + j];
        count++;
      }
      sum += g.w[i] * (mu1 - mu0) * ring * ((2 * Math.PI) / nAz);
    }
  }
  return { watts: sum, directions: count };
}

/**
 * Radiation intensity (U_θ, U_φ) on a product grid of directions, the same figures as
 * radiationIntensity direction by direction (index iEl·nAz + iAz into uTheta, uPhi), with what
 * depends on one angle only (the angles' sines and cosines, the ground's reflection coefficients,
 * each wire's height phase) computed once per row or column.
 */
export function radiationIntensityGrid(
  src: FarFieldSource,
  elsRad: readonly number[],
  azsRad: readonly number[],
  eta: number,
  uTheta: Float64Array,
  uPhi: Float64Array,
): void {
  const { mesh, nodeCurrents: I, k, ground } = src;
  if (seriesOn && (series === null || series.src !== src || series.currents !== I)) series = wireSeries(src);
  const coef = seriesOn && series !== null ? series.coef : null;
  const nW = mesh.nWires;
  const nAz = azsRad.length;
  const sa = new Float64Array(nAz);
  const ca = new Float64Array(nAz);
  for (let j = 0; j < nAz; j++) {
    sa[j] = Math.sin(azsRad[j]);
    ca[j] = Math.cos(azsRad[j]);
  }
  // per wire: direction, midpoint (series) or first node (direct sum), segment length and count
  const tx = new Float64Array(nW);
  const ty = new Float64Array(nW);
  const tz = new Float64Array(nW);
  const px = new Float64Array(nW);
  const py = new Float64Array(nW);
  const pz = new Float64Array(nW);
  const zr = new Float64Array(nW);
  const zi = new Float64Array(nW);
  for (let w = 0; w < nW; w++) {
    const s0 = mesh.wireSegStart[w];
    const nS = mesh.wireSegStart[w + 1] - s0;
    const hl = coef !== null && coef[w] !== null ? 0.5 * nS * mesh.len[s0] : 0;
    tx[w] = mesh.tx[s0];
    ty[w] = mesh.ty[s0];
    tz[w] = mesh.tz[s0];
    px[w] = mesh.sx[s0] + hl * tx[w];
    py[w] = mesh.sy[s0] + hl * ty[w];
    pz[w] = mesh.sz[s0] + hl * tz[w];
  }
  const f = (eta * k * k) / (32 * Math.PI * Math.PI);
  const r = new Float64Array(4);
  let idx = 0;
  for (const el of elsRad) {
    const ce = Math.cos(el);
    const se = Math.sin(el);
    if (ground && se < 0) {
      for (let j = 0; j < nAz; j++, idx++) {
        uTheta[idx] = 0;
        uPhi[idx] = 0;
      }
      continue;
    }
    if (ground) ground.farFieldReflection(se, r);
    for (let w = 0; w < nW; w++) {
      zr[w] = Math.cos(k * se * pz[w]);
      zi[w] = Math.sin(k * se * pz[w]);
    }
    for (let j = 0; j < nAz; j++, idx++) {
      const ux = ce * sa[j];
      const uy = ce * ca[j];
      let nxr = 0,
        nxi = 0,
        nyr = 0,
        nyi = 0,
        nzr = 0,
        nzi = 0,
        mxr = 0,
        mxi = 0,
        myr = 0,
        myi = 0,
        mzr = 0,
        mzi = 0;
      for (let w = 0; w < nW; w++) {
        const wtx = tx[w];
        const wty = ty[w];
        const wtz = tz[w];
        const xh = ux * wtx + uy * wty;
        const hp = k * (ux * px[w] + uy * py[w]);
        const hr = Math.cos(hp);
        const hi = Math.sin(hp);
        const tab = coef === null ? null : coef[w];
        // direct wire: S = e^{jk(ux px + uy py)} e^{jk uz pz} h(r̂·t̂)
        let ar: number, ai: number;
        if (tab) {
          clenshaw(tab, xh + se * wtz);
          ar = cl[0];
          ai = cl[1];
        } else {
          const s0 = mesh.wireSegStart[w];
          const d = mesh.len[s0];
          wireSum(I, mesh.wireNodeStart[w], mesh.wireSegStart[w + 1] - s0, d, k * d * (xh + se * wtz), 0);
          ar = ws[0];
          ai = ws[1];
        }
        const gr = hr * zr[w] - hi * zi[w];
        const gi = hr * zi[w] + hi * zr[w];
        const sr = ar * gr - ai * gi;
        const si = ar * gi + ai * gr;
        nxr += sr * wtx;
        nxi += si * wtx;
        nyr += sr * wty;
        nyi += si * wty;
        nzr += sr * wtz;
        nzi += si * wtz;
        if (ground) {
          // image: current −I along (tx, ty, −tz) from the mirrored point, e^{−jk uz pz}
          if (wtz !== 0) {
            if (tab) {
              clenshaw(tab, xh - se * wtz);
              ar = cl[0];
              ai = cl[1];
            } else {
              const s0 = mesh.wireSegStart[w];
              const d = mesh.len[s0];
              wireSum(I, mesh.wireNodeStart[w], mesh.wireSegStart[w + 1] - s0, d, k * d * (xh - se * wtz), 0);
              ar = ws[0];
              ai = ws[1];
            }
          }
          const qr = hr * zr[w] + hi * zi[w];
          const qi = hi * zr[w] - hr * zi[w];
          const jr = -(ar * qr - ai * qi);
          const ji = -(ar * qi + ai * qr);
          mxr += jr * wtx;
          mxi += ji * wtx;
          myr += jr * wty;
          myi += ji * wty;
          mzr -= jr * wtz;
          mzi -= ji * wtz;
        }
      }
      const thx = se * sa[j];
      const thy = se * ca[j];
      const thz = -ce;
      const phx = ca[j];
      const phy = -sa[j];
      let ntr = nxr * thx + nyr * thy + nzr * thz;
      let nti = nxi * thx + nyi * thy + nzi * thz;
      let npr = nxr * phx + nyr * phy;
      let npi = nxi * phx + nyi * phy;
      if (ground) {
        const itr = mxr * thx + myr * thy + mzr * thz;
        const iti = mxi * thx + myi * thy + mzi * thz;
        const ipr = mxr * phx + myr * phy;
        const ipi = mxi * phx + myi * phy;
        ntr += r[0] * itr - r[1] * iti;
        nti += r[0] * iti + r[1] * itr;
        npr += -(r[2] * ipr - r[3] * ipi);
        npi += -(r[2] * ipi + r[3] * ipr);
      }
      uTheta[idx] = f * (ntr * ntr + nti * nti);
      uPhi[idx] = f * (npr * npr + npi * npi);
    }
  }
}

const cl = new Float64Array(2);

/** Clenshaw's recurrence for Σ c_m T_m(x), complex coefficients interleaved: writes (re, im) to cl. */
function clenshaw(tab: Float64Array, x: number): void {
  const x2 = 2 * x;
  let b1r = 0,
    b1i = 0,
    b2r = 0,
    b2i = 0;
  for (let m = tab.length - 2; m >= 2; m -= 2) {
    const tr = tab[m] + x2 * b1r - b2r;
    const ti = tab[m + 1] + x2 * b1i - b2i;
    b2r = b1r;
    b2i = b1i;
    b1r = tr;
    b1i = ti;
  }
  cl[0] = tab[0] + x * b1r - b2r;
  cl[1] = tab[1] + x * b1i - b2i;
}
