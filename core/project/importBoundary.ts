/**
 * Import of a lot boundary from a GeoJSON (RFC 7946) or KML (OGC KML 2.2, OGC 07-147r2) file,
 * such as a county parcel export. Pure: takes the file's text, returns the boundary polygon or a
 * list of errors, each naming where in the file the problem is and what is wrong.
 *
 * Accepted: a GeoJSON Polygon, MultiPolygon with one polygon, Feature or FeatureCollection
 * holding one such geometry (the first polygon feature is used and the others are reported as
 * ignored); KML with a Placemark Polygon's outer boundary. Holes are dropped with a warning (a lot
 * boundary has none). Rings must close (a KML ring that does not is closed, with a warning),
 * have at least three distinct corners, lie within the coordinate ranges, and not cross themselves.
 */
import { XMLParser } from 'fast-xml-parser';
import { kinks, polygon as turfPolygon } from '@turf/turf';
import { ringProblems } from './validity.ts';
import type { LonLat, Polygon } from './schema.ts';

export const MAX_IMPORT_BYTES = 20 * 1024 * 1024;
export const MAX_NESTING_DEPTH = 64;
export const MAX_RING_POSITIONS = 10_000;

export interface ImportProblem {
  path: string;
  message: string;
}

export type BoundaryImport =
  | { ok: true; boundary: Polygon; format: 'geojson' | 'kml'; warnings: string[] }
  | { ok: false; errors: ImportProblem[] };

const fail = (path: string, message: string): BoundaryImport => ({ ok: false, errors: [{ path, message }] });

function depthExceeds(text: string, limit: number): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92) i++;
      else if (c === 34) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 91 || c === 123) {
      if (++depth > limit) return true;
    } else if (c === 93 || c === 125) depth--;
  }
  return false;
}

function checkRing(
  raw: unknown,
  path: string,
  warnings: string[],
  closeIfOpen: boolean,
): LonLat[] | ImportProblem {
  if (!Array.isArray(raw)) return { path, message: 'must be a list of positions' };
  if (raw.length > MAX_RING_POSITIONS)
    return { path, message: `has ${raw.length} positions; at most ${MAX_RING_POSITIONS} are accepted` };
  const ring: LonLat[] = [];
  for (let i = 0; i < raw.length; i++) {
    const p = raw[i] as unknown;
    if (!Array.isArray(p) || p.length < 2)
      return { path: `${path}[${i}]`, message: 'must be a position [longitude, latitude]' };
    const [lon, lat] = p as unknown[];
    if (
      typeof lon !== 'number' ||
      typeof lat !== 'number' ||
      !Number.isFinite(lon) ||
      !Number.isFinite(lat)
    ) {
      return { path: `${path}[${i}]`, message: 'longitude and latitude must be numbers' };
    }
    if (lon < -180 || lon > 180)
      return { path: `${path}[${i}][0]`, message: `longitude ${lon} is outside -180…180 degrees` };
    if (lat < -90 || lat > 90)
      return { path: `${path}[${i}][1]`, message: `latitude ${lat} is outside -90…90 degrees` };
    ring.push([lon, lat]);
  }
  const first = ring[0];
  const last = ring[ring.length - 1];
  if (first && last && (first[0] !== last[0] || first[1] !== last[1])) {
    if (!closeIfOpen)
      return {
        path,
        message: 'the ring is not closed: its last position must equal its first (RFC 7946 §3.1.6)',
      };
    ring.push([first[0], first[1]]);
    warnings.push('the boundary ring was not closed; it was closed by joining its last corner to its first');
  }
  const distinct = new Set(ring.map((p) => `${p[0]},${p[1]}`));
  if (distinct.size < 3)
    return { path, message: `needs at least 3 distinct corners (it has ${distinct.size})` };
  return ring;
}

function finishPolygon(
  rings: unknown[],
  path: string,
  format: 'geojson' | 'kml',
  warnings: string[],
): BoundaryImport {
  if (rings.length === 0) return fail(path, 'the polygon has no outer ring');
  if (rings.length > 1)
    warnings.push(
      `the polygon has ${rings.length - 1} hole(s); a lot boundary has none, so they were dropped`,
    );
  const ring = checkRing(rings[0], `${path}[0]`, warnings, format === 'kml');
  if (!Array.isArray(ring)) return { ok: false, errors: [ring] };
  const crossings = kinks(turfPolygon([ring])).features.length;
  if (crossings > 0)
    return fail(
      `${path}[0]`,
      `the boundary crosses itself (${crossings} crossing${crossings > 1 ? 's' : ''}); trace it again without crossing`,
    );
  const flat = ringProblems(ring, `${path}[0]`, 'boundary');
  if (flat.length > 0) return { ok: false, errors: flat };
  return { ok: true, boundary: { type: 'Polygon', coordinates: [ring] }, format, warnings };
}

function fromGeometry(g: unknown, path: string, warnings: string[]): BoundaryImport {
  if (g === null || typeof g !== 'object') return fail(path, 'must be a geometry object');
  const type = (g as { type?: unknown }).type;
  const coords = (g as { coordinates?: unknown }).coordinates;
  if (type === 'Polygon') {
    if (!Array.isArray(coords)) return fail(`${path}.coordinates`, 'must be a list of rings');
    return finishPolygon(coords, `${path}.coordinates`, 'geojson', warnings);
  }
  if (type === 'MultiPolygon') {
    if (!Array.isArray(coords) || coords.length === 0)
      return fail(`${path}.coordinates`, 'must be a non-empty list of polygons');
    if (coords.length > 1)
      return fail(
        `${path}.coordinates`,
        `holds ${coords.length} separate polygons; a lot boundary is one polygon — split the file or pick one parcel`,
      );
    if (!Array.isArray(coords[0])) return fail(`${path}.coordinates[0]`, 'must be a list of rings');
    return finishPolygon(coords[0], `${path}.coordinates[0]`, 'geojson', warnings);
  }
  return fail(
    `${path}.type`,
    `is "${String(type)}"; a lot boundary must be a Polygon (or a MultiPolygon with one polygon)`,
  );
}

/** Checks one GeoJSON Polygon (or one-polygon MultiPolygon) as a lot boundary; `path` names it in the errors. */
export function boundaryFromGeometry(g: unknown, path: string): BoundaryImport {
  return fromGeometry(g, path, []);
}

function importGeoJson(doc: unknown): BoundaryImport {
  const warnings: string[] = [];
  if (doc === null || typeof doc !== 'object' || Array.isArray(doc))
    return fail('(document)', 'must be a GeoJSON object');
  const type = (doc as { type?: unknown }).type;
  if (type === 'FeatureCollection') {
    const features = (doc as { features?: unknown }).features;
    if (!Array.isArray(features)) return fail('features', 'must be a list of features');
    const idx = features.findIndex((f) => {
      const t = (f as { geometry?: { type?: unknown } } | null)?.geometry?.type;
      return t === 'Polygon' || t === 'MultiPolygon';
    });
    if (idx < 0)
      return fail('features', `none of the ${features.length} features is a Polygon or MultiPolygon`);
    if (features.length > 1)
      warnings.push(
        `the file holds ${features.length} features; the first polygon (features[${idx}]) was used`,
      );
    const r = fromGeometry(
      (features[idx] as { geometry: unknown }).geometry,
      `features[${idx}].geometry`,
      warnings,
    );
    return r;
  }
  if (type === 'Feature') return fromGeometry((doc as { geometry?: unknown }).geometry, 'geometry', warnings);
  return fromGeometry(doc, '(document)', warnings);
}

function importKml(text: string): BoundaryImport {
  const warnings: string[] = [];
  let doc: unknown;
  try {
    const parser = new XMLParser({
      ignoreAttributes: true,
      processEntities: false,
      removeNSPrefix: true,
      isArray: () => false,
    });
    doc = parser.parse(text, true);
  } catch (e) {
    return fail(
      '(document)',
      `is not well-formed XML: ${e instanceof Error ? e.message.split('\n')[0] : String(e)}`,
    );
  }
  // Find the first Polygon anywhere in the tree (depth-limited walk).
  let found: unknown = null;
  let foundPath = '';
  const walk = (node: unknown, path: string, depth: number): void => {
    if (found !== null || depth > MAX_NESTING_DEPTH || node === null || typeof node !== 'object') return;
    for (const [k, v] of Object.entries(node as Record<string, unknown>)) {
      const items = Array.isArray(v) ? v : [v];
      items.forEach((item, i) => {
        const p = `${path}/${k}${Array.isArray(v) ? `[${i}]` : ''}`;
        if (found === null && k === 'Polygon') {
          found = item;
          foundPath = p;
        } else walk(item, p, depth + 1);
      });
    }
  };
  walk(doc, '', 0);
  if (found === null)
    return fail('(document)', 'holds no Polygon (a lot boundary must be a Placemark with a Polygon)');
  const outer = (found as { outerBoundaryIs?: { LinearRing?: { coordinates?: unknown } } }).outerBoundaryIs
    ?.LinearRing?.coordinates;
  if (typeof outer !== 'string')
    return fail(`${foundPath}/outerBoundaryIs/LinearRing/coordinates`, 'is missing or empty');
  const tuples = outer.trim().split(/\s+/);
  const ring: unknown[] = [];
  for (let i = 0; i < tuples.length; i++) {
    const parts = (tuples[i] as string).split(',').map((s) => Number(s));
    if (parts.length < 2 || parts.some((n) => !Number.isFinite(n))) {
      return fail(
        `${foundPath}/outerBoundaryIs/LinearRing/coordinates`,
        `position ${i + 1} ("${tuples[i]}") is not "longitude,latitude[,altitude]"`,
      );
    }
    ring.push(parts.slice(0, 2));
  }
  const inner = (found as { innerBoundaryIs?: unknown }).innerBoundaryIs;
  const rings = inner === undefined ? [ring] : [ring, inner];
  const r = finishPolygon(rings, `${foundPath}/outerBoundaryIs`, 'kml', warnings);
  return r;
}

/** Import a lot boundary from the text of a GeoJSON or KML file. */
export function importBoundary(text: string, fileName = ''): BoundaryImport {
  if (text.length > MAX_IMPORT_BYTES)
    return fail('(document)', `the file is larger than ${MAX_IMPORT_BYTES / 1024 / 1024} MB`);
  if (text.includes('\uFFFD'))
    return fail(
      '(document)',
      'the file is not valid UTF-8 text (wrong encoding?); save it as UTF-8 and try again',
    );
  const body = text.replace(/^\uFEFF/, '').trimStart();
  const looksXml = body.startsWith('<') || /\.kml$/i.test(fileName);
  if (looksXml) {
    if (/<!DOCTYPE|<!ENTITY/i.test(body))
      return fail('(document)', 'KML files with a DOCTYPE or entity declarations are not accepted');
    return importKml(body);
  }
  if (depthExceeds(body, MAX_NESTING_DEPTH))
    return fail('(document)', `is nested deeper than ${MAX_NESTING_DEPTH} levels`);
  let doc: unknown;
  try {
    doc = JSON.parse(body);
  } catch (e) {
    return fail('(document)', `is neither KML nor valid JSON: ${e instanceof Error ? e.message : String(e)}`);
  }
  return importGeoJson(doc);
}
