/**
 * Conductor loss of round wires: the internal (skin-effect) impedance per unit length.
 *
 * The core uses the exact Bessel form for a round wire of radius a (Ramo, Whinnery & Van
 * Duzer, Fields and Waves in Communication Electronics, 3rd ed. (1994), the section on the
 * internal impedance of round wires (§5.6; section number from memory)):
 *     Z_i = (T / (2π a σ)) · J₀(T a) / J₁(T a),   T = (1 − j)/δ,   δ = √(2/(ω μ σ)),
 * which tends to the DC resistance 1/(σπa²) for a ≪ δ and to the thin-skin form
 * R ≈ Rs/(2πa) = Rs/(π d) (with Rs = √(ωμ/2σ), the surface resistance of the same chapter) for a ≫ δ. For a 2 mm
 * copper wire at 3.6 MHz the two are 0.0802 and 0.0788 Ω/m.
 *
 * Material constants (σ in S/m, μr): annealed copper 5.80·10⁷ (the International Annealed
 * Copper Standard, IEC 60028:1925); aluminium (hard-drawn conductor grade, about 61 % IACS)
 * 3.54·10⁷ (value from memory, typical handbook figure); steel (plain carbon, galvanised
 * fence/guy wire) 6.0·10⁶ with μr = 100 at HF (values from memory, rough: the permeability of
 * steel wire at radio frequencies varies widely with the steel and the current); stainless steel
 * (austenitic, non-magnetic) 1.4·10⁶, μr = 1 (from memory).
 */
import { besselJ0OverJ1 } from '../numeric/bessel.ts';
import { c, cMul, type Complex } from '../numeric/complex.ts';
import { MU0 } from './constants.ts';

export interface ConductorMaterial {
  conductivitySPerM: number;
  relativePermeability: number;
}

export type MaterialName = 'perfect' | 'copper' | 'aluminium' | 'steel' | 'stainless-steel';

export const MATERIALS: Readonly<Record<Exclude<MaterialName, 'perfect'>, ConductorMaterial>> = {
  copper: { conductivitySPerM: 5.8e7, relativePermeability: 1 },
  aluminium: { conductivitySPerM: 3.54e7, relativePermeability: 1 },
  steel: { conductivitySPerM: 6.0e6, relativePermeability: 100 },
  'stainless-steel': { conductivitySPerM: 1.4e6, relativePermeability: 1 },
};

/** Skin depth δ = √(2/(ωμσ)) in metres (Ramo, Whinnery & Van Duzer, 3rd ed., ch. 5). */
export function skinDepthM(freqHz: number, m: ConductorMaterial): number {
  return Math.sqrt(2 / (2 * Math.PI * freqHz * MU0 * m.relativePermeability * m.conductivitySPerM));
}

/** Surface resistance Rs = √(ωμ/(2σ)) in ohms per square (ibid., ch. 5). */
export function surfaceResistanceOhm(freqHz: number, m: ConductorMaterial): number {
  return Math.sqrt((2 * Math.PI * freqHz * MU0 * m.relativePermeability) / (2 * m.conductivitySPerM));
}

/** Thin-skin approximation R' = Rs/(π d) in Ω/m, d = 2a (for comparison; the core uses the exact form). */
export function thinSkinResistancePerM(freqHz: number, radiusM: number, m: ConductorMaterial): number {
  return surfaceResistanceOhm(freqHz, m) / (2 * Math.PI * radiusM);
}

/**
 * Internal impedance per unit length, R' + jX'_i in Ω/m, exact Bessel form (module note).
 * Valid for a solid round wire in a field that is uniform around its circumference (a thin
 * wire far from other conductors compared with its radius).
 */
export function internalImpedancePerM(freqHz: number, radiusM: number, m: ConductorMaterial): Complex {
  const delta = skinDepthM(freqHz, m);
  const T = c(1 / delta, -1 / delta);
  const ratio = besselJ0OverJ1(c(T.re * radiusM, T.im * radiusM));
  const scale = 1 / (2 * Math.PI * radiusM * m.conductivitySPerM);
  const z = cMul(T, ratio);
  return c(z.re * scale, z.im * scale);
}
