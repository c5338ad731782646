// The exact ground's fast path against the full Sommerfeld computation. The fill as the solver
// runs it (remainder interpolated from the table, each half-space result reused for segment pairs
// related by a translation) is compared with the fill that integrates the Sommerfeld integrals at
// every quadrature point of every segment pair (no table, no translation cache). Two parallel
// λ/2 dipoles over average soil at heights where the ground's near field matters.
// The bound is this project's accuracy budget for the exact ground (core/em/halfspace/table.ts,
// the default spacing), not a published figure: common practice, no source.
import { describe, expect, it } from 'vitest';
import { ETA0, waveNumber } from '../../../../core/em/constants.ts';
import { prepareFor } from '../../../../core/em/evaluate.ts';
import { fillImpedanceMatrix } from '../../../../core/em/fill.ts';
import { createGroundModel } from '../../../../core/em/ground.ts';
import { ExactGroundAt, createExactGroundModel } from '../../../../core/em/halfspace/ground.ts';
import { luFactor, luSolve } from '../../../../core/numeric/lu.ts';
import type { AntennaModel, GroundSpec } from '../../../../core/em/types.ts';

const F = 3.6e6;
const LAMBDA = 299_792_458 / F;
const SOIL: GroundSpec = { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 };
/** Largest element difference of the impedance matrix, relative to its largest element (measured 7e-9). */
const MATRIX_TOL = 1e-6;
/** Feed impedance, relative (measured 6e-6 at 0.05 λ, 7e-7 at 0.15 λ). */
const IMPEDANCE_TOL = 2e-5;

function pair(hWl: number): AntennaModel {
  const L = 0.48 * LAMBDA;
  const h = hWl * LAMBDA;
  return {
    wires: [
      { from: [-L / 2, 0, h], to: [L / 2, 0, h], radiusM: 1e-3, segments: 9, material: 'perfect' },
      {
        from: [-L / 2, 0.1 * LAMBDA, h],
        to: [L / 2, 0.1 * LAMBDA, h],
        radiusM: 1e-3,
        segments: 9,
        material: 'perfect',
      },
    ],
    feeds: [{ wire: 0, position: 0.5 }],
    ground: SOIL,
  };
}

function feedImpedance(n: number, z: Float64Array, basis: Int32Array, coef: Float64Array): [number, number] {
  const rhs = new Float64Array(2 * n);
  for (let t = 0; t < basis.length; t++) rhs[2 * basis[t]] += coef[t];
  const x = luSolve(luFactor(n, z.slice()), rhs);
  let ir = 0;
  let ii = 0;
  for (let t = 0; t < basis.length; t++) {
    ir += coef[t] * x[2 * basis[t]];
    ii += coef[t] * x[2 * basis[t] + 1];
  }
  const d = ir * ir + ii * ii;
  return [ir / d, -ii / d];
}

describe('exact ground: fast path against the full Sommerfeld integrals', () => {
  for (const hWl of [0.05, 0.15])
    it(`two parallel dipoles at ${hWl} λ: matrix within ${MATRIX_TOL}, feed impedance within ${IMPEDANCE_TOL} (relative)`, () => {
      const pm = prepareFor(pair(hWl), [F]);
      const n = pm.mesh.nBasis;
      const k = waveNumber(F);
      const fast = pm.ground.at(F);
      expect(fast).toBeInstanceOf(ExactGroundAt);
      const full = createExactGroundModel(createGroundModel(SOIL), { useTable: false }).at(F);
      const zf = new Float64Array(2 * n * n);
      const zr = new Float64Array(2 * n * n);
      fillImpedanceMatrix(pm.mesh, k, ETA0, fast, zf, true);
      fillImpedanceMatrix(pm.mesh, k, ETA0, full, zr, false);
      // every pair was an exact one on both paths
      const st = (fast as ExactGroundAt).stats;
      expect(st.approximatePairs).toBe(0);
      expect((full as ExactGroundAt).stats.exactPairs).toBe(st.exactPairs);
      let big = 0;
      let diff = 0;
      for (let i = 0; i < zr.length; i += 2) {
        big = Math.max(big, Math.hypot(zr[i], zr[i + 1]));
        diff = Math.max(diff, Math.hypot(zf[i] - zr[i], zf[i + 1] - zr[i + 1]));
      }
      expect(diff / big).toBeLessThan(MATRIX_TOL);
      const f = pm.feeds[0];
      const a = feedImpedance(n, zf, f.basis, f.coef);
      const b = feedImpedance(n, zr, f.basis, f.coef);
      const rel = Math.hypot(a[0] - b[0], a[1] - b[1]) / Math.hypot(b[0], b[1]);
      expect(rel).toBeLessThan(IMPEDANCE_TOL);
    });
});
