// The fill's translation cache (core/em/fill.ts) against the plain pair-by-pair fill: parallel
// wires, anti-parallel wires (half-square legs), a vertical with its own image (anti-parallel
// image), horizontal wires with theirs (parallel image), over free space, perfect and lossy
// ground, with and without a ground-system zone.
import { describe, it, expect } from 'vitest';
import { ETA0, waveNumber } from '../../../core/em/constants.ts';
import { prepareFor } from '../../../core/em/evaluate.ts';
import { fillImpedanceMatrix } from '../../../core/em/fill.ts';
import type { AntennaModel, GroundSpec } from '../../../core/em/types.ts';

const F = 3.6e6;
const AVERAGE: GroundSpec = { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 };

function maxRelDiff(model: AntennaModel): number {
  const pm = prepareFor(model, [F]);
  const n = pm.mesh.nBasis;
  const a = new Float64Array(2 * n * n);
  const b = new Float64Array(2 * n * n);
  const g = pm.ground.at(F);
  fillImpedanceMatrix(pm.mesh, waveNumber(F), ETA0, g, a, true);
  fillImpedanceMatrix(pm.mesh, waveNumber(F), ETA0, g, b, false);
  let scale = 0;
  let diff = 0;
  for (let i = 0; i < a.length; i += 2) {
    scale = Math.max(scale, Math.hypot(b[i], b[i + 1]));
    diff = Math.max(diff, Math.hypot(a[i] - b[i], a[i + 1] - b[i + 1]));
  }
  return diff / scale;
}

const halfSquare = (ground: GroundSpec): AntennaModel => ({
  wires: [
    { from: [0, 0, 2.5], to: [0, 0, 23.5], radiusM: 0.001 },
    { from: [0, 0, 23.5], to: [42, 0, 23.5], radiusM: 0.001 },
    { from: [42, 0, 23.5], to: [42, 0, 2.5], radiusM: 0.001 },
    { from: [10, 8, 12], to: [30, 8, 12], radiusM: 0.001 },
  ],
  feeds: [{ wire: 1, position: 0 }],
  ground,
});

describe('translation cache of the fill', () => {
  for (const g of [{ kind: 'free-space' }, { kind: 'perfect' }, AVERAGE] as GroundSpec[])
    it(`half-square with a parallel wire, ${g.kind}`, () => {
      expect(maxRelDiff(halfSquare(g))).toBeLessThan(1e-13);
    });
  it('ground-mounted vertical with radials (a ground-system zone) and a parallel vertical', () => {
    const m: AntennaModel = {
      wires: [
        { from: [0, 0, 0], to: [0, 0, 20], radiusM: 0.01 },
        { from: [5, 0, 1], to: [5, 0, 21], radiusM: 0.01 },
      ],
      feeds: [{ wire: 0, position: 0 }],
      radials: [{ wire: 0, count: 16, lengthsM: new Array<number>(16).fill(20), radiusM: 0.001 }],
      ground: AVERAGE,
    };
    expect(maxRelDiff(m)).toBeLessThan(1e-13);
  });
});
