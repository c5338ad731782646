/**
 * Physical constants for the field solver (SI).
 *
 * μ0 is taken as 4π·10⁻⁷ H/m (its pre-2019 defined value; the CODATA 2018 value differs by
 * 5.5·10⁻¹⁰ relative, far below any tolerance here), c is exact, ε0 = 1/(μ0c²), η0 = μ0c.
 * Source: BIPM, The International System of Units (SI), 9th ed. (2019), §2.3.1 and appendix.
 */
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';

export const C0 = SPEED_OF_LIGHT_M_PER_S;
export const MU0 = 4e-7 * Math.PI;
export const EPS0 = 1 / (MU0 * C0 * C0);
/** Impedance of free space, ≈ 376.730 Ω. */
export const ETA0 = MU0 * C0;

export const waveNumber = (freqHz: number): number => (2 * Math.PI * freqHz) / C0;
