// The exact half-space against values computed once by a separate method:
// test/fixtures/em/halfspace-reference.json, written by test/fixtures/em/halfspace_reference.py
// (a complex-plane detour and QUADPACK on the real axis, with a perfect-conductor self-check;
// method in the script's header; formulas of core/REFERENCES.md §14).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { halfSpace } from '../../../../core/em/halfspace/medium.ts';
import { CYL_LEN, sommerfeldComponents } from '../../../../core/em/halfspace/sommerfeld.ts';

interface Row {
  soil: string;
  permittivity: number;
  conductivitySPerM: number;
  frequencyHz: number;
  rhoM: number;
  zetaM: number;
  components: [number, number][];
}
const rows = (
  JSON.parse(
    readFileSync(new URL('../../../fixtures/em/halfspace-reference.json', import.meta.url), 'utf8'),
  ) as {
    rows: Row[];
  }
).rows;
const SOURCE = 'independent fixture test/fixtures/em/halfspace-reference.json (core/REFERENCES.md §14)';
/** Relative to the largest component (measured: 2e-10 at worst; QUADPACK asked for 1e-11, the solver for 1e-10). */
const TOL = 1e-8;

describe('exact ground: the reflected-field components against an independent computation', () => {
  it('has the rows the script writes', () => expect(rows.length).toBe(10));
  for (const r of rows) {
    it(`${r.soil} soil, ${r.frequencyHz / 1e6} MHz, ρ = ${r.rhoM} m, ζ = ${r.zetaM} m`, () => {
      const hs = halfSpace({
        freqHz: r.frequencyHz,
        permittivity: r.permittivity,
        conductivitySPerM: r.conductivitySPerM,
      });
      const got = new Float64Array(CYL_LEN);
      sommerfeldComponents(hs, r.rhoM, r.zetaM, got, {
        relTol: 1e-10,
        subtractStatic: false,
        maxTailIntervals: 300,
      });
      let scale = 0;
      for (const [re, im] of r.components) scale = Math.max(scale, Math.abs(re), Math.abs(im));
      let worst = 0;
      r.components.forEach(([re, im], i) => {
        worst = Math.max(worst, Math.abs(got[2 * i] - re), Math.abs(got[2 * i + 1] - im));
      });
      expect(worst / scale, `${SOURCE}: worst component error relative to the largest`).toBeLessThan(TOL);
    });
  }
});
