/**
 * Cost of the take-off distribution: `npx tsx test/bench/takeoff.ts`.
 *
 * 1. The demo's paths with every band's distribution (planPaths), median of 20.
 * 2. Ranking the demo's 80 m plan from a filled evaluation cache (rankPlan, no solver work),
 *    scored over the weighted distributions, and the same with each region's directions replaced
 *    by the fewest-hop geometry alone (the scoring before the distribution), median of 7 each.
 * The cache is filled by a stand-in evaluator that returns grids of the real size: ranking reads
 * gains only, so its time does not depend on what the numbers are. Solver work is the same with
 * either scoring (the same designs are evaluated), so these are the whole extra cost.
 */
import { planPaths } from '../../core/paths/index.ts';
import { summarize, TAKEOFF_MODEL_ID } from '../../core/paths/takeoff.ts';
import { BANDS } from '../../core/project/schema.ts';
import { PATTERN_GRID } from '../../core/rank/pattern.ts';
import { conductorJobs, enumeratePlan, evaluateJobs, memoryCache, rankPlan } from '../../core/rank/plan.ts';
import type { Evaluator } from '../../core/rank/evaluator.ts';
import { buildDemoProject } from '../../data/demo/demoProject.ts';

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const time = (f: () => void): number => {
  const t = performance.now();
  f();
  return performance.now() - t;
};

const project = buildDemoProject();
const paths: number[] = [];
for (let i = 0; i < 20; i++) paths.push(time(() => planPaths(project.station!, project.targets)));
console.log(`planPaths (3 regions × 3 bands): median ${median(paths).toFixed(2)} ms`);

const n = PATTERN_GRID.elevationsDeg.length * PATTERN_GRID.azimuthsDeg.length;
const standIn: Evaluator = (req) =>
  req.frequenciesHz.map((freqHz) => ({
    freqHz,
    zOhm: [50, 0] as [number, number],
    inputPowerW: 1,
    radiatedPowerW: 0.5,
    conductorLossW: 0.1,
    groundLossW: 0.4,
    gainDbi: req.pattern ? Float64Array.from({ length: n }, (_, i) => Math.sin(i * 0.37) * 5) : null,
    diagnostics: [],
  }));
const setup = enumeratePlan(project, { bands: ['80m'] });
const cache = memoryCache();
evaluateJobs(setup.jobs, standIn, cache);
evaluateJobs(conductorJobs(setup, cache, project), standIn, cache);
rankPlan(setup, cache, project); // warm-up (the soil range is left out: it is solver work either way)
const weighted: number[] = [];
for (let i = 0; i < 7; i++) weighted.push(time(() => rankPlan(setup, cache, project)));
const saved = setup.paths.map((p) => p.takeoff);
for (const p of setup.paths) {
  const fewest = p.directions.map((d) => ({ ...d, weight: 1 / p.directions.length }));
  p.takeoff = Object.fromEntries(
    BANDS.map((b) => [b, summarize(TAKEOFF_MODEL_ID, b, fewest)]),
  ) as typeof p.takeoff;
}
const fewestHop: number[] = [];
for (let i = 0; i < 7; i++) fewestHop.push(time(() => rankPlan(setup, cache, project)));
setup.paths.forEach((p, i) => (p.takeoff = saved[i]));
const dirs = setup.paths.map(
  (p) => `${p.id} ${p.takeoff['80m'].directions.length} vs ${p.directions.length}`,
);
console.log(`directions per region (weighted vs fewest-hop): ${dirs.join(', ')}`);
console.log(
  `rankPlan, demo 80 m, ${setup.bands[0].proposed.length} placements: weighted ${median(weighted).toFixed(0)} ms, fewest-hop ${median(fewestHop).toFixed(0)} ms (medians of 7)`,
);
