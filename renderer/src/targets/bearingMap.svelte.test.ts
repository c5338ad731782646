// The bearing map's projection: centred on the station, radial lines are bearings, radii are distances.
import { describe, expect, it } from 'vitest';
import { bearingDistance } from '../../../core/paths/index.ts';
import type { LonLat } from '../../../core/project/schema.ts';
import { bearingFrame, invert, landPath, nearestRegion, project, ringRadiusPx } from './bearingMap.ts';

const STATION: LonLat = [-93.75, 44.9];

describe('bearing map', () => {
  const f = bearingFrame(STATION, 200, 200, 190);

  it('puts the station at the centre and the antipode on the rim', () => {
    const c = project(f, STATION)!;
    expect(c[0]).toBeCloseTo(200, 6);
    expect(c[1]).toBeCloseTo(200, 6);
    expect(ringRadiusPx(f, Math.PI * 6371.0088)).toBeCloseTo(190, 6);
  });

  it('draws a far point at its core bearing (within 0.3°) and distance (within 0.5 %)', () => {
    for (const q of [
      [2.3, 48.9],
      [139.7, 35.7],
      [-58.4, -34.6],
      [151.2, -33.9],
    ] as LonLat[]) {
      const [x, y] = project(f, q)!;
      const drawnAz = ((Math.atan2(x - 200, 200 - y) * 180) / Math.PI + 360) % 360;
      const core = bearingDistance(STATION, q);
      const d = Math.abs(((drawnAz - core.azimuthDeg + 540) % 360) - 180);
      expect(d).toBeLessThan(0.3);
      const drawnKm = Math.hypot(x - 200, y - 200);
      expect(drawnKm / ringRadiusPx(f, core.distanceM / 1000)).toBeCloseTo(1, 2);
    }
  });

  it('inverts a click back to the place and refuses one outside the rim', () => {
    const [x, y] = project(f, [2.3, 48.9])!;
    const ll = invert(f, x, y)!;
    expect(ll[0]).toBeCloseTo(2.3, 6);
    expect(ll[1]).toBeCloseTo(48.9, 6);
    expect(invert(f, 0, 0)).toBeNull();
  });

  it('finds the region near a click, and none in the open ocean', () => {
    expect(nearestRegion([2, 47])!.id).toBe('europe');
    expect(nearestRegion([139, 36])!.id).toBe('japan');
    expect(nearestRegion([-30, -45])).toBeNull();
  });

  it('draws land', () => {
    expect(landPath(f).length).toBeGreaterThan(1000);
  });
});
