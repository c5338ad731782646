/**
 * What a plan reads from a project, and a hash of it: a stored plan keeps the hash of the inputs
 * that made it, so the window knows exactly whether the plan still describes the project and, per
 * part, what changed since (the lot boundary, the keep-outs, the supports, the station position,
 * the soil, the targets, the bands, the planning settings).
 *
 * Only what `planSite` reads counts. The project's name and notes, the feed-line routes, the
 * display units, the imagery settings and the station's transmitter and coax (they change the
 * exposure estimate and the build sheet, not the plan) are left out. Every other setting counts,
 * so a setting added later counts unless it is listed here as display-only.
 */
import type { Band, Project, Settings } from '../project/schema.ts';
import { fnv1a64 } from './hash.ts';

/** The parts of a project a plan depends on, in the order they are reported. */
export const PLAN_INPUT_PARTS = [
  'boundary',
  'keepOuts',
  'supports',
  'station',
  'soil',
  'targets',
  'bands',
  'settings',
] as const;
export type PlanInputPart = (typeof PLAN_INPUT_PARTS)[number];

/** How each part is named to the user ("the … changed since this plan"). */
export const PLAN_INPUT_WORDS: Record<PlanInputPart, string> = {
  boundary: 'lot boundary',
  keepOuts: 'keep-outs',
  supports: 'supports',
  station: 'station position',
  soil: 'soil',
  targets: 'targets',
  bands: 'bands',
  settings: 'planning settings',
};

/** Settings that change only how things are shown or reported, never the plan. */
const DISPLAY_ONLY_SETTINGS: readonly (keyof Settings)[] = [
  'units',
  'tileUrlTemplate',
  'tileAttribution',
  'station',
];

export interface PlanInputsHash {
  /** Hash of every part together (16 hex digits). */
  hash: string;
  /** Hash of each part alone, to say what changed. */
  parts: Record<PlanInputPart, string>;
}

/** JSON with object keys sorted, so that key order never changes a hash. */
export function stableJson(value: unknown): string {
  if (value === undefined) return 'null';
  if (value === null || typeof value !== 'object') return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map(stableJson).join(',')}]`;
  const o = value as Record<string, unknown>;
  const keys = Object.keys(o)
    .filter((k) => o[k] !== undefined)
    .sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${stableJson(o[k])}`).join(',')}}`;
}

/** The plan's inputs of a project, part by part. */
export function planInputParts(project: Project, bands: readonly Band[]): Record<PlanInputPart, unknown> {
  const settings: Record<string, unknown> = { ...project.settings };
  for (const k of DISPLAY_ONLY_SETTINGS) delete settings[k];
  return {
    boundary: project.boundary,
    keepOuts: project.keepOuts,
    supports: project.supports,
    station: project.station,
    soil: project.soil,
    targets: project.targets,
    bands: [...bands],
    settings,
  };
}

/** The hash of a plan's inputs, whole and per part. Pure; the same project gives the same hash. */
export function planInputsHash(project: Project, bands: readonly Band[]): PlanInputsHash {
  const parts = planInputParts(project, bands);
  const each = {} as Record<PlanInputPart, string>;
  for (const k of PLAN_INPUT_PARTS) each[k] = fnv1a64(stableJson(parts[k]));
  return { hash: fnv1a64(PLAN_INPUT_PARTS.map((k) => each[k]).join(':')), parts: each };
}

/** The parts that differ between the inputs a plan was made from and the project now; [] if none. */
export function changedPlanInputs(made: PlanInputsHash, now: PlanInputsHash): PlanInputPart[] {
  if (made.hash === now.hash) return [];
  return PLAN_INPUT_PARTS.filter((k) => made.parts[k] !== now.parts[k]);
}

/** "the lot boundary and the supports changed since this plan", or '' when nothing changed. */
export function describePlanChanges(parts: readonly PlanInputPart[]): string {
  if (parts.length === 0) return '';
  const words = parts.map((p) => PLAN_INPUT_WORDS[p]);
  const list =
    words.length === 1 ? words[0]! : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]!}`;
  return `the ${list} changed since this plan`;
}
