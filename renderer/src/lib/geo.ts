/**
 * Plane and sphere helpers for the lot editor: side lengths and area of the lot, clearance bands
 * around keep-outs, the Maidenhead locator of a point, and new ids. Positions are [lon, lat]
 * (GeoJSON order), lengths metres, areas square metres.
 */
import { booleanPointInPolygon, buffer as turfBuffer, pointToLineDistance } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon as GeoPolygon } from 'geojson';
import type { KeepOut, LonLat, Polygon, Project, Support } from '../../../core/project/schema.ts';
import { bearingDistance } from '../../../core/paths/geodesy.ts';
import { lotMeasures } from '../../../core/project/lotMeasures.ts';
import { fromLocator, toLocator } from '../../../core/paths/maidenhead.ts';
import { formatLength, mToFeet, type UnitSystem } from '../../../core/units/index.ts';

/**
 * Geodesic distance on WGS84, metres (core/paths/geodesy.ts, GeographicLib). Not a sphere: a
 * spherical distance is off by up to 0.3 % (a 30 m east–west side read as 29.9 m at 45°).
 */
export function distanceM(a: LonLat, b: LonLat): number {
  return bearingDistance(a, b).distanceM;
}

export interface Side {
  from: LonLat;
  to: LonLat;
  mid: LonLat;
  lengthM: number;
  /** Unit vector (east, north) pointing out of the polygon, square to the side. */
  outward: [number, number];
  /** Compass direction the side faces (out of the polygon): N, NE, E, … */
  facing: string;
}

const COMPASS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;

/** Compass point of a direction given as (east, north). */
export function compassPoint(east: number, north: number): string {
  const bearingDeg = ((Math.atan2(east, north) * 180) / Math.PI + 360) % 360;
  return COMPASS[Math.round(bearingDeg / 45) % 8]!;
}

/**
 * The sides of a closed ring (first position repeated at the end), with their lengths and the
 * direction each faces. Directions use a local plane (longitude scaled by cos latitude), ample
 * over a lot.
 */
export function ringSides(ring: readonly LonLat[]): Side[] {
  const k = Math.cos(((ring[0]?.[1] ?? 0) * Math.PI) / 180);
  let twiceArea = 0;
  for (let i = 0; i + 1 < ring.length; i++) {
    twiceArea += ring[i]![0] * k * ring[i + 1]![1] - ring[i + 1]![0] * k * ring[i]![1];
  }
  const ccw = twiceArea > 0; // interior on the left of each side
  const sides: Side[] = [];
  for (let i = 0; i + 1 < ring.length; i++) {
    const from = ring[i]!;
    const to = ring[i + 1]!;
    const de = (to[0] - from[0]) * k;
    const dn = to[1] - from[1];
    const len = Math.hypot(de, dn) || 1;
    const outward: [number, number] = ccw ? [dn / len, -de / len] : [-dn / len, de / len];
    sides.push({
      from,
      to,
      mid: [(from[0] + to[0]) / 2, (from[1] + to[1]) / 2],
      lengthM: distanceM(from, to),
      outward,
      facing: compassPoint(outward[0], outward[1]),
    });
  }
  return sides;
}

/**
 * Area of a lot or keep-out on the WGS84 ellipsoid: the one geodesic area every view shows
 * (core/project/lotMeasures.ts). A sphere is off by a few tenths of a percent: it read a
 * 45 × 30 m lot at 45° N as 1347 m².
 */
export function polygonAreaM2(p: Polygon): number {
  return lotMeasures(p).areaM2;
}

export function perimeterM(p: Polygon): number {
  return lotMeasures(p).perimeterM;
}

const M2_PER_HA = 10_000;
const M2_PER_ACRE = 4046.8564224; // international acre, exact

/** "1.62 ha" or "850 m²"; "4.00 acres" or "9150 ft²". */
export function formatArea(m2: number, units: UnitSystem): string {
  if (units === 'metric')
    return m2 >= M2_PER_HA ? `${(m2 / M2_PER_HA).toFixed(2)} ha` : `${Math.round(m2)} m²`;
  const ft2 = m2 * mToFeet(1) ** 2;
  return m2 >= M2_PER_ACRE / 4 ? `${(m2 / M2_PER_ACRE).toFixed(2)} acres` : `${Math.round(ft2)} ft²`;
}

/** Close an open list of corners into a ring (first position repeated at the end). */
export function closeRing(corners: readonly LonLat[]): LonLat[] {
  const first = corners[0];
  const last = corners[corners.length - 1];
  if (!first || !last) return [];
  const same = first[0] === last[0] && first[1] === last[1];
  return same
    ? corners.map((c) => [c[0], c[1]])
    : [...corners.map((c): LonLat => [c[0], c[1]]), [first[0], first[1]]];
}

/** The clearance band around a keep-out (a power line's fall zone, a building's margin), or null if none. */
export function clearanceBand(k: KeepOut): Feature<GeoPolygon | MultiPolygon> | null {
  if (k.clearanceM <= 0) return null;
  const band = turfBuffer({ type: 'Feature', properties: {}, geometry: k.geometry }, k.clearanceM, {
    units: 'meters',
    steps: 16,
  });
  return band ?? null;
}

/**
 * Maidenhead locator (6 characters: field, square, subsquare) of a [lon, lat] point, by the
 * planning core's converter. Longitudes off the ±180° seam (a panned map) are wrapped first.
 */
export function maidenhead(p: LonLat): string {
  const lon = Math.abs(p[0]) <= 180 ? p[0] : ((((p[0] + 180) % 360) + 360) % 360) - 180;
  const lat = Math.min(90, Math.max(-90, p[1]));
  return toLocator([lon, lat], 6);
}

/** Parse "lat, lon" in decimal degrees or a Maidenhead locator (2–8 characters) to [lon, lat]. */
export function parsePlace(text: string): LonLat | null {
  const t = text.trim();
  const m = /^(-?\d+(?:\.\d+)?)\s*[, ]\s*(-?\d+(?:\.\d+)?)$/.exec(t);
  if (m) {
    const lat = Number(m[1]);
    const lon = Number(m[2]);
    return Math.abs(lat) <= 90 && Math.abs(lon) <= 180 ? [lon, lat] : null;
  }
  try {
    return fromLocator(t).center;
  } catch {
    return null;
  }
}

/** A new id for a support or keep-out, unique within a project (letters, digits, "-"). */
export function newId(prefix: string, taken: Iterable<string>): string {
  const used = new Set(taken);
  for (;;) {
    const id = `${prefix}-${Date.now().toString(36)}${Math.floor(Math.random() * 1296)
      .toString(36)
      .padStart(2, '0')}`;
    if (!used.has(id)) return id;
  }
}

/** "Support 3": the first "<base> n" not yet used among the names. */
export function nextName(base: string, names: readonly string[]): string {
  for (let n = 1; ; n++) {
    const name = `${base} ${n}`;
    if (!names.includes(name)) return name;
  }
}

/** A warning about a place on the lot: "danger" for power lines, "notice" for the rest. */
export interface PlaceWarning {
  level: 'danger' | 'notice';
  text: string;
}

/** Plain-words warnings about a point on the lot: in a keep-out or its clearance, outside the lot. */
export function pointWarnings(at: LonLat, p: Project): PlaceWarning[] {
  const out: PlaceWarning[] = [];
  for (const k of p.keepOuts) {
    const inShape = k.geometry.type === 'Polygon' && booleanPointInPolygon(at, k.geometry);
    const band = clearanceBand(k);
    if (inShape) out.push({ level: 'notice', text: `Inside “${k.name}”.` });
    else if (band && booleanPointInPolygon(at, band)) {
      out.push(
        k.kind === 'power-line'
          ? {
              level: 'danger',
              text: `Inside the clearance of “${k.name}”: anything attached here could reach the line if it falls.`,
            }
          : { level: 'notice', text: `Inside the clearance kept around “${k.name}”.` },
      );
    }
  }
  if (p.boundary && !booleanPointInPolygon(at, p.boundary)) {
    out.push({ level: 'notice', text: 'Outside the lot boundary: is it yours to use?' });
  }
  return out;
}

/** Every warning about a support, dangers first. */
export function supportWarnings(s: Support, p: Project, units: UnitSystem): PlaceWarning[] {
  const all = [...pointWarnings(s.position, p), ...fallReachWarnings(s, p, units)];
  return [...all.filter((w) => w.level === 'danger'), ...all.filter((w) => w.level !== 'danger')];
}

/** True when a support stands where a fall could reach a power line. */
export const supportInDanger = (s: Support, p: Project, units: UnitSystem): boolean =>
  supportWarnings(s, p, units).some((w) => w.level === 'danger');

/**
 * Power lines a support could reach if it fell: the line is nearer than the support's usable
 * height (the top of a tree or mast is higher still, so this errs on the kind side).
 */
export function fallReachWarnings(s: Support, p: Project, units: UnitSystem): PlaceWarning[] {
  const out: PlaceWarning[] = [];
  for (const k of p.keepOuts) {
    if (k.kind !== 'power-line' || k.geometry.type !== 'LineString') continue;
    const d = pointToLineDistance(s.position, k.geometry, { units: 'meters' });
    if (d < s.usableHeightM) {
      const text =
        `“${k.name}” is ${formatLength(d, units)} away, less than this support's ` +
        `${formatLength(s.usableHeightM, units)}: if it fell it could reach the line.`;
      out.push({ level: 'danger', text });
    }
  }
  return out;
}
