/**
 * Sommerfeld integrals for the field reflected by a lossy half-space from an electric current
 * element above it (air z > 0, soil z < 0, e^{jωt}).
 *
 * Formulation (Hertz vector, E = k0²Π + ∇∇·Π in air, Π = p/(4πjωε0)·…, p = I·dl):
 * Sommerfeld's potentials for a vertical and a horizontal element at height z' (A. Sommerfeld,
 * Ann. Phys. 28 (1909) 665; A. Baños, Dipole Radiation in the Presence of a Conducting
 * Half-Space (1966), ch. 2, eqs. for Π_z of the VED and Π_x, Π_z of the HED):
 *   Π_z^VED = C ∫ R_TM J0(λρ) e^{−u0ζ} λ/u0 dλ,
 *   Π_x^HED = C ∫ R_TE J0 e^{−u0ζ} λ/u0 dλ,  Π_z^HED = C ∂x ∫ P J0 e^{−u0ζ} λ dλ,
 * with ζ = z + z', u0 = √(λ² − k0²), u = √(λ² − k2²) (Re ≥ 0, the proper sheet), and
 *   R_TM = (εc u0 − u)/(εc u0 + u),  R_TE = (u0 − u)/(u0 + u) = Δ/(u0 + u)²,
 *   P = 2(u0 − u)/(k2² u0 + k0² u) = (R_TM + R_TE)/λ²            (identity checked in tests).
 * Applying E = k0²Π + ∇∇·Π under the integral and ∂ρ J0 = −λJ1, the reflected-field dyadic in
 * cylindrical components about the source (ρ̂ from source to observer, φ̂ = ẑ × ρ̂) is
 *   Gρρ = ∫ R_TM u0 J0 λ e dλ + ∫ (k0² R_TE − u0² R_TM) (J1/ρ) e dλ/u0
 *   Gφφ = k0² ∫ R_TE J0 λ e dλ/u0 − ∫ (k0² R_TE − u0² R_TM) (J1/ρ) e dλ/u0
 *   Gρz = ∫ R_TM J1 λ² e dλ,   Gzρ = −Gρz,   Gzz = ∫ R_TM J0 λ³ e dλ/u0,      e = e^{−u0ζ},
 * so that E = (p/(4πjωε0)) [Gρρ (ĥ·ρ̂) ρ̂ + Gφφ (ĥ·φ̂) φ̂ + Gzρ (ĥ·ρ̂) ẑ] for a horizontal
 * element along ĥ and E = (p/(4πjωε0)) [Gρz ρ̂ + Gzz ẑ] for a vertical one. The same
 * components written as Michalski & Mosig's spectral-domain transmission-line forms are in
 * K. A. Michalski and J. R. Mosig, IEEE Trans. AP-45 (1997) 508, §II–III (half-space case).
 *
 * Quasi-static split (the step 1): as λ → ∞, R_TM → K and R_TE → 0. Writing
 * R_TM = K + ΔTM with, without cancellation,
 *   ΔTM = R_TM − K = 2εcΔ / ((u0 + u)(εc u0 + u)(εc + 1))   = O(u0⁻²),
 * the K part with R_TE's "−K" image counterpart is the perfect-conductor image weighted by K
 * (image.ts, closed form), plus a small closed-form term K k0²·T (image.ts), which is added to
 * the remainder here (it cancels an e^{−jk0ζ} term of the integrals at large ρ, so the sum is
 * smoother than either). This module integrates only the remainder: the integrals above with R_TM → ΔTM and R_TE unchanged, whose
 * integrands decay like λ^{-1/2} e^{−λζ} instead of λ^{3/2} e^{−λζ}, so the remainder is
 * O(k0²/R1) near the image point instead of O(1/R1³).
 *
 * Path (Michalski & Mosig 1997 §V discuss the same choices): the real λ axis, with the branch
 * point λ = k0 removed by the substitutions λ = k0 sin t on [0, k0] (u0 = jk0 cos t,
 * dλ/u0 = −j dt) and λ = k0 cosh t on [k0, λb] (u0 = k0 sinh t, dλ/u0 = dt); with e^{jωt} the
 * soil branch point k2 and the TM pole lie below the real axis (Im < 0), so the real axis is the
 * proper path; for low-loss soils a breakpoint at Re k2 resolves the near-singular behaviour
 * there. Each piece is integrated by adaptive Gauss–Kronrod (7/15). The tail [λb, ∞) is split
 * into half-periods π/ρ of the Bessel functions (or 2/ζ when the exponential decays faster) and
 * the partial sums are accelerated by Wynn's ε algorithm (partition–extrapolation: K. A.
 * Michalski, IEEE Trans. AP-46 (1998) 1405, §II).
 *
 * Validity: ζ ≥ 0 (both points in air), ρ ≥ 0; ζ = 0 with ρ > 0 is handled by the
 * extrapolation (conditionally convergent tail). Accuracy: the requested relative tolerance on
 * the max-norm of the four components (default 1e-8; see the convergence tests).
 */
import { besselJ01 } from '../../numeric/halfspace-bessel.ts';
import { integrateAdaptive, WynnEpsilon, type AdaptiveOptions } from '../../numeric/halfspace-quadrature.ts';
import { addTeCounterpart } from './image.ts';
import type { HalfSpace } from './medium.ts';

/** Number of reals in a cylindrical component set: Gρρ, Gφφ, Gρz, Gzz (re, im each). */
export const CYL_LEN = 8;

export interface SommerfeldOptions {
  /** Relative tolerance on the max-norm of the four components. */
  relTol: number;
  /** Subtract the quasi-static K part (true: remainder; false: the whole reflected field). */
  subtractStatic: boolean;
  /** Maximum number of tail half-periods. */
  maxTailIntervals: number;
}

export const DEFAULT_SOMMERFELD: SommerfeldOptions = {
  relTol: 1e-8,
  subtractStatic: true,
  maxTailIntervals: 200,
};

export interface SommerfeldStats {
  evaluations: number;
  tailIntervals: number;
  converged: boolean;
}

// ---- integrand state (module scope: the kernels run in hot loops) --------------------------
let H: HalfSpace;
let RHO = 0;
let ZETA = 0;
let SUB = true;
const bj = new Float64Array(2);
const tmpOut = new Float64Array(CYL_LEN);

/**
 * The spectral integrand at λ with the path's u0 = (u0r, u0i) and measure w = dλ/u0·(dλ/dt)
 * … expressed so that out = H(λ)·w, H being the integrand times u0 (see the module note).
 */
function spectral(lam: number, u0r: number, u0i: number, wr: number, wi: number, out: Float64Array): void {
  const h = H;
  const k02 = h.k0 * h.k0;
  // u0², u = √(u0² − Δ) (principal root: Re u ≥ 0, the proper sheet)
  const u02r = u0r * u0r - u0i * u0i;
  const u02i = 2 * u0r * u0i;
  const sr = u02r - h.dRe;
  const si = u02i - h.dIm;
  const m = Math.hypot(sr, si);
  let ur: number;
  let ui: number;
  if (m === 0) {
    ur = 0;
    ui = 0;
  } else if (sr >= 0) {
    ur = Math.sqrt(0.5 * (m + sr));
    ui = si / (2 * ur);
  } else {
    const t = Math.sqrt(0.5 * (m - sr));
    ur = Math.abs(si) / (2 * t);
    ui = si >= 0 ? t : -t;
  }
  // a = u0 + u, b = εc u0 + u
  const ar = u0r + ur;
  const ai = u0i + ui;
  const br = h.epsRe * u0r - h.epsIm * u0i + ur;
  const bi = h.epsRe * u0i + h.epsIm * u0r + ui;
  // R_TE = Δ/a²
  const a2r = ar * ar - ai * ai;
  const a2i = 2 * ar * ai;
  let d = a2r * a2r + a2i * a2i;
  const teR = (h.dRe * a2r + h.dIm * a2i) / d;
  const teI = (h.dIm * a2r - h.dRe * a2i) / d;
  // TM factor: ΔTM = c2/(a b) (remainder) or R_TM = (εc u0 − u)/b (whole field)
  let tmR: number;
  let tmI: number;
  if (SUB) {
    const abr = ar * br - ai * bi;
    const abi = ar * bi + ai * br;
    d = abr * abr + abi * abi;
    tmR = (h.c2Re * abr + h.c2Im * abi) / d;
    tmI = (h.c2Im * abr - h.c2Re * abi) / d;
  } else {
    const nr = h.epsRe * u0r - h.epsIm * u0i - ur;
    const ni = h.epsRe * u0i + h.epsIm * u0r - ui;
    d = br * br + bi * bi;
    tmR = (nr * br + ni * bi) / d;
    tmI = (ni * br - nr * bi) / d;
  }
  // e^{−u0 ζ}·w
  const ex = Math.exp(-u0r * ZETA);
  const ph = u0i * ZETA;
  const er0 = ex * Math.cos(ph);
  const ei0 = -ex * Math.sin(ph);
  const er = er0 * wr - ei0 * wi;
  const ei = er0 * wi + ei0 * wr;
  // Bessel factors
  const x = lam * RHO;
  besselJ01(x, bj);
  const j0 = bj[0];
  const j1 = bj[1];
  const j1r = x > 1e-6 ? j1 / RHO : 0.5 * lam * (1 - 0.125 * x * x);
  // A = k0² R_TE − u0² ΔTM
  const uTr = u02r * tmR - u02i * tmI;
  const uTi = u02r * tmI + u02i * tmR;
  const Ar = k02 * teR - uTr;
  const Ai = k02 * teI - uTi;
  // Gρρ: (ΔTM u0² λ J0 + A J1/ρ)
  let pr = uTr * lam * j0 + Ar * j1r;
  let pi = uTi * lam * j0 + Ai * j1r;
  out[0] = pr * er - pi * ei;
  out[1] = pr * ei + pi * er;
  // Gφφ: (k0² R_TE λ J0 − A J1/ρ)
  pr = k02 * teR * lam * j0 - Ar * j1r;
  pi = k02 * teI * lam * j0 - Ai * j1r;
  out[2] = pr * er - pi * ei;
  out[3] = pr * ei + pi * er;
  // Gρz: ΔTM u0 λ² J1
  const l2j1 = lam * lam * j1;
  pr = (tmR * u0r - tmI * u0i) * l2j1;
  pi = (tmR * u0i + tmI * u0r) * l2j1;
  out[4] = pr * er - pi * ei;
  out[5] = pr * ei + pi * er;
  // Gzz: ΔTM λ³ J0
  const l3j0 = lam * lam * lam * j0;
  pr = tmR * l3j0;
  pi = tmI * l3j0;
  out[6] = pr * er - pi * ei;
  out[7] = pr * ei + pi * er;
}

/** Piece A: λ = k0 sin t, t ∈ [0, π/2]; u0 = jk0 cos t; dλ/u0 = −j dt. */
function pieceA(t: number, out: Float64Array): void {
  const k0 = H.k0;
  spectral(k0 * Math.sin(t), 0, k0 * Math.cos(t), 0, -1, out);
}
/** Piece B: λ = k0 cosh t; u0 = k0 sinh t; dλ/u0 = dt. */
function pieceB(t: number, out: Float64Array): void {
  const k0 = H.k0;
  spectral(k0 * Math.cosh(t), k0 * Math.sinh(t), 0, 1, 0, out);
}
/** Tail: λ real > λb; dλ/u0 explicit. */
function pieceTail(lam: number, out: Float64Array): void {
  const k0 = H.k0;
  const u0 = Math.sqrt((lam - k0) * (lam + k0));
  spectral(lam, u0, 0, 1 / u0, 0, out);
}

function maxNorm(v: Float64Array): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) m = Math.max(m, Math.abs(v[i]));
  return m;
}

/** Where the head path ends and the tail begins (λb), and an optional breakpoint at Re k2. */
export function headEnd(h: HalfSpace): { lambdaB: number; breakK2: number | null } {
  const k0 = h.k0;
  const lowLoss = Math.abs(h.epsIm) < h.epsRe;
  if (lowLoss && h.k2Re > 1.05 * k0) {
    return { lambdaB: h.k2Re + Math.max(k0, 6 * Math.abs(h.k2Im)), breakK2: h.k2Re };
  }
  return { lambdaB: 2 * k0, breakK2: null };
}

const head = new Float64Array(CYL_LEN);
const term = new Float64Array(CYL_LEN);
const partial = new Float64Array(CYL_LEN);
const est = new Float64Array(CYL_LEN);
const prevEst = new Float64Array(CYL_LEN);
const e2 = new Float64Array(2);

/**
 * The four cylindrical components (Gρρ, Gφφ, Gρz, Gzz; Gzρ = −Gρz) of the reflected-field
 * dyadic — or, when `subtractStatic`, of its remainder: the reflected field minus K times the
 * perfect-conductor image (the integrals with ΔTM plus the closed-form TE counterpart) — at
 * horizontal distance ρ and height sum ζ = z + z', written to out[0…7] (units m⁻³).
 */
export function sommerfeldComponents(
  hs: HalfSpace,
  rho: number,
  zeta: number,
  out: Float64Array,
  options: SommerfeldOptions = DEFAULT_SOMMERFELD,
): SommerfeldStats {
  if (!(rho >= 0) || !(zeta >= 0) || (rho === 0 && zeta === 0)) {
    throw new RangeError(`Sommerfeld integrals need ρ ≥ 0, ζ ≥ 0, not both 0 (got ${rho}, ${zeta})`);
  }
  H = hs;
  RHO = rho;
  ZETA = zeta;
  SUB = options.subtractStatic;
  const k0 = hs.k0;
  const tol = options.relTol;
  let evaluations = 0;
  let converged = true;
  head.fill(0);
  const phaseA = k0 * (rho + zeta);
  const optA: AdaptiveOptions = {
    relTol: tol,
    absTol: 0,
    maxIntervals: 400,
    initialPieces: 1 + Math.floor(phaseA / 2),
  };
  let r = integrateAdaptive(pieceA, 0, 0.5 * Math.PI, CYL_LEN, optA, head);
  evaluations += r.evaluations;
  converged &&= r.converged;
  const { lambdaB, breakK2 } = headEnd(hs);
  const tB = Math.acosh(lambdaB / k0);
  const breaks = [0];
  if (breakK2 !== null) breaks.push(Math.acosh(breakK2 / k0));
  breaks.push(tB);
  const scaleA = maxNorm(head);
  for (let i = 0; i + 1 < breaks.length; i++) {
    const l0 = k0 * Math.cosh(breaks[i]);
    const l1 = k0 * Math.cosh(breaks[i + 1]);
    const optB: AdaptiveOptions = {
      relTol: tol,
      absTol: tol * scaleA * 0.1,
      maxIntervals: 400,
      initialPieces: 1 + Math.floor(((l1 - l0) * rho) / 2),
    };
    r = integrateAdaptive(pieceB, breaks[i], breaks[i + 1], CYL_LEN, optB, head);
    evaluations += r.evaluations;
    converged &&= r.converged;
  }
  // tail: partition–extrapolation
  const q = rho > 0 ? Math.min(Math.PI / rho, zeta > 0 ? 2 / zeta : Infinity) : 2 / zeta;
  const oscillating = rho > 0 && Math.PI / rho <= (zeta > 0 ? 2 / zeta : Infinity);
  // start the half-periods at an asymptotic zero of J0/J1 beyond λb (phase-aligned partition)
  let a = lambdaB;
  if (oscillating) {
    const n0 = Math.ceil((lambdaB * rho) / Math.PI - 0.25);
    a = Math.max(lambdaB, ((n0 + 0.25) * Math.PI) / rho);
    if (a > lambdaB) {
      r = integrateAdaptive(
        pieceTail,
        lambdaB,
        a,
        CYL_LEN,
        { relTol: tol, absTol: tol * scaleA * 0.1, maxIntervals: 100 },
        head,
      );
      evaluations += r.evaluations;
    }
  }
  const scale = Math.max(maxNorm(head), 1e-300);
  const eps = [
    new WynnEpsilon(options.maxTailIntervals + 1),
    new WynnEpsilon(options.maxTailIntervals + 1),
    new WynnEpsilon(options.maxTailIntervals + 1),
    new WynnEpsilon(options.maxTailIntervals + 1),
  ];
  partial.fill(0);
  prevEst.fill(0);
  let n = 0;
  let quiet = 0;
  let tailDone = false;
  for (; n < options.maxTailIntervals; n++) {
    term.fill(0);
    r = integrateAdaptive(
      pieceTail,
      a + n * q,
      a + (n + 1) * q,
      CYL_LEN,
      { relTol: tol, absTol: tol * scale * 0.01, maxIntervals: 50 },
      term,
    );
    evaluations += r.evaluations;
    for (let i = 0; i < CYL_LEN; i++) partial[i] += term[i];
    const tnorm = maxNorm(term);
    if (tnorm <= 1e-3 * tol * scale && n >= 1) {
      est.set(partial);
      tailDone = true;
      n++;
      break;
    }
    for (let c = 0; c < 4; c++) {
      eps[c].push(partial[2 * c], partial[2 * c + 1], e2);
      est[2 * c] = e2[0];
      est[2 * c + 1] = e2[1];
    }
    if (!oscillating) {
      // monotone exponential decay: no extrapolation needed
      est.set(partial);
    }
    let change = 0;
    for (let i = 0; i < CYL_LEN; i++) change = Math.max(change, Math.abs(est[i] - prevEst[i]));
    prevEst.set(est);
    if (n >= 2 && change <= tol * scale) {
      quiet++;
      if (quiet >= 2) {
        tailDone = true;
        n++;
        break;
      }
    } else quiet = 0;
  }
  if (!tailDone) converged = false;
  for (let i = 0; i < CYL_LEN; i++) out[i] = head[i] + (Number.isFinite(est[i]) ? est[i] : partial[i]);
  // the closed-form TE counterpart belongs to the remainder (image.ts, note 2)
  if (SUB) addTeCounterpart(hs, rho, zeta, out);
  return { evaluations, tailIntervals: n, converged };
}

/** Same as sommerfeldComponents, but returns a fresh array (for tests and one-off use). */
export function sommerfeldAt(
  hs: HalfSpace,
  rho: number,
  zeta: number,
  options?: Partial<SommerfeldOptions>,
): Float64Array {
  const o = new Float64Array(CYL_LEN);
  sommerfeldComponents(hs, rho, zeta, o, { ...DEFAULT_SOMMERFELD, ...options });
  tmpOut.set(o);
  return o;
}
