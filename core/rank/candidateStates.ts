/**
 * The switchable directions (relay states) of a shortlisted candidate as every view shows them:
 * each state's pattern placed on the site, and which state serves each target region. One module
 * for the app's plots and shortlist and for the build sheet, so that they cannot disagree.
 */
import { variantPatternKey, type Candidate, type Shortlist } from './plan.ts';
import { statePattern } from './states.ts';

/**
 * The ink of each direction (relay state) of one switched array, the same in the app's plots and
 * on the build sheet, so that a builder holding the sheet reads the app's colours.
 */
export const STATE_COLOURS = ['#173f5f', '#d0711b', '#2f7d4f', '#7d4e9e'] as const;

/** A canonical pattern (core/rank/pattern.ts PATTERN_GRID) and the rotation that places it on the site. */
export interface PlacedPattern {
  gainDbi: readonly number[];
  rotationDeg: number;
}

/**
 * Each direction (relay state) of a candidate as a placed pattern: the evaluated pattern (or that
 * of the state's own phasing), mirrored where the state says, turned by the state's rotation
 * (./states.ts); a switched pair's states are solved apart (Candidate.stateKeys). One entry for a
 * fixed antenna; empty when the shortlist has no pattern for it.
 */
export function statePatterns(
  shortlist: Pick<Shortlist, 'patterns'>,
  c: Candidate,
): { name: string; beamDeg: number; p: PlacedPattern }[] {
  if (c.stateKeys?.length) {
    // a switched pair: each state solved apart, in the site's frame turned by the candidate's rotation
    const out = c.stateKeys.map((key, i) => ({
      name: c.states[i]?.name ?? `state ${i + 1}`,
      beamDeg: c.states[i]?.beamDeg ?? c.peak.azimuthDeg,
      p: { gainDbi: shortlist.patterns[key] ?? [], rotationDeg: c.rotationDeg },
    }));
    return out.every((x) => x.p.gainDbi.length > 0) ? out : [];
  }
  const g = shortlist.patterns[c.evaluationKey];
  if (!g || g.length === 0) return [];
  const specs = c.design.states?.length ? c.design.states : [{ name: 'fixed', rotationDeg: 0 }];
  const variants: number[][] = [];
  for (let k = 1; shortlist.patterns[variantPatternKey(c.evaluationKey, k)]; k++)
    variants.push(shortlist.patterns[variantPatternKey(c.evaluationKey, k)]!);
  if (specs.some((s) => s.variant !== undefined && !variants[s.variant - 1])) return [];
  return specs.map((s, i) => ({
    name: s.name,
    beamDeg: c.states[i]?.beamDeg ?? c.peak.azimuthDeg,
    p: { gainDbi: statePattern(g, s, variants), rotationDeg: c.rotationDeg + s.rotationDeg },
  }));
}

/**
 * The state of a switched array that serves a region (its best there), numbered from 1; null for a
 * fixed antenna. Ties go to the first state.
 */
export function servingState(
  c: Pick<Candidate, 'states'>,
  regionId: string,
): { n: number; name: string; beamDeg: number } | null {
  if (c.states.length < 2) return null;
  let best = -1;
  let bestGain = -Infinity;
  c.states.forEach((s, i) => {
    const g = s.regions.find((r) => r.id === regionId)?.gainDbi ?? -Infinity;
    if (g > bestGain) {
      bestGain = g;
      best = i;
    }
  });
  if (best < 0) return null;
  const s = c.states[best]!;
  return { n: best + 1, name: s.name, beamDeg: s.beamDeg };
}
