/**
 * A grounded metal support next to a quarter-wave vertical, through this project's solver
 * (core/em) with the support as the planner models it (core/antennas/conductors.ts).
 *
 * Published behaviour checked (direction only, not numbers): a parasitic element longer than its
 * resonant length acts as a reflector, so a two-element array with one driven element radiates
 * less toward the parasitic element than away from it, and the parasitic element changes the
 * driven element's feed impedance through the mutual impedance, Z1 = Z11 − Z12²/Z22
 * (J. D. Kraus, Antennas, 2nd ed., McGraw-Hill 1988, ch. 11, the two-element array with a
 * parasitic element; section number from memory). A grounded 25 m support is 0.30 λ tall at
 * 3.55 MHz, longer than the 0.25 λ resonance of a grounded monopole.
 *
 * Energy balance (over perfect ground): P_in = P_rad + P_conductor within the solver's own check.
 */
import { describe, expect, it } from 'vitest';
import { conductorWires, latticeEquivalentRadiusM } from '../../../core/antennas/conductors.ts';
import { evaluateAntenna } from '../../../core/em/evaluate.ts';
import type { AntennaModel, WireSpec } from '../../../core/em/types.ts';
import { wavelengthM } from '../../../core/units/index.ts';

const F_HZ = 3.55e6;
const LAMBDA_M = wavelengthM(F_HZ);
const VERTICAL_M = 0.245 * LAMBDA_M;
const TOWER_M = 25;
/** Shadow: at least this much less gain toward the support than away from it, dB (a clear effect). */
const SHADOW_MIN_DB = 1;
/** Detuning: the feed impedance moves by at least this much, ohms. */
const DETUNE_MIN_OHM = 5;
/** Energy balance tolerance, relative (the solver's own diagnostic threshold is 0.5 %). */
const BALANCE_TOL = 1e-3;

function solve(towerDistanceM: number | null) {
  const wires: WireSpec[] = [
    { from: [0, 0, 0], to: [0, 0, VERTICAL_M], radiusM: 0.001, segments: 20, material: 'copper' },
  ];
  if (towerDistanceM !== null) {
    // East of the vertical (x east): azimuth 90° looks at the support, 270° away from it.
    const [w] = conductorWires(
      [
        {
          supportId: 't',
          name: 'tower',
          xy: [towerDistanceM, 0],
          heightM: TOWER_M,
          radiusM: latticeEquivalentRadiusM(0.3),
          grounded: true,
          material: 'steel',
          standoff: false,
        },
      ],
      LAMBDA_M,
    );
    wires.push({ from: w.from, to: w.to, radiusM: w.radiusM, segments: w.segments, material: 'steel' });
  }
  const model: AntennaModel = { wires, feeds: [{ wire: 0, position: 0 }], ground: { kind: 'perfect' } };
  const r = evaluateAntenna(model, {
    frequenciesHz: [F_HZ],
    pattern: { elevationsDeg: [10], azimuthsDeg: [90, 270] },
  }).frequencies[0];
  return {
    z: r.feeds[0].impedanceOhm,
    towardDbi: r.pattern[0].gainDbi,
    awayDbi: r.pattern[1].gainDbi,
    balance: r.powerBalanceError,
  };
}

describe('a grounded tower next to a quarter-wave vertical (Kraus, Antennas, 2nd ed., two-element parasitic array)', () => {
  const alone = solve(null);
  it('alone the vertical is omnidirectional and balanced', () => {
    expect(Math.abs(alone.towardDbi - alone.awayDbi)).toBeLessThan(0.01);
    expect(Math.abs(alone.balance ?? 1)).toBeLessThan(BALANCE_TOL);
  });
  for (const d of [1, 0.1 * LAMBDA_M, 0.15 * LAMBDA_M]) {
    it(`at ${d.toFixed(1)} m the tower detunes the vertical and shadows it on its side`, () => {
      const t = solve(d);
      const dz = Math.hypot(t.z[0] - alone.z[0], t.z[1] - alone.z[1]);
      expect(
        dz,
        `feed ${t.z[0].toFixed(1)} ${t.z[1].toFixed(1)} vs ${alone.z[0].toFixed(1)}`,
      ).toBeGreaterThan(DETUNE_MIN_OHM);
      expect(t.awayDbi - t.towardDbi, 'a reflector: less gain toward the tower').toBeGreaterThan(
        SHADOW_MIN_DB,
      );
      expect(Math.abs(t.balance ?? 1)).toBeLessThan(BALANCE_TOL);
    });
  }
});
