/**
 * The planning workflow of the open project: its targets, the bands, the runner over the
 * workers, and what the planning views show (open tab, selected and compared candidates, the
 * sort, the elevation of the azimuth plot, the SWR sweeps fetched so far).
 *
 * A plan belongs to its project and is kept: each finished plan goes to the store with the hash
 * of the inputs that made it (core/rank/planInputs.ts), and opening a project brings its last
 * plan back with the selected and compared candidates. Nothing of one project's plan is shown
 * inside another: `candidates` is empty unless the plan is the open project's.
 */
import type { PlanRecord, PlanView, StoredPlan } from '../../../core/api/contract.ts';
import type { Band, Project } from '../../../core/project/schema.ts';
import { BANDS } from '../../../core/project/schema.ts';
import type { Candidate } from '../../../core/rank/plan.ts';
import {
  changedPlanInputs,
  describePlanChanges,
  planInputsHash,
  type PlanInputPart,
  type PlanInputsHash,
} from '../../../core/rank/planInputs.ts';
import type { ProjectState } from '../state/project.svelte.ts';
import { TargetsState } from '../targets/targets.svelte.ts';
import { sweepFrequenciesHz } from '../plots/patternData.ts';
import type { PlanWorker } from '../workers/pool.ts';
import type { SweepPoint } from '../workers/protocol.ts';
import { PlanRunner } from './planRun.svelte.ts';
import { sortCandidates, nextSort, type SortKey, type SortState } from './shortlistTable.ts';

export type PlanTab = 'targets' | 'shortlist' | 'compare' | 'rejected';

export type SweepResult =
  { status: 'loading' } | { status: 'ok'; points: SweepPoint[] } | { status: 'error'; message: string };

/** Where plans are kept (the store, through the API); tests give a stand-in or none. */
export interface PlanKeeper {
  load(projectId: string): Promise<StoredPlan | null>;
  save(projectId: string, plan: PlanRecord, view: PlanView): Promise<void>;
  setView(projectId: string, view: PlanView): Promise<void>;
}

export class Planning {
  readonly targets: TargetsState;
  readonly runner: PlanRunner;
  #doc: ProjectState;
  #keeper: PlanKeeper | null;
  /** Counts project switches, so that a plan loaded late for a project no longer open is dropped. */
  #openSeq = 0;
  /** The hash of the inputs of the shown plan. */
  madeWith = $state.raw<PlanInputsHash | null>(null);
  /** When the shown plan was kept, if it was brought back from the store (null for a plan run now). */
  keptAt = $state<string | null>(null);
  /** While the open project's kept plan is being read. */
  restoring = $state(false);

  tab = $state<PlanTab>('targets');
  open = $state(true);
  selectedId = $state<string | null>(null);
  compareId = $state<string | null>(null);
  sort = $state.raw<SortState>({ key: 'rank', dir: 1 });
  /** Elevation of the azimuth plot, degrees; null follows the selected candidate's first target. */
  elevationDeg = $state<number | null>(null);
  /** What the elevation plot cuts toward: a target id, or 'peak' for the peak bearing. */
  cutToward = $state<string>('');
  sweeps = $state.raw<Record<string, SweepResult>>({});

  constructor(doc: ProjectState, start: () => PlanWorker[], keeper: PlanKeeper | null = null) {
    this.#doc = doc;
    this.#keeper = keeper;
    this.targets = new TargetsState(doc);
    this.runner = new PlanRunner(start, undefined, {
      onShortlist: (shortlist, madeFor) => {
        const inputs = planInputsHash(madeFor.project, madeFor.bands);
        this.madeWith = inputs;
        this.keptAt = null;
        const id = madeFor.project.id;
        void this.#keeper
          ?.save(id, { inputs, bands: madeFor.bands, madeFor: madeFor.project, shortlist }, this.#view())
          .catch(() => {});
      },
    });
  }

  bands: Band[] = $derived.by(() => this.#doc.project?.bands ?? ['80m']);
  /**
   * The shown plan, when it is the open project's (never another project's): while something is
   * dragged, the provisional one of the drag (`live`), else the plan made last.
   */
  shortlist = $derived.by(() => {
    const s = this.runner.live?.shortlist ?? this.runner.shortlist;
    return s && s.projectId === this.#doc.project?.id ? s : null;
  });
  /** The project the shown plan was made for (the frame of its candidates), when it is the open one's. */
  madeFor: Project | null = $derived.by(() =>
    this.shortlist ? ((this.runner.live?.madeFor ?? this.runner.madeFor)?.project ?? null) : null,
  );
  /** The provisional shortlist of a drag in progress, when one is shown (never kept). */
  live = $derived.by(() => (this.shortlist && this.runner.live ? this.runner.live : null));
  candidates: Candidate[] = $derived.by(() => {
    const s = this.shortlist;
    return s ? sortCandidates(s.candidates, this.sort) : [];
  });
  /** The selected candidate; during a drag, the provisional top candidate if the selected one is not ranked there. */
  selected: Candidate | null = $derived.by(
    () =>
      this.candidates.find((c) => c.id === this.selectedId) ??
      (this.live ? (this.shortlist?.candidates[0] ?? null) : null),
  );
  compared: Candidate | null = $derived.by(
    () => this.candidates.find((c) => c.id === this.compareId && c.id !== this.selectedId) ?? null,
  );
  /** What changed since the shown plan was made, part by part; [] while it is current. */
  changes: PlanInputPart[] = $derived.by(() => {
    const m = this.madeWith;
    const p = this.#doc.project;
    if (!m || !p || !this.shortlist || this.live) return [];
    return changedPlanInputs(m, planInputsHash(p, this.bands));
  });
  /** True when something the plan reads changed since the shown shortlist was made. */
  stale = $derived(this.changes.length > 0);
  /** "the supports and soil changed since this plan", or ''. */
  staleText = $derived(describePlanChanges(this.changes));

  #view(): PlanView {
    return { selectedId: this.selectedId, compareId: this.compareId };
  }

  #keepView(): void {
    const id = this.shortlist?.projectId;
    if (id) void this.#keeper?.setView(id, this.#view()).catch(() => {});
  }

  /**
   * The open project changed: drop what was shown (a run in progress is cancelled: its plan would
   * be another project's), then bring back the project's kept plan with its view.
   */
  async openProject(projectId: string): Promise<void> {
    const seq = ++this.#openSeq;
    this.runner.clear();
    this.madeWith = null;
    this.keptAt = null;
    this.selectedId = null;
    this.compareId = null;
    this.elevationDeg = null;
    this.cutToward = '';
    this.sweeps = {};
    if (!this.#keeper) return;
    this.restoring = true;
    let kept: StoredPlan | null = null;
    try {
      kept = await this.#keeper.load(projectId);
    } catch {
      kept = null;
    }
    if (seq !== this.#openSeq) return;
    this.restoring = false;
    if (!kept || kept.plan.shortlist.projectId !== projectId || this.runner.running) {
      if (this.tab !== 'targets' && !this.runner.running) this.tab = 'targets';
      return;
    }
    this.runner.restore(kept.plan.shortlist, { project: kept.plan.madeFor, bands: kept.plan.bands });
    this.madeWith = kept.plan.inputs;
    this.keptAt = kept.savedAt;
    this.selectedId = kept.selectedId;
    this.compareId = kept.compareId;
    if (this.tab === 'targets') this.tab = 'shortlist';
  }

  /**
   * Something is being dragged and the project would be `moved` at this position: re-rank it
   * provisionally (live mode), but only while a plan of the open project is shown. The project
   * itself is not touched (the drag's end is one edit).
   */
  liveMove(moved: Project): void {
    const p = this.#doc.project;
    if (!p || moved.id !== p.id || (!this.runner.live && !this.shortlist)) return;
    this.runner.preview($state.snapshot(moved) as Project, [...this.bands]);
  }

  /**
   * The drag ended (after its edit, if any): when the project now differs from what the kept plan
   * was made for, the exact plan runs and is kept; otherwise the kept plan shows again.
   */
  liveEnd(): void {
    if (!this.runner.liveActive) return;
    const p = this.#doc.project;
    const moved = p && planInputsHash(p, this.bands).hash !== this.madeWith?.hash;
    this.runner.settle(moved ? { project: $state.snapshot(p) as Project, bands: [...this.bands] } : null);
  }

  /** Compare the selected candidate with this one (null: no comparison). */
  setCompare(id: string | null): void {
    this.compareId = id;
    this.#keepView();
  }

  /** The plan also places arrays (the project's `settings.planArrays`). */
  arrays: boolean = $derived.by(() => this.#doc.project?.settings.planArrays === true);

  /** Turn the array types on or off for the next run (an undoable edit of the project's settings). */
  setArrays(on: boolean): boolean {
    return this.#doc.edit(on ? 'plan arrays too' : 'plan single antennas only', (q) => ({
      ...q,
      settings: { ...q.settings, planArrays: on },
    }));
  }

  toggleBand(b: Band): boolean {
    const has = this.bands.includes(b);
    if (has && this.bands.length === 1) return false;
    const next = BANDS.filter((x) => (x === b ? !has : this.bands.includes(x)));
    return this.#doc.edit(`plan for ${next.join(', ')}`, (q) => ({ ...q, bands: next }));
  }

  run(): void {
    const p = this.#doc.project;
    if (!p) return;
    this.runner.run($state.snapshot(p) as Project, [...this.bands]);
    this.tab = this.tab === 'targets' ? 'shortlist' : this.tab;
    this.open = true;
  }

  select(id: string | null): void {
    this.selectedId = id;
    this.elevationDeg = null;
    this.cutToward = '';
    if (id === this.compareId) this.compareId = null;
    this.#keepView();
  }

  sortBy(key: SortKey): void {
    this.sort = nextSort(this.sort, key);
  }

  /** Ask the lead worker for the SWR curve of a candidate across its band (once per candidate). */
  requestSweep(c: Candidate): void {
    const key = `${c.id}:${c.evaluationKey}`;
    const madeFor = this.madeFor;
    if (this.sweeps[key] || !madeFor) return;
    this.sweeps = { ...this.sweeps, [key]: { status: 'loading' } };
    this.runner.sweep(c.design, madeFor.soil, c.trim.valueM, sweepFrequenciesHz(c.band)).then(
      (points) => (this.sweeps = { ...this.sweeps, [key]: { status: 'ok', points } }),
      (e: Error) => (this.sweeps = { ...this.sweeps, [key]: { status: 'error', message: e.message } }),
    );
  }

  sweepOf(c: Candidate): SweepResult | null {
    return this.sweeps[`${c.id}:${c.evaluationKey}`] ?? null;
  }

  dispose(): void {
    this.runner.dispose();
  }
}
