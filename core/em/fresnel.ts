/**
 * Plane-wave reflection from a flat homogeneous lossy ground (Fresnel coefficients), e^{jωt}.
 *
 *     εc = εr − jσ/(ωε0)                       complex relative permittivity
 *     S  = εc − cos²ψ   (principal root √S)    ψ = grazing (elevation) angle
 *     Rv = (εc sinψ − √S)/(εc sinψ + √S)       vertical (TM, E in the plane of incidence)
 *     Rh = (sinψ − √S)/(sinψ + √S)             horizontal (TE)
 *
 * Image rule used with them (core/REFERENCES.md §3): take the perfect-conductor image (vertical current
 * in phase, horizontal current reversed) and weight the image field's θ (TM) part by Rv and its
 * φ (TE) part by −Rh; over a perfect conductor Rv = 1 and −Rh = 1.
 *
 * References:
 *  - P. Beckmann and A. Spizzichino, The Scattering of Electromagnetic Waves from Rough
 *    Surfaces (1963), the smooth-surface (Fresnel) coefficients (chapter from memory).
 *  - ITU-R Recommendation P.527 (electrical characteristics of the surface of the Earth).
 *  - C. A. Balanis, Advanced Engineering Electromagnetics, 2nd ed. (2012), ch. 5 (reflection and
 *    transmission at oblique incidence).
 */
import { c, cDiv, cMul, cSqrt, cSub, cAdd, type Complex } from '../numeric/complex.ts';
import { EPS0 } from './constants.ts';

export interface SoilElectrical {
  permittivity: number;
  conductivitySPerM: number;
}

/** εc = εr − jσ/(ωε0). */
export function complexPermittivity(soil: SoilElectrical, freqHz: number): Complex {
  return c(soil.permittivity, -soil.conductivitySPerM / (2 * Math.PI * freqHz * EPS0));
}

export interface FresnelPair {
  rv: Complex;
  rh: Complex;
}

/** Fresnel coefficients at grazing angle ψ given by its sine (0 ≤ sinψ ≤ 1). */
export function fresnelCoefficients(epsC: Complex, sinPsi: number): FresnelPair {
  const cos2 = 1 - sinPsi * sinPsi;
  const root = cSqrt(c(epsC.re - cos2, epsC.im));
  const es = c(epsC.re * sinPsi, epsC.im * sinPsi);
  const rv = cDiv(cSub(es, root), cAdd(es, root));
  const rh = cDiv(c(sinPsi - root.re, -root.im), c(sinPsi + root.re, root.im));
  return { rv, rh };
}

/** Soil surface impedance Zg = η0 √(εc − 1)/εc (grazing limit of the Rv form; Wait 1956). */
export function soilSurfaceImpedanceOhm(epsC: Complex, eta0: number): Complex {
  const z = cDiv(cSqrt(c(epsC.re - 1, epsC.im)), epsC);
  return cMul(z, c(eta0));
}
