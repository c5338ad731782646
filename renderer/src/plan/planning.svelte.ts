/**
 * The planning workflow of the open project: its targets, the bands, the runner over the
 * workers, and what the planning views show (open tab, selected and compared candidates, the
 * sort, the elevation of the azimuth plot, the SWR sweeps fetched so far).
 */
import type { Band, Project } from '../../../core/project/schema.ts';
import { BANDS } from '../../../core/project/schema.ts';
import type { ProjectState } from '../state/project.svelte.ts';
import { TargetsState } from '../targets/targets.svelte.ts';
import { sweepFrequenciesHz } from '../plots/patternData.ts';
import type { PlanWorker } from '../workers/pool.ts';
import type { SweepPoint } from '../workers/protocol.ts';
import type { DrawnCandidate } from './mapDraw.ts';
import { PlanRunner } from './planRun.svelte.ts';
import { sortCandidates, nextSort, type SortKey, type SortState } from './shortlistTable.ts';

export type PlanTab = 'targets' | 'shortlist' | 'compare' | 'rejected';

export type SweepResult =
  { status: 'loading' } | { status: 'ok'; points: SweepPoint[] } | { status: 'error'; message: string };

/** The parts of a project a plan depends on (names and notes do not change a plan). */
export function planInputs(p: Project, bands: readonly Band[]): string {
  return JSON.stringify([
    p.boundary,
    p.supports,
    p.keepOuts,
    p.station,
    p.soil,
    p.targets,
    // The station's transmitter and coax change the build sheet and the exposure, not the plan.
    { ...p.settings, station: undefined },
    bands,
  ]);
}

export class Planning {
  readonly targets: TargetsState;
  readonly runner: PlanRunner;
  #doc: ProjectState;

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

  constructor(doc: ProjectState, start: () => PlanWorker[]) {
    this.#doc = doc;
    this.targets = new TargetsState(doc);
    this.runner = new PlanRunner(start);
  }

  bands: Band[] = $derived.by(() => this.#doc.project?.bands ?? ['80m']);
  candidates: DrawnCandidate[] = $derived.by(() => {
    const s = this.runner.shortlist;
    if (!s) return [];
    const d = this.runner.drawings;
    return sortCandidates(s.candidates, this.sort).map((c) => ({ ...c, drawing: d[c.id] }));
  });
  selected: DrawnCandidate | null = $derived.by(
    () => this.candidates.find((c) => c.id === this.selectedId) ?? null,
  );
  compared: DrawnCandidate | null = $derived.by(
    () => this.candidates.find((c) => c.id === this.compareId && c.id !== this.selectedId) ?? null,
  );
  /** True when the lot, targets or bands changed since the shown shortlist was made. */
  stale = $derived.by(() => {
    const m = this.runner.madeFor;
    const p = this.#doc.project;
    return !!m && !!p && planInputs(m.project, m.bands) !== planInputs(p, this.bands);
  });

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
  }

  sortBy(key: SortKey): void {
    this.sort = nextSort(this.sort, key);
  }

  /** Ask the lead worker for the SWR curve of a candidate across its band (once per candidate). */
  requestSweep(c: DrawnCandidate): void {
    const key = `${c.id}:${c.evaluationKey}`;
    if (this.sweeps[key]) return;
    this.sweeps = { ...this.sweeps, [key]: { status: 'loading' } };
    this.runner.sweep(c.evaluationKey, c.trim.valueM, sweepFrequenciesHz(c.band)).then(
      (points) => (this.sweeps = { ...this.sweeps, [key]: { status: 'ok', points } }),
      (e: Error) => (this.sweeps = { ...this.sweeps, [key]: { status: 'error', message: e.message } }),
    );
  }

  sweepOf(c: DrawnCandidate): SweepResult | null {
    return this.sweeps[`${c.id}:${c.evaluationKey}`] ?? null;
  }

  dispose(): void {
    this.runner.dispose();
  }
}
