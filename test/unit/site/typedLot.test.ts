import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import {
  offsetPoint,
  parseSides,
  rectangleLot,
  walkedLot,
  TypedLotError,
} from '../../../core/site/typedLot.ts';

// Distances and bearings checked with GeographicLib's geodesic inverse on WGS84 between the
// corners themselves (core/REFERENCES.md §10: the registry's GeographicLib port as the reference);
// the code under test walks the sides in a projected frame, so this checks the walk, not the library.
const G = geodesic.Geodesic.WGS84;
const inv = (a: readonly number[], b: readonly number[]) => {
  const r = G.Inverse(a[1]!, a[0]!, b[1]!, b[0]!);
  return { m: r.s12!, az: ((r.azi1! % 360) + 360) % 360 };
};

describe('a lot typed by its sides', () => {
  const corner: [number, number] = [-93.4, 45.12];

  it('a 45 × 30 m rectangle at 20° has sides of 45 and 30 m to the millimetre, at 20° and 110°', () => {
    const c = rectangleLot(corner, 45, 30, 20);
    expect(c).toHaveLength(4);
    const s = [inv(c[0]!, c[1]!), inv(c[1]!, c[2]!), inv(c[2]!, c[3]!), inv(c[3]!, c[0]!)];
    expect(s.map((x) => x.m)).toEqual([45, 30, 45, 30].map((v) => expect.closeTo(v, 3)));
    expect(s[0]!.az).toBeCloseTo(20, 2);
    expect(s[1]!.az).toBeCloseTo(110, 2);
  });

  it('walks sides from a corner, closing straight when the last side is left out', () => {
    const sides = parseSides('45 @ 90; 30 @ 180; 45 @ 270');
    const { corners } = walkedLot(corner, sides);
    expect(corners).toHaveLength(4);
    expect(inv(corners[3]!, corners[0]!).m).toBeCloseTo(30, 2);
    const all = walkedLot(corner, parseSides('45 @ 90; 30 @ 180; 45 @ 270; 30 @ 0'));
    expect(all.corners).toHaveLength(4);
    expect(all.gapM).toBeLessThan(0.01);
  });

  it('refuses what cannot make a lot, naming the field', () => {
    expect(() => rectangleLot(corner, -1, 30, 0)).toThrow(TypedLotError);
    expect(() => rectangleLot(corner, 45, 30, 400)).toThrow(/bearing must be a bearing from 0 to 360°/);
    expect(() => parseSides('45 east')).toThrow(/side 1 \("45 east"\) is not "length @ bearing"/);
    expect(() => walkedLot(corner, [{ lengthM: 10, bearingDeg: 0 }])).toThrow(/at least two sides/);
    try {
      walkedLot(corner, [
        { lengthM: 10, bearingDeg: 0 },
        { lengthM: 0, bearingDeg: 90 },
      ]);
    } catch (e) {
      expect((e as TypedLotError).field).toBe('side 2 length');
    }
  });

  it('places a point by distance and bearing from another', () => {
    const p = offsetPoint(corner, 12.5, 135);
    const r = inv(corner, p);
    expect(r.m).toBeCloseTo(12.5, 3);
    expect(r.az).toBeCloseTo(135, 2);
  });
});
