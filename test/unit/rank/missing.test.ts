/**
 * "Why not?" (issue 19.4): each planned type and band without a candidate gets its single closest
 * miss in plain words. Lots invented; the solver is the test double (test/helpers/testEvaluator.ts).
 */
import { describe, expect, it } from 'vitest';
import { closestMiss } from '../../../core/rank/missing.ts';
import { planSite } from '../../../core/rank/plan.ts';
import { bandPlan } from '../../../core/antennas/common.ts';
import { MIN_TOP_FRACTION } from '../../../core/antennas/halfSquare.ts';
import { resonantAt, testEvaluator } from '../../helpers/testEvaluator.ts';
import { testLot } from '../site/lot.ts';

describe('closest miss per type and band', () => {
  it('names the half-square pair distance and what it needs when no pair is far enough apart', () => {
    // Three trees 20, 12 and 23.3 m apart: the 80 m half-square's shortest top (MIN_TOP_FRACTION λ,
    // a shortened top with longer drops) is about 25 m.
    const project = testLot({
      halfX: 30,
      halfY: 30,
      supports: [
        { id: 'oak', x: -10, y: 0, h: 16 },
        { id: 'ash', x: 10, y: 0, h: 16 },
        { id: 'elm', x: 10, y: 12, h: 16 },
      ],
      bands: ['80m'],
    });
    const s = planSite(project, {
      evaluator: testEvaluator({ resonantM: resonantAt(0.47) }),
      types: ['half-square', 'dipole'],
    });
    expect(s.candidates.some((c) => c.type === 'half-square')).toBe(false);
    const hs = s.missing.filter((m) => m.type === 'half-square');
    expect(hs).toHaveLength(1);
    const T = MIN_TOP_FRACTION * bandPlan('80m').wavelengthM;
    const widest = Math.hypot(20, 12);
    // The widest pair (oak–elm, 23.3 m) is the closest miss, short by (T − 23.3)/T.
    expect(hs[0].closestMiss).toMatch(/^Half-square: /);
    expect(hs[0].closestMiss).toContain(`${widest.toFixed(1)} m`);
    expect(hs[0].closestMiss).toContain(`${T.toFixed(1)} m`);
    expect(hs[0].shortfall).toBeCloseTo((T - widest) / T, 3);
    // A type that has a candidate is not missing; every entry is for a planned band.
    for (const m of s.missing)
      expect(s.candidates.some((c) => c.type === m.type && c.band === m.band)).toBe(false);
  });

  it('falls back to the least refused placement, then the most common reason, then nothing to try', () => {
    const byFeas = closestMiss('dipole', '80m', [
      { where: 'between a and b', reasons: ['top wire leaves the lot by 4.0 m', 'x'], missByM: 4 },
      { where: 'between a and c', reasons: ['top wire leaves the lot by 1.0 m'], missByM: 1 },
    ]);
    expect(byFeas.closestMiss).toBe('Dipole: between a and c, top wire leaves the lot by 1.0 m');
    const byCount = closestMiss('inverted-l', '40m', [
      { where: 'up a', reasons: ['tall enough'] },
      { where: 'up b', reasons: ['tall enough'] },
      { where: 'up c', reasons: ['other'] },
    ]);
    expect(byCount.closestMiss).toBe('Inverted-L: tall enough (2 of 3 tries)');
    expect(closestMiss('dipole', '160m', []).closestMiss).toMatch(/^Dipole: nothing on the lot to try/);
  });
});
