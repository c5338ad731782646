/**
 * The inverted-L's far-support search (issue 19.3): every usable far support in reach is tried,
 * not only the nearest, within the stated budget (INVERTED_L_MAX_FAR_SUPPORTS per base support).
 * Geometry invented; the feasibility rules are core/site/feasibility.ts's.
 */
import { describe, expect, it } from 'vitest';
import { builderFor } from '../../../core/antennas/registry.ts';
import { bandPlan, placeElements } from '../../../core/antennas/common.ts';
import { INVERTED_L_MAX_FAR_SUPPORTS } from '../../../core/antennas/invertedL.ts';
import type { Proposal } from '../../../core/antennas/types.ts';
import { checkPlacement, prepareSite } from '../../../core/site/feasibility.ts';
import { powerLine, type LotSpec, preparedLot } from '../site/lot.ts';

const propose = (spec: LotSpec) => {
  const ps = preparedLot(spec);
  return { ps, out: builderFor('inverted-l').propose({ site: ps, band: bandPlan('80m') }) };
};
const fits = (ps: ReturnType<typeof prepareSite>, p: Proposal) =>
  checkPlacement(
    ps,
    placeElements(builderFor('inverted-l').elements(p.design, p.design.trim.nominalM), p.placement),
  );

describe('inverted-L far supports', () => {
  it('proposes a farther support when the nearest one is a poor choice', () => {
    // Base a (12 m, 80 m band: vertical part 12 m, top part ≈ 9.9 m). The nearest far support b
    // stands 15 m north, 10 m from a power line along y = 25: the rope to it comes within the
    // line's fall distance. c stands 20 m east, clear of everything.
    const { ps, out } = propose({
      supports: [
        { id: 'a', x: 0, y: 0, h: 12 },
        { id: 'b', x: 0, y: 15, h: 12 },
        { id: 'c', x: 20, y: 0, h: 12 },
      ],
      keepOuts: [powerLine('Line', 25, 5)],
    });
    const fromA = out.proposals.filter((p) => p.groupKey.startsWith('inverted-l:a:'));
    const toB = fromA.find((p) => p.groupKey === 'inverted-l:a:b');
    const toC = fromA.find((p) => p.groupKey === 'inverted-l:a:c');
    expect(toB).toBeDefined();
    expect(toC, JSON.stringify(out.rejections)).toBeDefined();
    expect(fits(ps, toB!).ok).toBe(false);
    expect(fits(ps, toC!).ok).toBe(true);
    expect(out.rejections.some((r) => /nearest|tallest far supports/.test(r.reasons.join(' ')))).toBe(false);
  });

  it('tries at most INVERTED_L_MAX_FAR_SUPPORTS far supports per base, the tallest first, and says so', () => {
    // Ten far supports on a circle 20 m around the base, heights 10..19 m (all in reach).
    const far = Array.from({ length: 10 }, (_, i) => {
      const t = (2 * Math.PI * i) / 10;
      return { id: `f${i}`, x: 20 * Math.sin(t), y: 20 * Math.cos(t), h: 10 + i };
    });
    // Some far supports are bases of their own inverted-Ls too: only the base a's proposals count.
    const { out } = propose({ supports: [{ id: 'a', x: 0, y: 0, h: 12 }, ...far] });
    const fromA = out.proposals.filter((p) => p.supports[0] === 'a');
    expect(fromA).toHaveLength(INVERTED_L_MAX_FAR_SUPPORTS);
    const tried = new Set(fromA.map((p) => p.supports[1]));
    for (let i = 10 - INVERTED_L_MAX_FAR_SUPPORTS; i < 10; i++) expect(tried.has(`f${i}`)).toBe(true);
    const budget = out.rejections.filter(
      (r) => r.supports[0] === 'a' && /tallest far supports in reach/.test(r.reasons[0]),
    );
    expect(budget).toHaveLength(10 - INVERTED_L_MAX_FAR_SUPPORTS);
  });

  it('gives a measured shortfall when a far support is too close', () => {
    const { out } = propose({
      supports: [
        { id: 'a', x: 0, y: 0, h: 12 },
        { id: 'b', x: 5, y: 0, h: 12 },
      ],
    });
    const r = out.rejections.find((x) => x.supports.join() === 'a,b')!;
    expect(r.reasons[0]).toMatch(/too close/);
    // Needs a run of 1.1 × (0.26 λ − 12 m); has 5 m.
    const need = 1.1 * (0.26 * bandPlan('80m').wavelengthM - 12);
    expect(r.shortfall).toBeCloseTo((need - 5) / need, 6);
  });
});
