/**
 * A planning worker: the pure core runs here, off the window's thread. The first worker of the
 * pool is the lead and keeps the evaluation cache between runs; see protocol.ts.
 */
/// <reference lib="webworker" />
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { createPlanHost, workerLoop } from './planHost.ts';
import type { FromWorker, ToWorker } from './protocol.ts';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const loop = workerLoop(createPlanHost(solverEvaluator), {
  close: () => scope.close(),
  postMessage: (m: FromWorker) => scope.postMessage(m),
});

scope.onmessage = (e: MessageEvent<ToWorker>) => loop(e.data);
