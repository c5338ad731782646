// Tabulated remainder: interpolation error against direct integration, and the cache.
import { describe, expect, it } from 'vitest';
import { halfSpace } from '../../../../core/em/halfspace/medium.ts';
import { CYL_LEN, sommerfeldComponents } from '../../../../core/em/halfspace/sommerfeld.ts';
import {
  cachedTableCount,
  clearRemainderTables,
  RemainderTable,
  remainderTable,
} from '../../../../core/em/halfspace/table.ts';

/** Interpolation tolerance, relative to the largest remainder component at the point (measured 6e-6 … 6e-5). */
const INTERP_TOL = 2e-4;

describe('remainder table', () => {
  it('interpolates within tolerance over a lot-sized range (average soil, 80 m)', () => {
    const hs = halfSpace({ freqHz: 3.6e6, permittivity: 13, conductivitySPerM: 0.005 });
    const t = new RemainderTable(hs, {
      rMinM: 0.5,
      rMaxM: 64,
      stepLn: 0.08,
      thetaIntervals: 40,
      relTol: 1e-8,
    });
    expect(t.stats.unconverged).toBe(0);
    let seed = 12345;
    const rnd = (): number => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const a = new Float64Array(CYL_LEN);
    const b = new Float64Array(CYL_LEN);
    let worst = 0;
    for (let n = 0; n < 60; n++) {
      const R = 0.5 * Math.exp(rnd() * Math.log(128));
      const th = rnd() * 0.5 * Math.PI;
      const rho = R * Math.cos(th);
      const zeta = R * Math.sin(th);
      expect(t.covers(rho, zeta)).toBe(true);
      t.interpolate(rho, zeta, a);
      sommerfeldComponents(hs, rho, zeta, b, { relTol: 1e-10, subtractStatic: true, maxTailIntervals: 300 });
      let d = 0;
      let m = 0;
      for (let i = 0; i < CYL_LEN; i++) {
        d = Math.max(d, Math.abs(a[i] - b[i]));
        m = Math.max(m, Math.abs(b[i]));
      }
      worst = Math.max(worst, d / m);
    }
    expect(worst).toBeLessThan(INTERP_TOL);
    // a non-zero error: the comparison is against independent direct integration, not the nodes
    expect(worst).toBeGreaterThan(1e-9);
  });

  it('caches by frequency and soil and reuses a covering table', () => {
    clearRemainderTables();
    const hs = halfSpace({ freqHz: 1.83e6, permittivity: 13, conductivitySPerM: 0.005 });
    const opts = { stepLn: 0.2, thetaIntervals: 8, relTol: 1e-6 };
    const a = remainderTable(hs, 1, 30, opts);
    const b = remainderTable(hs, 2, 20, opts);
    expect(b).toBe(a);
    expect(cachedTableCount()).toBe(1);
    const other = remainderTable(
      halfSpace({ freqHz: 1.83e6, permittivity: 13, conductivitySPerM: 0.002 }),
      2,
      20,
      opts,
    );
    expect(other).not.toBe(a);
    expect(cachedTableCount()).toBe(2);
  });
});
