/**
 * Checks of a project that the field-by-field schema cannot make: rings that cross themselves or
 * enclose no area, points far outside the lot, target regions that do not exist, and target ids
 * given twice. `parseProject` runs them after the schema; each problem names its JSON path.
 *
 * Distances are great-circle (haversine on a sphere of the mean Earth radius; accurate to about
 * 0.5 %, enough for a limit of a kilometre). Areas by @turf/area (spherical excess on the same sphere).
 */
import { area as turfArea, kinks, polygon as turfPolygon } from '@turf/turf';
import { regionById, REGIONS } from '../paths/regions.ts';
import type { FieldError, LonLat, Polygon, Project } from './schema.ts';

/** Supports, keep-outs and the station must lie within this distance outside the lot boundary. */
export const MAX_DISTANCE_FROM_LOT_M = 1000;
/** A ring enclosing less than this (m²) encloses no usable area. */
export const MIN_RING_AREA_M2 = 1;

const EARTH_RADIUS_M = 6_371_008.8; // mean radius R1 of GRS80, value from memory (core/REFERENCES.md §18)
const D2R = Math.PI / 180;

/** Haversine distance between two [lon, lat] points, metres. */
export function greatCircleM(a: LonLat, b: LonLat): number {
  const dLat = (b[1] - a[1]) * D2R;
  const dLon = (b[0] - a[0]) * D2R;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a[1] * D2R) * Math.cos(b[1] * D2R) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
}

/** Problems of one closed ring: crossing itself, or no area. */
export function ringProblems(ring: readonly LonLat[], path: string, what: string): FieldError[] {
  if (ring.length < 4) return [];
  const coords = ring.map((p) => [p[0], p[1]]);
  const poly = turfPolygon([coords]);
  let crossings = 0;
  try {
    crossings = kinks(poly).features.length;
  } catch {
    crossings = 0;
  }
  if (crossings > 0)
    return [
      {
        path,
        message: `the ${what} crosses itself (${crossings} crossing${crossings > 1 ? 's' : ''}); trace it again without crossing`,
      },
    ];
  const a = turfArea(poly);
  if (!(a >= MIN_RING_AREA_M2))
    return [
      {
        path,
        message: `the ${what} encloses no area (${a.toFixed(2)} m²): its corners lie on one line or on one point`,
      },
    ];
  return [];
}

interface LotCircle {
  centre: LonLat;
  radiusM: number;
}

function lotCircle(boundary: Polygon): LotCircle {
  const ring = boundary.coordinates[0];
  let lon = 0;
  let lat = 0;
  const n = ring.length - 1;
  // the mean of the corners; longitudes unwrapped about the first corner
  for (let i = 0; i < n; i++) {
    let x = ring[i][0];
    if (x - ring[0][0] > 180) x -= 360;
    if (x - ring[0][0] < -180) x += 360;
    lon += x;
    lat += ring[i][1];
  }
  const centre: LonLat = [(((lon / n + 540) % 360) - 180) as number, lat / n];
  let radiusM = 0;
  for (const p of ring) radiusM = Math.max(radiusM, greatCircleM(centre, p));
  return { centre, radiusM };
}

/** How far beyond the circle around the lot a set of points lies (its nearest point), metres. */
function beyondLot(c: LotCircle, pts: readonly LonLat[]): number {
  let best = Infinity;
  for (const p of pts) best = Math.min(best, greatCircleM(c.centre, p) - c.radiusM);
  return best;
}

const km = (m: number): string =>
  m >= 10_000 ? `${Math.round(m / 1000)} km` : `${(m / 1000).toFixed(1)} km`;

/** Every validity problem of a schema-valid project. */
export function projectValidity(p: Project): FieldError[] {
  const errors: FieldError[] = [];
  if (p.boundary)
    errors.push(...ringProblems(p.boundary.coordinates[0], 'boundary.coordinates[0]', 'boundary'));
  p.keepOuts.forEach((k, i) => {
    if (k.geometry.type === 'Polygon')
      errors.push(
        ...ringProblems(k.geometry.coordinates[0], `keepOuts[${i}].geometry.coordinates[0]`, 'keep-out'),
      );
  });
  if (p.boundary && errors.length === 0) {
    const c = lotCircle(p.boundary);
    const far = (path: string, what: string, pts: readonly LonLat[]) => {
      const d = beyondLot(c, pts);
      if (d > MAX_DISTANCE_FROM_LOT_M)
        errors.push({
          path,
          message: `the ${what} is ${km(d)} outside the lot; it must lie within ${MAX_DISTANCE_FROM_LOT_M / 1000} km of the lot boundary (check the coordinates: [longitude, latitude])`,
        });
    };
    if (p.station) far('station', 'station point', [p.station]);
    p.supports.forEach((s, i) => far(`supports[${i}].position`, `support "${s.name}"`, [s.position]));
    p.keepOuts.forEach((k, i) =>
      far(
        `keepOuts[${i}].geometry`,
        `keep-out "${k.name}"`,
        k.geometry.type === 'Polygon' ? k.geometry.coordinates[0] : k.geometry.coordinates,
      ),
    );
  }
  const seenTargets = new Set<string>();
  p.targets.forEach((t, i) => {
    if ('regionId' in t) {
      if (!regionById(t.regionId))
        errors.push({
          path: `targets[${i}].regionId`,
          message: `there is no built-in region "${t.regionId}" (known: ${REGIONS.map((r) => r.id).join(', ')})`,
        });
      if (seenTargets.has(`region:${t.regionId}`))
        errors.push({ path: `targets[${i}].regionId`, message: `region "${t.regionId}" is listed twice` });
      seenTargets.add(`region:${t.regionId}`);
    } else {
      if (seenTargets.has(`own:${t.id}`))
        errors.push({ path: `targets[${i}].id`, message: `duplicate target id "${t.id}"` });
      seenTargets.add(`own:${t.id}`);
      if ('type' in t.area)
        errors.push(
          ...ringProblems(t.area.coordinates[0], `targets[${i}].area.coordinates[0]`, 'target area'),
        );
    }
  });
  return errors;
}

/** A validator issue as far as `flattenIssues` reads it (zod's shape). */
export interface IssueLike {
  code: string;
  path: readonly PropertyKey[];
  message: string;
  errors?: readonly (readonly IssueLike[])[];
}

/**
 * Replace each "matches none of the alternatives" issue by the issues of the alternative the
 * document evidently meant (the branch that misses no required key), so the message names the
 * field ("soil.permittivity: must be between 1 and 100") instead of "Invalid input". When no
 * branch is evidently meant, the union's own message stays (its path is the union's).
 */
export function flattenIssues(
  issues: readonly IssueLike[],
  input: unknown,
  prefix: readonly PropertyKey[] = [],
): IssueLike[] {
  const out: IssueLike[] = [];
  for (const i of issues) {
    const path = [...prefix, ...i.path];
    if (i.code === 'invalid_union' && i.errors && i.errors.length > 0) {
      const here = valueAt(input, path);
      // a branch is meant when each of its problems is in a key the document gives
      const meant = i.errors.filter(
        (b) =>
          b.length > 0 &&
          b.every((e) => e.path.length > 0 && valueAt(here, e.path.slice(0, 1)) !== undefined),
      );
      if (meant.length > 0) {
        const best = meant.reduce((a, b) => (b.length < a.length ? b : a));
        out.push(...flattenIssues(best, input, path));
        continue;
      }
      out.push({
        code: i.code,
        path,
        message: i.message === 'Invalid input' ? 'does not match any accepted form' : i.message,
      });
      continue;
    }
    out.push({ code: i.code, path, message: i.message });
  }
  return out;
}

function valueAt(doc: unknown, path: readonly PropertyKey[]): unknown {
  let v = doc;
  for (const k of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[k];
  }
  return v;
}
