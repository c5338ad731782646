/**
 * A candidate's designed match in plain words, the same for the detail panel and the build sheet.
 */
import type { CandidateMatching } from './candidateMatch.ts';
import type { MatchComponent } from './lNetwork.ts';

export interface MatchingText {
  /** One sentence: what the feed is and what the network does. */
  summary: string;
  /** Both L-network arrangements, the chosen one first, each with its parts and loss. */
  arrangements: string[];
  /** For a ground-mounted vertical: the shunt coil and the transformer, in words. */
  alternatives: string[];
  /** How to adjust it. */
  adjust: string;
}

const part = (k: Pick<MatchComponent, 'kind' | 'value' | 'unit' | 'position'>): string =>
  `${k.kind === 'inductor' ? `${Number(k.value.toPrecision(3))} µH coil` : `${Number(k.value.toPrecision(3))} pF capacitor`} ${k.position === 'series' ? 'in series' : 'across the line'}`;

export function matchingText(
  m: CandidateMatching,
  feed: { zOhm: [number, number]; swr: number; z0Ohm: number; freqMHz: number },
): MatchingText {
  const [r, x] = feed.zOhm;
  const z = `${r.toFixed(1)} ${x < 0 ? '−' : '+'} j${Math.abs(x).toFixed(1)} Ω`;
  const arrangements = m.arrangements.map(
    (a, i) =>
      `${i === 0 ? 'Chosen (lower loss)' : 'Other arrangement'}: ${a.components.map(part).join(', then ')} (transmitter side first); ${a.lossDb.toFixed(2)} dB lost in the parts.`,
  );
  const alternatives: string[] = [];
  const v = m.vertical;
  if (v?.shuntCoil)
    alternatives.push(
      `Shunt coil at the base: shorten the vertical until the feed reads about ${r.toFixed(0)} − j${Math.abs(v.shuntCoil.targetReactanceOhm).toFixed(0)} Ω, then put a ${Number(v.shuntCoil.coil.value.toPrecision(3))} µH coil from the feed point to the radials; ${v.shuntCoil.lossDb.toFixed(2)} dB in the coil. Adjust the coil for the lowest SWR, then the length again.`,
    );
  if (v?.transformer)
    alternatives.push(
      `Transformer: a ${v.transformer.ratio}:1 broadband unun at the base with the vertical trimmed to resonance leaves an SWR of about ${v.transformer.swrAfter.toFixed(2)}; about ${v.transformer.lossDb} dB (typical, from memory).`,
    );
  return {
    summary: `The feed is ${z} at ${feed.freqMHz.toFixed(3)} MHz (SWR ${feed.swr.toFixed(2)} on ${feed.z0Ohm} Ω). An L-network at the feed point brings it to ${feed.z0Ohm} Ω; loss estimated with coils of Q ${m.q.inductor} and capacitors of Q ${m.q.capacitor} (typical values, from memory).`,
    arrangements,
    alternatives,
    adjust: m.adjust,
  };
}
