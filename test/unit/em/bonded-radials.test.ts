// Bonded radial fields of several verticals (core/em/bondedRadials.ts): the Wait–Pope
// integration over the union of the radial fields with the total surface field.
//  - one vertical: the same number as radials.ts (the single-connection integration), and the
//    regression value of core/REFERENCES.md §6 (a regression guard of this model, not outside truth);
//  - connections far apart: each cell is its whole disk;
//  - two overlapping fields: the sum of the cells equals an independent brute-force integration
//    over the union on a Cartesian grid (the partition is right, nothing counted twice);
//  - in the solver: bonding two close verticals loses less than integrating both full disks, and
//    far-apart verticals give the per-connection result.
import { describe, expect, it } from 'vitest';
import { bondedGroundLoss, type BondedConnection } from '../../../core/em/bondedRadials.ts';
import {
  groundLossResistance,
  sinusoidalMonopoleSurfaceField,
  surfaceImpedance,
  type RadialScreen,
} from '../../../core/em/radials.ts';
import { complexPermittivity, soilSurfaceImpedanceOhm } from '../../../core/em/fresnel.ts';
import { ETA0 } from '../../../core/em/constants.ts';
import { evaluateAntenna } from '../../../core/em/evaluate.ts';
import type { AntennaModel } from '../../../core/em/types.ts';
import { c } from '../../../core/numeric/complex.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../../core/units/index.ts';

const F = 3.6e6;
const LAMBDA = SPEED_OF_LIGHT_M_PER_S / F;
const zg = soilSurfaceImpedanceOhm(
  complexPermittivity({ permittivity: 13, conductivitySPerM: 0.005 }, F),
  ETA0,
);
const screen = (n: number, len = LAMBDA / 4): RadialScreen => ({
  lengthsM: Array(n).fill(len),
  radiusM: 1e-3,
});
const H = LAMBDA / 4;
const mono = sinusoidalMonopoleSurfaceField(F, H);

function conn(x: number, y: number, n = 32, i0 = c(1)): BondedConnection {
  return { x, y, screen: screen(n), rhoMinM: 1e-3, rhoMaxM: 0.5 * LAMBDA, current: i0 };
}

describe('bonded radial fields', () => {
  it('reduce to the single-vertical integration for one connection', () => {
    const single = groundLossResistance({
      freqHz: F,
      screen: screen(32),
      zg,
      hAbs2PerI0: mono,
      rhoMinM: 1e-3,
      rhoMaxM: 0.5 * LAMBDA,
    });
    const field = (x: number, y: number) => mono(Math.hypot(x - 3, y + 2));
    for (const symmetric of [true, false]) {
      const b = bondedGroundLoss({ freqHz: F, zg, connections: [conn(3, -2)], hAbs2: field, symmetric });
      expect(Math.abs(b.lossResistanceOhm[0] - single) / single).toBeLessThan(1e-12);
    }
    // regression guard: core/REFERENCES.md §6 gives 10.6 Ω for 32 λ/4 radials (this model's value)
    expect(single).toBeCloseTo(10.6, 1);
  });

  it('give each far-apart connection its whole disk', () => {
    const far = 1.2 * LAMBDA; // > 2 × 0.5 λ
    const field = (x: number, y: number) => mono(Math.hypot(x, y)) + mono(Math.hypot(x - far, y));
    const b = bondedGroundLoss({ freqHz: F, zg, connections: [conn(0, 0), conn(far, 0)], hAbs2: field });
    const alone = bondedGroundLoss({ freqHz: F, zg, connections: [conn(0, 0)], hAbs2: field });
    expect(Math.abs(b.cellLossW[0] - alone.cellLossW[0]) / alone.cellLossW[0]).toBeLessThan(1e-12);
  });

  it('split the union without counting twice (against a brute-force grid over the union)', () => {
    const d = 0.3 * LAMBDA;
    // a smooth field of two sources in quadrature, |H|² of their sum (amplitudes from the monopole form)
    const field = (x: number, y: number) => {
      const a = Math.sqrt(mono(Math.hypot(x, y)));
      const b = Math.sqrt(mono(Math.hypot(x - d, y)));
      return a * a + b * b; // quadrature: cross term vanishes
    };
    const cs = [conn(0, 0), conn(d, 0)];
    const b = bondedGroundLoss({ freqHz: F, zg, connections: cs, hAbs2: field, azimuths: 96 });
    // brute force: midpoint grid over the union, each point to its nearest connection; the
    // integrand is bounded near the bases (the screen is solid there), so a fine grid converges
    const R = 0.5 * LAMBDA;
    const n = 700;
    const x0 = -R;
    const x1 = d + R;
    const y0 = -R;
    const dx = (x1 - x0) / n;
    const dy = (2 * R) / n;
    let sum = 0;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const x = x0 + (i + 0.5) * dx;
        const y = y0 + (j + 0.5) * dy;
        const r0 = Math.hypot(x, y);
        const r1 = Math.hypot(x - d, y);
        const r = Math.min(r0, r1);
        if (r > R || r < 1e-3) continue;
        const zs = surfaceImpedance(F, r, screen(32), zg);
        sum += zs.re * field(x, y) * dx * dy;
      }
    const brute = 0.5 * sum;
    expect(Math.abs(b.totalLossW - brute) / brute).toBeLessThan(0.01);
    // and the union is smaller than two full disks
    const full = cs.map((ci) =>
      bondedGroundLoss({ freqHz: F, zg, connections: [ci], hAbs2: field, azimuths: 96 }),
    );
    expect(b.totalLossW).toBeLessThan(full[0].totalLossW + full[1].totalLossW);
  });
});

function pair(spacingM: number, bonded: boolean): AntennaModel {
  const h = 19.8;
  const radials = (w: number) => ({ wire: w, count: 16, lengthsM: Array(16).fill(20), radiusM: 0.001 });
  return {
    wires: [
      { from: [0, 0, 0], to: [0, 0, h], radiusM: 0.01 },
      { from: [spacingM, 0, 0], to: [spacingM, 0, h], radiusM: 0.01 },
    ],
    feeds: [
      { wire: 0, position: 0, voltage: [1, 0] },
      { wire: 1, position: 0, voltage: [0, -1] },
    ],
    radials: [radials(0), radials(1)],
    ground: { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 },
    radialsBonded: bonded,
  };
}

describe('bonded radial fields in the solver', () => {
  const loss = (m: AntennaModel) => {
    const r = evaluateAntenna(m, { frequenciesHz: [F], pattern: { elevationsDeg: [], azimuthsDeg: [] } })
      .frequencies[0];
    return r.groundSystems.reduce((s, g) => s + g.lossW, 0) / r.inputPowerW;
  };
  it('a λ/4-spaced pair loses less bonded than with two full disks', () => {
    const bonded = loss(pair(20.8, true));
    const separate = loss(pair(20.8, false));
    expect(bonded).toBeGreaterThan(0);
    expect(bonded).toBeLessThan(separate);
  });
  it('a pair 1.2 λ apart loses the same either way (within the azimuth quadratures, 2 %)', () => {
    const bonded = loss(pair(1.2 * LAMBDA, true));
    const separate = loss(pair(1.2 * LAMBDA, false));
    expect(Math.abs(bonded - separate) / separate).toBeLessThan(0.02);
  });
});
