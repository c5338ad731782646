/**
 * Feasibility results kept across plans. `checkPlacement` reads only the lot boundary, the
 * keep-outs and the settings of the site, and the placed elements; when one support moves, every
 * placement that does not use it has the same elements as before, so a planner that keeps this
 * memo between runs (the renderer's lead worker, while the user drags) checks only the placements
 * that changed. Elements are found by a hash of their fields and then compared field by field, so
 * a hit is the very result a fresh check would give (a hash collision only costs a fresh check).
 */
import type { PreparedSite } from './feasibility.ts';
import { checkPlacement, type Element, type FeasibilityResult } from './feasibility.ts';

export interface FeasibilityMemo {
  /** checkPlacement, answered from the memo when this site and these elements were checked before. */
  check(ps: PreparedSite, elements: readonly Element[]): FeasibilityResult;
  /** Results held. */
  size(): number;
}

/** What checkPlacement reads of a site, as text (computed once per prepared site). */
function siteText(ps: PreparedSite): string {
  const { boundary, keepOuts, settings } = ps.site;
  return JSON.stringify([boundary, keepOuts, settings]);
}

const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);

/**
 * A hash of plain data (numbers by their bits, strings by length and first code unit, field
 * values in order); what it leaves out only makes more elements share a bucket.
 */
function hashOf(v: unknown, h: number): number {
  if (typeof v === 'number') {
    f64[0] = v;
    h = Math.imul(h ^ u32[0]!, 0x01000193);
    return Math.imul(h ^ u32[1]!, 0x01000193);
  }
  if (typeof v === 'string') return Math.imul(h ^ (v.length * 65536 + (v.charCodeAt(0) || 0)), 0x01000193);
  if (Array.isArray(v)) {
    for (let i = 0; i < v.length; i++) h = hashOf(v[i], h);
    return Math.imul(h ^ v.length, 0x01000193);
  }
  if (v && typeof v === 'object') {
    for (const k in v) h = hashOf((v as Record<string, unknown>)[k], h);
    return h;
  }
  return Math.imul(h ^ (v === undefined ? 1 : v === null ? 2 : v ? 3 : 4), 0x01000193);
}

/** Field-by-field equality of plain data. */
function same(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || !a || !b) return false;
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!same(a[i], b[i])) return false;
    return true;
  }
  const x = a as Record<string, unknown>;
  const y = b as Record<string, unknown>;
  let n = 0;
  for (const k in x) {
    if (!same(x[k], y[k])) return false;
    n++;
  }
  for (const _ in y) n--;
  return n === 0;
}

/**
 * A memo of at most `limit` results per site (when full it starts again: the placements of the
 * latest plans are the ones asked again). Results are shared: callers must not change them.
 */
export function feasibilityMemo(limit = 10_000): FeasibilityMemo {
  const sites = new WeakMap<PreparedSite, string>();
  let site = '';
  let results = new Map<number, { elements: readonly Element[]; result: FeasibilityResult }[]>();
  let size = 0;
  return {
    check(ps, elements) {
      let text = sites.get(ps);
      if (text === undefined) sites.set(ps, (text = siteText(ps)));
      if (text !== site) {
        site = text;
        results = new Map();
        size = 0;
      }
      const key = hashOf(elements, 0x811c9dc5);
      const bucket = results.get(key);
      const hit = bucket?.find((b) => same(b.elements, elements));
      if (hit) return hit.result;
      const result = checkPlacement(ps, elements);
      if (size >= limit) {
        results = new Map();
        size = 0;
      }
      // The elements are kept as given: the planner builds them anew for every check and never changes them.
      const entry = { elements, result };
      const b = results.get(key);
      if (b) b.push(entry);
      else results.set(key, [entry]);
      size++;
      return result;
    },
    size: () => size,
  };
}
