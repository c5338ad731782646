/**
 * Feasibility results kept across plans. `checkPlacement` reads only the lot boundary, the
 * keep-outs and the settings of the site, and the placed elements; when one support moves, every
 * placement that does not use it has the same elements as before, so a planner that keeps this
 * memo between runs (the renderer's lead worker, while the user drags) checks only the placements
 * that changed. The key is the site's part that the check reads and the elements themselves, in
 * full (no hash, so no collision): a hit is the very result a fresh check would give.
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

/**
 * A memo of at most `limit` results per site (when full it starts again: the placements of the
 * latest plans are the ones asked again). Results are shared: callers must not change them.
 */
export function feasibilityMemo(limit = 50_000): FeasibilityMemo {
  const sites = new WeakMap<PreparedSite, string>();
  let site = '';
  let results = new Map<string, FeasibilityResult>();
  return {
    check(ps, elements) {
      let text = sites.get(ps);
      if (text === undefined) sites.set(ps, (text = siteText(ps)));
      if (text !== site) {
        site = text;
        results = new Map();
      }
      const key = JSON.stringify(elements);
      const hit = results.get(key);
      if (hit) return hit;
      const r = checkPlacement(ps, elements);
      if (results.size >= limit) results = new Map();
      results.set(key, r);
      return r;
    },
    size: () => results.size,
  };
}
