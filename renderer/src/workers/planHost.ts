/**
 * What a planning worker does with each message, apart from the worker itself so that it can be
 * tested in Node: a synchronous handler over the pure core (enumeratePlan, evaluateDesign,
 * planSite). The evaluation cache lives here and so survives from one run to the next.
 */
import { builderFor } from '../../../core/antennas/registry.ts';
import type { Design } from '../../../core/antennas/types.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { swrOf, type EvalGround, type Evaluator } from '../../../core/rank/evaluator.ts';
import type { EvaluationRecord } from '../../../core/rank/evaluate.ts';
import { enumeratePlan, planSite } from '../../../core/rank/plan.ts';
import type { FromWorker, ToWorker } from './protocol.ts';

export interface PlanHost {
  handle(msg: ToWorker): FromWorker[];
  /** Evaluations held in this worker's cache. */
  cacheSize(): number;
}

const message = (e: unknown): string => (e instanceof Error ? e.message : String(e));

export function createPlanHost(evaluator: Evaluator, now: () => number = () => performance.now()): PlanHost {
  const cache = new Map<string, EvaluationRecord>();
  /** Designs seen by enumeration, by evaluation key, for later sweeps. */
  const designs = new Map<string, { design: Design; ground: EvalGround }>();

  function handle(msg: ToWorker): FromWorker[] {
    switch (msg.type) {
      case 'enumerate': {
        try {
          const setup = enumeratePlan(msg.project, { bands: msg.bands });
          for (const j of setup.jobs) designs.set(j.key, { design: j.design, ground: j.ground });
          const missing = setup.jobs.filter((j) => !cache.has(j.key));
          return [
            {
              type: 'enumerated',
              runId: msg.runId,
              missing,
              cached: setup.jobs.length - missing.length,
              total: setup.jobs.length,
            },
          ];
        } catch (e) {
          return [{ type: 'error', runId: msg.runId, message: message(e) }];
        }
      }
      case 'evaluate': {
        const t0 = now();
        try {
          const record = cache.get(msg.job.key) ?? evaluateDesign(msg.job.design, msg.job.ground, evaluator);
          cache.set(msg.job.key, record);
          return [{ type: 'evaluated', runId: msg.runId, key: msg.job.key, record, ms: now() - t0 }];
        } catch (e) {
          return [
            {
              type: 'error',
              runId: msg.runId,
              key: msg.job.key,
              message: `the solver failed on a ${msg.job.design.type} (${msg.job.design.band}): ${message(e)}`,
            },
          ];
        }
      }
      case 'store':
        cache.set(msg.key, msg.record);
        return [];
      case 'rank': {
        const t0 = now();
        try {
          const shortlist = planSite(msg.project, { evaluator, cache, bands: msg.bands });
          shortlist.stats.evaluations = msg.evaluations;
          shortlist.stats.cacheHits = msg.cacheHits;
          return [{ type: 'ranked', runId: msg.runId, shortlist, ms: now() - t0 }];
        } catch (e) {
          return [{ type: 'error', runId: msg.runId, message: message(e) }];
        }
      }
      case 'sweep': {
        const d = designs.get(msg.evaluationKey);
        if (!d)
          return [
            { type: 'error', reqId: msg.reqId, message: 'this candidate is from an older plan: run again' },
          ];
        try {
          const model = builderFor(d.design.type).model(d.design, msg.trimM);
          const out = evaluator({ model, ground: d.ground, frequenciesHz: msg.freqsHz, pattern: null });
          const points = out.map((r) => ({ freqHz: r.freqHz, zOhm: r.zOhm, swr: swrOf(r.zOhm) }));
          return [{ type: 'swept', reqId: msg.reqId, points }];
        } catch (e) {
          return [{ type: 'error', reqId: msg.reqId, message: message(e) }];
        }
      }
    }
  }

  return { handle, cacheSize: () => cache.size };
}
