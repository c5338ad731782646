/**
 * Ground loss of a vertical with buried radials: the surface-impedance method.
 *
 * The ground near the base is described by a surface impedance Zs(ρ): inside the radial screen
 * the screen impedance Zw in parallel with the soil's Zg, beyond it the soil alone
 * (Wait & Pope 1954; Wait 1956; Abbott 1952):
 *     Zw = j (ω μ0 d / 2π) ln(d / 2πc),   d = 2πρ/N(ρ),  c = radial wire radius,
 *     Zg = η0 √(εc − 1)/εc,               Zs = Zg·Zw/(Zg + Zw)  (ρ inside the radials),
 * where N(ρ) counts the radials longer than ρ (radials of different lengths, e.g. clipped by a lot
 * boundary). Where d ≤ 2πc (ρ ≤ N·c) the wires touch and the screen is solid: Zw = 0.
 * The power lost in the ground is ½∫ Re(Zs)|Hφ|² dA, so referred to the base current I0
 *     Rg = (1/|I0|²) ∫_{ρmin}^{ρmax} Re(Zs(ρ)) |Hφ(ρ)|² 2πρ dρ.
 * Hφ is the tangential magnetic field at the surface. For a monopole of height h with a
 * sinusoidal current Im sin k(h − z) over a perfect ground (the field the radial system sees),
 *     Hφ = (j Im / 2πρ) [e^{−jk√(ρ²+h²)} − cos kh · e^{−jkρ}],   I0 = Im sin kh
 * (Wait & Pope 1954). The solver itself uses Hφ computed from the moment-method currents.
 *
 * Integration limits (stated, since the bare-soil tail grows with the outer limit):
 *  - outer ρmax = `NEAR_FIELD_WAVELENGTHS` λ, whatever the radials' length (its note says why);
 *    beyond it the solver's ground models and the far-field reflection loss take over. Radials
 *    longer than the disc count inside it at full number;
 *  - inner ρmin = the vertical's wire radius with radials (the integrand vanishes there), and
 *    `BARE_CONTACT_RADIUS_M` (a 12.7 mm ground stake) for a bare-soil connection (N = 0), where
 *    the integrand falls as 1/ρ and the loss depends on that radius logarithmically.
 * Quadrature: 8-point Gauss–Legendre on `RADIAL_PANELS` (12) panels uniform in ln ρ between the
 * limits, split at every radial end. The integrand is smooth in ln ρ between those breaks, so few
 * panels suffice: against 200 panels the result agrees to 1e-9 relative on the regression rows
 * (sinusoidal current; bare soil, clipped and long radials are checked to 1e-7 in
 * test/reference/em/radials.test.ts), and to 4e-10 with the solved currents of the demo lot's
 * verticals and inverted-Ls (32 radials, at f0 and f0 ± 2 %). The cost matters: the solver
 * evaluates the surface field of every segment at each quadrature point and azimuth.
 *
 * References:
 *  - J. R. Wait and W. A. Pope, "The characteristics of a vertical antenna with a radial
 *    conductor ground system", Appl. Sci. Res. B4 (1954) 177–195.
 *  - J. R. Wait, "Effect of the ground screen on the field radiated from a monopole", IRE Trans.
 *    AP-4 (1956) 179–181.
 *  - F. R. Abbott, "Design of optimum buried-conductor RF ground system", Proc. IRE 40 (1952)
 *    846–852.
 *  - G. H. Brown, R. F. Lewis, J. Epstein, "Ground systems as a factor in antenna efficiency",
 *    Proc. IRE 25 (1937) 753–787 (measurements).
 */
import { c, cAdd, cDiv, cMul, type Complex } from '../numeric/complex.ts';
import { gaussLegendre01 } from '../numeric/quadrature.ts';
import { MU0 } from './constants.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';

/**
 * Radius of the near-field disc, in wavelengths, over which the radial-field loss is integrated.
 *
 * Why a fixed disc and not the radial field or 0.5 λ: the solver's far field is the space wave
 * reflected with the plane-wave (Fresnel) coefficients of the soil, so the power that wave loses
 * in the soil, everywhere beyond the antenna, is already counted as reflection loss. Only the
 * induction field close to the base, which the plane-wave picture does not describe, needs the
 * surface-impedance integral; |Hφ|² there falls as 1/ρ² and its tail beyond a fraction of a
 * wavelength is the radiated field the reflection loss covers (integrating it too counted the
 * soil twice: 32 quarter-wave radials on 80 m over average soil lost 3.75 Ω inside the radials and
 * another 10.1 Ω on bare soil out to 0.5 λ). The disc does not grow with the radials: a longer
 * or denser screen can then only lower the surface impedance inside a fixed area, so the loss
 * falls monotonically with radial length and count (a disc that grew with the longest radial
 * would add soil under the screen for longer radials). The value is a choice, checked against
 * the exact half-space solver with the radials as wires just above the soil
 * (test/bench/radials.ts, test/reference/em/radialsExact.test.ts).
 */
export const NEAR_FIELD_WAVELENGTHS = 0.25;
export const BARE_CONTACT_RADIUS_M = 0.0127;
export const RADIAL_PANELS = 12;

export interface RadialScreen {
  /** Length of each radial (metres); an empty list means bare soil. */
  lengthsM: readonly number[];
  /** Radial wire radius c (metres). */
  radiusM: number;
}

/** Number of radials longer than ρ. */
export function radialsBeyond(screen: RadialScreen, rhoM: number): number {
  let n = 0;
  for (const l of screen.lengthsM) if (l > rhoM) n++;
  return n;
}

/** Zw = j(ωμ0 d/2π) ln(d/2πc), d = 2πρ/N; zero where the screen is solid (Wait & Pope 1954). */
export function radialScreenImpedance(freqHz: number, rhoM: number, n: number, radiusM: number): Complex {
  const d = (2 * Math.PI * rhoM) / n;
  const lg = Math.log(d / (2 * Math.PI * radiusM));
  if (!(lg > 0)) return c(0, 0);
  return c(0, ((2 * Math.PI * freqHz * MU0 * d) / (2 * Math.PI)) * lg);
}

/** Surface impedance at radius ρ: Zg ∥ Zw inside the radials, Zg beyond. */
export function surfaceImpedance(freqHz: number, rhoM: number, screen: RadialScreen, zg: Complex): Complex {
  const n = radialsBeyond(screen, rhoM);
  if (n === 0) return zg;
  const zw = radialScreenImpedance(freqHz, rhoM, n, screen.radiusM);
  if (zw.re === 0 && zw.im === 0) return c(0, 0);
  return cDiv(cMul(zg, zw), cAdd(zg, zw));
}

export interface GroundLossInput {
  freqHz: number;
  screen: RadialScreen;
  /** Soil surface impedance Zg (fresnel.ts soilSurfaceImpedanceOhm). */
  zg: Complex;
  /** |Hφ(ρ)/I0|² at the surface, in 1/m², for the base current I0. */
  hAbs2PerI0: (rhoM: number) => number;
  rhoMinM: number;
  rhoMaxM: number;
  /** Panels uniform in ln ρ (default `RADIAL_PANELS`); for convergence checks. */
  panels?: number;
}

/** Rg = (1/|I0|²)∫ Re(Zs)|Hφ|² 2πρ dρ, in ohms (module note). */
export function groundLossResistance(inp: GroundLossInput): number {
  const { rhoMinM, rhoMaxM } = inp;
  if (!(rhoMaxM > rhoMinM && rhoMinM > 0)) throw new RangeError('radial integration needs 0 < ρmin < ρmax');
  const la = Math.log(rhoMinM);
  const lb = Math.log(rhoMaxM);
  const breaks: number[] = [];
  const panels = inp.panels ?? RADIAL_PANELS;
  for (let i = 0; i <= panels; i++) breaks.push(la + ((lb - la) * i) / panels);
  for (const l of inp.screen.lengthsM) if (l > rhoMinM && l < rhoMaxM) breaks.push(Math.log(l));
  breaks.sort((x, y) => x - y);
  const g = gaussLegendre01(8);
  let sum = 0;
  for (let p = 0; p + 1 < breaks.length; p++) {
    const span = breaks[p + 1] - breaks[p];
    if (span <= 0) continue;
    for (let i = 0; i < g.x.length; i++) {
      const rho = Math.exp(breaks[p] + span * g.x[i]);
      const zs = surfaceImpedance(inp.freqHz, rho, inp.screen, inp.zg);
      sum += g.w[i] * span * rho * zs.re * inp.hAbs2PerI0(rho) * 2 * Math.PI * rho;
    }
  }
  return sum;
}

/**
 * |Hφ/I0|² at the surface for a monopole of height h with sinusoidal current over perfect
 * ground (Wait & Pope 1954), I0 = Im sin kh the base current.
 */
export function sinusoidalMonopoleSurfaceField(freqHz: number, heightM: number): (rhoM: number) => number {
  const k = (2 * Math.PI * freqHz) / SPEED_OF_LIGHT_M_PER_S;
  const s = Math.sin(k * heightM);
  const ckh = Math.cos(k * heightM);
  return (rho) => {
    const R = Math.hypot(rho, heightM);
    const er = Math.cos(k * R) - ckh * Math.cos(k * rho);
    const ei = -Math.sin(k * R) + ckh * Math.sin(k * rho);
    return (er * er + ei * ei) / (4 * Math.PI * Math.PI * rho * rho * s * s);
  };
}
