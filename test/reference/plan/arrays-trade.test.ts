// Loose trade check, marked: "common practice, no source": over very good ground a parasitic
// reflector behind a half-square raises its 15° gain by roughly 3 dB (from about 6 to about 9 dBi).
// The array is the registry's half-square-with-reflector builder (core/antennas/halfSquareArrays.ts)
// on an invented lot with four supports near a rectangle, with the stub it designs, trimmed by the
// planner's evaluation; the half-square alone is the registry's half-square at the same height.
import { describe, expect, it } from 'vitest';
import { bandPlan } from '../../../core/antennas/common.ts';
import { halfSquareBuilder } from '../../../core/antennas/halfSquare.ts';
import { halfSquareReflectorBuilder } from '../../../core/antennas/halfSquareArrays.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { preparedLot } from '../../unit/site/lot.ts';
import { gridGain } from '../../helpers/arrayChecks.ts';

const TRADE =
  'common practice, no source: reflector behind a half-square ≈ +3 dB at 15° over very good ground';

describe('half-square with a parasitic reflector (loose trade check)', () => {
  it('gains roughly 3 dB at 15° over the half-square alone, and has a back', () => {
    const band = bandPlan('80m');
    const site = preparedLot({
      halfX: 80,
      halfY: 70,
      station: [-60, 0],
      supports: [
        { id: 'a1', x: -30, y: 6.3, h: 24 },
        { id: 'a2', x: 30, y: 6.5, h: 24 },
        { id: 'b1', x: -30, y: -6.3, h: 24 },
        { id: 'b2', x: 30, y: -6.4, h: 24 },
      ],
    });
    const ground = { classId: 'very-good' } as const;
    const array = halfSquareReflectorBuilder.propose({ site, band }).proposals[0].design;
    const single = halfSquareBuilder.propose({ site, band }).proposals[0].design;
    const g = evaluateDesign(array, ground, solverEvaluator).gainDbi;
    const g0 = gridGain(evaluateDesign(single, ground, solverEvaluator).gainDbi, 15, 0);
    expect(g0, `${TRADE}: the half-square alone is about 6 dBi`).toBeGreaterThan(5);
    expect(g0, TRADE).toBeLessThan(7.5);
    expect(gridGain(g, 15, 0) - g0, TRADE).toBeGreaterThan(2);
    expect(gridGain(g, 15, 0) - g0, TRADE).toBeLessThan(4.5);
    expect(gridGain(g, 15, 0) - gridGain(g, 15, 180), 'a reflector gives the array a back').toBeGreaterThan(
      6,
    );
  });
});
