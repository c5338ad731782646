/**
 * Planning benchmark: `npx tsx test/bench/plan.ts [--quick] [--json]`. With `--json` the progress
 * lines go to stderr and stdout gets one JSON object (also merged into `npm run bench -- --json`).
 *
 *  1. Cold start: `npm run -s cli -- plan --demo --json` as a user types it (npm, a fresh Node
 *     process, worker threads on every core), wall time, median of 3.
 *  2. Re-plan: through the app's worker host with its warm evaluation cache (appReplan.ts), move
 *     one support by a few metres and plan again, phase by phase; median of 7 moves (3 with
 *     --quick). The live provisional re-rank is timed at the same positions.
 *  3. Growth: designs to evaluate and plan time against the number of supports on the invented
 *     300 m × 200 m lots of test/helpers/manySupportLot.ts (seeded positions and heights): 4, 8,
 *     16, 40, 100, 200 and 500 supports (the schema's maximum), each a cold plan (a fresh
 *     evaluation cache) on the workers as `plan` runs it; 40, 100, 200 and 500 three times each
 *     (median; once with --quick), with the enumeration alone and the memory.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { createWorkerPool, evaluateOnPool } from '../../core/cli/plan.ts';
import { enumeratePlan, memoryCache, planFromSetup } from '../../core/rank/plan.ts';
import { appReplan, DEMO_MOVES, medianOf } from './appReplan.ts';
import { solverEvaluator } from '../../core/rank/solver.ts';
import { lotWithSupports } from '../helpers/manySupportLot.ts';
import { forgetClippedRadials } from '../../core/site/feasibility.ts';

const quick = process.argv.includes('--quick');
const root = fileURLToPath(new URL('../..', import.meta.url));
const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const asJson = process.argv.includes('--json');
const log = (s: string): void => void (asJson ? process.stderr : process.stdout).write(s + '\n');
const json: Record<string, unknown> = {};

// 1. Cold start
const cold: number[] = [];
for (let i = 0; i < (quick ? 1 : 3); i++) {
  const t = performance.now();
  const r = spawnSync('npm', ['run', '-s', 'cli', '--', 'plan', '--demo', '--json'], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  const s = (performance.now() - t) / 1000;
  if (r.status !== 0) throw new Error(`plan --demo failed: ${r.stderr}`);
  const n = (JSON.parse(r.stdout) as { candidates: unknown[] }).candidates.length;
  cold.push(s);
  log(`cold start ${i + 1}: ${s.toFixed(2)} s (${n} candidates)`);
}
log(`COLD START median: ${median(cold).toFixed(2)} s (target ≤ 1.5 s)`);
json.coldPlanDemoS = median(cold);
json.coldPlanDemoRunsS = cold;

// 2. Re-plan after moving one support, through the app's worker host (test/bench/appReplan.ts)
{
  const rows = appReplan(quick ? DEMO_MOVES.slice(0, 3) : DEMO_MOVES, log);
  json.replanMedianS = medianOf(rows, 'totalMs') / 1000;
  json.replanCpuMedianS = medianOf(rows, 'cpuMs') / 1000;
  json.replanPhasesMedianMs = {
    enumerate: medianOf(rows, 'enumerateMs'),
    evaluateNewDesigns: medianOf(rows, 'evaluateMs'),
    rank: medianOf(rows, 'rankMs'),
    messages: medianOf(rows, 'messagesMs'),
  };
  json.livePreviewMedianS = medianOf(rows, 'previewMs') / 1000;
  json.livePreviewCpuMedianS = medianOf(rows, 'previewCpuMs') / 1000;
  json.replanAfterRestMedianS = medianOf(rows, 'afterRestMs') / 1000;
  json.replanRuns = rows;
  log(
    `RE-PLAN median (app path, one worker): ${medianOf(rows, 'totalMs').toFixed(0)} ms; live preview median ${medianOf(rows, 'previewMs').toFixed(0)} ms; ` +
      `after a rest in the drag ${medianOf(rows, 'afterRestMs').toFixed(0)} ms`,
  );
}
const pool = createWorkerPool(2);

// 3. Growth with the number of supports
const growth: Record<number, number[]> = {};
const enumeration: Record<number, number[]> = {};
const designs: Record<number, number> = {};
const cpu: Record<number, number[]> = {};
const sizes = quick
  ? [4, 8, 40, 100, 200, 500]
  : [4, 8, 16, 40, 40, 40, 100, 100, 100, 200, 200, 200, 500, 500, 500];
for (const n of sizes) {
  const p = lotWithSupports(n);
  forgetClippedRadials(); // cold: nothing kept from the plan before
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const setup = enumeratePlan(p);
  const tEnum = (performance.now() - t0) / 1000;
  const c = memoryCache();
  await evaluateOnPool(pool, setup, p, c, 10);
  const out = planFromSetup(setup, p, { evaluator: solverEvaluator, cache: c });
  const sec = (performance.now() - t0) / 1000;
  const c1 = process.cpuUsage(c0);
  const cpuS = (c1.user + c1.system) / 1e6; // this process: the main thread and the workers
  (growth[n] ??= []).push(sec);
  (cpu[n] ??= []).push(cpuS);
  (enumeration[n] ??= []).push(tEnum);
  designs[n] = setup.jobs.length + (setup.conductorJobs?.length ?? 0);
  const mem = process.memoryUsage();
  const cut = setup.cuts.reduce((s, k) => s + k.proposed - k.considered, 0);
  log(
    `${String(n).padStart(3)} supports: ${setup.jobs.length} designs, ${setup.bands[0].proposed.length} feasible placements` +
      (cut ? ` (${cut} placements left out by the bounds)` : '') +
      `, enumerate ${tEnum.toFixed(2)} s, plan ${sec.toFixed(1)} s (CPU ${cpuS.toFixed(1)} s), ${out.candidates.length} candidates, ` +
      `heap ${(mem.heapUsed / 2 ** 20).toFixed(0)} MiB, rss ${(mem.rss / 2 ** 20).toFixed(0)} MiB`,
  );
}
await pool.close();
json.plan40SupportsS = median(growth[40]);
json.plan40SupportsRunsS = growth[40];
json.plan500SupportsS = median(growth[500]);
json.planBySupportsS = Object.fromEntries(Object.entries(growth).map(([k, v]) => [k, median(v)]));
json.enumerateBySupportsS = Object.fromEntries(Object.entries(enumeration).map(([k, v]) => [k, median(v)]));
json.designsBySupports = designs;
json.planCpuBySupportsS = Object.fromEntries(Object.entries(cpu).map(([k, v]) => [k, median(v)]));
if (asJson) process.stdout.write(JSON.stringify(json) + '\n');
