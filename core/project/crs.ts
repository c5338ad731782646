/**
 * Coordinate systems of imported lot data (aerial GeoTIFFs, parcel files): from a GeoTIFF's
 * GeoKeys or an EPSG code to a proj4 definition, and the transforms between the file's own
 * coordinates and WGS84 [lon, lat].
 *
 * The definitions come from the EPSG Geodetic Parameter Dataset as packaged on the npm registry
 * by geotiff-geokeys-to-proj4 (core/REFERENCES.md §11); the transforms are computed by proj4.
 * No definition is written by hand here.
 *
 * Units: an EPSG projected system in feet or US survey feet keeps its unit in the definition
 * (`+to_meter`), so the file's numbers go to proj4 as they are; a user-defined system whose
 * GeoKeys name a linear unit (ProjLinearUnitsGeoKey, e.g. 9003 US survey foot) comes with scale
 * factors that turn the file's numbers into metres first (`scaleX`, `scaleY`).
 *
 * Axis order: GeoTIFF model space is always x = easting or longitude, y = northing or latitude
 * (OGC GeoTIFF 1.1, 19-008r4, model space; from memory), whatever axis order the EPSG entry
 * declares, so an `+axis` term of the definition is dropped.
 */
import proj4 from 'proj4';
import { toProj4, type GeoKeys } from 'geotiff-geokeys-to-proj4';
import type { LonLat } from './schema.ts';

export class CrsError extends Error {
  override name = 'CrsError';
  /** The GeoKey, file or field the problem is in. */
  readonly field: string;
  constructor(field: string, message: string) {
    super(`${field}: ${message}`);
    this.field = field;
  }
}

/** A coordinate system as Yardwire keeps it (plain data: stored with the overlay's reference). */
export interface ImageCrs {
  /** proj4 definition string. */
  definition: string;
  /** Short description for the user, e.g. "EPSG:2263 (US survey foot)". */
  label: string;
  /** Multiply the file's x and y by these before handing them to proj4 (1 unless user-defined units). */
  scaleX: number;
  scaleY: number;
  geographic: boolean;
  /** Length of one unit of the file's x/y in metres (informative; 1 for degrees). */
  unitM: number;
  epsg: number | null;
}

const USER_DEFINED = 32767;
/** EPSG unit-of-measure codes of the common linear units, metres per unit (EPSG dataset, UoM table). */
const LINEAR_UNITS: Record<number, { name: string; m: number }> = {
  9001: { name: 'metre', m: 1 },
  9002: { name: 'foot', m: 0.3048 },
  9003: { name: 'US survey foot', m: 1200 / 3937 },
};

type Keys = Partial<Record<string, unknown>>;

function stripAxis(def: string): string {
  return def.replace(/\s*\+axis=\w+/g, '');
}

function unitOfDefinition(def: string): number {
  const m = /\+to_meter=([0-9.eE+-]+)/.exec(def);
  if (m) return Number(m[1]);
  if (/\+units=us-ft\b/.test(def)) return 1200 / 3937;
  if (/\+units=ft\b/.test(def)) return 0.3048;
  return 1;
}

function unitName(m: number): string {
  if (Math.abs(m - 1200 / 3937) < 1e-9) return 'US survey foot';
  if (Math.abs(m - 0.3048) < 1e-9) return 'foot';
  if (m === 1) return 'metre';
  return `${m} m unit`;
}

function check(def: string, field: string): void {
  try {
    proj4(def, 'WGS84');
  } catch (e) {
    throw new CrsError(
      field,
      `the coordinate system cannot be built (${e instanceof Error ? e.message : String(e)})`,
    );
  }
}

/** The system a GeoTIFF's GeoKeys describe; refuses what they do not describe, naming the key. */
export function crsFromGeoKeys(raw: Keys | null | undefined): ImageCrs {
  const keys = raw ?? {};
  const model = keys['GTModelTypeGeoKey'];
  const pcs = keys['ProjectedCSTypeGeoKey'];
  const gcs = keys['GeographicTypeGeoKey'];
  if (model === 3)
    throw new CrsError(
      'GTModelTypeGeoKey',
      'the image is in geocentric coordinates; an aerial image must be projected or geographic',
    );
  if (typeof pcs !== 'number' && typeof gcs !== 'number' && model === undefined)
    throw new CrsError(
      'GeoKeyDirectory',
      'the image names no coordinate system (no GeoKeys); export it as a GeoTIFF with its system',
    );
  if (model === 1 && typeof pcs !== 'number' && keys['ProjCoordTransGeoKey'] === undefined)
    throw new CrsError(
      'ProjectedCSTypeGeoKey',
      'the image says it is projected but names no projected system; export it again with its EPSG code',
    );
  // For an EPSG-coded projected system, give the library only that code: a GeographicTypeGeoKey
  // written beside it is redundant and would be taken instead (geotiff-geokeys-to-proj4 README).
  const projected = model === 1 || (typeof pcs === 'number' && model !== 2);
  const given: Keys =
    projected && typeof pcs === 'number' && pcs !== USER_DEFINED
      ? { ProjectedCSTypeGeoKey: pcs }
      : { ...keys };
  let out: ReturnType<typeof toProj4>;
  try {
    out = toProj4(given as unknown as GeoKeys);
  } catch (e) {
    throw new CrsError(
      'GeoKeyDirectory',
      `the GeoKeys cannot be read (${e instanceof Error ? e.message : String(e)})`,
    );
  }
  const errors = out.errors as unknown as Record<string, unknown>;
  const notSupported = Object.keys(errors).find((k) => k !== 'bothGCSAndPCSAreSet');
  if (notSupported) {
    const key =
      notSupported === 'CRSNotSupported'
        ? projected
          ? 'ProjectedCSTypeGeoKey'
          : 'GeographicTypeGeoKey'
        : notSupported.replace(/NotSupported$|NotDefined$/, '');
    throw new CrsError(
      key,
      `the value ${String(errors[notSupported])} is not a coordinate system Yardwire knows; reproject the image to a common system (a UTM zone or WGS84) and import it again`,
    );
  }
  if (out.coordinatesUnits !== 'metre' && out.coordinatesUnits !== 'degree')
    throw new CrsError(
      'ProjLinearUnitsGeoKey',
      `the image's coordinates are in ${out.coordinatesUnits}, not a length`,
    );
  const definition = stripAxis(out.proj4);
  check(definition, 'GeoKeyDirectory');
  const conv = out.coordinatesConversionParameters;
  const scaleX = conv.x;
  const scaleY = conv.y;
  const unitM = out.isGCS ? 1 : unitOfDefinition(definition) * scaleX;
  const code = typeof given['ProjectedCSTypeGeoKey'] === 'number' ? given['ProjectedCSTypeGeoKey'] : gcs;
  const epsg = typeof code === 'number' && code !== USER_DEFINED ? code : null;
  const linear = keys['ProjLinearUnitsGeoKey'];
  const named = typeof linear === 'number' ? LINEAR_UNITS[linear]?.name : undefined;
  const label = `${epsg !== null ? `EPSG:${epsg}` : 'user-defined system'} (${out.isGCS ? 'degrees' : (named ?? unitName(unitM))})`;
  return { definition, label, scaleX, scaleY, geographic: out.isGCS, unitM, epsg };
}

/** The system an EPSG code names (projected or geographic), from the same registry data. */
export function crsFromEpsg(code: number, field = 'EPSG code'): ImageCrs {
  if (!Number.isInteger(code) || code <= 0 || code >= USER_DEFINED)
    throw new CrsError(field, `"${code}" is not an EPSG code (a whole number below ${USER_DEFINED})`);
  for (const key of ['ProjectedCSTypeGeoKey', 'GeographicTypeGeoKey'] as const) {
    const out = toProj4({ [key]: code } as unknown as GeoKeys);
    if (Object.keys(out.errors).length === 0) {
      return crsFromGeoKeys({ GTModelTypeGeoKey: key === 'GeographicTypeGeoKey' ? 2 : 1, [key]: code });
    }
  }
  throw new CrsError(field, `EPSG:${code} is not a coordinate system Yardwire knows`);
}

export interface Projector {
  /** The file's own x, y (in its units) to [lon, lat] degrees WGS84. */
  toLonLat(x: number, y: number): LonLat;
  /** [lon, lat] degrees WGS84 to the file's own x, y. */
  fromLonLat(lon: number, lat: number): [number, number];
}

/** Transforms between a system's own coordinates and WGS84 [lon, lat]. */
export function projector(crs: ImageCrs): Projector {
  const p = proj4(crs.definition, 'WGS84');
  return {
    toLonLat(x, y) {
      const [lon, lat] = p.forward([x * crs.scaleX, y * crs.scaleY]) as [number, number];
      return [lon, lat];
    },
    fromLonLat(lon, lat) {
      const [x, y] = p.inverse([lon, lat]) as [number, number];
      return [x / crs.scaleX, y / crs.scaleY];
    },
  };
}

/** Web mercator (EPSG:3857) metres of a [lon, lat] (spherical, EPSG guidance note 7-2 §1.3.3.2). */
export function lonLatToWebMercator(lon: number, lat: number): [number, number] {
  const R = 6_378_137;
  const phi = (lat * Math.PI) / 180;
  return [(R * lon * Math.PI) / 180, R * Math.log(Math.tan(Math.PI / 4 + phi / 2))];
}

/** Inverse of `lonLatToWebMercator`. */
export function webMercatorToLonLat(x: number, y: number): LonLat {
  const R = 6_378_137;
  return [(x / R) * (180 / Math.PI), (2 * Math.atan(Math.exp(y / R)) - Math.PI / 2) * (180 / Math.PI)];
}
