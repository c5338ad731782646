// Radiation resistance of a short top-loaded monopole over perfect ground against short-monopole
// theory (issue 19 point 2; core/REFERENCES.md §19).
//
// Short dipole of length l (Balanis, Antenna Theory, 4th ed.; equation numbers from memory, the
// same in the 3rd ed.): uniform current (infinitesimal dipole) Rr = 80π²(l/λ)², eq. 4-19;
// triangular current (small dipole) Rr = 20π²(l/λ)², eq. 4-37. A monopole of height h over
// perfect ground radiates into half the space of its image dipole (l = 2h) with the same current
// (image theory, Balanis §4.7), so Rr = 160π²(h/λ)² with uniform current and 40π²(h/λ)² with
// triangular current: a top hat that makes the current along the vertical uniform raises Rr
// fourfold. In general (a short element radiates by its current moment) Rr = 160π²(h/λ)²·(Ī/I0)²,
// Ī the mean current along the vertical and I0 the base current.
import { describe, expect, it } from 'vitest';
import { evaluateAntenna } from '../../../core/em/evaluate.ts';
import type { AntennaModel, WireSpec } from '../../../core/em/types.ts';
import { expectRelClose } from '../../helpers/expectClose.ts';
import { F_LAMBDA_1M, NO_PATTERN } from './helpers.ts';

const SRC =
  'Balanis, Antenna Theory, 4th ed., eq. 4-19 (80π²(l/λ)²) and eq. 4-37 (20π²(l/λ)²), halved for a monopole over perfect ground (§4.7); equation numbers from memory';
/** Height of the vertical, wavelengths (λ = 1 m). */
const H = 0.08;
const RADIUS = 1e-4;
/** Hat: HAT_WIRES horizontal wires from the top (symmetric, so the hat's own radiation cancels to first order). */
const HAT_WIRES = 8;
const HAT_RADII = [0, 0.01, 0.02, 0.04, 0.06, 0.08, 0.1];
const SEGMENTS_PER_WAVELENGTH = 400;
const TRIANGULAR = 40 * Math.PI ** 2 * H * H; // 2.53 Ω
const UNIFORM = 160 * Math.PI ** 2 * H * H; // 10.1 Ω
/**
 * The bare vertical's solved current is close to, not exactly, triangular (its mean is 0.49 of
 * the base current at this radius, 0.5 for a triangle); the tolerance covers that.
 */
const TOL_NO_HAT = 0.08;
/** The hat whose current along the vertical is the most uniform against the uniform-current limit. */
const TOL_LARGE_HAT = 0.06;
/** Rr against the moment form 160π²(h/λ)²·(Ī/I0)² at every hat size (short-element approximation at 0.08 λ). */
const TOL_MOMENT = 0.03;

function model(hatM: number): AntennaModel {
  const wires: WireSpec[] = [{ from: [0, 0, 0], to: [0, 0, H], radiusM: RADIUS, material: 'perfect' }];
  if (hatM > 0)
    for (let k = 0; k < HAT_WIRES; k++) {
      const b = (2 * Math.PI * k) / HAT_WIRES;
      wires.push({
        from: [0, 0, H],
        to: [hatM * Math.cos(b), hatM * Math.sin(b), H],
        radiusM: RADIUS,
        material: 'perfect',
      });
    }
  return { wires, feeds: [{ wire: 0, position: 0 }], ground: { kind: 'perfect' } };
}

function solve(hatM: number): { rOhm: number; meanOverBase: number; efficiency: number } {
  const f = evaluateAntenna(model(hatM), {
    frequenciesHz: [F_LAMBDA_1M],
    pattern: NO_PATTERN,
    segmentsPerWavelength: SEGMENTS_PER_WAVELENGTH,
    includeCurrents: true,
  }).frequencies[0];
  const nodes = f.currents![0].nodes;
  // Mean current along the vertical (trapezoid over its equally spaced nodes), phase-referenced to the base.
  const i0 = nodes[0];
  const mag0 = Math.hypot(i0[0], i0[1]);
  const proj = nodes.map((c) => (c[0] * i0[0] + c[1] * i0[1]) / mag0);
  let s = 0;
  for (let k = 1; k < proj.length; k++) s += (proj[k - 1] + proj[k]) / 2;
  return {
    rOhm: f.feeds[0].impedanceOhm[0],
    meanOverBase: s / (proj.length - 1) / mag0,
    efficiency: f.efficiency,
  };
}

describe('short monopole (0.08 λ) over perfect ground: the radiation resistance rises with the top hat', () => {
  const rows = HAT_RADII.map((r) => ({ r, ...solve(r) }));

  it('bare: Rr ≈ 40π²(h/λ)² (triangular current)', () => {
    expectRelClose(rows[0].rOhm, TRIANGULAR, TOL_NO_HAT, `${SRC}: 40π²(h/λ)²`);
  });

  it('rises monotonically with the hat', () => {
    for (let k = 1; k < rows.length; k++)
      expect(rows[k].rOhm, `hat ${rows[k].r} λ`).toBeGreaterThan(rows[k - 1].rOhm);
  });

  it('a hat large enough for a nearly uniform current: Rr ≈ 160π²(h/λ)², four times the bare value', () => {
    const flat = rows.reduce((p, q) => (Math.abs(q.meanOverBase - 1) < Math.abs(p.meanOverBase - 1) ? q : p));
    expect(flat.r).toBeGreaterThan(0);
    expect(Math.abs(flat.meanOverBase - 1)).toBeLessThan(0.05);
    expectRelClose(flat.rOhm, UNIFORM, TOL_LARGE_HAT, `${SRC}: 160π²(h/λ)²`);
  });

  it('at every hat size Rr = 160π²(h/λ)²·(Ī/I0)² from the solved current moment', () => {
    for (const row of rows)
      expectRelClose(
        row.rOhm,
        UNIFORM * row.meanOverBase ** 2,
        TOL_MOMENT,
        `${SRC}, hat ${row.r} λ: moment form`,
      );
  });

  it('perfect wires over perfect ground: all the input power is radiated (energy balance)', () => {
    for (const row of rows) expect(Math.abs(row.efficiency - 1)).toBeLessThan(1e-3);
  });
});
