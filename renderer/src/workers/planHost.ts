/**
 * What a planning worker does with each message, apart from the worker itself so that it can be
 * tested in Node: a synchronous handler over the pure core (enumeratePlan, evaluateDesign,
 * planSite). The evaluation cache lives here and so survives from one run to the next.
 */
import { builderFor } from '../../../core/antennas/registry.ts';
import type { Design } from '../../../core/antennas/types.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { evaluationModel } from '../../../core/antennas/conductors.ts';
import { Z0_OHM, type EvalGround, type Evaluator } from '../../../core/rank/evaluator.ts';
import { swrOf } from '../../../core/em/swr.ts';
import type { EvaluationRecord } from '../../../core/rank/evaluate.ts';
import { placeElements } from '../../../core/antennas/common.ts';
import { enumeratePlan, planFromSetup, type PlanSetup, type Shortlist } from '../../../core/rank/plan.ts';
import { placeXYZ, type XYZ } from '../../../core/site/geometry.ts';
import { measureTuning } from '../../../core/report/buildSheet.ts';
import { tuningProblem } from '../../../core/report/tuning.ts';
import type { CandidateDrawing, FromWorker, ToWorker } from './protocol.ts';
import { commitFault } from './testFault.ts';

/** What each shortlisted candidate looks like on the lot: its builder's elements, placed, and its feed point. */
export function drawingsOf(setup: PlanSetup, shortlist: Shortlist): Record<string, CandidateDrawing> {
  const out: Record<string, CandidateDrawing> = {};
  for (const c of shortlist.candidates) {
    const band = setup.bands.find((b) => b.band === c.band);
    const hit = band?.proposed.find(
      (q) =>
        (q.key === c.evaluationKey || q.withConductors?.key === c.evaluationKey) &&
        Math.abs(q.proposal.placement.rotationDeg - c.rotationDeg) < 1e-9 &&
        `${c.band}-${q.proposal.groupKey.replace(/:/g, '-')}` === c.id,
    );
    if (!hit) continue;
    const { design, placement } = hit.proposal;
    const builder = builderFor(design.type);
    const model = builder.model(design, c.trim.valueM);
    const feed = model.feeds[0];
    const w = feed ? model.wires[feed.wire] : undefined;
    let feedXYZ: XYZ | null = null;
    if (feed && w) {
      const t = feed.position;
      const local: XYZ = [
        w.from[0] + t * (w.to[0] - w.from[0]),
        w.from[1] + t * (w.to[1] - w.from[1]),
        w.from[2] + t * (w.to[2] - w.from[2]),
      ];
      feedXYZ = placeXYZ(local, placement.rotationDeg, placement.originXY);
    }
    out[c.id] = { elements: placeElements(builder.elements(design, c.trim.valueM), placement), feedXYZ };
  }
  return out;
}

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
  /** The last enumeration, reused by the rank of the same run. */
  let last: { runId: number; setup: PlanSetup } | null = null;

  function handle(msg: ToWorker): FromWorker[] {
    switch (msg.type) {
      case 'enumerate': {
        try {
          const setup = enumeratePlan(msg.project, { bands: msg.bands });
          last = { runId: msg.runId, setup };
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
          const record =
            cache.get(msg.job.key) ??
            evaluateDesign(msg.job.design, msg.job.ground, evaluator, msg.job.soilRange, msg.job.soilOnly);
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
          const setup =
            last?.runId === msg.runId ? last.setup : enumeratePlan(msg.project, { bands: msg.bands });
          // planSite is planFromSetup(enumeratePlan(...)); the setup of this run's enumeration is reused.
          const shortlist = planFromSetup(setup, msg.project, { evaluator, cache, bands: msg.bands });
          // Step 2 (placements near a metal support) ran here: keep those designs for sweeps.
          for (const j of setup.conductorJobs ?? [])
            designs.set(j.key, { design: j.design, ground: j.ground });
          shortlist.stats.evaluations = msg.evaluations;
          shortlist.stats.cacheHits = msg.cacheHits;
          const drawings = drawingsOf(setup, shortlist);
          return [{ type: 'ranked', runId: msg.runId, shortlist, drawings, ms: now() - t0 }];
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
          const model = evaluationModel(d.design, msg.trimM);
          const out = evaluator({ model, ground: d.ground, frequenciesHz: msg.freqsHz, pattern: null });
          const points = out.map((r) => ({
            freqHz: r.freqHz,
            zOhm: r.zOhm,
            swr: swrOf(r.zOhm[0], r.zOhm[1], Z0_OHM),
          }));
          return [{ type: 'swept', reqId: msg.reqId, points }];
        } catch (e) {
          return [{ type: 'error', reqId: msg.reqId, message: message(e) }];
        }
      }
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
