/** Pieces the array tests share: a pattern read at a grid direction, and one vertical to compare an array with. */
import { bandPlan } from '../../core/antennas/common.ts';
import type { Design, DesignParams } from '../../core/antennas/types.ts';
import { PATTERN_GRID } from '../../core/rank/pattern.ts';

/** Gain of a pattern on PATTERN_GRID at a direction of the grid (azimuth taken modulo 360°); throws off the grid. */
export function gridGain(g: readonly number[], elDeg: number, azDeg: number): number {
  const ei = PATTERN_GRID.elevationsDeg.indexOf(elDeg);
  const ai = PATTERN_GRID.azimuthsDeg.indexOf(((azDeg % 360) + 360) % 360);
  if (ei < 0 || ai < 0) throw new Error('direction not on the grid');
  return g[ei * PATTERN_GRID.azimuthsDeg.length + ai];
}

/**
 * One self-supporting ground-mounted vertical on the array's band and design frequency: by
 * default on 16 quarter-wave radials, its height trimmed from 0.245 λ between 0.2 and 0.3 λ.
 */
export function oneVertical(
  array: Design,
  radialLengthsM?: DesignParams[string],
  trim?: Design['trim'],
): Design {
  const lambda = bandPlan(array.band).wavelengthM;
  return {
    type: 'vertical',
    band: array.band,
    designFreqHz: array.designFreqHz,
    params: {
      radialLengthsM: radialLengthsM ?? Array(16).fill(lambda / 4),
      supportHeightM: 0,
      selfSupporting: 1,
    },
    trim: trim ?? { name: 'height', nominalM: 0.245 * lambda, minM: 0.2 * lambda, maxM: 0.3 * lambda },
  };
}
