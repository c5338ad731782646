/**
 * The lot in its own terms: area, perimeter and the length and bearing of each side, on the WGS84
 * ellipsoid (GeographicLib geodesics and geodesic polygon area: Karney, "Algorithms for
 * geodesics", J. Geodesy 87 (2013) 43–55, §6; core/REFERENCES.md §10), and what a parcel's
 * attributes offer as the project's name and notes.
 */
import geodesic from 'geographiclib-geodesic';
import type { Polygon } from './schema.ts';
import { parcelLabels, type AttributeValue } from './importShapefile.ts';

const WGS84 = geodesic.Geodesic.WGS84;

export interface LotSide {
  lengthM: number;
  /** Geodesic azimuth from the side's first corner to its second, degrees clockwise from north. */
  azimuthDeg: number;
}

export interface LotMeasures {
  areaM2: number;
  perimeterM: number;
  sides: LotSide[];
}

/** Area (absolute, whichever way the ring runs), perimeter and sides of a lot boundary. */
export function lotMeasures(boundary: Polygon): LotMeasures {
  const ring = boundary.coordinates[0] ?? [];
  const poly = WGS84.Polygon(false);
  const sides: LotSide[] = [];
  for (let i = 0; i + 1 < ring.length; i++) {
    const [lon1, lat1] = ring[i]!;
    const [lon2, lat2] = ring[i + 1]!;
    poly.AddPoint(lat1, lon1);
    const g = WGS84.Inverse(lat1, lon1, lat2, lon2);
    sides.push({ lengthM: g.s12 ?? 0, azimuthDeg: (((g.azi1 ?? 0) % 360) + 360) % 360 });
  }
  const r = poly.Compute(false, true);
  return {
    areaM2: Math.abs(r.area ?? 0),
    perimeterM: sides.reduce((s, x) => s + x.lengthM, 0),
    sides,
  };
}

/** What a parcel's attributes offer: a project name (the address) and notes (id and attributes). */
export function parcelOffer(
  attributes: Record<string, AttributeValue>,
  source: string,
): { name: string | null; notes: string } {
  const { address, parcelId } = parcelLabels(attributes);
  const lines = [
    `Lot boundary from ${source}${parcelId ? `, parcel ${parcelId}` : ''}.`,
    ...Object.entries(attributes)
      .filter(([, v]) => v !== null && String(v).trim() !== '')
      .slice(0, 40)
      .map(([k, v]) => `${k}: ${String(v).slice(0, 120)}`),
  ];
  return { name: address ? address.slice(0, 200) : null, notes: lines.join('\n').slice(0, 2000) };
}
