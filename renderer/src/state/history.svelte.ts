/**
 * Snapshot history of one project document: the document itself (an immutable snapshot per
 * edit), the undo and redo stacks over snapshots, and the save status. Every edit is validated
 * against the project schema and saved at once through the injected save function; saves run
 * one at a time and always send the newest snapshot.
 */
import type { ApiResponse } from '../../../core/api/contract.ts';
import { ProjectSchema, formatPath, type Project } from '../../../core/project/schema.ts';
import type { UnitSystem } from '../../../core/units/index.ts';
import { unitPreference } from './unitPreference.svelte.ts';

export type SaveState =
  | { status: 'idle' }
  | { status: 'saving' }
  | { status: 'saved'; at: string }
  | { status: 'error'; message: string };

export type SaveFn = (project: Project) => Promise<ApiResponse<{ updatedAt: string }>>;

export interface Snapshot {
  project: Project;
  label: string;
}

/** How many snapshots undo keeps. */
export const UNDO_DEPTH = 200;

export class ProjectHistory {
  project = $state.raw<Project | null>(null);
  past = $state.raw<Snapshot[]>([]);
  future = $state.raw<Snapshot[]>([]);
  save = $state.raw<SaveState>({ status: 'idle' });
  /** The last edit refused by validation (shown near the status bar). */
  editError = $state<string | null>(null);
  /** What the last edit, undo or redo did, in words. */
  lastAction = $state<string>('');

  /** The user's unit preference (kept across projects; not part of the undo history). */
  units: UnitSystem = $derived(unitPreference.units);
  canUndo = $derived(this.past.length > 0);
  canRedo = $derived(this.future.length > 0);

  #saver: SaveFn;
  #dirty = false;
  #running: Promise<void> | null = null;

  constructor(saver: SaveFn) {
    this.#saver = saver;
  }

  /** Show a project freshly opened from the store: no history, nothing to save. */
  open(project: Project): void {
    unitPreference.adoptDefault(project.settings.units);
    this.project = project;
    this.past = [];
    this.future = [];
    this.editError = null;
    this.lastAction = '';
    this.save = { status: 'idle' };
  }

  /** Apply a change as one undoable step; refused (and reported) if the result fails the schema. */
  edit(label: string, change: (p: Project) => Project): boolean {
    const current = this.project;
    if (!current) return false;
    const next = change(current);
    if (next === current) return false;
    const parsed = ProjectSchema.safeParse(next);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      this.editError = issue ? `${formatPath(issue.path)}: ${issue.message}` : 'invalid edit';
      return false;
    }
    this.editError = null;
    this.past = [...this.past, { project: current, label }].slice(-UNDO_DEPTH);
    this.future = [];
    this.project = parsed.data;
    this.lastAction = label;
    this.#queueSave();
    return true;
  }

  undo(): void {
    this.#restore('past', 'future', 'Undid');
  }

  redo(): void {
    this.#restore('future', 'past', 'Redid');
  }

  /** Bring back the newest snapshot of one stack, keeping the current project on the other. */
  #restore(from: 'past' | 'future', to: 'past' | 'future', verb: string): void {
    const snap = this[from].at(-1);
    if (!snap || !this.project) return;
    this[from] = this[from].slice(0, -1);
    this[to] = [...this[to], { project: this.project, label: snap.label }];
    this.project = snap.project;
    this.lastAction = `${verb}: ${snap.label}`;
    this.restored();
    this.#queueSave();
  }

  /** Send the current snapshot again (after a failed save). */
  retrySave(): void {
    if (this.project) this.#queueSave();
  }

  /** Resolves once every queued save has finished. */
  async flush(): Promise<void> {
    while (this.#running) await this.#running;
  }

  /** Called after undo or redo has put another snapshot in place. */
  protected restored(): void {}

  #queueSave(): void {
    this.#dirty = true;
    this.save = { status: 'saving' };
    if (!this.#running) this.#running = this.#drain();
  }

  async #drain(): Promise<void> {
    while (this.#dirty) {
      this.#dirty = false;
      const snapshot = this.project;
      if (!snapshot) break;
      let result: ApiResponse<{ updatedAt: string }>;
      try {
        result = await this.#saver(snapshot);
      } catch (e) {
        result = { ok: false, error: { code: 'internal', message: String(e) } };
      }
      if (this.#dirty) continue; // a newer snapshot is waiting; its result is the one to show
      this.save = result.ok
        ? { status: 'saved', at: result.value.updatedAt }
        : { status: 'error', message: result.error.message };
    }
    this.#running = null;
  }
}
