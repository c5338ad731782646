// Horizontal half-wave dipole over perfect ground against image theory with sinusoidal currents
// (Balanis, Antenna Theory, 3rd ed., §4.7; core/REFERENCES.md §5).
import { describe, it, expect } from 'vitest';
import { evaluateAntenna } from '../../../core/em/evaluate.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { F_LAMBDA_1M, horizontalDipole, solveOne } from './helpers.ts';

const SRC = 'Balanis, Antenna Theory, 3rd ed., §4.7, image theory (core/REFERENCES.md §5)';
const A = 1e-9; // thin-wire limit, where the sinusoidal current of the reference holds
// R = R11 − R12(2h) in the reference; the solver's free-space R11 at this radius is 2 Ω above
// 73.13 (see dipole.test.ts), so the check is on the ground's share, −R12(2h), within 1.5 Ω.
const R_TOL = 1.5;
const G_TOL_DB = 0.05; // REFERENCES: "within about 0.1 dB"

const rows: { h: number; r: number; g: number }[] = [
  { h: 0.25, r: 85.66, g: 7.48 },
  { h: 0.3, r: 96.44, g: 6.97 },
  { h: 0.375, r: 95.63, g: 7.01 },
  { h: 0.5, r: 69.12, g: 8.42 },
  { h: 0.75, r: 75.02, g: 8.06 },
  { h: 1.0, r: 72.05, g: 8.24 },
];

describe('horizontal λ/2 dipole over perfect ground', () => {
  const rFree = solveOne(horizontalDipole(0.5, A, 0, { kind: 'free-space' })).feeds[0].impedanceOhm[0];
  for (const row of rows) {
    it(`h = ${row.h} λ: lobe at arcsin(λ/4h), R = ${row.r} Ω, peak ${row.g} dBi`, () => {
      const lobe = (Math.asin(Math.min(1, 1 / (4 * row.h))) * 180) / Math.PI;
      const els = [lobe - 1, lobe, lobe + 1].filter((e) => e <= 90);
      const r = evaluateAntenna(horizontalDipole(0.5, A, row.h, { kind: 'perfect' }), {
        frequenciesHz: [F_LAMBDA_1M],
        pattern: { elevationsDeg: els, azimuthsDeg: [0] }, // broadside (north), perpendicular to the wire
      }).frequencies[0];
      const g = r.pattern.map((p) => p.gainDbi);
      // the lobe: a local maximum in elevation at arcsin(λ/4h), with the peak gain
      if (els.length === 3) {
        expect(g[1]).toBeGreaterThan(g[0]);
        expect(g[1]).toBeGreaterThan(g[2]);
      } else expect(g[1]).toBeGreaterThan(g[0]);
      expectClose(g[1], row.g, G_TOL_DB, `${SRC}: gain at the lobe`);
      expectClose(r.peak.gainDbi, row.g, G_TOL_DB, `${SRC}: peak gain`);
      expectClose(r.feeds[0].impedanceOhm[0] - rFree, row.r - 73.13, R_TOL, `${SRC}: R11 − R12(2h) − R11`);
    });
  }
  it('half a wavelength up: lobe at 30°', () => {
    const r = solveOne(horizontalDipole(0.5, A, 0.5, { kind: 'perfect' }));
    expectClose(r.peak.elevationDeg, 30, 0.05, `${SRC}: arcsin(1/2) = 30°`);
  });
});
