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
  w.onerror = (e: ErrorEvent) => {
    e.preventDefault();
    handler?.({ type: 'error', message: `a planning worker stopped: ${e.message || 'unknown error'}` });
  };
  return {
    post: (msg) => w.postMessage(msg),
    onMessage: (h) => (handler = h),
    terminate: () => w.terminate(),
  };
}

export function startPool(): PlanWorker[] {
  const n = poolSize(typeof navigator === 'undefined' ? undefined : navigator.hardwareConcurrency);
  return Array.from({ length: n }, startWorker);
}
