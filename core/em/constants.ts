/**
 * The field solver's short names for the physical constants of core/units (the one place they are
 * defined, with their source), in the symbols of the solver's formulas.
 */
import { EPS0_F_PER_M, ETA0_OHM, MU0_H_PER_M, SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';

export const C0 = SPEED_OF_LIGHT_M_PER_S;
export const MU0 = MU0_H_PER_M;
export const EPS0 = EPS0_F_PER_M;
/** Impedance of free space, ≈ 376.730 Ω. */
export const ETA0 = ETA0_OHM;

export const waveNumber = (freqHz: number): number => (2 * Math.PI * freqHz) / C0;
