/**
 * Worker thread of `plan`: evaluates designs with the field solver, one job per message.
 * Messages in: a Job { key, design, ground, soilRange? }. Out: { key, record, ms } | { key, error }.
 */
import { parentPort } from 'node:worker_threads';
import { evaluateDesign } from '../rank/evaluate.ts';
import type { Job } from '../rank/plan.ts';
import { solverEvaluator } from '../rank/solver.ts';

const port = parentPort;
if (!port) throw new Error('plan-worker must run as a worker thread');
port.on('message', (msg: Job) => {
  try {
    const t0 = performance.now();
    const record = evaluateDesign(msg.design, msg.ground, solverEvaluator, msg.soilRange, msg.soilOnly);
    port.postMessage({ key: msg.key, record, ms: performance.now() - t0 });
  } catch (e) {
    port.postMessage({ key: msg.key, error: e instanceof Error ? e.message : String(e) });
  }
});
