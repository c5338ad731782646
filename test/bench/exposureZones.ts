/**
 * The RF-exposure zones of the demo's shortlist, timed (`npx tsx test/bench/exposureZones.ts`):
 * the window computes them on its main thread when a candidate is selected (renderer/src/plan/
 * exposure.ts), so they must stay well under a frame. Prints, per candidate, the median and the
 * minimum of seven runs of `exposureOnLot` at 1500 W CW, both FCC zones outlined.
 */
import { buildDemoProject } from '../../data/demo/demoProject.ts';
import { planSite } from '../../core/rank/plan.ts';
import { solverEvaluator } from '../../core/rank/solver.ts';
import { estimateExposure } from '../../core/report/exposure.ts';
import { exposureOnLot } from '../../core/report/exposureZones.ts';
import { buildSite } from '../../core/site/site.ts';

const project = buildDemoProject();
const shortlist = planSite(project, { evaluator: solverEvaluator });
const site = buildSite(project);
for (const c of shortlist.candidates.slice(0, 8)) {
  const estimate = estimateExposure({
    peakEnvelopePowerW: 1500,
    mode: 'cw',
    onTimeFraction: 0.5,
    feedLossDb: 0,
    gainDbi: c.peak.gainDbi,
    freqMhz: c.feed.freqMHz,
  });
  const ms: number[] = [];
  for (let i = 0; i < 7; i++) {
    const t0 = performance.now();
    exposureOnLot(c.wires, site, estimate, ['fcc-general', 'fcc-controlled']);
    ms.push(performance.now() - t0);
  }
  ms.sort((a, b) => a - b);
  console.log(`#${c.rank} ${c.band} ${c.type}: median ${ms[3].toFixed(1)} ms, min ${ms[0].toFixed(1)} ms`);
}
