// The radial ground-system model against a second method inside the solver: the same quarter-wave
// vertical with its radials as wires 5 cm above the soil over the exact half-space (Sommerfeld;
// core/REFERENCES.md §14, checked against an independent fixture in halfspace/fixture.test.ts),
// with no ground-system model. Both share the far field, so the efficiency difference in dB is the
// difference in near-field soil loss. Full grid (90 cases) and its figures: test/bench/radials.ts.
import { describe, expect, it } from 'vitest';
import { compareCase } from '../../bench/radials.ts';

/**
 * Stated tolerance per case, dB. The full grid gives a median |Δ| of 0.35 dB and a worst of
 * 4.65 dB (few radials of 0.3–0.4 λ, where the elevated wires resonate); these cheap cases
 * are mid-grid, where the two methods should agree within 0.75 dB. With the old outer limit
 * (max(0.5 λ, longest radial)) the first two were off by 1.17 and 1.00 dB: this test fails there.
 */
const TOL_DB = 0.75;
const SOURCE = 'radials as wires over the exact half-space (test/bench/radials.ts)';

describe('radial loss: surface-impedance model against radials as wires over the exact ground', () => {
  const cases: [string, number, number][] = [
    ['average', 16, 0.25],
    ['very-good', 4, 0.25],
    ['poor', 16, 0.1],
    ['very-good', 16, 0.1],
  ];
  for (const [soil, n, len] of cases) {
    it(`${soil} soil, ${n} radials of ${len} λ: efficiencies within ${TOL_DB} dB`, () => {
      const c = compareCase(soil, n, len);
      expect(Math.abs(c.deltaDb), `${SOURCE}: Δ ${c.deltaDb.toFixed(2)} dB`).toBeLessThanOrEqual(TOL_DB);
    });
  }
});
