/**
 * The open project as the editor sees it: the snapshot history (see history.svelte.ts) plus the
 * selection and the edits the lot editor offers (supports, boundary, keep-outs, station,
 * settings), each one validated, undoable step.
 */
import { unitPreference } from './unitPreference.svelte.ts';
import type {
  KeepOut,
  LonLat,
  Polygon,
  Project,
  Settings,
  StationSettings,
  Support,
} from '../../../core/project/schema.ts';
import type { UnitSystem } from '../../../core/units/index.ts';
import { closeRing, newId, nextName } from '../lib/geo.ts';
import { ProjectHistory } from './history.svelte.ts';

export { UNDO_DEPTH, type SaveFn, type SaveState, type Snapshot } from './history.svelte.ts';

export type Selection =
  | { kind: 'support'; id: string }
  | { kind: 'keepOut'; id: string }
  | { kind: 'boundary' }
  | { kind: 'station' }
  | null;

export const DEFAULT_SUPPORT_HEIGHT_M = 10;

export class ProjectState extends ProjectHistory {
  selection = $state.raw<Selection>(null);
  /** The support placed by the last click (its height field takes the focus once). */
  justAdded = $state<string | null>(null);

  selectedSupport: Support | null = $derived.by(() => {
    const s = this.selection;
    return s?.kind === 'support' ? (this.project?.supports.find((x) => x.id === s.id) ?? null) : null;
  });
  selectedKeepOut: KeepOut | null = $derived.by(() => {
    const s = this.selection;
    return s?.kind === 'keepOut' ? (this.project?.keepOuts.find((x) => x.id === s.id) ?? null) : null;
  });

  override open(project: Project): void {
    super.open(project);
    this.selection = null;
  }

  select(s: Selection): void {
    this.selection = s;
  }

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
    this.justAdded = id;
    return id;
  }

  updateSupport(id: string, patch: Partial<Omit<Support, 'id'>>, label?: string): boolean {
    return this.#update('supports', id, patch, label);
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
    const base =
      kind === 'power-line'
        ? 'Power line'
        : kind === 'building'
          ? 'Building'
          : kind === 'path'
            ? 'Path'
            : kind === 'buried'
              ? 'Buried line'
              : 'Keep-out';
    const k: KeepOut = {
      id,
      kind,
      geometry,
      name: nextName(
        base,
        p.keepOuts.map((x) => x.name),
      ),
      // A path only marks where people walk (checked by the exposure zones); it blocks nothing
      // until the user gives it a clearance. A buried line is kept by settings.buriedClearanceM.
      clearanceM: kind === 'power-line' ? 15 : kind === 'path' || kind === 'buried' ? 0 : 1,
      notes: '',
      ...extra,
    };
    if (!this.edit(`add ${k.name}`, (q) => ({ ...q, keepOuts: [...q.keepOuts, k] }))) return null;
    this.selection = { kind: 'keepOut', id };
    return id;
  }

  updateKeepOut(id: string, patch: Partial<Omit<KeepOut, 'id'>>, label?: string): boolean {
    return this.#update('keepOuts', id, patch, label);
  }

  /** Apply `patch` to the item `id` of a list as one undoable edit; none when it changes no field (compared as JSON). */
  #update<L extends 'supports' | 'keepOuts'>(
    list: L,
    id: string,
    patch: Partial<Project[L][number]>,
    label?: string,
  ): boolean {
    const items: readonly (Support | KeepOut)[] = this.project?.[list] ?? [];
    const item = items.find((x) => x.id === id);
    if (!item) return false;
    const changed = Object.entries(patch).some(
      ([k, v]) => JSON.stringify(item[k as keyof typeof item]) !== JSON.stringify(v),
    );
    if (!changed) return false;
    return this.edit(label ?? `edit ${item.name}`, (q) => ({
      ...q,
      [list]: (q[list] as readonly (Support | KeepOut)[]).map((x) => (x.id === id ? { ...x, ...patch } : x)),
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

  /** Change the station's transmitter or feed-line settings (the exposure estimate and build sheet follow). */
  updateStation(patch: Partial<StationSettings>, label = 'change station settings'): boolean {
    return this.edit(label, (q) => {
      const cur = q.settings.station;
      const same = Object.entries(patch).every(([k, v]) => cur[k as keyof StationSettings] === v);
      return same ? q : { ...q, settings: { ...q.settings, station: { ...cur, ...patch } } };
    });
  }

  /** Set (or clear, with an empty list) the feed-line bend points for a shortlisted candidate. */
  setFeedRoute(candidateId: string, bends: LonLat[], label = 'reroute feed line'): boolean {
    return this.edit(label, (q) => {
      const cur = q.feedRoutes[candidateId] ?? [];
      if (JSON.stringify(cur) === JSON.stringify(bends)) return q;
      const next = { ...q.feedRoutes };
      if (bends.length) next[candidateId] = bends.map((b) => [b[0], b[1]] as LonLat);
      else delete next[candidateId];
      return { ...q, feedRoutes: next };
    });
  }

  /** The user's unit preference: kept across projects, not an edit (undo does not revert it). */
  setUnits(units: UnitSystem): boolean {
    if (unitPreference.units === units) return false;
    unitPreference.set(units);
    return true;
  }

  setSoilClass(classId: string): boolean {
    return this.edit('change soil', (q) =>
      'classId' in q.soil && q.soil.classId === classId ? q : { ...q, soil: { classId } },
    );
  }

  /** Drop a selection that undo or redo made vanish. */
  protected override restored(): void {
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
}
