// The feasibility memo answers exactly what a fresh check answers, checks each placement of a
// site once, and checks again when the site's boundary, keep-outs or settings change.
import { describe, expect, it } from 'vitest';
import { checkPlacement, type Element } from '../../../core/site/feasibility.ts';
import { feasibilityMemo } from '../../../core/site/feasibilityMemo.ts';
import { box, testLot, preparedLot } from './lot.ts';

const shed = {
  id: 'shed',
  name: 'Shed',
  kind: 'building' as const,
  geometry: box(5, -5, 15, 5),
  clearanceM: 2,
};
const prepared = (spec: Parameters<typeof testLot>[0] = {}) => preparedLot(spec);
const wire = (x0: number, x1: number, z = 12): Element[] => [
  { kind: 'wire', label: 'top wire', from: [x0, 0, z], to: [x1, 0, z] },
  { kind: 'end', label: 'west end', at: [x0, 0, z] },
];

describe('feasibility memo', () => {
  it('gives the fresh result, reuses it for the same elements on a site rebuilt alike, and checks again when the site changes', () => {
    const memo = feasibilityMemo();
    const a = prepared({ keepOuts: [shed] });
    const placements = [wire(-20, 0), wire(-20, 10), wire(-49.5, -10), wire(-20, 0, 2)];
    const first = placements.map((e) => memo.check(a, e));
    placements.forEach((e, i) => expect(first[i]).toEqual(checkPlacement(a, e)));
    expect(first.map((r) => r.ok)).toEqual([true, false, false, false]);
    expect(memo.size()).toBe(4);

    // A support moved: a new prepared site with the same boundary, keep-outs and settings.
    const b = prepared({ keepOuts: [shed], supports: [{ id: 't', x: 3, y: 3, h: 15 }] });
    placements.forEach((e, i) => expect(memo.check(b, e)).toBe(first[i]));
    expect(memo.size()).toBe(4);

    // The keep-out moved: checked again, with the new answer.
    const c = prepared({ keepOuts: [{ ...shed, geometry: box(25, -5, 35, 5) }] });
    const moved = memo.check(c, placements[1]!);
    expect(moved.ok).toBe(true);
    expect(moved).toEqual(checkPlacement(c, placements[1]!));
    expect(memo.size()).toBe(1);
  });

  it('tells apart elements that share a hash (labels of one length and first letter)', () => {
    const memo = feasibilityMemo();
    const a = prepared();
    const named = (label: string): Element[] => [{ kind: 'end', label, at: [0, 0, 2] }];
    const one = memo.check(a, named('end A'));
    const two = memo.check(a, named('end B'));
    expect(one.violations[0]!.message).toMatch(/^end A /);
    expect(two.violations[0]!.message).toMatch(/^end B /);
    expect(memo.size()).toBe(2);
    expect(memo.check(a, named('end B'))).toBe(two);
  });

  it('holds at most its limit', () => {
    const memo = feasibilityMemo(3);
    const a = prepared();
    for (let x = 0; x < 10; x++) memo.check(a, wire(-20, x));
    expect(memo.size()).toBeLessThanOrEqual(3);
  });
});
