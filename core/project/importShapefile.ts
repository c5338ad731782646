/**
 * Import of lot boundaries from a shapefile (a county's parcel layer): a .zip holding the files,
 * or the loose .shp with its .dbf, .prj and .cpg. Pure: takes the files' bytes, returns every
 * polygon record as a candidate parcel with its .dbf attributes (the caller shows a chooser when
 * there are several), or errors that name the file, the record and the byte where the problem is.
 *
 * The .shp and .dbf headers and record layout are checked here first (ESRI Shapefile Technical
 * Description, July 1998; dBASE III layout, common practice, no source: core/REFERENCES.md §11),
 * so a damaged file is refused with its place named; the parsing and the reprojection through
 * the .prj are shpjs's and proj4's (npm registry). Nothing is saved here: the caller writes the
 * chosen parcel in one edit, so a refused file never leaves a partial lot.
 *
 * Bounds: at most MAX_SHAPEFILE_BYTES of input (after unzipping) and MAX_PARCELS records; every
 * pass over the data is linear.
 */
import proj4 from 'proj4';
import { parseDbf, parseShp } from 'shpjs';
import { boundaryFromGeometry, type ImportProblem } from './importBoundary.ts';
import type { Polygon } from './schema.ts';
import { readZipEntries, ZipError } from './zipEntries.ts';

export const MAX_SHAPEFILE_BYTES = 64 * 1024 * 1024;
export const MAX_PARCELS = 250_000;
/** Problems listed one by one; the rest are counted. */
const MAX_LISTED = 20;

export type AttributeValue = string | number | boolean | null;

export interface Parcel {
  /** 1-based record number in the .shp. */
  record: number;
  attributes: Record<string, AttributeValue>;
  boundary: Polygon;
  warnings: string[];
}

export type ShapefileImport =
  | {
      ok: true;
      /** Name of the layer (the .shp's base name). */
      layer: string;
      parcels: Parcel[];
      /** .dbf field names in file order (empty without a .dbf). */
      fields: string[];
      /** Records that are not usable lot boundaries, with the reason (first MAX_LISTED). */
      skipped: ImportProblem[];
      skippedCount: number;
      warnings: string[];
    }
  | { ok: false; errors: ImportProblem[] };

export interface InputFile {
  name: string;
  bytes: Uint8Array;
}

const fail = (path: string, message: string): ShapefileImport => ({ ok: false, errors: [{ path, message }] });
const ext = (name: string): string => /\.([^./\\]+)$/.exec(name)?.[1]?.toLowerCase() ?? '';
const base = (name: string): string => name.replace(/^.*[/\\]/, '').replace(/\.[^.]+$/, '');

const POLYGON_TYPES = new Set([5, 15, 25]);
const SHAPE_NAMES: Record<number, string> = {
  1: 'points',
  3: 'lines',
  8: 'multipoints',
  11: 'points',
  13: 'lines',
  21: 'points',
  23: 'lines',
  31: 'multipatches',
};

/** Checks the .shp's header and walks its records; returns the record count or the problem. */
export function checkShp(shp: Uint8Array, file: string): number | ImportProblem {
  const v = new DataView(shp.buffer, shp.byteOffset, shp.byteLength);
  if (shp.length < 100)
    return { path: file, message: `is ${shp.length} bytes; a .shp has a 100-byte header` };
  if (v.getInt32(0, false) !== 9994)
    return {
      path: `${file}, byte 0`,
      message: 'does not start with the shapefile code 9994; it is not a .shp',
    };
  const declared = v.getInt32(24, false) * 2;
  if (declared > shp.length)
    return {
      path: `${file}, byte 24`,
      message: `the header says the file is ${declared} bytes, but it holds ${shp.length}: it was cut short`,
    };
  const type = v.getInt32(32, true);
  if (!POLYGON_TYPES.has(type))
    return {
      path: `${file}, byte 32`,
      message: `holds ${SHAPE_NAMES[type] ?? `shape type ${type}`}, not polygons; a lot boundary comes from a parcel (polygon) layer`,
    };
  let at = 100;
  let n = 0;
  const end = Math.min(declared, shp.length);
  while (at < end) {
    n++;
    if (n > MAX_PARCELS)
      return {
        path: file,
        message: `holds more than ${MAX_PARCELS} records; export the area around your lot`,
      };
    if (at + 8 > end)
      return { path: `${file}, record ${n} (byte ${at})`, message: 'the record header is cut off' };
    const words = v.getInt32(at + 4, false);
    const len = words * 2;
    if (words < 2 || at + 8 + len > end)
      return {
        path: `${file}, record ${n} (byte ${at})`,
        message: `declares ${len} bytes of content, which runs past the end of the file`,
      };
    const c = at + 8;
    const rtype = v.getInt32(c, true);
    if (rtype !== 0 && rtype !== type)
      return {
        path: `${file}, record ${n} (byte ${c})`,
        message: `has shape type ${rtype} in a layer of type ${type}`,
      };
    if (rtype !== 0) {
      if (len < 44)
        return { path: `${file}, record ${n} (byte ${c})`, message: 'is too short for a polygon' };
      const parts = v.getInt32(c + 36, true);
      const points = v.getInt32(c + 40, true);
      if (parts < 1 || points < 3 || 44 + 4 * parts + 16 * points > len)
        return {
          path: `${file}, record ${n} (byte ${c + 36})`,
          message: `declares ${parts} part(s) and ${points} point(s), which do not fit in its ${len} bytes`,
        };
    }
    at = c + len;
  }
  return n;
}

interface DbfHeader {
  records: number;
  fields: string[];
}

/** Checks the .dbf's header and that every record it declares is in the file. */
export function checkDbf(dbf: Uint8Array, file: string): DbfHeader | ImportProblem {
  const v = new DataView(dbf.buffer, dbf.byteOffset, dbf.byteLength);
  if (dbf.length < 33)
    return { path: file, message: `is ${dbf.length} bytes; a .dbf has at least a 33-byte header` };
  const records = v.getUint32(4, true);
  const headerLen = v.getUint16(8, true);
  const recordLen = v.getUint16(10, true);
  if (headerLen < 33 || (headerLen - 1) % 32 !== 0 || headerLen > dbf.length)
    return {
      path: `${file}, byte 8`,
      message: `the header length ${headerLen} is not possible for this file (${dbf.length} bytes)`,
    };
  const fields: string[] = [];
  let width = 1;
  const dec = new TextDecoder('latin1');
  for (let at = 32; at + 32 <= headerLen - 1; at += 32) {
    if (dbf[at] === 0x0d) break;
    fields.push(
      dec
        .decode(dbf.subarray(at, at + 11))
        .replace(/\0.*$/s, '')
        .trim(),
    );
    width += dbf[at + 16]!;
  }
  if (width !== recordLen)
    return {
      path: `${file}, byte 10`,
      message: `the record length is ${recordLen} bytes but the ${fields.length} fields add up to ${width}`,
    };
  const room = Math.floor((dbf.length - headerLen) / Math.max(1, recordLen));
  if (room < records)
    return {
      path: `${file}, record ${room + 1} (byte ${headerLen + room * recordLen})`,
      message: `is cut off: the header declares ${records} records of ${recordLen} bytes, but the file ends at byte ${dbf.length}`,
    };
  return { records, fields };
}

function cleanAttributes(raw: Record<string, unknown>): Record<string, AttributeValue> {
  const out: Record<string, AttributeValue> = {};
  for (const [k, v] of Object.entries(raw)) {
    if (typeof v === 'string') out[k] = v.trim();
    else if (typeof v === 'number' || typeof v === 'boolean' || v === null) out[k] = v;
    else if (v instanceof Date) out[k] = Number.isNaN(v.getTime()) ? null : v.toISOString().slice(0, 10);
    else out[k] = v === undefined ? null : String(v);
  }
  return out;
}

function outsideDegrees(g: unknown): boolean {
  let bad = false;
  const walk = (c: unknown): void => {
    if (bad || !Array.isArray(c)) return;
    if (typeof c[0] === 'number') {
      const [x, y] = c as number[];
      if (Math.abs(x!) > 180 || Math.abs(y!) > 90) bad = true;
    } else c.forEach(walk);
  };
  walk((g as { coordinates?: unknown } | null)?.coordinates);
  return bad;
}

/** Import the parcels of a shapefile given as a .zip or as its loose files. */
export async function importShapefile(files: InputFile[]): Promise<ShapefileImport> {
  const size = files.reduce((s, f) => s + f.bytes.length, 0);
  if (size > MAX_SHAPEFILE_BYTES)
    return fail(
      files.map((f) => f.name).join(', '),
      `the files are ${(size / 1e6).toFixed(1)} MB together; at most ${MAX_SHAPEFILE_BYTES / 1e6} MB are accepted (export the area around your lot)`,
    );
  let parts = files;
  const zips = files.filter((f) => ext(f.name) === 'zip');
  if (zips.length > 1) return fail(zips.map((z) => z.name).join(', '), 'choose one .zip at a time');
  if (zips.length === 1) {
    const zip = zips[0]!;
    try {
      const entries = await readZipEntries(
        zip.bytes,
        (n) => !n.includes('__MACOSX') && ['shp', 'dbf', 'prj', 'cpg'].includes(ext(n)),
        MAX_SHAPEFILE_BYTES,
      );
      parts = entries.map((e) => ({ name: e.name, bytes: e.data }));
    } catch (e) {
      return fail(zip.name, e instanceof ZipError ? e.message : `cannot be unpacked (${String(e)})`);
    }
  }
  const shps = parts.filter((f) => ext(f.name) === 'shp');
  if (shps.length === 0)
    return fail(
      zips[0]?.name ?? files.map((f) => f.name).join(', '),
      'holds no .shp file; choose the .shp together with its .dbf and .prj, or the .zip that holds them',
    );
  if (shps.length > 1)
    return fail(
      zips[0]?.name ?? 'files',
      `holds ${shps.length} layers (${shps.map((s) => base(s.name)).join(', ')}); choose one layer's files`,
    );
  const shp = shps[0]!;
  const layer = base(shp.name);
  const sibling = (e: string): InputFile | undefined =>
    parts.find((f) => ext(f.name) === e && base(f.name).toLowerCase() === layer.toLowerCase()) ??
    parts.find((f) => ext(f.name) === e);
  const dbf = sibling('dbf');
  const prj = sibling('prj');
  const cpg = sibling('cpg');
  const warnings: string[] = [];

  const shpCheck = checkShp(shp.bytes, shp.name);
  if (typeof shpCheck !== 'number') return { ok: false, errors: [shpCheck] };
  let header: DbfHeader | null = null;
  if (dbf) {
    const d = checkDbf(dbf.bytes, dbf.name);
    if ('message' in d) return { ok: false, errors: [d] };
    if (d.records !== shpCheck)
      return fail(
        dbf.name,
        `holds ${d.records} records but ${shp.name} holds ${shpCheck} shapes; the two files do not belong together`,
      );
    header = d;
  } else warnings.push('no .dbf came with the .shp, so the parcels have no attributes to choose by');

  let prjText: string | false = false;
  if (prj) {
    prjText = new TextDecoder().decode(prj.bytes).trim();
    try {
      proj4(prjText, 'WGS84').forward([0, 0]);
    } catch (e) {
      return fail(
        prj.name,
        `is not a coordinate system proj4 can read (${e instanceof Error ? e.message : String(e)})`,
      );
    }
  }

  let shapes: unknown[];
  let rows: Record<string, unknown>[] = [];
  try {
    shapes = parseShp(shp.bytes, prjText);
  } catch (e) {
    return fail(shp.name, `cannot be read (${e instanceof Error ? e.message : String(e)})`);
  }
  if (dbf) {
    try {
      rows = parseDbf(dbf.bytes, cpg ? new TextDecoder().decode(cpg.bytes).trim() : undefined);
    } catch (e) {
      return fail(dbf.name, `cannot be read (${e instanceof Error ? e.message : String(e)})`);
    }
  }
  if (!prj && shapes.some(outsideDegrees))
    return fail(
      shp.name,
      'has coordinates that are not longitude and latitude, and no .prj came with it to say what they are; include the .prj',
    );

  const parcels: Parcel[] = [];
  const skipped: ImportProblem[] = [];
  let skippedCount = 0;
  shapes.forEach((g, i) => {
    const path = `${shp.name}, record ${i + 1}`;
    const r =
      g === null
        ? { ok: false as const, errors: [{ path, message: 'is an empty (null) shape' }] }
        : boundaryFromGeometry(g, path);
    if (r.ok) {
      parcels.push({
        record: i + 1,
        attributes: cleanAttributes(rows[i] ?? {}),
        boundary: r.boundary,
        warnings: r.warnings,
      });
    } else {
      skippedCount++;
      if (skipped.length < MAX_LISTED) skipped.push(...r.errors.slice(0, 1));
    }
  });
  if (parcels.length === 0)
    return {
      ok: false,
      errors: skipped.length ? skipped : [{ path: shp.name, message: 'holds no polygons' }],
    };
  return { ok: true, layer, parcels, fields: header?.fields ?? [], skipped, skippedCount, warnings };
}

const ADDRESS_FIELDS =
  /^(site_?addr(ess)?|situs(_?addr(ess)?)?|prop_?addr(ess)?|addr(ess)?|full_?addr(ess)?|location|st_?addr(ess)?)$/i;
const PARCEL_ID_FIELDS =
  /^(pin|apn|pid|parcel_?id|parcelid|parcel_?no|parcel_?num(ber)?|parcel|tax_?id|parid)$/i;

/** The parcel's address and id from its attributes, by the field names counties commonly use (common practice, no source). */
export function parcelLabels(attributes: Record<string, AttributeValue>): {
  address: string | null;
  parcelId: string | null;
} {
  const pick = (re: RegExp): string | null => {
    for (const [k, v] of Object.entries(attributes))
      if (re.test(k) && v !== null && String(v).trim() !== '') return String(v).trim();
    return null;
  };
  return { address: pick(ADDRESS_FIELDS), parcelId: pick(PARCEL_ID_FIELDS) };
}
