/**
 * Worker thread of `plan`: evaluates designs with the field solver, one job per message.
 * Messages in: a Job { key, design, ground, soilRange? }, a WarmMessage or a TablesMessage.
 * Out: { key, record, ms } | { key, error } for a job, { warmed: tables } for a WarmMessage.
 */
import { parentPort } from 'node:worker_threads';
import { evaluateDesign } from '../rank/evaluate.ts';
import type { Job } from '../rank/plan.ts';
import { solverEvaluator, warmGround } from '../rank/solver.ts';
import type { EvalGround } from '../rank/evaluator.ts';
import {
  exportRemainderTables,
  importRemainderTables,
  type RemainderTableData,
} from '../em/halfspace/table.ts';

/**
 * Build the exact ground's tables for these grounds and frequencies before the jobs come; the
 * answer is the tables built ({ warmed }), which the pool hands to the other workers.
 */
export interface WarmMessage {
  warm: { ground: EvalGround; frequenciesHz: number[] }[];
}

/** Tables another worker built (the same values this one would build), to reuse. */
export interface TablesMessage {
  tables: RemainderTableData[];
}

const port = parentPort;
if (!port) throw new Error('plan-worker must run as a worker thread');
port.on('message', (msg: Job | WarmMessage | TablesMessage) => {
  if ('warm' in msg) {
    // A failure here is the plan's to report, on the first job over this ground.
    try {
      for (const w of msg.warm) warmGround(w.ground, w.frequenciesHz);
    } catch {
      /* nothing: the evaluations will say it */
    }
    port.postMessage({ warmed: exportRemainderTables() });
    return;
  }
  if ('tables' in msg) {
    importRemainderTables(msg.tables);
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
