// The lot in its own terms (issue 18 point 4): area, perimeter and sides of a lot boundary.
import { area } from '@turf/turf';
import geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { lotMeasures, parcelOffer } from '../../../core/project/lotMeasures.ts';
import type { LonLat, Polygon } from '../../../core/project/schema.ts';
import { expectClose } from '../../helpers/expectClose.ts';

const WGS84 = geodesic.Geodesic.WGS84;

/** A 120 m × 80 m lot walked with geodesic steps north, east, south (Karney 2013, REFERENCES §10). */
function walkedLot(lat: number, lon: number): Polygon {
  const steps: [number, number][] = [
    [0, 80],
    [90, 120],
    [180, 80],
  ];
  const ring: LonLat[] = [[lon, lat]];
  let [la, lo] = [lat, lon];
  for (const [azi, s] of steps) {
    const d = WGS84.Direct(la, lo, azi, s);
    [la, lo] = [d.lat2 ?? NaN, d.lon2 ?? NaN];
    ring.push([lo, la]);
  }
  ring.push([lon, lat]);
  return { type: 'Polygon', coordinates: [ring] };
}

describe('lotMeasures', () => {
  it('measures a walked 120 m × 80 m lot', () => {
    const m = lotMeasures(walkedLot(44.9021, -93.7512));
    expect(m.sides).toHaveLength(4);
    // Three sides were walked exactly; the closing side of a geodesic "rectangle" is 120 m to
    // within the convergence of meridians over 80 m (common practice, no source): 1 cm.
    [80, 120, 80, 120].forEach((s, i) => expectClose(m.sides[i]!.lengthM, s, 0.01, 'the walked lengths'));
    expectClose(m.sides[0]!.azimuthDeg, 0, 1e-6, 'walked north');
    expectClose(m.sides[1]!.azimuthDeg, 90, 0.01, 'walked east');
    expectClose(m.perimeterM, 400, 0.02, 'sum of the walked lengths');
    expectClose(m.areaM2, 9600, 1, '120 m × 80 m');
  });

  it('agrees with turf (npm registry; a spherical area, within 0.5 % of the ellipsoidal area at lot size: common practice, no source), either way round', () => {
    const lot = walkedLot(-33.9, 151.2);
    const reversed: Polygon = { type: 'Polygon', coordinates: [[...lot.coordinates[0]!].reverse()] };
    const t = area({ type: 'Feature', properties: {}, geometry: lot });
    expectClose(lotMeasures(lot).areaM2, t, t * 0.005, '@turf/area');
    expect(lotMeasures(reversed).areaM2).toBeCloseTo(lotMeasures(lot).areaM2, 6);
  });

  it('offers the address as the name and the parcel id and attributes as notes', () => {
    const o = parcelOffer(
      { PIN: '27-118-0001', SITEADDR: '100 Invented Lane', ACRES: 2.4, OWNER: null },
      'parcels.zip',
    );
    expect(o.name).toBe('100 Invented Lane');
    expect(o.notes).toMatch(/^Lot boundary from parcels\.zip, parcel 27-118-0001\./);
    expect(o.notes).toContain('ACRES: 2.4');
    expect(o.notes).not.toContain('OWNER');
    expect(parcelOffer({ FOO: 'x' }, 'a.shp').name).toBeNull();
  });
});
