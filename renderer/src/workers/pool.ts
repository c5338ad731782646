/**
 * The pool of planning workers: module workers built from plan.worker.ts (the bundler turns the
 * URL into the worker's own chunk, in the browser and in the Electron window alike).
 */
import type { FromWorker, ToWorker } from './protocol.ts';

/** What the runner needs of a worker (a real Worker, or a stand-in in tests). */
export interface PlanWorker {
  post(msg: ToWorker): void;
  onMessage(handler: (msg: FromWorker) => void): void;
  terminate(): void;
}

/** Workers to start: one per core, less one for the window, at least one, at most eight. */
export function poolSize(cores: number | undefined): number {
  return Math.max(1, Math.min(8, (cores ?? 2) - 1));
}

export function startWorker(): PlanWorker {
  const w = new Worker(new URL('./plan.worker.ts', import.meta.url), {
    type: 'module',
    name: 'yardwire-plan',
  });
  let handler: ((msg: FromWorker) => void) | null = null;
  w.onmessage = (e: MessageEvent<FromWorker>) => handler?.(e.data);
  // An uncaught error in the worker (or a worker that could not start): the runner ends the run
  // and stops the pool. Handled here, so the window does not report it a second time.
  w.onerror = (e: ErrorEvent) => {
    e.preventDefault();
    handler?.({ type: 'crashed', message: e.message || 'it stopped with an unknown error' });
  };
  w.onmessageerror = () => handler?.({ type: 'crashed', message: 'one of its messages could not be read' });
  return {
    post: (msg) => w.postMessage(msg),
    onMessage: (h) => (handler = h),
    terminate: () => {
      handler = null;
      w.terminate();
    },
  };
}

export function startPool(): PlanWorker[] {
  const n = poolSize(typeof navigator === 'undefined' ? undefined : navigator.hardwareConcurrency);
  return Array.from({ length: n }, startWorker);
}
