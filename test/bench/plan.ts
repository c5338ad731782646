/**
 * Planning benchmark: `npx tsx test/bench/plan.ts [--quick] [--json]`. With `--json` the progress
 * lines go to stderr and stdout gets one JSON object (also merged into `npm run bench -- --json`).
 *
 *  1. Cold start: `plan --demo --json` in a fresh Node process (worker threads on every core),
 *     wall time, median of 3.
 *  2. Re-plan: through the app's worker host with its warm evaluation cache (appReplan.ts), move
 *     one support by a few metres and plan again, phase by phase; median of 7 moves (3 with
 *     --quick). The live provisional re-rank is timed at the same positions.
 *  3. Growth: designs to evaluate and plan time against the number of supports on an invented
 *     300 m × 200 m lot (seeded positions), up to 40 supports (the 40-support lot three times, a
 *     fresh evaluation cache each time; median), with the peak memory.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { createWorkerPool } from '../../core/cli/plan.ts';
import { enumeratePlan, memoryCache, planFromSetup } from '../../core/rank/plan.ts';
import { appReplan, DEMO_MOVES, medianOf } from './appReplan.ts';
import { solverEvaluator } from '../../core/rank/solver.ts';
import { lotWithSupports } from '../helpers/manySupportLot.ts';

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
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'core/cli/main.ts', 'plan', '--demo', '--json'], {
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
log(`COLD START median: ${median(cold).toFixed(2)} s (target ≤ 5 s)`);
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
  json.replanRuns = rows;
  log(
    `RE-PLAN median (app path, one worker): ${medianOf(rows, 'totalMs').toFixed(0)} ms; live preview median ${medianOf(rows, 'previewMs').toFixed(0)} ms`,
  );
}
const pool = createWorkerPool(2);

// 3. Growth with the number of supports
const growth: Record<number, number[]> = {};
for (const n of quick ? [4, 8, 40] : [4, 8, 16, 40, 40, 40]) {
  const p = lotWithSupports(n);
  const t0 = performance.now();
  const setup = enumeratePlan(p);
  const tEnum = (performance.now() - t0) / 1000;
  const c = memoryCache();
  await pool.evaluate(setup.jobs, c);
  const out = planFromSetup(setup, p, { evaluator: solverEvaluator, cache: c });
  const sec = (performance.now() - t0) / 1000;
  (growth[n] ??= []).push(sec);
  const mem = process.memoryUsage();
  log(
    `${String(n).padStart(2)} supports: ${setup.jobs.length} designs, ${setup.bands[0].proposed.length} feasible placements, ` +
      `enumerate ${tEnum.toFixed(2)} s, plan ${sec.toFixed(1)} s, ${out.candidates.length} candidates, ` +
      `heap ${(mem.heapUsed / 2 ** 20).toFixed(0)} MiB, rss ${(mem.rss / 2 ** 20).toFixed(0)} MiB`,
  );
}
await pool.close();
json.plan40SupportsS = median(growth[40]);
json.plan40SupportsRunsS = growth[40];
json.planBySupportsS = Object.fromEntries(Object.entries(growth).map(([k, v]) => [k, median(v)]));
if (asJson) process.stdout.write(JSON.stringify(json) + '\n');
