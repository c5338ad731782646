// Timing of the field solver's cost limits (core/em/limits.ts): the ground-power check's cost per
// unit of work, and one evaluation near the unknowns bound. Not a test; prints one line per case.
// Run: npx tsx test/bench/limits.ts
import { evaluateAntenna } from '../../core/em/evaluate.ts';
import { groundAbsorptionWork } from '../../core/em/halfspace/absorption.ts';
import { prepareFor } from '../../core/em/evaluate.ts';
import type { AntennaModel } from '../../core/em/types.ts';

const f = 3.6e6;
const dipoleAt = (h: number): AntennaModel => ({
  ground: { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 },
  wires: [{ from: [-20, 0, h], to: [20, 0, h], radiusM: 0.001 }],
  feeds: [{ wire: 0, position: 0.5 }],
});
const heights = (process.argv[2] ?? '10,2,0.5').split(',').map(Number);
for (const h of heights) {
  const m = dipoleAt(h);
  const pm = prepareFor(m, [f]);
  const work = groundAbsorptionWork(pm.mesh, (2 * Math.PI * f) / 299_792_458) ?? 0;
  const t0 = performance.now();
  evaluateAntenna(m, {
    frequenciesHz: [f],
    pattern: { elevationsDeg: [], azimuthsDeg: [] },
    groundPowerCheck: true,
  });
  const t1 = performance.now();
  evaluateAntenna(m, { frequenciesHz: [f], pattern: { elevationsDeg: [], azimuthsDeg: [] } });
  const t2 = performance.now();
  const checkMs = t1 - t0 - (t2 - t1);
  console.log(
    `height ${h} m: ground-check work ${work.toExponential(2)}, check ${checkMs.toFixed(0)} ms, ${((checkMs * 1e6) / work).toFixed(1)} ns per unit`,
  );
}
