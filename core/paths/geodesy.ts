/**
 * Geodesic bearing and distance on the WGS84 ellipsoid with GeographicLib
 * (C. F. F. Karney, "Algorithms for geodesics", J. Geodesy 87 (2013) 43–55). Accuracy of the
 * library: about 15 nm in distance and 1e-9 degrees in azimuth for any pair of points.
 */
import geodesic from 'geographiclib-geodesic';
import type { LonLat } from '../project/schema.ts';

const WGS84 = geodesic.Geodesic.WGS84;

export interface BearingDistance {
  /** Initial bearing at the first point, degrees clockwise from north, in [0, 360). */
  azimuthDeg: number;
  /** Geodesic distance, metres. */
  distanceM: number;
}

/** Normalise an angle in degrees to [0, 360). */
export function normalizeDeg(deg: number): number {
  const r = deg % 360;
  return r < 0 ? r + 360 : r === 360 ? 0 : r;
}

/** Short-path bearing and distance from `from` to `to` ([lon, lat] degrees). */
export function bearingDistance(from: LonLat, to: LonLat): BearingDistance {
  const r = WGS84.Inverse(
    from[1],
    from[0],
    to[1],
    to[0],
    geodesic.Geodesic.DISTANCE | geodesic.Geodesic.AZIMUTH,
  );
  return { azimuthDeg: normalizeDeg(r.azi1 ?? 0), distanceM: r.s12 ?? 0 };
}

/** The point at geodesic distance `distanceM` along initial bearing `azimuthDeg` from `from`. */
export function destination(from: LonLat, azimuthDeg: number, distanceM: number): LonLat {
  const r = WGS84.Direct(
    from[1],
    from[0],
    azimuthDeg,
    distanceM,
    geodesic.Geodesic.LATITUDE | geodesic.Geodesic.LONGITUDE,
  );
  return [r.lon2 ?? from[0], r.lat2 ?? from[1]];
}

export interface AzimuthSpan {
  /** First bearing of the smallest arc, clockwise, that holds every bearing; degrees. */
  fromDeg: number;
  /** Last bearing of that arc (may be numerically below fromDeg when the arc crosses north). */
  toDeg: number;
  /** Width of the arc, degrees. */
  widthDeg: number;
  /** Middle of the arc. */
  centerDeg: number;
}

/** Smallest clockwise arc that holds all the given bearings (degrees). */
export function azimuthSpan(bearingsDeg: readonly number[]): AzimuthSpan {
  if (bearingsDeg.length === 0) throw new Error('azimuthSpan: no bearings');
  const b = bearingsDeg.map(normalizeDeg).sort((p, q) => p - q);
  // The arc is the circle minus its largest gap between consecutive bearings.
  let gap = b[0] + 360 - b[b.length - 1];
  let start = b[0];
  for (let i = 1; i < b.length; i++) {
    const g = b[i] - b[i - 1];
    if (g > gap) {
      gap = g;
      start = b[i];
    }
  }
  const widthDeg = b.length === 1 ? 0 : 360 - gap;
  return {
    fromDeg: start,
    toDeg: normalizeDeg(start + widthDeg),
    widthDeg,
    centerDeg: normalizeDeg(start + widthDeg / 2),
  };
}
