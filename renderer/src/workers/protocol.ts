/**
 * Messages between the renderer and its planning workers. One worker, the lead, keeps the
 * evaluation cache between runs, enumerates the candidates and ranks them with the core's
 * planSite; every worker in the pool (the lead included) evaluates single designs, so a run uses
 * every core the machine offers and the window never waits on the solver.
 */
import type { EvaluationRecord } from '../../../core/rank/evaluate.ts';
import type { Candidate, Job, Shortlist } from '../../../core/rank/plan.ts';
import type { TuningMeasurement } from '../../../core/report/buildSheet.ts';
import type { Band, Project } from '../../../core/project/schema.ts';
import type { Design } from '../../../core/antennas/types.ts';
import type { EvalGround } from '../../../core/rank/evaluator.ts';

export type ToWorker =
  /** Lead: build the site and the jobs; answer with the jobs missing from the cache. */
  | { type: 'enumerate'; runId: number; project: Project; bands: Band[] }
  /**
   * Any worker: trim, sweep and pattern of one design. `testFault` is set only by tests (see
   * testFault.ts); the worker then fails on purpose instead of answering.
   */
  | { type: 'evaluate'; runId: number; job: Job; testFault?: TestFault }
  /** Lead: keep an evaluation made by another worker. */
  | { type: 'store'; key: string; record: EvaluationRecord }
  /**
   * Lead: a provisional shortlist for a position of a drag (live re-ranking): ranked with the
   * cached evaluations only, similar designs standing in for missing ones (core/rank/preview.ts).
   */
  | { type: 'preview'; liveId: number; project: Project; bands: Band[] }
  /** Lead: rank with every job in the cache (planSite evaluates nothing then). */
  | { type: 'rank'; runId: number; project: Project; bands: Band[]; evaluations: number; cacheHits: number }
  /**
   * Lead: feed impedance of a shortlisted candidate's design (as the candidate carries it) over
   * the plan's ground at these frequencies (for the SWR curve).
   */
  | { type: 'sweep'; reqId: number; design: Design; ground: EvalGround; trimM: number; freqsHz: number[] }
  /**
   * Lead: the tuning rate of a shortlisted candidate (measureTuning at its trimmed length, over
   * the ground its plan used). `project` is the one the shortlist was made for: with it the lead
   * finds the design again when it has not enumerated it itself (a fresh pool after a failure).
   */
  | { type: 'tune'; reqId: number; project: Project; candidate: Candidate };

/**
 * A fault a test asks a worker to commit on purpose, after it has evaluated `afterEvaluations`
 * designs of runs that carry the fault: throw out of its message handler (an error event), close
 * itself (no answer ever comes), or keep quiet while staying alive (no answer ever comes).
 */
export interface TestFault {
  kind: 'throw' | 'close' | 'hang';
  afterEvaluations: number;
  /** How long the runner waits on a silent worker in this run, ms (tests shorten it). */
  stallMs?: number;
}

export interface SweepPoint {
  freqHz: number;
  zOhm: [number, number];
  swr: number;
}

export type FromWorker =
  | { type: 'enumerated'; runId: number; missing: Job[]; cached: number; total: number }
  | { type: 'evaluated'; runId: number; key: string; record: EvaluationRecord; ms: number }
  | { type: 'ranked'; runId: number; shortlist: Shortlist; ms: number }
  | {
      type: 'previewed';
      liveId: number;
      shortlist: Shortlist;
      borrowed: number;
      leftOut: number;
      /** The designs of this position not yet solved (the runner has them solved while the drag rests). */
      missing: Job[];
      ms: number;
    }
  | { type: 'swept'; reqId: number; points: SweepPoint[] }
  | { type: 'tuned'; reqId: number; tuning: TuningMeasurement }
  | { type: 'error'; runId?: number; reqId?: number; liveId?: number; key?: string; message: string }
  /**
   * Not sent by a worker: what the pool reports when a worker itself failed (an uncaught error,
   * a message that could not be read). The runner ends the run and stops the pool.
   */
  | { type: 'crashed'; message: string };
