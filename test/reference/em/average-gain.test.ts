// Average gain of lossless antennas: 1 over the sphere in free space, 2 over the upper
// hemisphere over perfect ground (power conservation with the IEEE definition of gain, IEEE Std
// 145; core/REFERENCES.md §5), within 0.05 dB. The input power comes from the feed (½ Re V I*), the
// radiated power from integrating the far field, so this checks the solver end to end.
import { describe, it } from 'vitest';
import type { AntennaModel, GroundSpec } from '../../../core/em/types.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { solveOne } from './helpers.ts';

const SRC = 'average gain 1 (free space) / 2 (perfect ground), IEEE Std 145 (core/REFERENCES.md §5)';
const TOL_DB = 0.05;

const free: GroundSpec = { kind: 'free-space' };
const perfect: GroundSpec = { kind: 'perfect' };

const shapes: { name: string; model: (g: GroundSpec) => AntennaModel }[] = [
  {
    name: 'horizontal dipole 0.5 λ at 0.3 λ',
    model: (g) => ({
      wires: [{ from: [-0.25, 0, 0.3], to: [0.25, 0, 0.3], radiusM: 1e-3, material: 'perfect' }],
      feeds: [{ wire: 0, position: 0.5 }],
      ground: g,
    }),
  },
  {
    name: 'bent wire (inverted-V, 100° apex)',
    model: (g) => {
      const h = 0.4;
      const s = 0.25 * Math.sin((50 * Math.PI) / 180);
      const d = 0.25 * Math.cos((50 * Math.PI) / 180);
      return {
        wires: [
          { from: [-s, 0, h - d], to: [0, 0, h], radiusM: 1e-3, material: 'perfect' },
          { from: [0, 0, h], to: [s, 0, h - d], radiusM: 1e-3, material: 'perfect' },
        ],
        feeds: [{ wire: 0, position: 1 }],
        ground: g,
      };
    },
  },
  {
    name: 'junction of three wires (a Y, one arm fed)',
    model: (g) => {
      const c: [number, number, number] = [0, 0, 0.5];
      return {
        wires: [
          { from: [0, 0, 0.2], to: c, radiusM: 1e-3, material: 'perfect' },
          { from: c, to: [0.25, 0.1, 0.6], radiusM: 1e-3, material: 'perfect' },
          { from: c, to: [-0.2, 0.15, 0.65], radiusM: 1.5e-3, material: 'perfect' },
        ],
        feeds: [{ wire: 0, position: 0.5 }],
        ground: g,
      };
    },
  },
  {
    name: 'inverted-L, fed against the ground plane',
    model: (g) => ({
      wires: [
        { from: [0, 0, 0], to: [0, 0, 0.15], radiusM: 1e-3, material: 'perfect' },
        { from: [0, 0, 0.15], to: [0.2, 0, 0.15], radiusM: 1e-3, material: 'perfect' },
      ],
      feeds: [{ wire: 0, position: 0 }],
      ground: g,
    }),
  },
];

describe('average gain of lossless antennas', () => {
  for (const s of shapes) {
    if (!s.name.startsWith('inverted-L'))
      it(`${s.name}, free space → 0 dB`, () => {
        expectClose(solveOne(s.model(free)).averageGainDb, 0, TOL_DB, SRC);
      });
    it(`${s.name}, perfect ground → 3.01 dB`, () => {
      expectClose(solveOne(s.model(perfect)).averageGainDb, 10 * Math.log10(2), TOL_DB, SRC);
    });
  }
  it('ground-mounted quarter-wave vertical, perfect ground → 3.01 dB', () => {
    const m: AntennaModel = {
      wires: [{ from: [0, 0, 0], to: [0, 0, 0.25], radiusM: 1e-3, material: 'perfect' }],
      feeds: [{ wire: 0, position: 0 }],
      ground: perfect,
    };
    expectClose(solveOne(m).averageGainDb, 10 * Math.log10(2), TOL_DB, SRC);
  });
});
