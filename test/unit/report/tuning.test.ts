// How to tune, in words and in the user's units (core/report/tuning.ts). The measurements here are
// invented inputs for the formatting and the checks; the solver's own rate is tested in
// renderer/src/plan/planRunTune.svelte.test.ts against full sweeps.
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { BUILDERS } from '../../../core/antennas/registry.ts';
import { planSite } from '../../../core/rank/plan.ts';
import { buildSheet, type TuningMeasurement } from '../../../core/report/buildSheet.ts';
import { CM_PER_INCH, TRIM_HOW, trimHow, tuningProblem, tuningText } from '../../../core/report/tuning.ts';
import { resonantAt, testEvaluator } from '../../helpers/testEvaluator.ts';

/** Invented: a rate of −0.9 kHz/cm around 3.57 MHz. */
const m: TuningMeasurement = {
  dimension: 'total wire length',
  trimM: 40.5,
  resonanceMHz: { shorter: 3.5885, longer: 3.552 },
  kHzPerCm: -0.9,
  cmPer10kHzUp: 10 / 0.9,
};
const F0_HZ = 3.57e6;

describe('tuning text', () => {
  it('an inch is 2.54 cm (international inch, exact by definition since 1959)', () => {
    expect(CM_PER_INCH).toBeCloseTo(2.54, 12);
  });

  it('metric users read centimetres, imperial users inches, for the same measurement', () => {
    expect(tuningText(m, 'metric')).toEqual({ rate: '0.90 kHz per cm', per10kHz: '11.1 cm' });
    // 0.9 kHz/cm × 2.54 cm/in = 2.286 kHz/in; 11.11 cm / 2.54 = 4.37 in.
    expect(tuningText(m, 'imperial')).toEqual({ rate: '2.29 kHz per inch', per10kHz: '4.4 in' });
  });

  it('has a trim text for every antenna type the planner builds, and a general one otherwise', () => {
    for (const b of BUILDERS) expect(TRIM_HOW[b.type], b.type).toMatch(/\w+/);
    expect(trimHow('dipole')).toBe(TRIM_HOW.dipole);
    expect(trimHow('no-such-type')).toBe('Change the trim dimension as described.');
  });

  it('says the same as the build sheet for each type on the demo lot', () => {
    const ev = testEvaluator({ resonantM: resonantAt(0.47, 0.24) });
    const project = buildDemoProject();
    const s = planSite(project, { evaluator: ev, bands: ['80m'] });
    const types = new Set(s.candidates.map((c) => c.type));
    expect(types.size).toBeGreaterThanOrEqual(4);
    for (const t of types) {
      const c = s.candidates.find((x) => x.type === t)!;
      const sheet = buildSheet({
        project,
        shortlist: s,
        candidate: c,
      });
      expect(sheet.tuning.instruction, t).toContain(trimHow(t));
    }
  });
});

describe('tuning checks', () => {
  it('passes a sound measurement', () => {
    expect(tuningProblem(m, F0_HZ)).toBeNull();
  });

  it('refuses numbers that are not finite', () => {
    expect(tuningProblem({ ...m, cmPer10kHzUp: NaN }, F0_HZ)).toMatch(/no resonance near/);
    expect(tuningProblem({ ...m, resonanceMHz: { shorter: Infinity, longer: 3.55 } }, F0_HZ)).toMatch(
      /no resonance near/,
    );
  });

  it('refuses a rate that says a longer wire resonates higher', () => {
    expect(tuningProblem({ ...m, kHzPerCm: 0.9, cmPer10kHzUp: -10 / 0.9 }, F0_HZ)).toMatch(
      /did not move down/,
    );
    expect(tuningProblem({ ...m, kHzPerCm: 0 }, F0_HZ)).toMatch(/did not move down/);
  });

  it('refuses resonances far from the design frequency (an extrapolated fit)', () => {
    const far = { ...m, resonanceMHz: { shorter: 3.3, longer: 3.27 } };
    expect(tuningProblem(far, F0_HZ)).toMatch(/does not resonate within 3 % of 3\.570 MHz/);
  });
});
