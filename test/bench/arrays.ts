/**
 * Cost of one design evaluation per array type (not a timed test):
 * `npx tsx test/bench/arrays.ts [runs]`. Each type's first proposal on an invented 160 × 120 m lot
 * (two 24 m supports, 25 m self-supporting limit, 32 radials; the half-square arrays on the example
 * lot data/examples/four-supports-near-a-rectangle.json) on 80 m over average soil goes
 * through the planner's evaluation (trim, ±2 % sweep, pattern on the planning grid) `runs` times
 * (default 3) after one warm-up that builds the ground tables; the median wall and CPU times are
 * printed with the number of solver calls and the load average (the machine may be shared).
 * Then the arrays hung from supports near a square or a pair (four-square hung, loop array, and
 * the switched half-squares for comparison) on 40 m on data/examples/four-trees-near-a-square.json.
 */
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { bandPlan } from '../../core/antennas/common.ts';
import { builderFor } from '../../core/antennas/registry.ts';
import { evaluateDesign } from '../../core/rank/evaluate.ts';
import { solverEvaluator } from '../../core/rank/solver.ts';
import type { Evaluator } from '../../core/rank/evaluator.ts';
import { twoSupportSite } from '../unit/site/lot.ts';
import { parseProject } from '../../core/project/schema.ts';
import { buildSite } from '../../core/site/site.ts';
import { prepareSite, type PreparedSite } from '../../core/site/feasibility.ts';
import type { BandPlan } from '../../core/antennas/types.ts';

const runs = Number(process.argv[2] ?? 3);
const site = twoSupportSite({ maxVerticalHeightM: 25, radialCount: 32 });
function exampleSite(file: string) {
  const example = parseProject(
    JSON.parse(readFileSync(new URL(`../../data/examples/${file}`, import.meta.url), 'utf8')),
  );
  if (!example.ok) throw new Error(`the example lot ${file} does not parse`);
  return prepareSite(buildSite(example.value));
}
const rectSite = exampleSite('four-supports-near-a-rectangle.json');
const squareSite = exampleSite('four-trees-near-a-square.json');
const HALF_SQUARE_ARRAYS = ['half-square-reflector', 'half-square-switched', 'half-square-l'];
const ground = { classId: 'average' } as const;
const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
function bench(type: string, on: PreparedSite, band: BandPlan): void {
  const p = builderFor(type).propose({ site: on, band }).proposals[0];
  if (!p) {
    console.log(`${type}: no proposal on the bench lot`);
    return;
  }
  let calls = 0;
  const counting: Evaluator = (req) => {
    calls++;
    return solverEvaluator(req);
  };
  evaluateDesign(p.design, ground, solverEvaluator);
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    calls = 0;
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    evaluateDesign(p.design, ground, counting);
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  console.log(
    `${type.padEnd(20)} ${band.band} median ${median(wall).toFixed(0)} ms wall, ${median(cpu).toFixed(0)} ms CPU, ${calls} solver calls per evaluation`,
  );
}
for (const type of ['vertical', 'half-square', 'vertical-pair', 'four-square', ...HALF_SQUARE_ARRAYS])
  bench(type, HALF_SQUARE_ARRAYS.includes(type) ? rectSite : site, bandPlan('80m'));
for (const type of ['four-square-hung', 'loop-reflector', 'half-square-switched'])
  bench(type, squareSite, bandPlan('40m'));
console.log(
  `load average ${loadavg()
    .map((v) => v.toFixed(1))
    .join(' ')}`,
);
