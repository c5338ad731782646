import { describe, expect, it } from 'vitest';
import {
  degToRad,
  feetToM,
  formatLength,
  hzToMhz,
  lengthFromDisplay,
  lengthToDisplay,
  mhzToHz,
  mToFeet,
  radToDeg,
  wavelengthM,
} from '../../core/units/index.ts';
import { expectClose } from '../helpers/expectClose.ts';

describe('unit conversions', () => {
  it('uses the international foot, 0.3048 m exactly (international yard and pound agreement, 1959)', () => {
    expect(feetToM(1)).toBe(0.3048);
    expectClose(mToFeet(100), 328.0839895, 1e-6, 'international foot = 0.3048 m');
  });
  it('round-trips lengths through the display units', () => {
    for (const m of [0, 2.5, 19.99, 123.456]) {
      expectClose(lengthFromDisplay(lengthToDisplay(m, 'imperial'), 'imperial'), m, 1e-12, 'round trip');
      expect(lengthFromDisplay(lengthToDisplay(m, 'metric'), 'metric')).toBe(m);
    }
  });
  it('formats for display', () => {
    expect(formatLength(10, 'metric')).toBe('10.0 m');
    expect(formatLength(10, 'imperial')).toBe('32.8 ft');
  });
  it('converts frequency, angle and wavelength (c exact by the SI definition)', () => {
    expect(mhzToHz(3.6)).toBe(3.6e6);
    expect(hzToMhz(7.05e6)).toBeCloseTo(7.05, 12);
    expectClose(radToDeg(degToRad(37.5)), 37.5, 1e-12, 'round trip');
    expectClose(wavelengthM(3.6e6), 83.275683, 1e-5, 'c / f with c = 299 792 458 m/s');
  });
});
