// Physical properties of the solver (no published value needed): reciprocity, energy balance,
// symmetry, convergence under segment doubling, and limiting cases. Sources of the principles:
// Harrington, Time-Harmonic Electromagnetic Fields (1961), §3-8 (reciprocity); Balanis, Antenna
// Theory, 3rd ed., §2 (power, gain).
import { describe, it, expect } from 'vitest';
import { pairMoments } from '../../../core/em/kernel.ts';
import { evaluateAntenna, prepareFor } from '../../../core/em/evaluate.ts';
import { createWorkspace, solveFrequency } from '../../../core/em/solver.ts';
import { fillImpedanceMatrix } from '../../../core/em/fill.ts';
import { ETA0, waveNumber } from '../../../core/em/constants.ts';
import type { AntennaModel, GroundSpec } from '../../../core/em/types.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { solveOne } from './helpers.ts';

const AVERAGE: GroundSpec = { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 };

/** An irregular antenna: a bent wire, a three-wire junction, two radii, a wire near the ground. */
function irregular(ground: GroundSpec): AntennaModel {
  return {
    wires: [
      { from: [0, 0, 8], to: [6, 1, 10], radiusM: 0.001, material: 'copper' },
      { from: [6, 1, 10], to: [12, -2, 9], radiusM: 0.002, material: 'aluminium' },
      { from: [6, 1, 10], to: [7, 4, 3], radiusM: 0.001, material: 'copper' },
      { from: [-3, 5, 1.5], to: [3, 7, 1.5], radiusM: 0.0015, material: 'copper' },
    ],
    feeds: [
      { wire: 0, position: 0.4, voltage: [1, 0] },
      { wire: 3, position: 0.5, voltage: [0, 0] },
    ],
    loads: [{ wire: 2, position: 0.5, kind: 'series-rlc', rOhm: 5, lH: 2e-6 }],
    ground,
  };
}

describe('reciprocity', () => {
  it('segment-pair moments are symmetric when source and observation swap (free and image terms)', () => {
    // Different code paths (outer/inner roles swap), so this is not true by construction.
    const P = [0.1, 0.2, 0.3, 0.6, 0.0, 0.8, 0.07];
    const Q = [0.15, 0.21, 0.37, 0.0, 1.0, 0.0, 0.05];
    const a2 = 1e-6;
    const k = 2 * Math.PI;
    for (const mirror of [1, -1]) {
      const q = [Q[0], Q[1], mirror * Q[2], Q[3], Q[4], mirror * Q[5], Q[6]];
      const p = [P[0], P[1], mirror * P[2], P[3], P[4], mirror * P[5], P[6]];
      const a = new Float64Array(8);
      const b = new Float64Array(8);
      pairMoments(
        P[0],
        P[1],
        P[2],
        P[3],
        P[4],
        P[5],
        P[6],
        q[0],
        q[1],
        q[2],
        q[3],
        q[4],
        q[5],
        q[6],
        a2,
        k,
        false,
        a,
        0,
      );
      pairMoments(
        Q[0],
        Q[1],
        Q[2],
        Q[3],
        Q[4],
        Q[5],
        Q[6],
        p[0],
        p[1],
        p[2],
        p[3],
        p[4],
        p[5],
        p[6],
        a2,
        k,
        false,
        b,
        0,
      );
      const scale = Math.hypot(a[0], a[1]);
      const swap = [0, 1, 4, 5, 2, 3, 6, 7]; // M10(p,q) = M01(q,p)
      for (let i = 0; i < 8; i++) expect(Math.abs(a[i] - b[swap[i]]) / scale).toBeLessThan(2e-5);
    }
  });
  it('the impedance matrix over lossy ground is symmetric, and so is the two-port', () => {
    const model = irregular(AVERAGE);
    const pm = prepareFor(model, [7.1e6]);
    const n = pm.mesh.nBasis;
    const z = new Float64Array(2 * n * n);
    fillImpedanceMatrix(pm.mesh, waveNumber(7.1e6), ETA0, pm.ground.at(7.1e6), z);
    let maxAbs = 0;
    let maxAsym = 0;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const a = 2 * (i * n + j);
        const b = 2 * (j * n + i);
        maxAbs = Math.max(maxAbs, Math.hypot(z[a], z[a + 1]));
        maxAsym = Math.max(maxAsym, Math.hypot(z[a] - z[b], z[a + 1] - z[b + 1]));
      }
    expect(maxAsym / maxAbs).toBeLessThan(1e-12);
    // I2 caused by V1 equals I1 caused by V2 (ports with loads and lossy conductors)
    const s12 = solveOne(model, 7.1e6).feeds[1].currentA;
    const swapped = {
      ...model,
      feeds: [
        { ...model.feeds[0], voltage: [0, 0] as [number, number] },
        { ...model.feeds[1], voltage: [1, 0] as [number, number] },
      ],
    };
    const s21 = solveOne(swapped, 7.1e6).feeds[0].currentA;
    expectClose(s12[0], s21[0], 1e-9 * Math.hypot(...s12), 'reciprocity (Harrington 1961, §3-8)');
    expectClose(s12[1], s21[1], 1e-9 * Math.hypot(...s12), 'reciprocity (Harrington 1961, §3-8)');
  });
});

describe('energy balance: input = radiated + conductor + load loss within 0.5 %', () => {
  for (const ground of [{ kind: 'free-space' }, { kind: 'perfect' }] as GroundSpec[]) {
    it(`irregular lossy antenna, ${ground.kind}`, () => {
      const m = irregular(ground);
      const r = solveOne({ ...m, feeds: [{ wire: 0, position: 0.4 }] }, 7.1e6);
      expect(r.conductorLossW).toBeGreaterThan(0);
      expect(r.loadLossW).toBeGreaterThan(0);
      const balance = (r.radiatedPowerW + r.conductorLossW + r.loadLossW) / r.inputPowerW;
      expectClose(balance, 1, 0.005, 'conservation of energy (Poynting theorem; Balanis §2)');
    });
  }
});

describe('symmetry', () => {
  it('an inverted-V symmetric about x = 0 over lossy ground has a mirror-symmetric pattern', () => {
    const m: AntennaModel = {
      wires: [
        { from: [-15, 0, 9], to: [0, 0, 15], radiusM: 0.001 },
        { from: [0, 0, 15], to: [15, 0, 9], radiusM: 0.001 },
      ],
      feeds: [{ wire: 0, position: 1 }],
      ground: AVERAGE,
    };
    const az = [10, 35, 60, 85, 120, 150];
    const r = evaluateAntenna(m, {
      frequenciesHz: [4.4e6],
      pattern: {
        elevationsDeg: [15, 40],
        azimuthsDeg: [...az, ...az.map((a) => 360 - a), ...az.map((a) => 180 - a)],
      },
    }).frequencies[0];
    const g = new Map(r.pattern.map((p) => [`${p.elevationDeg}/${p.azimuthDeg}`, p.gainDbi]));
    for (const el of [15, 40])
      for (const a of az) {
        expectClose(g.get(`${el}/${360 - a}`)!, g.get(`${el}/${a}`)!, 1e-6, 'mirror symmetry in x');
        expectClose(g.get(`${el}/${180 - a}`)!, g.get(`${el}/${a}`)!, 1e-6, 'mirror symmetry in y');
      }
  });
});

describe('convergence under segment doubling (default segmentation already converged)', () => {
  // 15° gain within 0.05 dB, impedance within 1 % (of |Z|) when the default count is doubled.
  const cases: { name: string; model: AntennaModel; f: number; az: number }[] = [
    {
      name: '40 m dipole, 12 m over average ground',
      model: {
        wires: [{ from: [-10.05, 0, 12], to: [10.05, 0, 12], radiusM: 0.001 }],
        feeds: [{ wire: 0, position: 0.5 }],
        ground: AVERAGE,
      },
      f: 7.1e6,
      az: 0,
    },
    {
      name: '80 m half-square over average ground',
      model: {
        wires: [
          { from: [0, 0, 2.5], to: [0, 0, 23], radiusM: 0.001 },
          { from: [0, 0, 23], to: [41, 0, 23], radiusM: 0.001 },
          { from: [41, 0, 23], to: [41, 0, 2.5], radiusM: 0.001 },
        ],
        feeds: [{ wire: 1, position: 0 }],
        ground: AVERAGE,
      },
      f: 3.65e6,
      az: 0,
    },
    {
      name: 'ground-mounted vertical with 32 radials',
      model: {
        wires: [{ from: [0, 0, 0], to: [0, 0, 19.5], radiusM: 0.01 }],
        feeds: [{ wire: 0, position: 0 }],
        radials: [{ wire: 0, count: 32, lengthsM: new Array<number>(32).fill(20), radiusM: 0.001 }],
        ground: AVERAGE,
      },
      f: 3.65e6,
      az: 0,
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const run = (spw?: number) =>
        evaluateAntenna(c.model, {
          frequenciesHz: [c.f],
          pattern: { elevationsDeg: [15], azimuthsDeg: [c.az] },
          segmentsPerWavelength: spw,
        }).frequencies[0];
      const a = run();
      const b = run(160);
      const za = a.feeds[0].impedanceOhm;
      const zb = b.feeds[0].impedanceOhm;
      expect(Math.hypot(za[0] - zb[0], za[1] - zb[1]) / Math.hypot(zb[0], zb[1])).toBeLessThan(0.01);
      expect(Math.abs(a.pattern[0].gainDbi - b.pattern[0].gainDbi)).toBeLessThan(0.05);
    });
  }
});

describe('limiting cases', () => {
  it('lossy ground with huge conductivity tends to perfect ground', () => {
    const base = (g: GroundSpec): AntennaModel => ({
      wires: [
        { from: [-10, 0, 8], to: [10, 0, 8], radiusM: 0.001, material: 'perfect' },
        { from: [12, 3, 0], to: [12, 3, 9], radiusM: 0.001, material: 'perfect' },
      ],
      feeds: [{ wire: 0, position: 0.5 }],
      ground: g,
    });
    const opts = {
      frequenciesHz: [7.1e6],
      pattern: { elevationsDeg: [5, 20, 45, 80], azimuthsDeg: [0, 70] },
    };
    const p = evaluateAntenna(base({ kind: 'perfect' }), opts).frequencies[0];
    const s = evaluateAntenna(base({ kind: 'soil', permittivity: 10, conductivitySPerM: 1e9 }), opts)
      .frequencies[0];
    expectClose(
      s.feeds[0].impedanceOhm[0],
      p.feeds[0].impedanceOhm[0],
      0.02,
      'σ → ∞: Rv → 1, Rh → −1 (core/REFERENCES.md §3)',
    );
    expectClose(
      s.feeds[0].impedanceOhm[1],
      p.feeds[0].impedanceOhm[1],
      0.02,
      'σ → ∞ (core/REFERENCES.md §3)',
    );
    p.pattern.forEach((pp, i) =>
      expectClose(s.pattern[i].gainDbi, pp.gainDbi, 0.01, 'σ → ∞ (core/REFERENCES.md §3)'),
    );
  });
  it('a sweep reuses one mesh: the same answer as separate solves', () => {
    const m: AntennaModel = {
      wires: [{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001 }],
      feeds: [{ wire: 0, position: 0.5 }],
      ground: AVERAGE,
    };
    const pm = prepareFor(m, [7.0e6, 7.2e6]);
    const ws = createWorkspace(pm);
    const a = solveFrequency(pm, 7.1e6, ws).feeds[0].impedance;
    solveFrequency(pm, 7.0e6, ws);
    const b = solveFrequency(pm, 7.1e6, ws).feeds[0].impedance;
    expect(a).toEqual(b);
  });
});
