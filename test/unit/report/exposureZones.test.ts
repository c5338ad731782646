/**
 * The exposure zones on the lot: geometric checks with closed-form answers (a disc round a
 * vertical, a stadium under a horizontal wire, nothing under a high wire), convergence of the
 * outline under refinement, and which places a zone reaches on an invented lot.
 */
import { describe, expect, it } from 'vitest';
import {
  exposureOnLot,
  marchingSquares,
  placeReach,
  ringArea,
  zoneRings,
  type ZoneWire,
} from '../../../core/report/exposureZones.ts';
import { estimateExposure } from '../../../core/report/exposure.ts';
import { buildSite } from '../../../core/site/site.ts';
import { ring, testLot, box, walkway } from '../site/lot.ts';

const area = (rings: [number, number][][]): number => rings.reduce((s, r) => s + Math.abs(ringArea(r)), 0);

describe('zone outlines', () => {
  it('a vertical from the ground: a disc of the compliance radius round its base', () => {
    const wires: ZoneWire[] = [{ from: [3, -2, 0], to: [3, -2, 12] }];
    const R = 2.5;
    const rings = zoneRings(wires, R);
    expect(rings).toHaveLength(1);
    // Area of a disc πR²; the polygonal outline is inside the circle, within 1 %.
    expect(area(rings)).toBeGreaterThan(Math.PI * R * R * 0.99);
    expect(area(rings)).toBeLessThan(Math.PI * R * R * 1.005);
    for (const p of rings[0]) expect(Math.hypot(p[0] - 3, p[1] + 2)).toBeCloseTo(R, 1);
  });

  it('a horizontal wire at 3 m: a stadium of half-width √(R² − (h − H)²)', () => {
    const L = 20;
    const h = 3;
    const R = 2;
    const w = Math.sqrt(R * R - (h - 2) ** 2);
    const rings = zoneRings([{ from: [-L / 2, 0, h], to: [L / 2, 0, h] }], R);
    expect(rings).toHaveLength(1);
    const exact = 2 * w * L + Math.PI * w * w;
    expect(Math.abs(area(rings) - exact) / exact).toBeLessThan(0.01);
  });

  it('a wire higher than head height plus the radius has no zone on the ground', () => {
    expect(zoneRings([{ from: [-10, 0, 8], to: [10, 0, 8] }], 5.9)).toEqual([]);
    expect(zoneRings([{ from: [-10, 0, 8], to: [10, 0, 8] }], 6.1).length).toBe(1);
  });

  it('two verticals far apart give two rings; close together one', () => {
    const v = (x: number): ZoneWire => ({ from: [x, 0, 0], to: [x, 0, 10] });
    expect(zoneRings([v(-10), v(10)], 2)).toHaveLength(2);
    expect(zoneRings([v(-1), v(1)], 2)).toHaveLength(1);
  });

  it('the outline of a circle field converges to πR² as the grid is refined', () => {
    const errs = [0.5, 0.25, 0.125].map((cell) => {
      const n = Math.ceil(8 / cell) + 1;
      const f = new Float64Array(n * n);
      for (let j = 0; j < n; j++)
        for (let i = 0; i < n; i++) f[j * n + i] = Math.hypot(-4 + i * cell, -4 + j * cell) - 3;
      const rings = marchingSquares(f, n, n, -4, -4, cell);
      return Math.abs(area(rings) - Math.PI * 9);
    });
    // Second-order: each halving cuts the error by about four.
    expect(errs[1]).toBeLessThan(errs[0] / 3);
    expect(errs[2]).toBeLessThan(errs[1] / 3);
  });
});

describe('places a zone reaches', () => {
  // Invented lot: 100 × 60 m, a house 8 m east of a vertical at the origin, a path 4 m west.
  const project = testLot({
    keepOuts: [
      {
        id: 'house',
        name: 'House',
        kind: 'building',
        geometry: box(8, -5, 18, 5),
      },
      walkway('Garden path', -4),
    ],
    station: [0, 25],
  });
  const site = buildSite(project);
  const origin = site.frame.toLocal(site.frame.toLonLat([0, 0]));
  const vertical: ZoneWire[] = [{ from: [origin[0], origin[1], 0], to: [origin[0], origin[1], 12] }];

  it('measures the closest approach to each place', () => {
    const byName = new Map(placeReach(vertical, site).map((p) => [p.name, p.closestM]));
    expect(byName.get('House')).toBeCloseTo(8, 1);
    expect(byName.get('Garden path')).toBeCloseTo(4, 1);
    // The lot is 100 × 60 m centred on the origin: the nearest boundary is 30 m away.
    expect(byName.get('the property line')).toBeCloseTo(30, 0);
    expect(byName.get('the station point (operating position)')).toBeCloseTo(25, 0);
  });

  it('flags what lies inside the compliance distance, with and without the reflection factor', () => {
    // Choose the power so that the general-population distance is about 5 m with the factor.
    const base = { mode: 'cw' as const, onTimeFraction: 1, feedLossDb: 0, gainDbi: 0, freqMhz: 3.6 };
    const unit = estimateExposure({ ...base, peakEnvelopePowerW: 1 });
    const r1 = unit.distances[0].withGroundReflectionM; // distance ∝ √P
    const est = estimateExposure({ ...base, peakEnvelopePowerW: (5 / r1) ** 2 });
    const lot = exposureOnLot(vertical, site, est);
    const general = lot.zones.find((z) => z.limitId === 'fcc-general')!;
    expect(general.radiusM).toBeCloseTo(5, 6);
    expect(general.reached.map((p) => p.name)).toEqual(['Garden path']);
    // Free space: 5/1.6 = 3.1 m, short of the path at 4 m.
    expect(general.reachedFreeSpace).toEqual([]);
    expect(general.rings).toHaveLength(1);
    // Limits not asked for carry no outline.
    expect(lot.zones.find((z) => z.limitId === 'fcc-controlled')!.rings).toEqual([]);
  });
});

describe('where a flag goes', () => {
  it('on the place, at its point nearest the antenna', () => {
    const project = testLot({
      keepOuts: [walkway('Walk', -4)],
    });
    const site = buildSite(project);
    const o = site.frame.toLocal(site.frame.toLonLat([0, 3]));
    const walk = placeReach([{ from: [o[0], o[1], 0], to: [o[0], o[1], 10] }], site).find(
      (p) => p.kind === 'path',
    )!;
    // The path runs north–south 4 m west of the vertical: the flag sits on it, level with the vertical.
    expect(walk.closestM).toBeCloseTo(4, 1);
    const onPath = site.frame.toLocal(ring([[-4, 3]])[0]);
    expect(Math.hypot(walk.placeXY[0] - onPath[0], walk.placeXY[1] - onPath[1])).toBeLessThan(0.05);
  });
});
