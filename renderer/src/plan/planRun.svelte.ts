/**
 * Running a plan from the window: the lead worker enumerates the jobs its cache lacks, every
 * worker evaluates them one at a time (the next job goes to whichever worker is free), the lead
 * keeps every result and ranks. Cancelling stops handing out jobs at once; the few in flight
 * finish and stay cached, so the next run starts where this one stopped.
 *
 * A worker that fails (an uncaught error, an unreadable message, or silence: no answer to work
 * handed out for `stallMs`) ends the run with an error in words, and every worker of the pool is
 * stopped; the next run starts a fresh pool. The project is never touched by a run.
 */
import type { Candidate, Job, Shortlist } from '../../../core/rank/plan.ts';
import type { TuningMeasurement } from '../../../core/report/buildSheet.ts';
import type { Band, Project } from '../../../core/project/schema.ts';
import type { Design } from '../../../core/antennas/types.ts';
import type { EvalGround } from '../../../core/rank/evaluator.ts';
import type { FromWorker, SweepPoint, TestFault } from '../workers/protocol.ts';
import type { PlanWorker } from '../workers/pool.ts';
import { takeTestFault } from '../workers/testFault.ts';
import { LiveQueue } from './liveQueue.ts';

/** How long the runner waits on workers that hold work and say nothing, by default (ms). */
export const DEFAULT_STALL_MS = 180_000;

export interface RunnerOptions {
  /** How long work handed out may go unanswered before the pool counts as failed, ms. */
  stallMs?: number;
  /** Where a test fault comes from (tests only; see testFault.ts). */
  testFault?: () => TestFault | null;
  /** Called with every new shortlist a run makes (to keep it), with what it was made for. */
  onShortlist?: (shortlist: Shortlist, madeFor: { project: Project; bands: Band[] }) => void;
}

/** The words of a worker failure, as shown in the run bar. */
export const workerFailure = (why: string): string =>
  `a planning worker failed: ${why}; the project is unchanged; run again`;

/** The tuning rate of one shortlisted candidate, as far as it is known. */
export type TuningState =
  | { status: 'measuring' }
  | { status: 'ok'; measurement: TuningMeasurement }
  | { status: 'error'; message: string };

/** A request to the lead worker awaiting its answer. */
type Pending =
  | { kind: 'sweep'; resolve: (p: SweepPoint[]) => void; reject: (e: Error) => void }
  | { kind: 'tune'; resolve: (t: TuningMeasurement) => void; reject: (e: Error) => void };

/** What a plan is made for: the project (as it was, or as it would be at a drag's position) and the bands. */
export interface MadeFor {
  project: Project;
  bands: Band[];
}

/**
 * The provisional shortlist of a drag in progress (live re-ranking), never kept as the project's
 * plan. `following`: the drag has moved on since this result (the worker is on a newer position);
 * `settling`: the drag ended and the exact plan of the final position is running.
 */
export interface LiveView {
  shortlist: Shortlist;
  madeFor: MadeFor;
  /** Placements ranked with a similar design's evaluation, and placements left out. */
  borrowed: number;
  leftOut: number;
  /** How long the lead worker took for this result, ms. */
  ms: number;
  following: boolean;
  settling: boolean;
  /** The last live re-plan that failed, in words (the shown result stays). */
  error: string | null;
}

export type RunStatus = 'idle' | 'enumerating' | 'evaluating' | 'ranking' | 'done' | 'cancelled' | 'error';

interface Run {
  id: number;
  project: Project;
  bands: Band[];
  queue: Job[];
  pending: Set<string>;
  cached: number;
  evaluations: number;
  startedAt: number;
  testFault: TestFault | null;
}

export class PlanRunner {
  status = $state<RunStatus>('idle');
  /** Jobs finished and jobs to do in this run (cached ones are not counted). */
  done = $state(0);
  total = $state(0);
  /** Evaluations this run took from the cache. */
  cached = $state(0);
  shortlist = $state.raw<Shortlist | null>(null);
  /** The project and bands the shown shortlist was made for. */
  madeFor = $state.raw<{ project: Project; bands: Band[] } | null>(null);
  error = $state<string | null>(null);
  elapsedMs = $state(0);
  workerCount = $state(0);
  /**
   * Tuning rates of the shown shortlist's candidates, by candidate id (requestTuning); emptied
   * when a new plan replaces the shortlist.
   */
  tunings = $state.raw<Record<string, TuningState>>({});
  /** While something is dragged with a plan shown: the provisional shortlist (see LiveView). */
  live = $state.raw<LiveView | null>(null);

  running = $derived(
    this.status === 'enumerating' || this.status === 'evaluating' || this.status === 'ranking',
  );
  fraction = $derived(
    this.status === 'done' ? 1 : this.total > 0 ? this.done / this.total : this.status === 'ranking' ? 1 : 0,
  );

  #start: () => PlanWorker[];
  #now: () => number;
  #workers: PlanWorker[] = [];
  // eslint-disable-next-line svelte/prefer-svelte-reactivity -- bookkeeping, never rendered
  #busy = new Map<PlanWorker, string | null>();
  #run: Run | null = null;
  #runSeq = 0;
  #reqSeq = 0;
  // eslint-disable-next-line svelte/prefer-svelte-reactivity -- bookkeeping, never rendered
  #requests = new Map<number, Pending>();
  /** The tuning promises behind `tunings`, by candidate id; and which shortlist they belong to. */
  // eslint-disable-next-line svelte/prefer-svelte-reactivity -- bookkeeping, never rendered
  #tuneWaits = new Map<string, Promise<TuningMeasurement>>();
  #shortlistSeq = 0;
  readonly #liveQueue = new LiveQueue<MadeFor>((ask) =>
    this.#lead().post({ type: 'preview', liveId: ask.seq, project: ask.what.project, bands: ask.what.bands }),
  );
  /** Designs the shown drag position lacks, solved while the drag rests (#warmNext). */
  #warm: Job[] = [];
  /** The run that settles a drag: its plan replaces the provisional one. */
  #settleRun = 0;

  #stallMs: number;
  #takeFault: () => TestFault | null;
  #onShortlist: RunnerOptions['onShortlist'];
  #watchdog: ReturnType<typeof setTimeout> | null = null;

  constructor(
    start: () => PlanWorker[],
    now: () => number = () => performance.now(),
    options: RunnerOptions = {},
  ) {
    this.#start = start;
    this.#now = now;
    this.#stallMs = options.stallMs ?? DEFAULT_STALL_MS;
    this.#takeFault = options.testFault ?? (() => takeTestFault());
    this.#onShortlist = options.onShortlist;
  }

  #lead(): PlanWorker {
    if (this.#workers.length === 0) {
      this.#workers = this.#start();
      this.workerCount = this.#workers.length;
      for (const w of this.#workers) {
        this.#busy.set(w, null);
        w.onMessage((m) => {
          // A worker of a pool already stopped says nothing more that counts.
          if (this.#busy.has(w)) this.#receive(w, m);
        });
      }
    }
    return this.#workers[0]!;
  }

  /** Start a plan for these bands; a run in progress is cancelled first. */
  run(project: Project, bands: Band[]): void {
    if (this.running) this.cancel();
    this.#dropLive();
    this.#begin(project, bands);
  }

  #begin(project: Project, bands: Band[]): number {
    const lead = this.#lead();
    const id = ++this.#runSeq;
    const testFault = this.#takeFault();
    this.#run = {
      id,
      project,
      bands,
      queue: [],
      // eslint-disable-next-line svelte/prefer-svelte-reactivity -- bookkeeping, never rendered
      pending: new Set(),
      cached: 0,
      evaluations: 0,
      startedAt: this.#now(),
      testFault,
    };
    this.status = 'enumerating';
    this.error = null;
    this.done = 0;
    this.total = 0;
    this.cached = 0;
    this.elapsedMs = 0;
    lead.post({ type: 'enumerate', runId: id, project, bands });
    this.#arm();
    return id;
  }

  /** Stop handing out work; what is in flight finishes into the cache. A settling drag shows the kept plan again. */
  cancel(): void {
    if (this.live?.settling) this.#dropLive();
    this.#stopRun();
  }

  #stopRun(): void {
    if (!this.running || !this.#run) return;
    this.#run = null;
    this.status = 'cancelled';
    // Jobs in flight may finish into the cache; the watchdog still waits on them.
    this.#arm();
  }

  /**
   * A position of a drag: re-rank the project as it would be there, provisionally (no solver
   * work; see core/rank/preview.ts). Only the newest position waits while the lead worker is busy,
   * and an answer older than the one shown is dropped. A run in progress is cancelled (the drag's
   * end starts the exact one).
   */
  preview(project: Project, bands: Band[]): void {
    this.#stopRun();
    this.#settleRun = 0;
    if (this.live) this.live = { ...this.live, following: true, settling: false };
    this.#liveQueue.move({ project, bands });
    this.#arm();
  }

  /**
   * The drag ended. With the final project: run the exact plan; the provisional shortlist stays
   * (marked settling) until its result replaces it. Without (nothing moved): show the kept plan again.
   */
  settle(final: MadeFor | null): void {
    this.#liveQueue.end();
    if (!final || !this.live) {
      this.#dropLive();
      if (final) this.run(final.project, final.bands);
      return;
    }
    this.live = { ...this.live, following: false, settling: true };
    this.#settleRun = this.#begin(final.project, final.bands);
  }

  /** True from a drag's first position until its end is settled (not reactive). */
  get liveActive(): boolean {
    return this.#liveQueue.active || this.live !== null;
  }

  /**
   * While the drag rests (no newer position waiting), the lead worker solves the designs the shown
   * position lacks, one at a time, into its cache: a newer position waits for one solve at most,
   * and the exact plan at the drag's end finds them done.
   */
  #warmNext(): void {
    const lead = this.#workers[0];
    if (!lead || this.#run || !this.#liveQueue.active || this.#liveQueue.busy) return;
    if (this.#busy.get(lead) !== null) return;
    const job = this.#warm.shift();
    if (!job) return;
    this.#busy.set(lead, job.key);
    lead.post({ type: 'evaluate', runId: 0, job });
  }

  #dropLive(): void {
    this.#warm = [];
    this.#liveQueue.end();
    this.live = null;
    this.#settleRun = 0;
  }

  /** Show no plan: a run in progress is cancelled and the shown shortlist dropped. */
  clear(): void {
    this.cancel();
    this.#dropLive();
    this.#setShortlist(null, null);
    this.status = 'idle';
    this.error = null;
  }

  /** Show a plan made before (kept in the store): nothing runs. */
  restore(shortlist: Shortlist, madeFor: { project: Project; bands: Band[] }): void {
    this.cancel();
    this.#dropLive();
    this.#setShortlist(shortlist, madeFor);
    this.status = 'done';
    this.error = null;
  }

  #setShortlist(shortlist: Shortlist | null, madeFor: { project: Project; bands: Band[] } | null): void {
    this.shortlist = shortlist;
    this.#shortlistSeq++;
    this.#tuneWaits.clear();
    this.tunings = {};
    this.madeFor = madeFor;
  }

  /**
   * Feed impedance of a shortlisted candidate's design (as it carries it) across frequencies,
   * over the plan's ground, from the lead worker's solver.
   */
  sweep(design: Design, ground: EvalGround, trimM: number, freqsHz: number[]): Promise<SweepPoint[]> {
    const lead = this.#lead();
    const reqId = ++this.#reqSeq;
    return new Promise((resolve, reject) => {
      this.#requests.set(reqId, { kind: 'sweep', resolve, reject });
      lead.post({ type: 'sweep', reqId, design, ground, trimM, freqsHz });
      this.#arm();
    });
  }

  /**
   * The tuning rate of a shortlisted candidate, measured by the lead worker's field solver over
   * the ground its plan used (about a second with the exact ground). `project` defaults to the
   * project the shown shortlist was made for. Rejects with the reason in words.
   */
  tune(
    candidate: Candidate,
    project: Project | null = this.madeFor?.project ?? null,
  ): Promise<TuningMeasurement> {
    if (!project) return Promise.reject(new Error('there is no plan to measure: run the plan first'));
    const lead = this.#lead();
    const reqId = ++this.#reqSeq;
    return new Promise((resolve, reject) => {
      this.#requests.set(reqId, { kind: 'tune', resolve, reject });
      lead.post({ type: 'tune', reqId, project, candidate: $state.snapshot(candidate) as Candidate });
      this.#arm();
    });
  }

  /**
   * Measure a shown candidate's tuning rate once and keep it in `tunings` (a failed one is tried
   * again). Resolves with the measurement; what comes back after a new plan replaced the
   * shortlist is not kept.
   */
  requestTuning(candidate: Candidate): Promise<TuningMeasurement> {
    const id = candidate.id;
    const have = this.#tuneWaits.get(id);
    if (have && this.tunings[id]?.status !== 'error') return have;
    const seq = this.#shortlistSeq;
    const set = (t: TuningState): void => {
      if (seq === this.#shortlistSeq) this.tunings = { ...this.tunings, [id]: t };
    };
    const p = this.tune(candidate);
    this.#tuneWaits.set(id, p);
    set({ status: 'measuring' });
    p.then(
      (measurement) => set({ status: 'ok', measurement }),
      (e: Error) => set({ status: 'error', message: e.message }),
    );
    return p;
  }

  /** What is known of a candidate's tuning rate, by candidate id. */
  tuningOf(id: string): TuningState | null {
    return this.tunings[id] ?? null;
  }

  /** The measured tuning rate of a candidate, by id, for the build sheet; null until measured. */
  measuredTuning(id: string): TuningMeasurement | null {
    const t = this.tunings[id];
    return t?.status === 'ok' ? t.measurement : null;
  }

  dispose(): void {
    this.#dropLive();
    this.#stopPool();
    this.#run = null;
    if (this.running) this.status = 'cancelled';
    this.#rejectRequests('the plan was closed');
  }

  #stopPool(): void {
    this.#liveQueue.reset();
    for (const w of this.#workers) w.terminate();
    this.#workers = [];
    this.#busy.clear();
    this.workerCount = 0;
    if (this.#watchdog !== null) clearTimeout(this.#watchdog);
    this.#watchdog = null;
  }

  #rejectRequests(message: string): void {
    const pending = [...this.#requests.values()];
    this.#requests.clear();
    for (const r of pending) r.reject(new Error(message));
  }

  /** The request waiting on this answer, taken off the list. */
  #take(reqId: number): Pending | undefined {
    const r = this.#requests.get(reqId);
    this.#requests.delete(reqId);
    return r;
  }

  /** True while some worker owes an answer: a run, a job of a cancelled run, a sweep or a tuning. */
  #owed(): boolean {
    if (this.#run || this.#requests.size > 0 || this.#liveQueue.busy) return true;
    for (const k of this.#busy.values()) if (k !== null) return true;
    return false;
  }

  /** (Re)start the wait for the next answer, or stop waiting when nothing is owed. */
  #arm(): void {
    if (this.#watchdog !== null) clearTimeout(this.#watchdog);
    this.#watchdog = null;
    if (!this.#owed()) return;
    const ms = this.#run?.testFault?.stallMs ?? this.#stallMs;
    this.#watchdog = setTimeout(() => {
      this.#watchdog = null;
      this.#fail(`no answer for ${Math.round(ms / 100) / 10} s`);
    }, ms);
  }

  /**
   * A worker failed: stop every worker (what they held is lost; the project is not touched), end
   * the run with the reason in words, and fail the sweeps and tunings waiting on the lead.
   */
  #fail(why: string): void {
    const message = workerFailure(why);
    const hadRun = this.#run !== null;
    this.#dropLive();
    this.#stopPool();
    this.#run = null;
    if (hadRun) {
      this.error = message;
      this.status = 'error';
    }
    this.#rejectRequests(message);
  }

  #dispatch(): void {
    const run = this.#run;
    if (!run) return;
    for (const w of this.#workers) {
      if (this.#busy.get(w) !== null) continue;
      const job = run.queue.shift();
      if (!job) return;
      this.#busy.set(w, job.key);
      w.post(
        run.testFault
          ? { type: 'evaluate', runId: run.id, job, testFault: run.testFault }
          : { type: 'evaluate', runId: run.id, job },
      );
    }
  }

  #inFlight(key: string): boolean {
    for (const k of this.#busy.values()) if (k === key) return true;
    return false;
  }

  #rank(run: Run): void {
    this.status = 'ranking';
    this.#lead().post({
      type: 'rank',
      runId: run.id,
      project: run.project,
      bands: run.bands,
      evaluations: run.evaluations,
      cacheHits: run.cached,
    });
  }

  #receive(w: PlanWorker, m: FromWorker): void {
    this.#handle(w, m);
    if (this.#workers.length > 0) this.#arm();
  }

  #handle(w: PlanWorker, m: FromWorker): void {
    const run = this.#run;
    if (run) this.elapsedMs = this.#now() - run.startedAt;
    switch (m.type) {
      case 'enumerated': {
        if (!run || m.runId !== run.id) return;
        run.cached = m.cached;
        // eslint-disable-next-line svelte/prefer-svelte-reactivity -- bookkeeping, never rendered
        run.pending = new Set(m.missing.map((j) => j.key));
        run.queue = m.missing.filter((j) => !this.#inFlight(j.key));
        this.cached = m.cached;
        this.total = m.missing.length;
        if (run.pending.size === 0) return this.#rank(run);
        this.status = 'evaluating';
        return this.#dispatch();
      }
      case 'evaluated': {
        this.#busy.set(w, null);
        // Every result is kept by the lead, whichever run asked for it.
        if (w !== this.#workers[0]) this.#workers[0]?.post({ type: 'store', key: m.key, record: m.record });
        if (run && run.pending.delete(m.key)) {
          run.evaluations++;
          this.done = run.evaluations;
          if (run.pending.size === 0) return this.#rank(run);
        }
        if (!run) return this.#warmNext();
        return this.#dispatch();
      }
      case 'ranked': {
        if (!run || m.runId !== run.id) return;
        const madeFor = { project: run.project, bands: run.bands };
        this.#setShortlist(m.shortlist, madeFor);
        this.#dropLive();
        this.status = 'done';
        this.#run = null;
        this.#onShortlist?.(m.shortlist, madeFor);
        return;
      }
      case 'previewed': {
        const asked = this.#liveQueue.answer(m.liveId);
        if (!asked) return;
        const { shortlist, borrowed, leftOut, ms } = m;
        this.#warm = m.missing;
        this.#warmNext();
        const following = this.#liveQueue.following;
        this.live = {
          shortlist,
          madeFor: asked,
          borrowed,
          leftOut,
          ms,
          following,
          settling: false,
          error: null,
        };
        return;
      }
      case 'swept': {
        const r = this.#take(m.reqId);
        if (r?.kind === 'sweep') r.resolve(m.points);
        else r?.reject(new Error('the lead worker answered a tuning request with a sweep'));
        return;
      }
      case 'tuned': {
        const r = this.#take(m.reqId);
        if (r?.kind === 'tune') r.resolve(m.tuning);
        else r?.reject(new Error('the lead worker answered a sweep request with a tuning rate'));
        return;
      }
      case 'error': {
        if (m.liveId !== undefined) {
          if (this.#liveQueue.answer(m.liveId) && this.live) this.live = { ...this.live, error: m.message };
          return;
        }
        if (m.reqId !== undefined) {
          this.#take(m.reqId)?.reject(new Error(m.message));
          return;
        }
        if (m.key !== undefined) this.#busy.set(w, null);
        if (!run || (m.runId !== undefined && m.runId !== run.id)) return;
        if (run.id === this.#settleRun) this.#dropLive();
        this.error = m.message;
        this.status = 'error';
        this.#run = null;
        return;
      }
      case 'crashed':
        return this.#fail(m.message);
      default:
        return this.#fail(`it sent a message the window does not know (${describe(m)})`);
    }
  }
}

function describe(m: unknown): string {
  const t = typeof m === 'object' && m !== null ? (m as { type?: unknown }).type : undefined;
  return typeof t === 'string' ? `"${t.slice(0, 40)}"` : typeof m;
}
