/**
 * Switchable directions (relay states) of an array: each state's pattern is the evaluated pattern
 * turned by the state's rotation, or mirrored first across a vertical plane when the array is
 * mirror-symmetric rather than turn-symmetric (Design.states, `statePattern`); a state of another
 * phasing (`variant`) starts from its own solved pattern (EvaluationRecord.variants). Each region is
 * served by its best state, and the score is the weighted mean of those best region gains, as for
 * a fixed antenna.
 */
import type { Design } from '../antennas/types.ts';
import { PATTERN_GRID } from './pattern.ts';

type StateSpec = NonNullable<Design['states']>[number];

/**
 * The canonical pattern (PATTERN_GRID, elevation-major) of one state: the evaluated pattern (or,
 * for a state with `variant` k, `variants[k − 1]`, the pattern of that phasing) mirrored across the vertical plane at canonical bearing `mirrorAxisDeg` (az → 2φ − az) when the
 * state has one; its `rotationDeg` is applied by the placement like any rotation. The axis must
 * map the 2° grid onto itself (a whole number of degrees).
 */
export function statePattern(
  gainDbi: readonly number[],
  state: StateSpec,
  variants: readonly (readonly number[])[] = [],
): readonly number[] {
  if (state.variant !== undefined) {
    const v = variants[state.variant - 1];
    if (!v || v.length !== gainDbi.length)
      throw new Error(`statePattern: the pattern of variant ${state.variant} is missing`);
    gainDbi = v;
  }
  if (state.mirrorAxisDeg === undefined) return gainDbi;
  const az = PATTERN_GRID.azimuthsDeg;
  const nAz = az.length;
  const step = 360 / nAz;
  const out = new Array<number>(gainDbi.length);
  const rows = gainDbi.length / nAz;
  for (let j = 0; j < nAz; j++) {
    const src = (((2 * state.mirrorAxisDeg - az[j]) % 360) + 360) % 360;
    const k = Math.round(src / step) % nAz;
    for (let i = 0; i < rows; i++) out[i * nAz + j] = gainDbi[i * nAz + k];
  }
  return out;
}

export type BaseScorer = (
  gainDbi: readonly number[],
  rot: number,
) => { score: number; regionGains: number[] };

export interface StateResult {
  name: string;
  /** Beam bearing of the state on the site, degrees (the peak's bearing for a fixed antenna). */
  beamDeg: number;
  regionGains: number[];
  score: number;
}

export interface StatesScore {
  score: number;
  /** Per region: the gain of its best state. */
  regionGains: number[];
  states: StateResult[];
}

/** Canonical bearing of a state's beam before its rotation: its own, else twice its mirror axis, else 0. */
export function stateBeamDeg(s: StateSpec): number {
  if (s.beamDeg !== undefined)
    return s.mirrorAxisDeg === undefined ? s.beamDeg : 2 * s.mirrorAxisDeg - s.beamDeg;
  return s.mirrorAxisDeg === undefined ? 0 : 2 * s.mirrorAxisDeg;
}

const norm = (deg: number): number => Math.round((((deg % 360) + 360) % 360) * 10) / 10;

/**
 * Score of a design placed with rotation `rot`. `weights` are the regions' weights; with no weight
 * at all the base scorer's own score is used and the best state's is kept. `peakAzDeg` is the
 * canonical bearing of the pattern's peak (the beam of a fixed antenna).
 */
export function scoreStates(
  base: BaseScorer,
  weights: readonly number[],
  gainDbi: readonly number[],
  rot: number,
  design: Pick<Design, 'states'>,
  peakAzDeg = 0,
  variants: readonly (readonly number[])[] = [],
): StatesScore {
  const states = design.states?.length ? design.states : [{ name: 'fixed', rotationDeg: 0 }];
  const fixed = !design.states?.length;
  const results: StateResult[] = states.map((s) => {
    const r = base(statePattern(gainDbi, s, variants), rot + s.rotationDeg);
    const beam = stateBeamDeg(s);
    return {
      name: s.name,
      beamDeg: norm(fixed ? rot + peakAzDeg : rot + s.rotationDeg + beam),
      regionGains: r.regionGains,
      score: r.score,
    };
  });
  const regionGains = weights.map((_, k) => Math.max(...results.map((r) => r.regionGains[k])));
  const total = weights.reduce((s, w) => s + w, 0);
  const score =
    total > 0
      ? regionGains.reduce((s, g, k) => s + g * weights[k], 0) / total
      : Math.max(...results.map((r) => r.score));
  return { score, regionGains, states: results };
}
