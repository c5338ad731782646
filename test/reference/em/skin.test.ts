// Conductor loss (core/em/conductor.ts) against core/REFERENCES.md §9: Ramo, Whinnery & Van Duzer,
// Fields and Waves in Communication Electronics, 3rd ed. (1994).
import { describe, it } from 'vitest';
import {
  MATERIALS,
  internalImpedancePerM,
  skinDepthM,
  surfaceResistanceOhm,
  thinSkinResistancePerM,
} from '../../../core/em/conductor.ts';
import { expectClose } from '../../helpers/expectClose.ts';

const SRC = 'Ramo, Whinnery & Van Duzer, 3rd ed. (core/REFERENCES.md §9)';
const cu = MATERIALS.copper;

describe('skin effect', () => {
  it('copper at 3.6 MHz: δ = 34.83 µm, Rs = 0.4950 mΩ', () => {
    expectClose(skinDepthM(3.6e6, cu) * 1e6, 34.83, 0.01, SRC);
    expectClose(surfaceResistanceOhm(3.6e6, cu) * 1e3, 0.495, 0.0005, SRC);
  });
  it('2 mm copper wire: 0.0788 Ω/m by Rs/(πd), 0.0802 Ω/m by the exact Bessel form (used by the core)', () => {
    expectClose(thinSkinResistancePerM(3.6e6, 1e-3, cu), 0.0788, 0.0001, SRC);
    expectClose(internalImpedancePerM(3.6e6, 1e-3, cu).re, 0.0802, 0.0001, SRC);
  });
  it('the exact form tends to the DC resistance 1/(σπa²) for a wire much thinner than δ', () => {
    const a = 1e-6;
    expectClose(
      internalImpedancePerM(3.6e6, a, cu).re / (1 / (cu.conductivitySPerM * Math.PI * a * a)),
      1,
      1e-4,
      `${SRC}: DC limit`,
    );
  });
  it('and to Rs/(2πa)·(1 + j) for a wire much thicker than δ', () => {
    const a = 0.05; // a/δ ≈ 1400: asymptotic branch
    const z = internalImpedancePerM(3.6e6, a, cu);
    const rs = thinSkinResistancePerM(3.6e6, a, cu);
    expectClose(z.re / rs, 1, 1e-3, `${SRC}: thin-skin limit`);
    expectClose(z.im / rs, 1, 1e-3, `${SRC}: internal reactance equals resistance`);
  });
});
