/**
 * Lengths as the build sheet prints them, in the user's unit system: metres (centimetres for
 * trims) or feet (feet and inches for cut lengths, inches for trims). Every length on the sheet
 * goes through one of these, so an imperial sheet holds no metre lengths.
 */
import { mToFeet, type UnitSystem } from '../units/index.ts';
import { CM_PER_INCH } from './tuning.ts';

export interface SheetLengths {
  units: UnitSystem;
  /** A length, e.g. "12.3 m" or "40.4 ft". */
  len: (m: number, digits?: number) => string;
  /** A length to cut, e.g. "20.15 m" or "66 ft 1¼ in" (to the nearest quarter inch). */
  cut: (m: number) => string;
  /** A small length, e.g. a trim: "4.5 cm" or "1.8 in". */
  small: (m: number, digits?: number) => string;
  /** The unit word of `len`: "m" or "ft". */
  unit: string;
  /** A loss per length: "dB/100 m" or "dB/100 ft", with the value converted. */
  per100: (dbPer100m: number) => string;
}

const QUARTERS = ['', '¼', '½', '¾'];

/** Feet and inches to the nearest quarter inch, e.g. 66 ft 1¼ in. */
export function feetInches(m: number): string {
  const q = Math.round(mToFeet(Math.abs(m)) * 12 * 4);
  const ft = Math.floor(q / 48);
  const rest = q - ft * 48;
  const inch = Math.floor(rest / 4);
  const frac = QUARTERS[rest % 4];
  const sign = m < 0 ? '−' : '';
  if (ft === 0) return `${sign}${inch}${frac} in`;
  return `${sign}${ft} ft ${inch}${frac} in`;
}

export function sheetLengths(units: UnitSystem): SheetLengths {
  if (units === 'imperial')
    return {
      units,
      // A foot is about three decimetres: a centimetre figure (2 digits in metres) reads as
      // tenths of a foot, not hundredths.
      len: (m, digits = 1) => `${mToFeet(m).toFixed(digits >= 2 ? digits - 1 : digits)} ft`,
      cut: feetInches,
      small: (m, digits = 1) => `${((m * 100) / CM_PER_INCH).toFixed(digits)} in`,
      unit: 'ft',
      per100: (db) => `${(db * 0.3048).toFixed(2)} dB/100 ft`,
    };
  return {
    units,
    len: (m, digits = 1) => `${m.toFixed(digits)} m`,
    cut: (m) => `${m.toFixed(2)} m`,
    small: (m, digits = 1) => `${(m * 100).toFixed(digits)} cm`,
    unit: 'm',
    per100: (db) => `${db.toFixed(2)} dB/100 m`,
  };
}
