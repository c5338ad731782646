// The solver's surface magnetic field (core/em/solver.ts surfaceMagneticField) for an imposed
// sinusoidal current on a ground-mounted vertical, against the closed form of Wait & Pope,
// Appl. Sci. Res. B4 (1954) 177–195 (core/REFERENCES.md §6): Hφ = (j Im/2πρ)[e^{−jk√(ρ²+h²)} − cos kh e^{−jkρ}].
import { describe, it } from 'vitest';
import { buildMesh } from '../../../core/em/mesh.ts';
import { surfaceMagneticField } from '../../../core/em/solver.ts';
import { sinusoidalMonopoleSurfaceField } from '../../../core/em/radials.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../../core/units/index.ts';

const SOURCE = 'Wait & Pope 1954, surface Hφ of a monopole with sinusoidal current (core/REFERENCES.md §6)';
// Piecewise-linear sampling of the sine with 200 segments: error well under 0.1 %.
const REL_TOL = 2e-3;

describe('surface magnetic field of a vertical', () => {
  for (const hOverLambda of [0.25, 0.125]) {
    it(`matches the closed form for h = ${hOverLambda} λ`, () => {
      const freqHz = 3.6e6;
      const lam = SPEED_OF_LIGHT_M_PER_S / freqHz;
      const k = (2 * Math.PI) / lam;
      const h = hOverLambda * lam;
      const mesh = buildMesh(
        {
          wires: [{ from: [0, 0, 0], to: [0, 0, h], radiusM: 0.001, segments: 200, material: 'perfect' }],
          feeds: [{ wire: 0, position: 0 }],
          ground: { kind: 'perfect' },
        },
        { maxFreqHz: freqHz },
      );
      const nodeI = new Float64Array(2 * mesh.nNodes);
      for (let n = 0; n <= 200; n++) nodeI[2 * n] = Math.sin(k * (h - (n * h) / 200));
      const i0 = Math.sin(k * h);
      const ref = sinusoidalMonopoleSurfaceField(freqHz, h);
      const out = new Float64Array(4);
      for (const rho of [0.01, 0.3, 3, 10, 20, 40]) {
        surfaceMagneticField(mesh, nodeI, k, rho, 0, out);
        const got = (out[0] ** 2 + out[1] ** 2 + out[2] ** 2 + out[3] ** 2) / (i0 * i0);
        const want = ref(rho);
        expectClose(got / want, 1, REL_TOL, `${SOURCE}, ρ = ${rho} m`);
      }
    });
  }
});
