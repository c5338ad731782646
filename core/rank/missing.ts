/**
 * "Why not?": for each antenna type planned on a band that has no candidate in the shortlist, the
 * single closest miss in plain words, the type's name first.
 *
 * Which rejection is the closest, in this order:
 *  1. the one with the smallest measured shortfall (Rejection.shortfall: what is lacking over
 *     what is needed, set by the builders on measurable misses: a span, a height, a rope);
 *  2. else the placement the lot refused by the least (RejectedPlacement.missByM: its worst
 *     violation of the site rules, metres);
 *  3. else the most common reason among the type's rejections;
 *  4. else (nothing was even tried) that there was nothing on the lot to try it on.
 */
import { typeName } from '../antennas/typeName.ts';
import type { AntennaTypeId } from '../antennas/types.ts';
import type { Band } from '../project/schema.ts';

export interface MissingType {
  type: AntennaTypeId;
  band: Band;
  /** The closest miss in plain words, e.g. "Half-square: between Oak and Ash, span 24.0 m is shorter than the 40.2 m top wire". */
  closestMiss: string;
  /** The closest miss's measured shortfall (0 = just fits), when it has one. */
  shortfall?: number;
  /** Or the metres by which the lot refused its closest placement, when that was the closest miss. */
  missByM?: number;
}

/** What closestMiss reads of a rejection (a RejectedPlacement of core/rank/plan.ts). */
export interface MissInput {
  where: string;
  reasons: string[];
  shortfall?: number;
  missByM?: number;
}

export function closestMiss(
  type: AntennaTypeId,
  band: Band,
  rejected: readonly MissInput[],
  /** Said when nothing was tried, instead of "nothing on the lot to try it on" (a type not needed here). */
  notTried?: string,
): MissingType {
  const name = typeName(type);
  const say = (r: MissInput): string =>
    `${name}: ${r.where ? `${r.where}, ` : ''}${r.reasons.join('; ') || 'refused without a stated reason'}`;
  let best: MissInput | undefined;
  for (const r of rejected)
    if (r.shortfall !== undefined && (best === undefined || r.shortfall < best.shortfall!)) best = r;
  if (best) return { type, band, closestMiss: say(best), shortfall: best.shortfall };
  for (const r of rejected)
    if (r.missByM !== undefined && (best === undefined || r.missByM < best.missByM!)) best = r;
  if (best) {
    // The lot's rules it misses, worst first: the worst one, and how many more.
    const more = best.reasons.length - 1;
    const one = { ...best, reasons: best.reasons.slice(0, 1) };
    const tail = more > 0 ? ` (and ${more} more rule${more > 1 ? 's' : ''})` : '';
    return { type, band, closestMiss: say(one) + tail, missByM: best.missByM };
  }
  if (rejected.length) {
    const count = new Map<string, number>();
    for (const r of rejected) {
      const why = r.reasons[0] ?? '';
      count.set(why, (count.get(why) ?? 0) + 1);
    }
    let top = '';
    let n = 0;
    for (const [why, c] of count) if (c > n) [top, n] = [why, c];
    const tail = rejected.length > 1 ? ` (${n} of ${rejected.length} tries)` : '';
    return { type, band, closestMiss: `${name}: ${top || 'refused without a stated reason'}${tail}` };
  }
  return {
    type,
    band,
    closestMiss: `${name}: ${notTried ?? 'nothing on the lot to try it on (no support or free spot it could use)'}`,
  };
}
