/**
 * A planning worker: the pure core runs here, off the window's thread. The first worker of the
 * pool is the lead and keeps the evaluation cache between runs; see protocol.ts.
 */
/// <reference lib="webworker" />
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { createPlanHost } from './planHost.ts';
import type { ToWorker } from './protocol.ts';

const host = createPlanHost(solverEvaluator);
const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (e: MessageEvent<ToWorker>) => {
  for (const reply of host.handle(e.data)) scope.postMessage(reply);
};
