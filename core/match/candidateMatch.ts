/**
 * The designed match of one candidate, from its solved feed impedance at the design frequency
 * (./lNetwork.ts): none when the SWR is already at or below MATCH_ABOVE_SWR; otherwise the
 * L-network of lower loss, the other arrangement, and for a ground-mounted vertical (a candidate
 * with radials) the shunt coil and the transformer. A pure function of the candidate: the detail
 * panel, the build sheet and `plan --json` all call it.
 */
import {
  DEFAULT_Q,
  MATCH_ABOVE_SWR,
  designLNetworks,
  shuntCoilMatch,
  transformerMatch,
  type ComponentQ,
  type LNetworkDesign,
  type ShuntCoilMatch,
  type TransformerMatch,
} from './lNetwork.ts';

/** What the match needs from a candidate. */
export interface MatchInput {
  feed: { zOhm: [number, number]; swr: number; z0Ohm: number; freqMHz: number };
  groundSystem: { kind: string };
}

export interface CandidateMatching {
  /** The network in words, e.g. "L-network: series coil at the antenna, capacitor across the line". */
  network: string;
  /** The chosen network's parts, transmitter side first; values to three significant figures. */
  components: {
    kind: 'inductor' | 'capacitor';
    position: 'series' | 'shunt';
    value: number;
    unit: 'µH' | 'pF';
  }[];
  /** Loss in the components at the stated Q, dB. */
  lossDb: number;
  q: ComponentQ;
  /** Both usable L-network arrangements, lower loss first (the first is the chosen one). */
  arrangements: LNetworkDesign[];
  /** For a ground-mounted vertical: a coil across the base, and a broadband transformer. */
  vertical: { shuntCoil: ShuntCoilMatch | null; transformer: TransformerMatch | null } | null;
  /** How to set it up and adjust it (common practice, no source). */
  adjust: string;
}

const sig3 = (v: number): number => Number(v.toPrecision(3));

export const MATCH_ADJUST =
  'Build it with an adjustable coil (taps or a roller) and a variable capacitor near the values given. With an antenna analyser at the feed point, set the coil first, then turn the capacitor for the lowest SWR at your frequency; if the minimum stays above 1.5:1, move the coil one tap and repeat. Keep the network in a weatherproof box at the feed point (common practice, no source).';

export function candidateMatching(c: MatchInput, q: ComponentQ = DEFAULT_Q): CandidateMatching | null {
  const { zOhm, swr, z0Ohm, freqMHz } = c.feed;
  if (!(swr > MATCH_ABOVE_SWR) || !(zOhm[0] > 0)) return null;
  const arrangements = designLNetworks(zOhm, freqMHz * 1e6, z0Ohm, q);
  const best = arrangements[0];
  if (!best) return null;
  const words = best.components
    .map(
      (k) =>
        `${k.kind === 'inductor' ? 'coil' : 'capacitor'} ${k.position === 'series' ? 'in series' : 'across the line'}`,
    )
    .join(', ');
  const vertical =
    c.groundSystem.kind === 'radials'
      ? {
          shuntCoil: shuntCoilMatch(zOhm[0], freqMHz * 1e6, z0Ohm, q),
          transformer: transformerMatch(zOhm[0], z0Ohm),
        }
      : null;
  return {
    network: `L-network (${words}; transmitter side first)`,
    components: best.components.map((k) => ({
      kind: k.kind,
      position: k.position,
      value: sig3(k.value),
      unit: k.unit,
    })),
    lossDb: Number(best.lossDb.toFixed(3)),
    q,
    arrangements,
    vertical,
    adjust:
      best.components.length === 1
        ? `Build it with a variable ${best.components[0]!.kind === 'inductor' ? 'coil' : 'capacitor'} near the value given, in series at the feed point, and set it for the lowest SWR at your frequency with an antenna analyser; keep it in a weatherproof box (common practice, no source).`
        : MATCH_ADJUST,
  };
}
