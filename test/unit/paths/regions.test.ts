import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import {
  REGIONS,
  planPaths,
  resolveTargets,
  regionPath,
  UnknownRegionError,
} from '../../../core/paths/index.ts';
import { fewestHops } from '../../../core/paths/hops.ts';
import { expectClose } from '../../helpers/expectClose.ts';

describe('built-in regions', () => {
  it('has the ids the demo project uses and the regions amateurs aim at', () => {
    const ids = REGIONS.map((r) => r.id);
    for (const id of [
      'europe',
      'japan',
      'south-america',
      'pacific',
      'southern-africa',
      'north-america-east',
      'north-america-west',
      'caribbean',
      'oceania',
      'antarctica',
    ]) {
      expect(ids).toContain(id);
    }
    expect(new Set(ids).size).toBe(ids.length);
    for (const r of REGIONS) {
      expect(r.points.length).toBeGreaterThanOrEqual(3);
      for (const [lon, lat] of r.points) {
        expect(Math.abs(lon)).toBeLessThanOrEqual(180);
        expect(Math.abs(lat)).toBeLessThanOrEqual(90);
      }
    }
  });

  it('throws on an unknown region id', () => {
    expect(() => resolveTargets([{ regionId: 'atlantis', weight: 1 }])).toThrow(UnknownRegionError);
  });
});

describe('region paths', () => {
  const station: [number, number] = [-93.7, 44.9];

  it('gives each sample its geodesic bearing and distance and the fewest-hop elevation', () => {
    const [p] = planPaths(station, [{ regionId: 'japan', weight: 2 }]);
    expect(p.weight).toBe(2);
    for (const s of p.samples) {
      const ref = geodesic.Geodesic.WGS84.Inverse(station[1], station[0], s.point[1], s.point[0]);
      expectClose(s.distanceM, ref.s12 ?? NaN, 1e-6, 'geographiclib-geodesic called directly');
      for (const h of s.hops) expect(h).toEqual(fewestHops(s.distanceM, h.layerHeightM, 3));
    }
    const els = p.directions.map((d) => d.elevationDeg);
    expect(p.elevationWindowDeg.min).toBe(Math.min(...els));
    expect(p.elevationWindowDeg.max).toBe(Math.max(...els));
    expect(p.directions.length).toBe(p.samples.length * 4);
  });

  it('samples a custom circle on its rim and a custom polygon inside it', () => {
    const [c] = resolveTargets([
      { id: 'c', name: 'circle', weight: 1, area: { center: [10, 50], radiusKm: 500 } },
    ]);
    expect(c.points.length).toBe(9);
    for (const q of c.points.slice(1)) {
      const d = geodesic.Geodesic.WGS84.Inverse(50, 10, q[1], q[0]).s12 ?? NaN;
      expectClose(d, 500_000, 1e-3, 'geographiclib-geodesic called directly');
    }
    const [poly] = resolveTargets([
      {
        id: 'p',
        name: 'poly',
        weight: 1,
        area: {
          type: 'Polygon',
          coordinates: [
            [
              [0, 0],
              [10, 0],
              [10, 10],
              [0, 10],
              [0, 0],
            ],
          ],
        },
      },
    ]);
    expect(poly.points.length).toBe(4 + 25);
    const path = regionPath(station, poly);
    expect(path.azimuthSpan.widthDeg).toBeGreaterThan(0);
  });
});
