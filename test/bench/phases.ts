/**
 * Where one evaluation's time goes (not a timed test): `npx tsx test/bench/phases.ts [--json]`.
 * The 200-unknown array of test/bench/models.ts at 7.1 MHz, with the approximate and the exact
 * ground (tables cached by a first run): the matrix fill, the LU factorisation, the rest of the
 * solve, and the pattern (8280 directions, radiated power, peak search). Medians of paired runs.
 */
import { loadavg } from 'node:os';
import { ETA0, waveNumber } from '../../core/em/constants.ts';
import { DEFAULT_PATTERN, frequencyResult, prepareFor } from '../../core/em/evaluate.ts';
import { fillImpedanceMatrix } from '../../core/em/fill.ts';
import { createWorkspace, solveFrequency } from '../../core/em/solver.ts';
import { luFactor } from '../../core/numeric/lu.ts';
import { array200 } from './models.ts';

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const RUNS = 11;
const f = 7.1e6;
const out: Record<string, Record<string, number>> = {};
for (const ground of ['approximate', 'exact'] as const) {
  const pm = prepareFor(array200, [f], undefined, ground);
  const ws = createWorkspace(pm);
  const n = pm.mesh.nBasis;
  const k = waveNumber(f);
  solveFrequency(pm, f, ws); // builds the tables (exact ground) and warms up
  const t = { fill: [] as number[], lu: [] as number[], solve: [] as number[], pattern: [] as number[] };
  for (let r = 0; r < RUNS; r++) {
    const g = pm.ground.at(f);
    let t0 = performance.now();
    fillImpedanceMatrix(pm.mesh, k, ETA0, g, ws.z);
    t.fill.push(performance.now() - t0);
    t0 = performance.now();
    luFactor(n, ws.z, ws.pivots);
    t.lu.push(performance.now() - t0);
    t0 = performance.now();
    const sol = solveFrequency(pm, f, ws);
    t.solve.push(performance.now() - t0);
    t0 = performance.now();
    frequencyResult(pm, sol, { frequenciesHz: [f], pattern: DEFAULT_PATTERN });
    t.pattern.push(performance.now() - t0);
  }
  out[ground] = {
    unknowns: n,
    fillMs: median(t.fill),
    luMs: median(t.lu),
    solveMs: median(t.solve),
    patternMs: median(t.pattern),
  };
}
if (process.argv.includes('--json'))
  process.stdout.write(JSON.stringify({ ...out, loadAverage: loadavg() }) + '\n');
else {
  for (const [g, o] of Object.entries(out))
    process.stdout.write(
      `${g} ground, ${o.unknowns} unknowns: fill ${o.fillMs.toFixed(1)} ms, LU ${o.luMs.toFixed(1)} ms, ` +
        `whole solve (fill + LU + rest) ${o.solveMs.toFixed(1)} ms, pattern and peak ${o.patternMs.toFixed(1)} ms\n`,
    );
  process.stdout.write(
    `load average: ${loadavg()
      .map((l) => l.toFixed(2))
      .join(', ')}\n`,
  );
}
