import { describe, expect, it } from 'vitest';
import { fromLocator, toLocator, LocatorError } from '../../../core/paths/maidenhead.ts';

// The grid definition (fields 20°×10° A–R from 180°W/90°S, squares 2°×1°, subsquares 5′×2.5′ a–x,
// extended squares 30″×15″) is common practice, no source; the expected strings follow from it by hand.
describe('Maidenhead locator', () => {
  it('encodes the corners of the grid', () => {
    expect(toLocator([-180, -90], 6)).toBe('AA00aa');
    expect(toLocator([180, 90], 6)).toBe('RR99xx');
  });

  it('encodes a point by hand-worked arithmetic', () => {
    // lon 13.41 → +180 = 193.41: field 9 (J), 13.41 → square 6, rem 1.41° → 16 (q) subsquares of 5′;
    // lat 52.52 → +90 = 142.52: field 14 (O), 2.52 → square 2, rem 0.52° → 12 (m) subsquares of 2.5′.
    expect(toLocator([13.41, 52.52], 6)).toBe('JO62qm');
    expect(toLocator([13.41, 52.52], 4)).toBe('JO62');
    expect(toLocator([13.41, 52.52], 2)).toBe('JO');
  });

  it('decodes to the cell centre and round-trips at every length', () => {
    let seed = 7;
    const rnd = (): number => {
      seed = (seed * 16807) % 2147483647;
      return seed / 2147483647;
    };
    for (let i = 0; i < 500; i++) {
      const p: [number, number] = [rnd() * 360 - 180, rnd() * 180 - 90];
      for (const n of [2, 4, 6, 8] as const) {
        const loc = toLocator(p, n);
        const cell = fromLocator(loc);
        expect(p[0]).toBeGreaterThanOrEqual(cell.southWest[0] - 1e-9);
        expect(p[0]).toBeLessThanOrEqual(cell.southWest[0] + cell.sizeDeg[0] + 1e-9);
        expect(p[1]).toBeGreaterThanOrEqual(cell.southWest[1] - 1e-9);
        expect(p[1]).toBeLessThanOrEqual(cell.southWest[1] + cell.sizeDeg[1] + 1e-9);
        expect(toLocator(cell.center, n)).toBe(loc);
      }
    }
  });

  it('rejects what is not a locator, naming it', () => {
    expect(() => fromLocator('ZZ00')).toThrow(LocatorError);
    expect(() => fromLocator('JO6')).toThrow(/"JO6" is not a Maidenhead locator/);
    expect(() => toLocator([200, 0])).toThrow(LocatorError);
  });
});
