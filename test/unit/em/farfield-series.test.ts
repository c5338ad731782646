// Internal consistency check between two ways of computing the far field (core/em/farfield.ts):
// each wire's Chebyshev series in the direction (the default) against the direct closed-form sum
// over its nodes, on random wire models in free space, over perfect ground and over soil.
import { describe, it, expect, afterEach } from 'vitest';
import { frequencyResult, prepareFor } from '../../../core/em/evaluate.ts';
import {
  radiationIntensity,
  radiationIntensityGrid,
  seriesOrder,
  useWireSeries,
} from '../../../core/em/farfield.ts';
import { ETA0 } from '../../../core/em/constants.ts';
import { createWorkspace, solveFrequency } from '../../../core/em/solver.ts';
import type { AntennaModel } from '../../../core/em/types.ts';

let seed = 7;
const rnd = (): number => {
  seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
  return seed / 4294967296;
};

/** Three wires of random direction and length (2–60 m) joined end to end, fed on the first. */
function randomModel(ground: AntennaModel['ground']): AntennaModel {
  const pts: [number, number, number][] = [[0, 0, 3 + 10 * rnd()]];
  for (let i = 0; i < 3; i++) {
    const p = pts[i];
    const len = 2 + 58 * rnd();
    const th = Math.acos(2 * rnd() - 1);
    const ph = 2 * Math.PI * rnd();
    pts.push([
      p[0] + len * Math.sin(th) * Math.cos(ph),
      p[1] + len * Math.sin(th) * Math.sin(ph),
      Math.max(1, p[2] + len * Math.cos(th)),
    ]);
  }
  return {
    wires: [0, 1, 2].map((i) => ({ from: pts[i], to: pts[i + 1], radiusM: 0.002 })),
    feeds: [{ wire: 0, position: 0.3 }],
    ground,
  };
}

afterEach(() => {
  useWireSeries(true);
});

describe('far field: wire series against the direct sum (internal consistency)', () => {
  const grounds: AntennaModel['ground'][] = [
    { kind: 'free-space' },
    { kind: 'perfect' },
    { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 },
  ];
  for (const ground of grounds)
    it(`agrees within 1e-9 of the peak at random directions (${ground.kind})`, () => {
      for (let trial = 0; trial < 4; trial++) {
        const f = 1.8e6 + 5.5e6 * rnd();
        const pm = prepareFor(randomModel(ground), [f], undefined, 'approximate');
        const sol = solveFrequency(pm, f, createWorkspace(pm));
        const src = { mesh: pm.mesh, nodeCurrents: sol.nodeCurrents, k: sol.k, ground: sol.groundAt };
        const dirs = Array.from({ length: 300 }, () => [
          Math.asin(rnd()) * (ground.kind === 'free-space' ? 2 * rnd() - 1 : 1),
          2 * Math.PI * rnd(),
        ]);
        const u = new Float64Array(2);
        const uTot = (): number[] =>
          dirs.map(([el, az]) => {
            radiationIntensity(src, el, az, ETA0, u);
            return u[0] + u[1];
          });
        useWireSeries(false);
        const direct = uTot();
        useWireSeries(true);
        const fast = uTot();
        const peak = Math.max(...direct);
        expect(peak).toBeGreaterThan(0);
        for (let i = 0; i < dirs.length; i++) expect(Math.abs(fast[i] - direct[i])).toBeLessThan(1e-9 * peak);
        // the product-grid routine against the direct sum direction by direction
        const els = Array.from({ length: 7 }, () =>
          ground.kind === 'free-space' ? Math.PI * (rnd() - 0.5) : 1.5 * rnd(),
        );
        const azs = Array.from({ length: 11 }, () => 2 * Math.PI * rnd());
        const gt = new Float64Array(77);
        const gp = new Float64Array(77);
        radiationIntensityGrid(src, els, azs, ETA0, gt, gp);
        useWireSeries(false);
        els.forEach((el, i) =>
          azs.forEach((az, j) => {
            radiationIntensity(src, el, az, ETA0, u);
            expect(Math.abs(gt[i * 11 + j] - u[0])).toBeLessThan(1e-9 * peak);
            expect(Math.abs(gp[i * 11 + j] - u[1])).toBeLessThan(1e-9 * peak);
          }),
        );
        useWireSeries(true);
        // and the radiated power, efficiency and peak of the assembled result
        const opts = { frequenciesHz: [f] };
        useWireSeries(false);
        const a = frequencyResult(pm, sol, opts);
        useWireSeries(true);
        const b = frequencyResult(pm, sol, opts);
        expect(Math.abs(b.radiatedPowerW - a.radiatedPowerW)).toBeLessThan(1e-9 * a.radiatedPowerW);
        // the peak search stops at 1e-4° (Brent), so rounding-level differences can end it elsewhere
        // within that tolerance
        expect(Math.abs(b.peak.gainDbi - a.peak.gainDbi)).toBeLessThan(1e-3);
      }
    });

  it('the series order meets its bound 4 (b/2)^{M+1}/(M+1)! ≤ tolerance', () => {
    for (const b of [0.01, 0.5, 1.5, 3, 10, 30]) {
      const m = seriesOrder(b, 1e-15);
      let t = 1;
      for (let i = 1; i <= m + 1; i++) t *= b / 2 / i;
      expect(4 * t).toBeLessThanOrEqual(1e-15);
      expect(m).toBeGreaterThanOrEqual(b / 2); // the terms have started to fall
    }
  });
});
