/**
 * The shortlist as rows and columns: the figures each column shows (all from the planning
 * core's Candidate), how each column sorts, and the plain-text forms used by the CSV export.
 */
import { typeName } from '../../../core/antennas/typeName.ts';
import type { Candidate } from '../../../core/rank/plan.ts';
import { formatLength, type UnitSystem } from '../../../core/units/index.ts';

export type SortKey =
  | 'rank'
  | 'type'
  | 'score'
  | 'peak'
  | 'swr'
  | 'bandwidth'
  | 'efficiency'
  | 'height'
  | 'wire'
  | `region:${string}`;

export interface SortState {
  key: SortKey;
  /** 1 ascending, -1 descending. */
  dir: 1 | -1;
}

/** Highest point of the antenna above ground, m (from the core's heights list). */
export const topHeightM = (c: Candidate): number => Math.max(0, ...c.heights.map((h) => h.heightM));

/** Total wire to cut, m (the core's cut list, ropes left out). */
export const wireToCutM = (c: Candidate): number =>
  c.cutList.filter((x) => !/rope/i.test(x.label)).reduce((s, x) => s + x.count * x.cutLengthM, 0);

/** Plan area of the footprint, m² (shoelace over the core's footprint ring). */
export function footprintAreaM2(c: Candidate): number {
  const r = c.footprint.ringXY;
  let a = 0;
  for (let i = 0; i + 1 < r.length; i++) a += r[i]![0] * r[i + 1]![1] - r[i + 1]![0] * r[i]![1];
  return Math.abs(a) / 2;
}

/** Longest distance across the footprint, m: the length of a footprint that is a line from above. */
export function footprintSpanM(c: Candidate): number {
  const r = c.footprint.ringXY;
  let d = 0;
  for (const p of r) for (const q of r) d = Math.max(d, Math.hypot(p[0] - q[0], p[1] - q[1]));
  return d;
}

export function regionGain(c: Candidate, regionId: string): number {
  return c.regions.find((r) => r.id === regionId)?.gainDbi ?? -Infinity;
}

function sortValue(c: Candidate, key: SortKey): number | string {
  switch (key) {
    case 'rank':
      return c.rank;
    case 'type':
      return c.typeLabel;
    case 'score':
      return c.score;
    case 'peak':
      return c.peak.gainDbi;
    case 'swr':
      return c.feed.swr;
    case 'bandwidth':
      return c.bandwidth2to1.widthKHz;
    case 'efficiency':
      return c.efficiency.percent;
    case 'height':
      return topHeightM(c);
    case 'wire':
      return wireToCutM(c);
    default:
      return regionGain(c, key.slice('region:'.length));
  }
}

/** The natural first direction of a column: best first for figures of merit, lowest first for SWR, rank, wire. */
export function defaultDir(key: SortKey): 1 | -1 {
  return key === 'rank' || key === 'swr' || key === 'type' || key === 'wire' || key === 'height' ? 1 : -1;
}

/** Rows sorted by one column, ties kept in rank order (band first, as the core ranks per band). */
export function sortCandidates(list: readonly Candidate[], s: SortState): Candidate[] {
  return [...list].sort((a, b) => {
    const va = sortValue(a, s.key);
    const vb = sortValue(b, s.key);
    const c =
      typeof va === 'string' ? va.localeCompare(String(vb)) : va === vb ? 0 : va < (vb as number) ? -1 : 1;
    return c * s.dir || a.band.localeCompare(b.band) || a.rank - b.rank;
  });
}

/** Clicking a column: sort by it, or flip it when it is already the sort. */
export function nextSort(cur: SortState, key: SortKey): SortState {
  return cur.key === key ? { key, dir: cur.dir === 1 ? -1 : 1 } : { key, dir: defaultDir(key) };
}

export const fmtDb = (v: number): string =>
  Number.isFinite(v) ? `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(1)}` : '—';
export const fmtZ = (z: readonly [number, number]): string =>
  `${z[0].toFixed(1)} ${z[1] < 0 ? '−' : '+'} j${Math.abs(z[1]).toFixed(1)} Ω`;
export const fmtSwr = (s: number): string => (Number.isFinite(s) ? `${s.toFixed(2)}:1` : 'over 99:1');
/** Types with no broadside that still favour one way: a sloping wire radiates best toward its slope. */
const SLOPING: ReadonlySet<Candidate['type']> = new Set(['sloper', 'sloping-vertical']);
/** The candidate's broadside bearings; a sloping wire's favoured bearing; else 'all round'. */
export const fmtBearings = (c: Pick<Candidate, 'type' | 'broadsideDeg' | 'peak'>): string =>
  c.broadsideDeg.length
    ? c.broadsideDeg.map((x) => `${Math.round(x)}°`).join(' / ')
    : SLOPING.has(c.type)
      ? `none: favours its slope, peak toward ${Math.round(c.peak.azimuthDeg)}°`
      : 'all round';
export const fmtLen = (m: number, units: UnitSystem): string => formatLength(m, units);

/** The type's short name for table cells (core/antennas/typeName.ts; the full label is in the detail). */
export const shortType = (c: Candidate): string =>
  c.type === 'vertical' ? 'Vertical, radials' : typeName(c.type);

/** A switched array's states in a few words ("2 directions: 154°, 244°"); empty for a fixed antenna. */
export function statesText(c: Pick<Candidate, 'states'>): string {
  if (c.states.length < 2) return '';
  return `${c.states.length} directions: ${c.states.map((s) => `${Math.round(s.beamDeg) % 360}°`).join(', ')}`;
}

export { servingState } from '../../../core/rank/candidateStates.ts';
