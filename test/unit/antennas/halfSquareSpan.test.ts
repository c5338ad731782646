/**
 * Half-squares that adapt to the span (issue 19): a pair closer than the half-wave top gets a top
 * as long as the span and longer drops, trimmed by the field solver; a pair too close is rejected
 * with its shortfall.
 *
 * Physical check (no fixed values): shortening the top of a resonant half-square removes wire, so
 * the drops must grow to keep it resonant, and they must grow more as the top shrinks further.
 * The check is of that trend with the solver doing the trim. It runs on 40 m over a perfect
 * ground with the builders' own coarse segmentation (λ/40): the trend concerns the wire's total
 * electrical length, which neither the soil's loss nor a finer mesh changes in sign, and it keeps
 * each trim under a second.
 */
import { describe, expect, it } from 'vitest';
import { builderFor } from '../../../core/antennas/registry.ts';
import { bandPlan } from '../../../core/antennas/common.ts';
import { MIN_TOP_FRACTION, TOP_FRACTION } from '../../../core/antennas/halfSquare.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { supportPair, preparedLot } from '../site/lot.ts';

const band = bandPlan('40m');
const lambda = band.wavelengthM;

function propose(spanM: number, heightM = 14) {
  return builderFor('half-square').propose({
    site: preparedLot({ halfX: Math.max(40, spanM / 2 + 5), supports: supportPair(spanM, heightM) }),
    band,
  });
}

describe('half-square on a span shorter than its half-wave top', () => {
  it('shortens the top to the span, lengthens the nominal drops and says so', () => {
    const full = propose(0.52 * lambda).proposals[0];
    expect(full.adaptations).toBeUndefined();
    expect(full.design.params.topM).toBeCloseTo(TOP_FRACTION * lambda, 2);
    const p = propose(0.4 * lambda).proposals[0];
    expect(p.design.params.topM).toBeCloseTo(0.4 * lambda, 2);
    expect(p.design.trim.nominalM).toBeGreaterThan(full.design.trim.nominalM);
    expect(p.adaptations?.[0]).toMatch(/^top shortened to 17\.0 m .*drops lengthened/);
  });

  it('rejects a pair closer than the shortest top, naming the distance it needs and its shortfall', () => {
    const span = 0.25 * lambda;
    const out = propose(span);
    expect(out.proposals).toHaveLength(0);
    const r = out.rejections[0];
    const need = MIN_TOP_FRACTION * lambda;
    expect(r.reasons[0]).toContain(`${span.toFixed(1)} m apart`);
    expect(r.reasons[0]).toContain(`at least ${need.toFixed(1)} m`);
    expect(r.shortfall).toBeCloseTo((need - span) / need, 9);
  });

  it('rejects a pair too far apart for the rope limit, with the excess rope as its shortfall', () => {
    const span = 0.5 * lambda + 2 * 50; // ropes of 50 m each against the default 40 m limit
    const r = propose(span).rejections[0];
    expect(r.reasons[0]).toMatch(/needs ropes of 50\.0 m, over the 40 m rope limit/);
    expect(r.shortfall).toBeCloseTo(10 / 50, 6);
  });

  it('rejects with its shortfall a pair too low for the lengthened drops', () => {
    // 0.31 λ top: drops of about 0.34 λ; 5 m supports leave 2.5 m of drop plus a bent end to 1 m short of the middle.
    const out = propose(0.31 * lambda, 5);
    expect(out.proposals).toHaveLength(0);
    expect(out.rejections[0].shortfall).toBeGreaterThan(0);
    expect(out.rejections[0].reasons[0]).toMatch(/drops need about .* leaves room for/);
  });

  it("the solver's resonant drop grows as the span (and the top) shrinks", () => {
    const spans = [0.5, 0.45, 0.4, 0.35, 0.31].map((f) => f * lambda);
    const drops = spans.map((s) => {
      const p = propose(s).proposals[0];
      const r = evaluateDesign(p.design, 'perfect', solverEvaluator);
      expect(r.resonant, `resonance found for the ${s.toFixed(1)} m span`).toBe(true);
      expect(r.trimM).toBeLessThan(p.design.trim.maxM);
      return r.trimM;
    });
    for (let i = 1; i < drops.length; i++) expect(drops[i]).toBeGreaterThan(drops[i - 1]);
    // The wire keeps roughly its electrical length: each drop grows by the same order as half of
    // what the top lost (a quarter to twice: a bent end under the top counts for less than a
    // straight drop, so the growth may exceed the loss once the ends bend).
    for (let i = 1; i < drops.length; i++) {
      const halfLoss = (spans[i - 1] - spans[i]) / 2;
      const grew = drops[i] - drops[i - 1];
      expect(grew).toBeGreaterThan(0.25 * halfLoss);
      expect(grew).toBeLessThan(2 * halfLoss);
    }
  });
});
