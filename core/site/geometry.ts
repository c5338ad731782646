/**
 * Plane and space helpers in the site frame (metres). Point-in-polygon and hulls go through Turf,
 * which treats coordinates as plane coordinates for these operations; distances are closed-form
 * Euclidean geometry.
 */
// Turf's single-purpose packages (installed with @turf/turf 7.4, same versions): loading the whole
// @turf/turf bundle costs about a second at start-up, these three about 0.1 s.
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { convex } from '@turf/convex';
import { featureCollection, point, polygon } from '@turf/helpers';
import type { XY } from './frame.ts';

export type XYZ = [number, number, number];

/** Distance from point p to segment ab in the plane. */
export function pointSegmentDistance(p: XY, a: XY, b: XY): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  let t = len2 === 0 ? 0 : ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2;
  t = Math.max(0, Math.min(1, t));
  return Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy);
}

/** Distance from a point to a polyline (open), plane. */
export function pointPolylineDistance(p: XY, line: readonly XY[]): number {
  let d = Infinity;
  for (let i = 0; i + 1 < line.length; i++) d = Math.min(d, pointSegmentDistance(p, line[i], line[i + 1]));
  return d;
}

/** True when the closed ring (first = last) contains p (boundary counts as inside). */
export function insideRing(p: XY, ring: readonly XY[]): boolean {
  return booleanPointInPolygon(point(p), polygon([ring as XY[]]));
}

/** Distance from p to the edges of a closed ring. */
export function distanceToRingEdges(p: XY, ring: readonly XY[]): number {
  return pointPolylineDistance(p, ring);
}

/** Horizontal distance from p to a polygon: 0 inside, else the distance to its edges. */
export function distanceToPolygon(p: XY, ring: readonly XY[]): number {
  return insideRing(p, ring) ? 0 : distanceToRingEdges(p, ring);
}

/** Points along a 3-D segment at most `stepM` apart, both ends included. */
export function sampleSegment(a: XYZ, b: XYZ, stepM: number): XYZ[] {
  const len = Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
  const n = Math.max(1, Math.ceil(len / stepM));
  const out: XYZ[] = [];
  for (let i = 0; i <= n; i++) {
    const t = i / n;
    out.push([a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), a[2] + t * (b[2] - a[2])]);
  }
  return out;
}

/** Convex hull of plane points as a closed ring (counter-clockwise as Turf returns it). */
export function convexHull(points: readonly XY[]): XY[] {
  if (points.length === 0) return [];
  const hull = convex(featureCollection(points.map((p) => point(p))));
  if (!hull) {
    // Degenerate (collinear or one point): the bounding segment, closed.
    let a = points[0];
    let b = points[0];
    for (const p of points) {
      if (p[0] < a[0] || (p[0] === a[0] && p[1] < a[1])) a = p;
      if (p[0] > b[0] || (p[0] === b[0] && p[1] > b[1])) b = p;
    }
    return [a, b, a];
  }
  return hull.geometry.coordinates[0] as XY[];
}

/** Rotate a plane point clockwise (compass sense) by `deg` about the origin, then translate. */
export function placeXY(p: XY, rotationDeg: number, origin: XY): XY {
  const r = (rotationDeg * Math.PI) / 180;
  const c = Math.cos(r);
  const s = Math.sin(r);
  return [origin[0] + p[0] * c + p[1] * s, origin[1] + p[1] * c - p[0] * s];
}

export function placeXYZ(p: XYZ, rotationDeg: number, origin: XY): XYZ {
  const q = placeXY([p[0], p[1]], rotationDeg, origin);
  return [q[0], q[1], p[2]];
}

/** Unit vector in the plane along a compass bearing. */
export function bearingUnit(bearingDeg: number): XY {
  const r = (bearingDeg * Math.PI) / 180;
  return [Math.sin(r), Math.cos(r)];
}

/** Compass bearing from a to b, degrees in [0, 360). */
export function bearingOf(a: XY, b: XY): number {
  const d = (Math.atan2(b[0] - a[0], b[1] - a[1]) * 180) / Math.PI;
  return d < 0 ? d + 360 : d;
}

export function dist2(a: XY, b: XY): number {
  return Math.hypot(b[0] - a[0], b[1] - a[1]);
}
