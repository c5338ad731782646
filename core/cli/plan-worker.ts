/**
 * Worker thread of `plan`: evaluates designs with the field solver, one job per message.
 * Messages in: a Job { key, design, ground, soilRange? }, or a WarmMessage (no answer).
 * Out: { key, record, ms } | { key, error }.
 */
import { parentPort } from 'node:worker_threads';
import { evaluateDesign } from '../rank/evaluate.ts';
import type { Job } from '../rank/plan.ts';
import { solverEvaluator, warmGround } from '../rank/solver.ts';
import type { EvalGround } from '../rank/evaluator.ts';

/** Build the ground's tables for these frequencies before the jobs come (no answer). */
export interface WarmMessage {
  warm: { ground: EvalGround; frequenciesHz: number[] };
}

const port = parentPort;
if (!port) throw new Error('plan-worker must run as a worker thread');
port.on('message', (msg: Job | WarmMessage) => {
  if ('warm' in msg) {
    // Errors here are the plan's own to report later, on the first job over this ground.
    try {
      warmGround(msg.warm.ground, msg.warm.frequenciesHz);
    } catch {
      /* nothing: the evaluations will say it */
    }
    return;
  }
  try {
    const t0 = performance.now();
    const record = evaluateDesign(msg.design, msg.ground, solverEvaluator, msg.soilRange, msg.soilOnly);
    port.postMessage({ key: msg.key, record, ms: performance.now() - t0 });
  } catch (e) {
    port.postMessage({ key: msg.key, error: e instanceof Error ? e.message : String(e) });
  }
});
