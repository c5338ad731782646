/**
 * Exact-ground benchmark (not a timed test): `npx tsx test/bench/halfspace.ts [--json]`, also run
 * by `npm run bench` after the solver benchmark.
 *
 *  1. remainder-table build at 3.6 MHz and 7.1 MHz over average soil (default spacing, the range
 *     a plan asks for), with its node count;
 *  2. one full evaluation of the 200-unknown array of test/bench/run.ts (four 40 m-band dipoles at
 *     15 m = 0.36 λ, so every pair is exact) with the exact ground: first (tables built) and cached
 *     (median of several), beside the reflection-coefficient approximation;
 *  3. a 31-point feed sweep of the 100-unknown half-square (3.5–3.8 MHz): first (a table per
 *     frequency) and cached.
 * Wall clock and process CPU time in ms.
 */
import { loadavg } from 'node:os';
import { evaluateAntenna } from '../../core/em/evaluate.ts';
import { halfSpace } from '../../core/em/halfspace/medium.ts';
import { clearRemainderTables, remainderTable } from '../../core/em/halfspace/table.ts';
import { sweepImpedance } from '../../core/em/sweep.ts';

import { array200, halfSquare100 } from './models.ts';

function timed(fn: () => void): { ms: number; cpuMs: number } {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  fn();
  const ms = performance.now() - t0;
  const c = process.cpuUsage(c0);
  return { ms, cpuMs: (c.user + c.system) / 1000 };
}
const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const fmt = (t: { ms: number; cpuMs: number }): string =>
  `${t.ms.toFixed(0)} ms (CPU ${t.cpuMs.toFixed(0)} ms)`;

const lines: string[] = [];
const json: Record<string, unknown> = {};

// 1. table build
for (const f of [3.6e6, 7.1e6]) {
  clearRemainderTables();
  const hs = halfSpace({ freqHz: f, permittivity: 13, conductivitySPerM: 0.005 });
  let nodes = 0;
  let range = '';
  const t = timed(() => {
    const tab = remainderTable(hs, 4, 60);
    nodes = tab.stats.nodes;
    range = `${tab.rMinM}–${tab.rMaxM} m`;
  });
  json[`table${f / 1e6}MHz`] = { ...t, nodes };
  lines.push(`remainder table, ${f / 1e6} MHz, average soil, R1 ${range}: ${nodes} nodes, ${fmt(t)}`);
}

// 2. full evaluation, 200 unknowns
{
  const opts = { frequenciesHz: [7.1e6] };
  clearRemainderTables();
  let unknowns = 0;
  const first = timed(() => {
    unknowns = evaluateAntenna(array200, opts).unknowns;
  });
  const cached: { ms: number; cpuMs: number }[] = [];
  for (let i = 0; i < 7; i++) cached.push(timed(() => evaluateAntenna(array200, opts)));
  const approx: { ms: number; cpuMs: number }[] = [];
  for (let i = 0; i < 7; i++)
    approx.push(timed(() => evaluateAntenna(array200, { ...opts, groundModel: 'approximate' })));
  const c = { ms: median(cached.map((x) => x.ms)), cpuMs: median(cached.map((x) => x.cpuMs)) };
  const a = { ms: median(approx.map((x) => x.ms)), cpuMs: median(approx.map((x) => x.cpuMs)) };
  json.fullEvaluation200 = { unknowns, first, cachedMedian: c, approximateMedian: a };
  lines.push(
    `full evaluation, ${unknowns} unknowns, exact ground: first ${fmt(first)}, cached median ${fmt(c)}; approximate ground median ${fmt(a)}`,
  );
}

// 3. sweep
{
  const freqs = Array.from({ length: 31 }, (_, i) => 3.5e6 + i * 0.01e6);
  clearRemainderTables();
  const first = timed(() => sweepImpedance(halfSquare100, freqs));
  const cached = timed(() => sweepImpedance(halfSquare100, freqs));
  const approx = timed(() => sweepImpedance(halfSquare100, freqs, { groundModel: 'approximate' }));
  json.sweep31x100 = { first, cached, approximate: approx };
  lines.push(
    `31-point sweep, 100 unknowns, exact ground: first ${fmt(first)} (31 tables), cached ${fmt(cached)}; approximate ${fmt(approx)}`,
  );
}
lines.push(
  `load average (1, 5, 15 min): ${loadavg()
    .map((l) => l.toFixed(2))
    .join(', ')}`,
);
json.loadAverage = loadavg();

if (process.argv.includes('--json')) process.stdout.write(JSON.stringify(json, null, 2) + '\n');
else process.stdout.write(lines.join('\n') + '\n');
