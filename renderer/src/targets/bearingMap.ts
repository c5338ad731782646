/**
 * Geometry of the bearing map: an azimuthal equidistant projection of the whole world centred on
 * the station (d3-geo on a sphere), so that a straight line from the centre is the great circle
 * and its length the distance. Land from the world-atlas 1:110 M outline. The figures printed on
 * the map (bearing, distance) come from the planning core's geodesics on the ellipsoid; the
 * sphere only places the drawing, within a fraction of a degree.
 */
import { geoAzimuthalEquidistant, geoDistance, geoGraticule10, geoPath, type GeoProjection } from 'd3-geo';
import { feature } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
import land110 from 'world-atlas/land-110m.json';
import { REGIONS, type RegionDef } from '../../../core/paths/regions.ts';
import type { LonLat } from '../../../core/project/schema.ts';

/** Mean earth radius used to turn distances into angles on the drawing, km (IUGG mean radius). */
export const DRAWING_EARTH_RADIUS_KM = 6371.0088;

const topo = land110 as unknown as Topology<{ land: GeometryCollection }>;
const LAND = feature(topo, topo.objects.land);
const GRATICULE = geoGraticule10();

export interface BearingFrame {
  projection: GeoProjection;
  cx: number;
  cy: number;
  /** Radius of the rim (the antipode), px. */
  radiusPx: number;
  /** px per radian of great-circle angle. */
  scale: number;
}

export function bearingFrame(station: LonLat, cx: number, cy: number, radiusPx: number): BearingFrame {
  const scale = radiusPx / Math.PI;
  const projection = geoAzimuthalEquidistant()
    .rotate([-station[0], -station[1]])
    .scale(scale)
    .translate([cx, cy])
    .clipAngle(179.99)
    .precision(0.3);
  return { projection, cx, cy, radiusPx, scale };
}

export function landPath(f: BearingFrame): string {
  return geoPath(f.projection)(LAND) ?? '';
}

export function graticulePath(f: BearingFrame): string {
  return geoPath(f.projection)(GRATICULE) ?? '';
}

/** Radius on the drawing of a circle `km` from the station. */
export function ringRadiusPx(f: BearingFrame, km: number): number {
  return (km / DRAWING_EARTH_RADIUS_KM) * f.scale;
}

export function project(f: BearingFrame, p: LonLat): [number, number] | null {
  return f.projection([p[0], p[1]]);
}

/** The point of the world under a drawing position, or null outside the rim. */
export function invert(f: BearingFrame, x: number, y: number): LonLat | null {
  if (Math.hypot(x - f.cx, y - f.cy) > f.radiusPx) return null;
  const ll = f.projection.invert?.([x, y]);
  return ll ? [ll[0], ll[1]] : null;
}

/** The built-in region with a sample point nearest to `p`, if one lies within `maxKm`. */
export function nearestRegion(
  p: LonLat,
  maxKm = 1500,
  regions: readonly RegionDef[] = REGIONS,
): RegionDef | null {
  let best: RegionDef | null = null;
  let bestKm = maxKm;
  for (const r of regions) {
    for (const q of r.points) {
      const km = geoDistance([p[0], p[1]], [q[0], q[1]]) * DRAWING_EARTH_RADIUS_KM;
      if (km < bestKm) {
        bestKm = km;
        best = r;
      }
    }
  }
  return best;
}

/** Centre of a set of drawing points (for a label). */
export function centroid(points: readonly [number, number][]): [number, number] | null {
  if (points.length === 0) return null;
  let x = 0;
  let y = 0;
  for (const p of points) {
    x += p[0];
    y += p[1];
  }
  return [x / points.length, y / points.length];
}
