/**
 * The homogeneous lossy half-space z < 0 under air, at one frequency: the constants every
 * kernel of the exact ground model needs.
 *
 * Symbols (e^{jωt}; Sommerfeld 1909, Baños 1966 ch. 2 use the same quantities):
 *   k0   free-space wave number ω/c
 *   εc   complex relative permittivity of the soil, εr − jσ/(ωε0)
 *   k2   soil wave number k0 √εc (principal root; Im k2 ≤ 0)
 *   Δ    k2² − k0² = k0²(εc − 1), so that u² = u0² − Δ with u0 = √(λ² − k0²), u = √(λ² − k2²)
 *   K    (εc − 1)/(εc + 1), the quasi-static image weight (the large-λ limit of the TM
 *        reflection coefficient; for a point charge over a dielectric half-space it is the
 *        electrostatic image factor: J. D. Jackson, Classical Electrodynamics, 3rd ed. (1999),
 *        §4.4, eq. 4.45, with ε → εc)
 */
import { EPS0_F_PER_M, ETA0_OHM, SPEED_OF_LIGHT_M_PER_S } from '../../units/index.ts';

/** ε0 and η0 from core/units (the one place the constants are defined). */
export const HS_EPS0 = EPS0_F_PER_M;
export const HS_ETA0 = ETA0_OHM;

export interface SoilAtFrequency {
  freqHz: number;
  permittivity: number;
  conductivitySPerM: number;
}

export interface HalfSpace {
  readonly freqHz: number;
  readonly permittivity: number;
  readonly conductivitySPerM: number;
  readonly k0: number;
  readonly epsRe: number;
  readonly epsIm: number;
  /** K = (εc − 1)/(εc + 1). */
  readonly kRe: number;
  readonly kIm: number;
  /** Δ = k0²(εc − 1). */
  readonly dRe: number;
  readonly dIm: number;
  /** k2 = k0 √εc. */
  readonly k2Re: number;
  readonly k2Im: number;
  /** 2 εc Δ/(εc + 1): numerator of R_TM − K (see spectral note in sommerfeld.ts). */
  readonly c2Re: number;
  readonly c2Im: number;
}

/** Builds the half-space constants; throws RangeError on a non-physical soil. */
export function halfSpace(soil: SoilAtFrequency): HalfSpace {
  const { freqHz, permittivity, conductivitySPerM } = soil;
  if (!(freqHz > 0) || !(permittivity >= 1) || !(conductivitySPerM >= 0)) {
    throw new RangeError(
      `half-space needs f > 0, εr ≥ 1, σ ≥ 0 (got ${freqHz}, ${permittivity}, ${conductivitySPerM})`,
    );
  }
  const k0 = (2 * Math.PI * freqHz) / SPEED_OF_LIGHT_M_PER_S;
  const epsRe = permittivity;
  const epsIm = -conductivitySPerM / (2 * Math.PI * freqHz * HS_EPS0);
  // K = (εc − 1)/(εc + 1)
  const nr = epsRe - 1;
  const dr = epsRe + 1;
  const den = dr * dr + epsIm * epsIm;
  const kRe = (nr * dr + epsIm * epsIm) / den;
  const kIm = (epsIm * dr - nr * epsIm) / den;
  const dRe = k0 * k0 * (epsRe - 1);
  const dIm = k0 * k0 * epsIm;
  // √εc, principal
  const m = Math.hypot(epsRe, epsIm);
  const sr = Math.sqrt(0.5 * (m + epsRe));
  const si = epsIm / (2 * sr);
  // c2 = 2 εc Δ/(εc + 1) = 2 εc k0² K
  const ekr = epsRe * kRe - epsIm * kIm;
  const eki = epsRe * kIm + epsIm * kRe;
  return {
    freqHz,
    permittivity,
    conductivitySPerM,
    k0,
    epsRe,
    epsIm,
    kRe,
    kIm,
    dRe,
    dIm,
    k2Re: k0 * sr,
    k2Im: k0 * si,
    c2Re: 2 * k0 * k0 * ekr,
    c2Im: 2 * k0 * k0 * eki,
  };
}
