/**
 * Named unit conversions. core/ works in SI and radians; degrees, feet and MHz only at the
 * edges, through these functions (one quantity per name, unit as suffix).
 */
export const FT_PER_M = 1 / 0.3048; // international foot, exact by definition (1959)

/*
 * Physical constants, the one place for them (SI). c is exact; μ0 is taken as 4π·10⁻⁷ H/m (its
 * pre-2019 defined value; the CODATA 2018 value differs by 5.5·10⁻¹⁰ relative, far below any
 * tolerance here); ε0 = 1/(μ0 c²); η0 = μ0 c ≈ 376.730 Ω.
 * Source: BIPM, The International System of Units (SI), 9th ed. (2019), §2.3.1 and appendix.
 */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;
export const MU0_H_PER_M = 4e-7 * Math.PI;
export const EPS0_F_PER_M = 1 / (MU0_H_PER_M * SPEED_OF_LIGHT_M_PER_S * SPEED_OF_LIGHT_M_PER_S);
/** Impedance of free space, Ω. */
export const ETA0_OHM = MU0_H_PER_M * SPEED_OF_LIGHT_M_PER_S;

export const feetToM = (ft: number): number => ft * 0.3048;
export const mToFeet = (m: number): number => m / 0.3048;
export const mhzToHz = (mhz: number): number => mhz * 1e6;
export const hzToMhz = (hz: number): number => hz / 1e6;
export const khzToHz = (khz: number): number => khz * 1e3;
export const degToRad = (deg: number): number => (deg * Math.PI) / 180;
export const radToDeg = (rad: number): number => (rad * 180) / Math.PI;
export const wavelengthM = (freqHz: number): number => SPEED_OF_LIGHT_M_PER_S / freqHz;
export const mSPerMToSPerM = (mSPerM: number): number => mSPerM / 1000;
export const sPerMToMsPerM = (sPerM: number): number => sPerM * 1000;
export const linearToDb = (power: number): number => 10 * Math.log10(power);
export const dbToLinear = (db: number): number => 10 ** (db / 10);

export type UnitSystem = 'metric' | 'imperial';

/** Format a length for display in the user's unit system. */
export function formatLength(m: number, units: UnitSystem, digits = 1): string {
  return units === 'metric' ? `${m.toFixed(digits)} m` : `${mToFeet(m).toFixed(digits)} ft`;
}

/** Parse a length typed in the user's unit system back to metres. */
export function lengthFromDisplay(value: number, units: UnitSystem): number {
  return units === 'metric' ? value : feetToM(value);
}

export function lengthToDisplay(m: number, units: UnitSystem): number {
  return units === 'metric' ? m : mToFeet(m);
}

/**
 * A sentence made in core with metre lengths in it ("span 12.3 m", "limits (24.57–54.06 m)",
 * "over the 40 m rope limit"), in the user's unit system: each "N m" or "N–M m" becomes feet with
 * the same number of decimals (at least one for values under 10 ft). Band names ("160 m band",
 * "80 m #2") are left alone. Metric text comes back unchanged.
 */
export function lengthsInText(text: string, units: UnitSystem): string {
  if (units === 'metric') return text;
  const ft = (v: string): string => {
    const d = (v.split('.')[1] ?? '').length;
    const f = mToFeet(Number(v));
    return f.toFixed(f < 10 ? Math.max(1, d) : d);
  };
  return text.replace(
    /(\d+(?:\.\d+)?)(?:\s?(–|-|to)\s?(\d+(?:\.\d+)?))?\s?m\b(?!\s*(?:band|#|²))/g,
    (_all, a: string, sep: string | undefined, b: string | undefined) =>
      b ? `${ft(a)}${sep === 'to' ? ' to ' : sep}${ft(b)} ft` : `${ft(a)} ft`,
  );
}
