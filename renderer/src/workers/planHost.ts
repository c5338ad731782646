/**
 * What a planning worker does with each message, apart from the worker itself so that it can be
 * tested in Node: a synchronous handler over the pure core (enumeratePlan, evaluateDesign,
 * planSite). The evaluation cache lives here and so survives from one run to the next.
 */
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { evaluationModel } from '../../../core/antennas/conductors.ts';
import { Z0_OHM, type Evaluator } from '../../../core/rank/evaluator.ts';
import { swrOf } from '../../../core/em/swr.ts';
import type { EvaluationRecord } from '../../../core/rank/evaluate.ts';
import { enumeratePlan, planFromSetup, type PlanSetup } from '../../../core/rank/plan.ts';
import { DesignIndex, previewPlan } from '../../../core/rank/preview.ts';
import { feasibilityMemo } from '../../../core/site/feasibilityMemo.ts';
import { measureTuning } from '../../../core/report/buildSheet.ts';
import { tuningNotMeasured, tuningProblem } from '../../../core/report/tuning.ts';
import type { FromWorker, ToWorker } from './protocol.ts';
import { commitFault } from './testFault.ts';

export interface PlanHost {
  handle(msg: ToWorker): FromWorker[];
  /** Evaluations held in this worker's cache. */
  cacheSize(): number;
}

const message = (e: unknown): string => (e instanceof Error ? e.message : String(e));

/** Which request an error answers (its run, live preview, request or job). */
type ErrorAbout = Omit<Extract<FromWorker, { type: 'error' }>, 'type' | 'message'>;

/** What `work` answers or, when it throws, one error about the request saying why (in `words`). */
function answer(about: ErrorAbout, work: () => FromWorker[], words = (why: string) => why): FromWorker[] {
  try {
    return work();
  } catch (e) {
    return [{ type: 'error', ...about, message: words(message(e)) }];
  }
}

export function createPlanHost(evaluator: Evaluator, now: () => number = () => performance.now()): PlanHost {
  const cache = new Map<string, EvaluationRecord>();
  /** The last enumeration, reused by the rank of the same run. */
  let last: { runId: number; setup: PlanSetup } | null = null;
  /** The designs behind the cached evaluations, for the stand-ins of a live preview. */
  const designs = new DesignIndex();
  /**
   * Feasibility results kept across runs: a moved support changes only the placements that use it
   * (core/site/feasibilityMemo.ts), so a re-plan and a live preview check only those again.
   */
  const feasibility = feasibilityMemo().check;

  function handle(msg: ToWorker): FromWorker[] {
    switch (msg.type) {
      case 'enumerate':
        return answer({ runId: msg.runId }, () => {
          const setup = enumeratePlan(msg.project, { bands: msg.bands, feasibility });
          last = { runId: msg.runId, setup };
          for (const j of setup.jobs) designs.add(j);
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
        });
      case 'evaluate': {
        const t0 = now();
        return answer(
          { runId: msg.runId, key: msg.job.key },
          () => {
            const record =
              cache.get(msg.job.key) ??
              evaluateDesign(msg.job.design, msg.job.ground, evaluator, msg.job.soilRange, msg.job.soilOnly);
            cache.set(msg.job.key, record);
            designs.add(msg.job);
            return [{ type: 'evaluated', runId: msg.runId, key: msg.job.key, record, ms: now() - t0 }];
          },
          (why) => `the solver failed on a ${msg.job.design.type} (${msg.job.design.band}): ${why}`,
        );
      }
      case 'store':
        cache.set(msg.key, msg.record);
        return [];
      case 'preview': {
        const t0 = now();
        return answer({ liveId: msg.liveId }, () => {
          const setup = enumeratePlan(msg.project, { bands: msg.bands, feasibility });
          const out = previewPlan(setup, msg.project, cache, designs);
          const missing = setup.jobs.filter((j) => !cache.has(j.key));
          return [{ type: 'previewed', liveId: msg.liveId, ...out, missing, ms: now() - t0 }];
        });
      }
      case 'rank': {
        const t0 = now();
        return answer({ runId: msg.runId }, () => {
          const setup =
            last?.runId === msg.runId
              ? last.setup
              : enumeratePlan(msg.project, { bands: msg.bands, feasibility });
          // planSite is planFromSetup(enumeratePlan(...)); the setup of this run's enumeration is reused.
          const shortlist = planFromSetup(setup, msg.project, { evaluator, cache, bands: msg.bands });
          shortlist.stats.evaluations = msg.evaluations;
          shortlist.stats.cacheHits = msg.cacheHits;
          return [{ type: 'ranked', runId: msg.runId, shortlist, ms: now() - t0 }];
        });
      }
      case 'sweep':
        return answer({ reqId: msg.reqId }, () => {
          // The candidate carries its design (with the metal near it, if any) and the plan's ground.
          const model = evaluationModel(msg.design, msg.trimM);
          const out = evaluator({ model, ground: msg.ground, frequenciesHz: msg.freqsHz, pattern: null });
          const points = out.map((r) => ({
            freqHz: r.freqHz,
            zOhm: r.zOhm,
            swr: swrOf(r.zOhm[0], r.zOhm[1], Z0_OHM),
          }));
          return [{ type: 'swept', reqId: msg.reqId, points }];
        });
      case 'tune': {
        const c = msg.candidate;
        const fail = (why: string): FromWorker[] => [
          {
            type: 'error',
            reqId: msg.reqId,
            message: `the tuning rate of #${c.rank} could not be measured: ${why}`,
          },
        ];
        try {
          // The candidate carries its design; the ground is the plan's (the project's soil).
          const d = { design: c.design, ground: msg.project.soil };
          const none = tuningNotMeasured(d.design);
          if (none) return fail(none);
          const tuning = measureTuning(d.design, c.trim.valueM, d.ground, evaluator);
          const problem = tuningProblem(tuning, d.design.designFreqHz);
          if (problem) return fail(problem);
          return [{ type: 'tuned', reqId: msg.reqId, tuning }];
        } catch (e) {
          return fail(`the solver failed (${message(e)})`);
        }
      }
    }
  }

  return { handle, cacheSize: () => cache.size };
}

/**
 * A worker's message loop over its host: each message answered in turn, except an evaluation
 * that carries a test fault (only tests send one), which the worker commits instead once due.
 */
export function workerLoop(
  host: PlanHost,
  scope: { close(): void; postMessage(msg: FromWorker): void },
): (msg: ToWorker) => void {
  let faulted = 0;
  return (msg) => {
    if (msg.type === 'evaluate' && msg.testFault) {
      if (commitFault(msg.testFault, faulted++, scope) === 'silent') return;
    }
    for (const reply of host.handle(msg)) scope.postMessage(reply);
  };
}
