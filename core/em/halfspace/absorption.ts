/**
 * Power absorbed by the lossy half-space, computed on its own from the solved currents: the net
 * Poynting flux down through the plane z = 0, summed over the plane-wave spectrum of the currents.
 * It uses neither the impedance matrix nor the far field, so the balance
 *     P_in = P_rad (space wave, far field) + P_conductor + P_ground (this module)
 * is a check of the solution that can fail (evaluate.ts reports the difference).
 *
 * Derivation (e^{jωt}). Below every source, the field of the currents J in free space is the
 * Weyl (plane-wave) expansion of the free-space dyadic Green's function (W. C. Chew, Waves and
 * Fields in Inhomogeneous Media (1990), eq. 2.2.11 and §2.2; J. A. Kong, Electromagnetic Wave
 * Theory (1986), §5.2):
 *     E(r) = −(ωμ0/8π²) ∫∫ d²k_ρ (1/k_z) e^{−j(k_ρ·ρ − k_z z)} (ĥĥ + v̂v̂)·J̃(k_ρ),
 *     J̃(k_ρ) = ∫ J(r′) e^{j k_ρ·ρ′} e^{−j k_z z′} dV′,   k_z = √(k0² − k_ρ²), Im k_z ≤ 0,
 * with ĥ = ẑ × k̂_ρ (TE) and v̂ = (k_z k̂_ρ + k_ρ ẑ)/k0 (TM; I − kk/k0² = ĥĥ + v̂v̂ also for
 * complex k_z). Each downgoing plane wave meets the ground with the Fresnel coefficients of the
 * tangential E (TE) and tangential H (TM), R_TE = (u0 − u)/(u0 + u), R_TM = (εc u0 − u)/(εc u0 + u),
 * u0 = j k_z, u = √(u0² − k0²(εc − 1)) (sommerfeld.ts, the same spectral quantities). With
 * Parseval's theorem the time-averaged flux into the ground is
 *     P_ground = (ωμ0/32π²) ∫∫ d²k_ρ (1/|k_z|) [ |ĥ·J̃|² T_TE + |v̂·J̃|² T_TM ],
 *     T = 1 − |R|² (k_ρ < k0, propagating),   T = −2 Im R (k_ρ > k0, evanescent),
 * from Re(E_t × H_t*) of the incident-plus-reflected pair at z = 0 (J. A. Stratton, Electromagnetic
 * Theory (1941), §9.4, for the propagating case; the evanescent case is the same algebra with
 * k_z = −j|k_z|). Check of the normalisation: with R = 0 the propagating part is the power the
 * currents radiate into the lower half-space in free space (test/reference/em/halfspace).
 *
 * Numerics: piecewise-linear current on each segment, so J̃ of a segment is in closed form
 * (∫₀¹ e^{xu} du and ∫₀¹ u e^{xu} du, series for small |x|). k_ρ = k0 sin θ on [0, k0] and
 * k0 cosh t just above k0 remove the 1/|k_z| end point; Gauss–Legendre panels graded toward
 * k_ρ = k0 and Re k2, no wider than 2/D in k_ρ (D the horizontal extent of the antenna) and 1/z_min;
 * cut where e^{−2 k_ρ z_min} < e^{−40}. Azimuth: trapezoidal rule with more points than the
 * bandwidth k_ρ D of |J̃|² (exponentially convergent for a band-limited periodic function).
 * Valid only when no segment touches the ground (the spectrum then decays); otherwise null.
 */
import { gaussLegendre01 } from '../../numeric/quadrature.ts';
import type { Mesh } from '../mesh.ts';
import { HS_ETA0, type HalfSpace } from './medium.ts';

export interface GroundAbsorption {
  /** Net power into the ground, W. */
  watts: number;
  /** Part carried by propagating (k_ρ < k0) and by evanescent (k_ρ > k0) plane waves. */
  propagatingW: number;
  evanescentW: number;
  /** Spectral points used (k_ρ, φ). */
  points: number;
}

const GL = gaussLegendre01(8);

/** Panel edges on [a, b]: uniform no wider than `w`, plus geometric grading toward `toward`. */
function panelEdges(a: number, b: number, w: number, grade: readonly number[]): number[] {
  const e = new Set<number>([a, b]);
  const n = Math.max(1, Math.ceil((b - a) / w));
  for (let i = 1; i < n; i++) e.add(a + ((b - a) * i) / n);
  for (const g of grade) {
    if (g < a || g > b) continue;
    e.add(g);
    for (let i = 1; i <= 14; i++) {
      const d = (b - a) * 2 ** -i;
      if (g - d > a) e.add(g - d);
      if (g + d < b) e.add(g + d);
    }
  }
  return [...e].sort((x, y) => x - y);
}

interface Segs {
  n: number;
  x: Float64Array;
  y: Float64Array;
  z: Float64Array;
  tx: Float64Array;
  ty: Float64Array;
  tz: Float64Array;
  len: Float64Array;
  /** Node currents at the two ends (re, im). */
  iar: Float64Array;
  iai: Float64Array;
  ibr: Float64Array;
  ibi: Float64Array;
}

const J = new Float64Array(6);

/**
 * J̃ at (kx, ky) with exponent factor γ = −j k_z = (gr, gi) for the height: writes
 * (Jx, Jy, Jz) re/im into J.
 */
function spectrum(s: Segs, kx: number, ky: number, gr: number, gi: number): void {
  J.fill(0);
  for (let i = 0; i < s.n; i++) {
    // exponent at the start: j(kx x + ky y) + γ z
    const er = gr * s.z[i];
    const ei = kx * s.x[i] + ky * s.y[i] + gi * s.z[i];
    const L = s.len[i];
    // x = αL, α = j(kx tx + ky ty) + γ tz
    const xr = gr * s.tz[i] * L;
    const xi = (kx * s.tx[i] + ky * s.ty[i] + gi * s.tz[i]) * L;
    let e1r: number, e1i: number, e2r: number, e2i: number;
    const m2 = xr * xr + xi * xi;
    if (m2 < 0.25) {
      // Σ xⁿ/(n+1)!  and  Σ xⁿ/(n!(n+2))
      let pr = 1,
        pi = 0,
        fact = 1;
      e1r = 1;
      e1i = 0;
      e2r = 0.5;
      e2i = 0;
      for (let n = 1; n < 16; n++) {
        const t = pr * xr - pi * xi;
        pi = pr * xi + pi * xr;
        pr = t;
        fact *= n;
        const c1 = 1 / (fact * (n + 1));
        const c2 = 1 / (fact * (n + 2));
        e1r += c1 * pr;
        e1i += c1 * pi;
        e2r += c2 * pr;
        e2i += c2 * pi;
      }
    } else {
      const ex = Math.exp(xr);
      const cr = ex * Math.cos(xi);
      const ci = ex * Math.sin(xi);
      // e1 = (e^x − 1)/x, e2 = (e^x (x − 1) + 1)/x² = (e^x − e1)/x
      const nr = cr - 1;
      const ni = ci;
      e1r = (nr * xr + ni * xi) / m2;
      e1i = (ni * xr - nr * xi) / m2;
      const qr = cr - e1r;
      const qi = ci - e1i;
      e2r = (qr * xr + qi * xi) / m2;
      e2i = (qi * xr - qr * xi) / m2;
    }
    // L·[Ia (e1 − e2) + Ib e2]
    const dr = e1r - e2r;
    const di = e1i - e2i;
    const vr = L * (s.iar[i] * dr - s.iai[i] * di + s.ibr[i] * e2r - s.ibi[i] * e2i);
    const vi = L * (s.iar[i] * di + s.iai[i] * dr + s.ibr[i] * e2i + s.ibi[i] * e2r);
    // × e^{exponent at the start}
    const ea = Math.exp(er);
    const pr = ea * Math.cos(ei);
    const pim = ea * Math.sin(ei);
    const ar = vr * pr - vi * pim;
    const ai = vr * pim + vi * pr;
    J[0] += s.tx[i] * ar;
    J[1] += s.tx[i] * ai;
    J[2] += s.ty[i] * ar;
    J[3] += s.ty[i] * ai;
    J[4] += s.tz[i] * ar;
    J[5] += s.tz[i] * ai;
  }
}

/** √(a) principal (Re ≥ 0), into out[0..1]. */
function csqrt(ar: number, ai: number, out: Float64Array): void {
  const m = Math.hypot(ar, ai);
  if (m === 0) {
    out[0] = 0;
    out[1] = 0;
  } else if (ar >= 0) {
    const r = Math.sqrt(0.5 * (m + ar));
    out[0] = r;
    out[1] = ai / (2 * r);
  } else {
    const t = Math.sqrt(0.5 * (m - ar));
    out[0] = Math.abs(ai) / (2 * t);
    out[1] = ai >= 0 ? t : -t;
  }
}

const sq = new Float64Array(2);
const refl = new Float64Array(4);

/** R_TE (re, im) and R_TM (re, im) into refl for u0 = (u0r, u0i). */
function reflections(hs: HalfSpace, u0r: number, u0i: number): void {
  const u02r = u0r * u0r - u0i * u0i;
  const u02i = 2 * u0r * u0i;
  csqrt(u02r - hs.dRe, u02i - hs.dIm, sq);
  const ur = sq[0];
  const ui = sq[1];
  let nr = u0r - ur;
  let ni = u0i - ui;
  let dr = u0r + ur;
  let di = u0i + ui;
  let d = dr * dr + di * di;
  refl[0] = (nr * dr + ni * di) / d;
  refl[1] = (ni * dr - nr * di) / d;
  const er = hs.epsRe * u0r - hs.epsIm * u0i;
  const ei = hs.epsRe * u0i + hs.epsIm * u0r;
  nr = er - ur;
  ni = ei - ui;
  dr = er + ur;
  di = ei + ui;
  d = dr * dr + di * di;
  refl[2] = (nr * dr + ni * di) / d;
  refl[3] = (ni * dr - nr * di) / d;
}

/**
 * Power into the ground of the currents `nodeCurrents` (along each wire's direction, as the
 * solver returns them) over the half-space `hs`; null when a segment comes within `contactM` of
 * the ground.
 */
export function groundAbsorption(
  mesh: Mesh,
  nodeCurrents: Float64Array,
  hs: HalfSpace,
  contactM = 2e-3,
): GroundAbsorption | null {
  const n = mesh.nSeg;
  const s: Segs = {
    n,
    x: new Float64Array(n),
    y: new Float64Array(n),
    z: new Float64Array(n),
    tx: new Float64Array(n),
    ty: new Float64Array(n),
    tz: new Float64Array(n),
    len: new Float64Array(n),
    iar: new Float64Array(n),
    iai: new Float64Array(n),
    ibr: new Float64Array(n),
    ibi: new Float64Array(n),
  };
  const { cx, cy, zMin, D } = meshExtent(mesh);
  if (!(zMin > contactM)) return null;
  for (let i = 0; i < n; i++) {
    const w = mesh.segWire[i];
    const a = mesh.wireNodeStart[w] + (i - mesh.wireSegStart[w]);
    s.x[i] = mesh.sx[i] - cx;
    s.y[i] = mesh.sy[i] - cy;
    s.z[i] = mesh.sz[i];
    s.tx[i] = mesh.tx[i];
    s.ty[i] = mesh.ty[i];
    s.tz[i] = mesh.tz[i];
    s.len[i] = mesh.len[i];
    s.iar[i] = nodeCurrents[2 * a];
    s.iai[i] = nodeCurrents[2 * a + 1];
    s.ibr[i] = nodeCurrents[2 * a + 2];
    s.ibi[i] = nodeCurrents[2 * a + 3];
  }
  const k0 = hs.k0;
  let points = 0;
  /** ∫ dφ of the bracket at k_ρ, trapezoidal; kz given as γ = −j k_z = (gr, gi), T's from R. */
  const ring = (kr: number, gr: number, gi: number, evanescent: boolean): number => {
    const nPhi = 2 * Math.ceil(0.5 * (1.1 * kr * D + 24));
    // u0 = j k_z = −γ
    reflections(hs, -gr, -gi);
    const tTe = evanescent ? -2 * refl[1] : 1 - (refl[0] * refl[0] + refl[1] * refl[1]);
    const tTm = evanescent ? -2 * refl[3] : 1 - (refl[2] * refl[2] + refl[3] * refl[3]);
    // k_z = jγ
    const kzr = -gi;
    const kzi = gr;
    let sum = 0;
    for (let p = 0; p < nPhi; p++) {
      const phi = (2 * Math.PI * p) / nPhi;
      const c = Math.cos(phi);
      const sn = Math.sin(phi);
      spectrum(s, kr * c, kr * sn, gr, gi);
      const hr = -sn * J[0] + c * J[2];
      const hi = -sn * J[1] + c * J[3];
      const pr = c * J[0] + sn * J[2];
      const pi = c * J[1] + sn * J[3];
      const vr = (kzr * pr - kzi * pi + kr * J[4]) / k0;
      const vi = (kzr * pi + kzi * pr + kr * J[5]) / k0;
      sum += (hr * hr + hi * hi) * tTe + (vr * vr + vi * vi) * tTm;
    }
    points += nPhi;
    return (sum * 2 * Math.PI) / nPhi;
  };
  const C = (k0 * HS_ETA0) / (32 * Math.PI * Math.PI);
  // propagating: k_ρ = k0 sin θ, measure k0 sin θ dθ; k_z = k0 cos θ, γ = −j k0 cos θ
  let prop = 0;
  for (const [a, b] of pairs(panelEdges(0, 0.5 * Math.PI, Math.min(0.1, 2 / (k0 * D)), [0.5 * Math.PI]))) {
    for (let q = 0; q < GL.x.length; q++) {
      const th = a + (b - a) * GL.x[q];
      prop += GL.w[q] * (b - a) * k0 * Math.sin(th) * ring(k0 * Math.sin(th), 0, -k0 * Math.cos(th), false);
    }
  }
  // evanescent near k0: k_ρ = k0 cosh t, measure k0 cosh t dt; |k_z| = k0 sinh t, γ = −|k_z|
  let evan = 0;
  const t1 = Math.acosh(1.5);
  for (const [a, b] of pairs(panelEdges(0, t1, Math.min(0.05, 2 / (k0 * D)), [0]))) {
    for (let q = 0; q < GL.x.length; q++) {
      const t = a + (b - a) * GL.x[q];
      evan += GL.w[q] * (b - a) * k0 * Math.cosh(t) * ring(k0 * Math.cosh(t), -k0 * Math.sinh(t), 0, true);
    }
  }
  // evanescent beyond 1.5 k0: measure k_ρ dk_ρ/|k_z|
  const kMax = Math.max(3 * k0, 20 / zMin);
  const k2 = hs.k2Re > 1.5 * k0 && hs.k2Re < kMax ? [hs.k2Re] : [];
  for (const [a, b] of pairs(panelEdges(1.5 * k0, kMax, Math.min(2 / D, 1 / zMin, k0), k2))) {
    for (let q = 0; q < GL.x.length; q++) {
      const kr = a + (b - a) * GL.x[q];
      const kz = Math.sqrt((kr - k0) * (kr + k0));
      evan += ((GL.w[q] * (b - a) * kr) / kz) * ring(kr, -kz, 0, true);
    }
  }
  return { watts: C * (prop + evan), propagatingW: C * prop, evanescentW: C * evan, points };
}

/**
 * The work of `groundAbsorption` before doing it: spectral points (k_ρ, φ) times segments, by the
 * same panel rule; null when a segment comes within `contactM` of the ground (no check possible).
 * About 150 ns per unit here (measured with `npx tsx test/bench/limits.ts`).
 */
export function groundAbsorptionWork(mesh: Mesh, k0: number, contactM = 2e-3): number | null {
  const n = mesh.nSeg;
  const { zMin, D } = meshExtent(mesh);
  if (!(zMin > contactM)) return null;
  const nq = GL.x.length;
  const ringsUpTo = (kr: number) => 2 * Math.ceil(0.5 * (1.1 * kr * D + 24));
  let points = 0;
  const nProp = pairs(panelEdges(0, 0.5 * Math.PI, Math.min(0.1, 2 / (k0 * D)), [0.5 * Math.PI])).length;
  points += nProp * nq * ringsUpTo(k0);
  const nNear = pairs(panelEdges(0, Math.acosh(1.5), Math.min(0.05, 2 / (k0 * D)), [0])).length;
  points += nNear * nq * ringsUpTo(1.5 * k0);
  const kMax = Math.max(3 * k0, 20 / zMin);
  const w = Math.min(2 / D, 1 / zMin, k0);
  const nFar = Math.ceil((kMax - 1.5 * k0) / w) + 30;
  // rings grow linearly in k_ρ: mean ring at the middle of [1.5 k0, kMax]
  points += nFar * nq * ringsUpTo(0.5 * (1.5 * k0 + kMax));
  return points * n;
}

/**
 * Where the segments lie: their start points' mean (cx, cy), the lowest point of any segment and
 * D, twice the largest plan distance of a segment end from (cx, cy) (at least 1 mm).
 */
function meshExtent(mesh: Mesh): { cx: number; cy: number; zMin: number; D: number } {
  const n = mesh.nSeg;
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < n; i++) {
    cx += mesh.sx[i];
    cy += mesh.sy[i];
  }
  cx /= n;
  cy /= n;
  let zMin = Infinity;
  let D = 0;
  for (let i = 0; i < n; i++) {
    zMin = Math.min(zMin, mesh.sz[i], mesh.sz[i] + mesh.len[i] * mesh.tz[i]);
    for (const f of [0, 1])
      D = Math.max(
        D,
        2 *
          Math.hypot(
            mesh.sx[i] - cx + f * mesh.len[i] * mesh.tx[i],
            mesh.sy[i] - cy + f * mesh.len[i] * mesh.ty[i],
          ),
      );
  }
  return { cx, cy, zMin, D: Math.max(D, 1e-3) };
}

function pairs(e: number[]): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i + 1 < e.length; i++) out.push([e[i], e[i + 1]]);
  return out;
}
