/**
 * Target regions of the open project: which built-in regions are chosen and with what weight,
 * the user's own areas (a point with a radius, or a polygon), the station position and its
 * Maidenhead locator, the paths (bearings, distances, take-off distributions) from the planning
 * core, and a target's own take-off window when the user sets one. Every change goes through the project state as one undoable, validated edit.
 */
import { planPaths, REGIONS, toLocator, fromLocator, type RegionPath } from '../../../core/paths/index.ts';
import {
  TakeoffWindowSchema,
  type Band,
  type LonLat,
  type Polygon,
  type Project,
  type Target,
} from '../../../core/project/schema.ts';
import { ringReferencePoint } from '../../../core/site/frame.ts';
import type { ProjectState } from '../state/project.svelte.ts';
import { newId, parsePlace } from '../lib/geo.ts';

/** Most targets a project may hold (the schema's limit). */
export const MAX_TARGETS = 100;
export const DEFAULT_WEIGHT = 1;
export const MAX_WEIGHT = 100;

/**
 * The weight a typed value becomes (0…100, to a tenth) and, when that is not what was typed, a
 * note that says so; null for a value that is not a number.
 */
export function clampWeight(typed: number): { weight: number; note: string } | null {
  if (!Number.isFinite(typed)) return null;
  const weight = Math.min(MAX_WEIGHT, Math.max(0, Math.round(typed * 10) / 10));
  const note =
    typed > MAX_WEIGHT
      ? `${typed} is more than the largest weight: set to ${MAX_WEIGHT}`
      : typed < 0
        ? `a weight cannot be negative: ${typed} set to 0`
        : weight !== typed
          ? `rounded to ${weight}`
          : '';
  return { weight, note };
}

/** The key of a target: its region id for a built-in region, its own id otherwise. */
export const targetKey = (t: Target): string => ('regionId' in t ? t.regionId : t.id);

/** A target as the interface lists it. */
export interface TargetRow {
  key: string;
  name: string;
  weight: number;
  builtIn: boolean;
  /** Colour index, stable per position in the project's list. */
  colour: number;
  /** Short description of a custom area. */
  area: string;
  /** The user's own take-off window, degrees, when set. */
  takeoffWindowDeg: [number, number] | null;
}

/** Where the station is for paths: the project's station, else the centre of the lot (as the core's site does). */
export function stationOf(p: Project | null): LonLat | null {
  if (!p) return null;
  if (p.station) return p.station;
  if (p.boundary) return ringReferencePoint(p.boundary.coordinates[0]);
  return null;
}

/** A short description of a custom target's area. */
export function describeArea(t: Target): string {
  if ('regionId' in t) return 'built-in region';
  if ('center' in t.area) return `${toLocator(t.area.center, 4)}, radius ${Math.round(t.area.radiusKm)} km`;
  return `area of ${t.area.coordinates[0].length - 1} corners`;
}

function close(ring: readonly LonLat[]): LonLat[] {
  const out = ring.map((p): LonLat => [p[0], p[1]]);
  const a = out[0];
  const b = out[out.length - 1];
  if (a && b && (a[0] !== b[0] || a[1] !== b[1])) out.push([a[0], a[1]]);
  return out;
}

/** Parse a list of corners: Maidenhead locators or "lat, lon" pairs separated by semicolons or new lines. */
export function parseCorners(text: string): { corners: LonLat[]; error: string | null } {
  const parts = text
    .split(/[;\n]+|\s+(?=[A-Ra-r]{2}\d\d)/)
    .map((s) => s.trim())
    .filter((s) => s !== '');
  const corners: LonLat[] = [];
  for (const part of parts) {
    const p = parsePoint(part);
    if (!p) return { corners, error: `"${part}" is neither a locator (like FN31) nor "lat, lon"` };
    corners.push(p);
  }
  if (corners.length < 3) return { corners, error: 'an area needs at least 3 corners' };
  return { corners, error: null };
}

/** A locator (2 to 8 characters, the centre of its cell) or "lat, lon" in decimal degrees: the
 * same reading as the Go-to box (lib/geo.ts parsePlace). */
export const parsePoint = parsePlace;

export class TargetsState {
  #doc: ProjectState;

  constructor(doc: ProjectState) {
    this.#doc = doc;
  }

  targets: Target[] = $derived.by(() => this.#doc.project?.targets ?? []);
  station: LonLat | null = $derived.by(() => stationOf(this.#doc.project));
  /** True when the station is the lot's centre because none was placed. */
  stationIsLotCentre = $derived.by(() => !!this.#doc.project && !this.#doc.project.station && !!this.station);
  locator: string = $derived(this.station ? toLocator(this.station, 6) : '');
  rows: TargetRow[] = $derived(
    this.targets.map((t, i) => ({
      key: targetKey(t),
      name: 'regionId' in t ? (REGIONS.find((r) => r.id === t.regionId)?.name ?? t.regionId) : t.name,
      weight: t.weight,
      builtIn: 'regionId' in t,
      colour: i,
      area: describeArea(t),
      takeoffWindowDeg: t.takeoffWindowDeg ?? null,
    })),
  );
  /** The band whose take-off distribution the list shows: the project's first. */
  band: Band = $derived.by(() => this.#doc.project?.bands[0] ?? '80m');
  /** Bearings, distances and elevation windows from the planning core, one per target. */
  paths: RegionPath[] = $derived.by(() => {
    const st = this.station;
    if (!st) return [];
    try {
      return planPaths(st, this.targets);
    } catch {
      return [];
    }
  });
  /** The built-in regions not yet chosen. */
  available = $derived(
    REGIONS.filter((r) => !this.targets.some((t) => 'regionId' in t && t.regionId === r.id)),
  );

  isChosen(regionId: string): boolean {
    return this.targets.some((t) => 'regionId' in t && t.regionId === regionId);
  }

  colourOf(key: string): number {
    return this.targets.findIndex((t) => targetKey(t) === key);
  }

  /** Add a built-in region, or remove it when already chosen. */
  toggleRegion(regionId: string): boolean {
    const region = REGIONS.find((r) => r.id === regionId);
    if (!region) return false;
    if (this.isChosen(regionId)) return this.remove(regionId);
    if (this.targets.length >= MAX_TARGETS) return false;
    return this.#doc.edit(`aim at ${region.name}`, (q) => ({
      ...q,
      targets: [...q.targets, { regionId, weight: DEFAULT_WEIGHT }],
    }));
  }

  setWeight(key: string, weight: number): boolean {
    const c = clampWeight(weight);
    if (!c) return false;
    const w = c.weight;
    const row = this.rows.find((r) => r.key === key);
    if (!row || row.weight === w) return false;
    return this.#doc.edit(`weight of ${row.name}: ${w}`, (q) => ({
      ...q,
      targets: q.targets.map((t) => (targetKey(t) === key ? { ...t, weight: w } : t)),
    }));
  }

  /**
   * Set a target's own take-off window [lowest, highest] in degrees, in place of the computed
   * distribution. Returns an error in words (checked by the project schema), or null when set.
   */
  setTakeoffWindow(key: string, lowDeg: number, highDeg: number): string | null {
    const row = this.rows.find((r) => r.key === key);
    if (!row) return 'no such target';
    const checked = TakeoffWindowSchema.safeParse([lowDeg, highDeg]);
    if (!checked.success) return checked.error.issues[0]?.message ?? 'not a valid window';
    const win: [number, number] = [lowDeg, highDeg];
    if (row.takeoffWindowDeg && row.takeoffWindowDeg[0] === lowDeg && row.takeoffWindowDeg[1] === highDeg)
      return null;
    const ok = this.#doc.edit(`take-off angles of ${row.name}: ${lowDeg}–${highDeg}°`, (q) => ({
      ...q,
      targets: q.targets.map((t) => (targetKey(t) === key ? { ...t, takeoffWindowDeg: win } : t)),
    }));
    return ok ? null : (this.#doc.editError ?? 'the window could not be set');
  }

  /** Go back to the computed take-off distribution for a target. */
  clearTakeoffWindow(key: string): boolean {
    const row = this.rows.find((r) => r.key === key);
    if (!row || !row.takeoffWindowDeg) return false;
    return this.#doc.edit(`computed take-off angles for ${row.name}`, (q) => ({
      ...q,
      targets: q.targets.map((t) => {
        if (targetKey(t) !== key) return t;
        const { takeoffWindowDeg: _drop, ...rest } = t;
        return rest as Target;
      }),
    }));
  }

  remove(key: string): boolean {
    const row = this.rows.find((r) => r.key === key);
    if (!row) return false;
    return this.#doc.edit(`stop aiming at ${row.name}`, (q) => ({
      ...q,
      targets: q.targets.filter((t) => targetKey(t) !== key),
    }));
  }

  #newId(): string {
    return newId(
      'target',
      this.targets.map((t) => targetKey(t)),
    );
  }

  /** Add the user's own target: a point with a radius. Returns its key, or null when refused. */
  addCircle(name: string, center: LonLat, radiusKm: number, weight = DEFAULT_WEIGHT): string | null {
    const id = this.#newId();
    const t: Target = { id, name: name.trim(), weight, area: { center: [center[0], center[1]], radiusKm } };
    return this.#doc.edit(`aim at ${t.name}`, (q) => ({ ...q, targets: [...q.targets, t] })) ? id : null;
  }

  /** Add the user's own target: a polygon through these corners. */
  addPolygon(name: string, corners: readonly LonLat[], weight = DEFAULT_WEIGHT): string | null {
    if (corners.length < 3) return null;
    const id = this.#newId();
    const area: Polygon = { type: 'Polygon', coordinates: [close(corners)] };
    const t: Target = { id, name: name.trim(), weight, area };
    return this.#doc.edit(`aim at ${t.name}`, (q) => ({ ...q, targets: [...q.targets, t] })) ? id : null;
  }

  /**
   * Place the station from a typed locator. When the locator's cell holds the lot, the station
   * goes to the lot's centre (the cell is kilometres wide); otherwise to the cell's centre.
   * Returns an error in words, or null when the station was placed.
   */
  setLocator(text: string): string | null {
    const p = this.#doc.project;
    if (!p) return 'no project is open';
    let cell;
    try {
      cell = fromLocator(text);
    } catch {
      return `"${text.trim()}" is not a Maidenhead locator (like FN31 or FN31pr)`;
    }
    const current = this.station;
    if (
      current &&
      toLocator(current, text.trim().length as 2 | 4 | 6 | 8).toUpperCase() === text.trim().toUpperCase()
    ) {
      return null; // already inside the typed cell: keep the exact spot
    }
    const lotCentre = p.boundary ? ringReferencePoint(p.boundary.coordinates[0]) : null;
    const inCell = (q: LonLat): boolean =>
      q[0] >= cell.southWest[0] &&
      q[0] < cell.southWest[0] + cell.sizeDeg[0] &&
      q[1] >= cell.southWest[1] &&
      q[1] < cell.southWest[1] + cell.sizeDeg[1];
    const at = lotCentre && inCell(lotCentre) ? lotCentre : cell.center;
    const ok = this.#doc.edit(`place station at ${text.trim()}`, (q) => ({ ...q, station: [at[0], at[1]] }));
    return ok ? null : (this.#doc.editError ?? 'the station could not be placed');
  }
}
