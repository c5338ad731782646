/** Hop geometry against the values of core/REFERENCES.md §7 (ITU-R P.533 form; Davies, Ionospheric Radio, 1990). */
import { describe, expect, it } from 'vitest';
import { fewestHops, maxSingleHopM, singleHopElevationDeg } from '../../../core/paths/hops.ts';
import { expectClose } from '../../helpers/expectClose.ts';

const SRC =
  'Δ = atan[(cos θ − R/(R+h))/sin θ], R = 6371 km (ITU-R P.533; Davies 1990), values computed independently (core/REFERENCES.md §7)';
const TOL_DEG = 0.005;

describe('single-hop elevation', () => {
  it.each([
    [300, 1000, 28.12],
    [300, 2000, 11.81],
    [300, 3000, 4.26],
    [300, 4000, -0.72],
    [350, 1000, 32.0],
    [350, 2000, 14.28],
    [350, 3000, 5.99],
    [350, 4000, 0.59],
  ])('h = %i km, D = %i km → %f°', (hKm, dKm, el) => {
    expectClose(singleHopElevationDeg(dKm * 1000, hKm * 1000), el, TOL_DEG, SRC);
  });

  it('gives the longest single hop', () => {
    expectClose(maxSingleHopM(300_000) / 1000, 3836, 1, SRC);
    expectClose(maxSingleHopM(350_000) / 1000, 4130, 1, SRC);
  });
});

describe('fewest hops', () => {
  it('needs two hops for 4000 km off a 300 km layer (one hop is impossible)', () => {
    const s = fewestHops(4_000_000, 300_000);
    expect(s.hops).toBe(2);
    expectClose(s.elevationDeg, singleHopElevationDeg(2_000_000, 300_000), 1e-12, SRC);
    expectClose(s.elevationDeg, 11.81, TOL_DEG, SRC);
  });

  it('takes one hop for 4000 km off a 350 km layer, at 0.59°', () => {
    const s = fewestHops(4_000_000, 350_000);
    expect(s.hops).toBe(1);
    expectClose(s.elevationDeg, 0.59, TOL_DEG, SRC);
  });

  it('has a non-negative elevation and the minimum hop count for every distance', () => {
    for (let d = 100_000; d < 20_000_000; d += 137_000) {
      const s = fewestHops(d, 300_000);
      expect(s.elevationDeg).toBeGreaterThanOrEqual(0);
      if (s.hops > 1) expect(singleHopElevationDeg(d / (s.hops - 1), 300_000)).toBeLessThan(0);
    }
  });
});
