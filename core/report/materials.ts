/**
 * Materials tables of the build sheet, each with where its numbers come from: coaxial cable loss
 * and wire gauge. Pure; used by the feed run (./feedRun.ts), the bill of materials (./bom.ts) and
 * the app's exposure panel.
 */
import { COAX_TYPES } from '../project/schema.ts';
import type { UnitSystem } from '../units/index.ts';

/* ----------------------------------------------------------------------------------------------
 * Coaxial cable loss
 * -------------------------------------------------------------------------------------------- */

export { COAX_TYPES };
export type CoaxType = (typeof COAX_TYPES)[number];

/** Frequencies of the loss table, MHz. */
export const COAX_TABLE_MHZ = [1.8, 3.5, 7] as const;

/**
 * Matched loss, dB per 100 m, at 1.8 / 3.5 / 7 MHz: typical datasheet values, from memory (not
 * checked against a particular maker's sheet; real cable varies by maker and age).
 */
export const COAX_LOSS_DB_PER_100M: Record<CoaxType, readonly [number, number, number]> = {
  'RG-58': [2.0, 2.8, 3.9],
  'RG-8X': [1.4, 2.0, 2.8],
  'RG-213': [0.85, 1.2, 1.7],
  'low-loss 10 mm foam': [0.55, 0.8, 1.1],
};
export const COAX_SOURCE = 'typical datasheet values, from memory';

export function isCoaxType(s: string): s is CoaxType {
  return (COAX_TYPES as readonly string[]).includes(s);
}

/**
 * Matched loss at `freqMhz`, dB/100 m: the table value at the nearest tabulated frequency scaled
 * by √(f / f_table) (conductor loss dominates at these frequencies and grows as √f).
 */
export function coaxLossDbPer100m(coax: CoaxType, freqMhz: number): number {
  if (!(freqMhz > 0)) throw new RangeError('freqMhz must be positive');
  let i = 0;
  for (let k = 1; k < COAX_TABLE_MHZ.length; k++)
    if (Math.abs(Math.log(freqMhz / COAX_TABLE_MHZ[k])) < Math.abs(Math.log(freqMhz / COAX_TABLE_MHZ[i])))
      i = k;
  return COAX_LOSS_DB_PER_100M[coax][i] * Math.sqrt(freqMhz / COAX_TABLE_MHZ[i]);
}

/* ----------------------------------------------------------------------------------------------
 * Wire gauge
 * -------------------------------------------------------------------------------------------- */

/** AWG diameter, mm: 0.127 mm · 92^((36 − n)/39) (the gauge's defining formula, from memory). */
export function awgDiameterMm(n: number): number {
  return 0.127 * 92 ** ((36 - n) / 39);
}

/** Nearest AWG number to a diameter in mm. */
export function nearestAwg(diameterMm: number): number {
  return Math.round(36 - (39 * Math.log(diameterMm / 0.127)) / Math.log(92));
}

/** The wire as bought: millimetres for metric users, the AWG number and inches for imperial ones. */
export function gaugeText(radiusM: number, units: UnitSystem = 'metric'): string {
  const d = radiusM * 2000;
  const n = nearestAwg(d);
  if (units === 'imperial')
    return `${n} AWG copper (${(awgDiameterMm(n) / 25.4).toFixed(3)} in; the nearest gauge to the modelled wire by the AWG formula)`;
  return `${d.toFixed(1)} mm diameter copper (≈ ${n} AWG, ${awgDiameterMm(n).toFixed(2)} mm; nearest gauge by the AWG formula)`;
}
