/**
 * Geometry and loss terms of the take-off model (core/paths/takeoff.ts) against the cited
 * formulas, each recomputed here by a separate method.
 */
import { describe, expect, it } from 'vitest';
import { EARTH_RADIUS_M, singleHopElevationDeg } from '../../../core/paths/hops.ts';
import {
  ABSORPTION_DB_PER_PASS,
  PATH_TERRAIN,
  groundReflectionLossDb,
  hopAbsorptionDb,
  hopRayLengthM,
  incidenceAngleRad,
  pathModes,
} from '../../../core/paths/takeoff.ts';
import { expectClose } from '../../helpers/expectClose.ts';

const R = EARTH_RADIUS_M;
const deg = (r: number): number => (r * 180) / Math.PI;

/** The ray from the take-off point traced as a straight line in the plane, to radius R + h. */
function tracedIncidenceDeg(elevationDeg: number, h: number): number {
  const e = (elevationDeg * Math.PI) / 180;
  const [dx, dy] = [Math.cos(e), Math.sin(e)];
  const b = 2 * R * dy;
  const c = R * R - (R + h) ** 2;
  const t = (-b + Math.sqrt(b * b - 4 * c)) / 2;
  const [px, py] = [t * dx, R + t * dy];
  return deg(Math.acos((dx * px + dy * py) / Math.hypot(px, py)));
}

/** Ray length of one hop by tracing: twice the straight distance from the ground to the apex point. */
function tracedHopLengthM(hopM: number, h: number): number {
  const theta = hopM / (2 * R);
  const apex = [(R + h) * Math.sin(theta), (R + h) * Math.cos(theta)];
  return 2 * Math.hypot(apex[0], apex[1] - R);
}

describe('take-off geometry (core/REFERENCES.md §7, §13)', () => {
  const SRC13 = 'sin i = R cosΔ/(R+h) (Davies 1990), against a traced straight ray (core/REFERENCES.md §13)';

  it.each([
    [10, 110_000, 75.49],
    [3, 300_000, 72.5],
    [30, 250_000, undefined],
    [60, 400_000, undefined],
  ])('angle of incidence at Δ = %f°, h = %i m', (el, h, published) => {
    const traced = tracedIncidenceDeg(el, h);
    expectClose(deg(incidenceAngleRad(el, h)), traced, 1e-9, SRC13);
    if (published !== undefined) expectClose(traced, published, 0.005, 'core/REFERENCES.md §13 check values');
  });

  it('hop ray length matches a traced ray', () => {
    for (const [d, h] of [
      [1_000_000, 300_000],
      [3_000_000, 110_000],
      [3_500_000, 400_000],
    ])
      expectClose(
        hopRayLengthM(d, h),
        tracedHopLengthM(d, h),
        1e-6,
        'law of cosines (core/REFERENCES.md §13)',
      );
  });

  it('takes the 2-, 3- and 4-hop modes of a 4000 km path off 300 km at the §7 angles', () => {
    const modes = pathModes(4_000_000, 3.55e6).modes.filter((m) => m.layerHeightM === 300_000);
    expect(modes.map((m) => m.hops)).toEqual([2, 3, 4]);
    const SRC7 =
      'Δ = atan[(cos θ − R/(R+h))/sin θ] (ITU-R P.533; Davies 1990), core/REFERENCES.md §7 and §13';
    expectClose(modes[0].elevationDeg, 11.81, 0.005, SRC7);
    expectClose(modes[1].elevationDeg, 20.72, 0.005, SRC7);
    expectClose(modes[2].elevationDeg, 28.12, 0.005, SRC7);
    // The fewest-hop count is the smallest n with Δ(D/n) ≥ 3°: one hop of 4000 km is impossible here.
    expect(singleHopElevationDeg(4_000_000, 300_000)).toBeLessThan(0);
  });
});

describe('loss terms', () => {
  it('ground reflection at normal incidence is |(√εc − 1)/(√εc + 1)|² over the mean terrain (core/REFERENCES.md §3)', () => {
    const f = 3.55e6;
    const eps0 = 8.8541878128e-12;
    const power = (er: number, sigma: number): number => {
      // √εc by polar form, independent of the project's complex arithmetic.
      const re = er;
      const im = -sigma / (2 * Math.PI * f * eps0);
      const mod = Math.sqrt(Math.hypot(re, im));
      const arg = Math.atan2(im, re) / 2;
      const [sr, si] = [mod * Math.cos(arg), mod * Math.sin(arg)];
      const num = (sr - 1) ** 2 + si ** 2;
      const den = (sr + 1) ** 2 + si ** 2;
      return num / den;
    };
    const { sea, land, seaFraction } = PATH_TERRAIN;
    const expected =
      -10 *
      Math.log10(
        seaFraction * power(sea.permittivity, sea.conductivitySPerM) +
          (1 - seaFraction) * power(land.permittivity, land.conductivitySPerM),
      );
    expectClose(
      groundReflectionLossDb(90, f),
      expected,
      1e-9,
      'Fresnel at normal incidence, core/REFERENCES.md §3',
    );
  });

  it('ground reflection loses nothing at grazing incidence (Rv = Rh = −1, core/REFERENCES.md §3)', () => {
    expectClose(groundReflectionLossDb(0, 3.55e6), 0, 1e-9, 'core/REFERENCES.md §3: grazing gives |R| = 1');
  });

  it('absorption is two passes of the vertical value at the reference frequency, times sec i', () => {
    expectClose(
      hopAbsorptionDb(90, 3.55),
      2 * ABSORPTION_DB_PER_PASS,
      1e-9,
      'sec-law absorption, core/REFERENCES.md §13',
    );
    const el = 5;
    const sec = 1 / Math.cos((tracedIncidenceDeg(el, 110_000) * Math.PI) / 180);
    expectClose(
      hopAbsorptionDb(el, 3.55),
      2 * ABSORPTION_DB_PER_PASS * sec,
      1e-6,
      'sec-law absorption, core/REFERENCES.md §13',
    );
  });
});
