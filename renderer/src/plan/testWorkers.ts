/**
 * For tests: stand-in plan workers that run the real planning host (core enumerate, trim, rank)
 * in this thread over a given evaluator, and a wait for a condition.
 */
import type { Evaluator } from '../../../core/rank/evaluator.ts';
import { createPlanHost } from '../workers/planHost.ts';
import type { PlanWorker } from '../workers/pool.ts';
import type { FromWorker, ToWorker } from '../workers/protocol.ts';

export interface HostWorker extends PlanWorker {
  /** Messages posted to this worker, by type. */
  posted: Partial<Record<ToWorker['type'], number>>;
}

/**
 * `n` workers over `evaluator`. Each answers a message after `delayMs`, passing it and its replies
 * through structured clones as a real worker boundary would; `onPost` sees every message posted.
 * A terminated worker drops its replies.
 */
export function hostWorkers(
  n: number,
  evaluator: Evaluator,
  opts: { delayMs?: number; onPost?: (msg: ToWorker) => void } = {},
): HostWorker[] {
  return Array.from({ length: n }, () => {
    const host = createPlanHost(evaluator, () => 0);
    let handler: ((m: FromWorker) => void) | null = null;
    const w: HostWorker = {
      posted: {},
      post(msg: ToWorker) {
        w.posted[msg.type] = (w.posted[msg.type] ?? 0) + 1;
        opts.onPost?.(msg);
        setTimeout(() => {
          for (const r of host.handle(structuredClone(msg))) handler?.(structuredClone(r));
        }, opts.delayMs ?? 0);
      },
      onMessage: (h) => (handler = h),
      terminate: () => (handler = null),
    };
    return w;
  });
}

/** Waits until `check()` holds, looking every millisecond; fails after `ms`. */
export async function until(check: () => boolean, ms = 20_000): Promise<void> {
  const t0 = Date.now();
  while (!check()) {
    if (Date.now() - t0 > ms) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 1));
  }
}
