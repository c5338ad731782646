/**
 * The open project: the document itself (an immutable snapshot per edit), the selection, the
 * undo and redo stacks over snapshots, and the save status. Every edit is validated against the
 * project schema and saved at once through the injected save function; saves run one at a time
 * and always send the newest snapshot.
 */
import type { ApiResponse } from '../../../core/api/contract.ts';
import {
  ProjectSchema,
  formatPath,
  type KeepOut,
  type LonLat,
  type Polygon,
  type Project,
  type Settings,
  type Support,
} from '../../../core/project/schema.ts';
import type { UnitSystem } from '../../../core/units/index.ts';
import { closeRing, newId, nextName } from '../lib/geo.ts';

export type Selection =
  | { kind: 'support'; id: string }
  | { kind: 'keepOut'; id: string }
  | { kind: 'boundary' }
  | { kind: 'station' }
  | null;

export type SaveState =
  | { status: 'idle' }
  | { status: 'saving' }
  | { status: 'saved'; at: string }
  | { status: 'error'; message: string };

export type SaveFn = (project: Project) => Promise<ApiResponse<{ updatedAt: string }>>;

interface Snapshot {
  project: Project;
  label: string;
}

/** How many snapshots undo keeps. */
export const UNDO_DEPTH = 200;
export const DEFAULT_SUPPORT_HEIGHT_M = 10;

export class ProjectState {
  project = $state.raw<Project | null>(null);
  selection = $state.raw<Selection>(null);
  past = $state.raw<Snapshot[]>([]);
  future = $state.raw<Snapshot[]>([]);
  save = $state.raw<SaveState>({ status: 'idle' });
  /** The last edit refused by validation (shown near the status bar). */
  editError = $state<string | null>(null);
  /** What the last edit, undo or redo did, in words. */
  lastAction = $state<string>('');

  units: UnitSystem = $derived(this.project?.settings.units ?? 'metric');
  canUndo = $derived(this.past.length > 0);
  canRedo = $derived(this.future.length > 0);
  selectedSupport: Support | null = $derived.by(() => {
    const s = this.selection;
    return s?.kind === 'support' ? (this.project?.supports.find((x) => x.id === s.id) ?? null) : null;
  });
  selectedKeepOut: KeepOut | null = $derived.by(() => {
    const s = this.selection;
    return s?.kind === 'keepOut' ? (this.project?.keepOuts.find((x) => x.id === s.id) ?? null) : null;
  });

  #saver: SaveFn;
  #dirty = false;
  #running: Promise<void> | null = null;

  constructor(saver: SaveFn) {
    this.#saver = saver;
  }

  /** Show a project freshly opened from the store: no history, nothing to save. */
  open(project: Project): void {
    this.project = project;
    this.selection = null;
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
    const prev = this.past.at(-1);
    if (!prev || !this.project) return;
    this.past = this.past.slice(0, -1);
    this.future = [...this.future, { project: this.project, label: prev.label }];
    this.project = prev.project;
    this.lastAction = `Undid: ${prev.label}`;
    this.#keepSelectionValid();
    this.#queueSave();
  }

  redo(): void {
    const next = this.future.at(-1);
    if (!next || !this.project) return;
    this.future = this.future.slice(0, -1);
    this.past = [...this.past, { project: this.project, label: next.label }];
    this.project = next.project;
    this.lastAction = `Redid: ${next.label}`;
    this.#keepSelectionValid();
    this.#queueSave();
  }

  select(s: Selection): void {
    this.selection = s;
  }

  /** Send the current snapshot again (after a failed save). */
  retrySave(): void {
    if (this.project) this.#queueSave();
  }

  /** Resolves once every queued save has finished. */
  async flush(): Promise<void> {
    while (this.#running) await this.#running;
  }

  // ---- edits ---------------------------------------------------------------------------------

  addSupport(position: LonLat): string | null {
    const p = this.project;
    if (!p) return null;
    const id = newId('support', [...p.supports.map((s) => s.id), ...p.keepOuts.map((k) => k.id)]);
    const support: Support = {
      id,
      name: nextName(
        'Support',
        p.supports.map((s) => s.name),
      ),
      kind: 'tree',
      position: [position[0], position[1]],
      usableHeightM: DEFAULT_SUPPORT_HEIGHT_M,
      notes: '',
    };
    if (!this.edit(`add ${support.name}`, (q) => ({ ...q, supports: [...q.supports, support] }))) return null;
    this.selection = { kind: 'support', id };
    return id;
  }

  updateSupport(id: string, patch: Partial<Omit<Support, 'id'>>, label?: string): boolean {
    const s = this.project?.supports.find((x) => x.id === id);
    if (!s) return false;
    const changed = Object.entries(patch).some(
      ([k, v]) => JSON.stringify(s[k as keyof Support]) !== JSON.stringify(v),
    );
    if (!changed) return false;
    return this.edit(label ?? `edit ${s.name}`, (q) => ({
      ...q,
      supports: q.supports.map((x) => (x.id === id ? { ...x, ...patch } : x)),
    }));
  }

  moveSupport(id: string, position: LonLat): boolean {
    const s = this.project?.supports.find((x) => x.id === id);
    return s ? this.updateSupport(id, { position: [position[0], position[1]] }, `move ${s.name}`) : false;
  }

  deleteSupport(id: string): boolean {
    const s = this.project?.supports.find((x) => x.id === id);
    if (!s) return false;
    return this.edit(`delete ${s.name}`, (q) => ({ ...q, supports: q.supports.filter((x) => x.id !== id) }));
  }

  /** Replace the lot boundary with the polygon through these corners. */
  setBoundary(corners: readonly LonLat[], label = 'draw lot boundary'): boolean {
    const ring = closeRing(corners);
    const boundary: Polygon = { type: 'Polygon', coordinates: [ring] };
    return this.edit(label, (q) => ({ ...q, boundary }));
  }

  clearBoundary(): boolean {
    return this.edit('delete lot boundary', (q) => (q.boundary ? { ...q, boundary: null } : q));
  }

  addKeepOut(
    kind: KeepOut['kind'],
    geometry: KeepOut['geometry'],
    extra: Partial<KeepOut> = {},
  ): string | null {
    const p = this.project;
    if (!p) return null;
    const id = newId('keepout', [...p.supports.map((s) => s.id), ...p.keepOuts.map((k) => k.id)]);
    const base = kind === 'power-line' ? 'Power line' : kind === 'building' ? 'Building' : 'Keep-out';
    const k: KeepOut = {
      id,
      kind,
      geometry,
      name: nextName(
        base,
        p.keepOuts.map((x) => x.name),
      ),
      clearanceM: kind === 'power-line' ? 15 : 1,
      notes: '',
      ...extra,
    };
    if (!this.edit(`add ${k.name}`, (q) => ({ ...q, keepOuts: [...q.keepOuts, k] }))) return null;
    this.selection = { kind: 'keepOut', id };
    return id;
  }

  updateKeepOut(id: string, patch: Partial<Omit<KeepOut, 'id'>>, label?: string): boolean {
    const k = this.project?.keepOuts.find((x) => x.id === id);
    if (!k) return false;
    const changed = Object.entries(patch).some(
      ([f, v]) => JSON.stringify(k[f as keyof KeepOut]) !== JSON.stringify(v),
    );
    if (!changed) return false;
    return this.edit(label ?? `edit ${k.name}`, (q) => ({
      ...q,
      keepOuts: q.keepOuts.map((x) => (x.id === id ? ({ ...x, ...patch } as KeepOut) : x)),
    }));
  }

  deleteKeepOut(id: string): boolean {
    const k = this.project?.keepOuts.find((x) => x.id === id);
    if (!k) return false;
    return this.edit(`delete ${k.name}`, (q) => ({ ...q, keepOuts: q.keepOuts.filter((x) => x.id !== id) }));
  }

  setStation(position: LonLat | null): boolean {
    const label = position ? 'place station' : 'remove station';
    return this.edit(label, (q) => ({ ...q, station: position ? [position[0], position[1]] : null }));
  }

  /** Delete whatever is selected; true if something was deleted. */
  deleteSelected(): boolean {
    const s = this.selection;
    if (!s) return false;
    const done =
      s.kind === 'support'
        ? this.deleteSupport(s.id)
        : s.kind === 'keepOut'
          ? this.deleteKeepOut(s.id)
          : s.kind === 'boundary'
            ? this.clearBoundary()
            : this.setStation(null);
    if (done) this.selection = null;
    return done;
  }

  rename(name: string): boolean {
    const n = name.trim();
    return this.edit('rename project', (q) => (n === q.name ? q : { ...q, name: n }));
  }

  setNotes(notes: string): boolean {
    return this.edit('edit project notes', (q) => (notes === q.notes ? q : { ...q, notes }));
  }

  updateSettings(patch: Partial<Settings>, label = 'change settings'): boolean {
    return this.edit(label, (q) => {
      const same = Object.entries(patch).every(([k, v]) => q.settings[k as keyof Settings] === v);
      return same ? q : { ...q, settings: { ...q.settings, ...patch } };
    });
  }

  setUnits(units: UnitSystem): boolean {
    return this.updateSettings({ units }, units === 'metric' ? 'show metric units' : 'show imperial units');
  }

  setSoilClass(classId: string): boolean {
    return this.edit('change soil', (q) =>
      'classId' in q.soil && q.soil.classId === classId ? q : { ...q, soil: { classId } },
    );
  }

  // ---- internals -----------------------------------------------------------------------------

  #keepSelectionValid(): void {
    const s = this.selection;
    const p = this.project;
    if (!s || !p) return;
    const gone =
      (s.kind === 'support' && !p.supports.some((x) => x.id === s.id)) ||
      (s.kind === 'keepOut' && !p.keepOuts.some((x) => x.id === s.id)) ||
      (s.kind === 'boundary' && !p.boundary) ||
      (s.kind === 'station' && !p.station);
    if (gone) this.selection = null;
  }

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
