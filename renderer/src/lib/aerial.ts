/**
 * Import of a georeferenced aerial image (GeoTIFF) for the map overlay, parsed in the renderer
 * with the geotiff package. The georeference comes from ModelTiepoint + ModelPixelScale or
 * ModelTransformation (GeoTIFF 1.0 §2.6); the GeoKeys say whether the numbers are WGS84
 * lon/lat degrees (EPSG:4326) or web-mercator metres (EPSG:3857, converted here). Anything else
 * is refused with a message that says what to do.
 */
import { fromArrayBuffer, type GeoTIFFImage } from 'geotiff';
import type { LonLat } from '../../../core/project/schema.ts';

export class AerialImportError extends Error {
  override name = 'AerialImportError';
}

export interface DecodedAerial {
  width: number;
  height: number;
  rgba: Uint8ClampedArray;
  /** [[south, west], [north, east]] degrees, as the overlay API carries it. */
  bounds: [[number, number], [number, number]];
  crs: 'EPSG:4326' | 'EPSG:3857';
}

/** WGS84 semi-major axis, the sphere radius of web mercator (EPSG:3857), metres. */
const WEB_MERCATOR_R_M = 6_378_137;
const MERCATOR_CODES = new Set([3857, 3785, 900913, 102100, 102113]);
const GEOGRAPHIC_WGS84 = 4326;
const USER_DEFINED = 32767;

/** Web-mercator metres (EPSG:3857) to [lon, lat] degrees (spherical inverse, EPSG guidance note 7-2). */
export function webMercatorToLonLat(x: number, y: number): LonLat {
  const lon = (x / WEB_MERCATOR_R_M) * (180 / Math.PI);
  const lat = (2 * Math.atan(Math.exp(y / WEB_MERCATOR_R_M)) - Math.PI / 2) * (180 / Math.PI);
  return [lon, lat];
}

function isTiff(buf: ArrayBuffer): boolean {
  if (buf.byteLength < 8) return false;
  const b = new Uint8Array(buf, 0, 4);
  const le = b[0] === 0x49 && b[1] === 0x49 && (b[2] === 42 || b[2] === 43) && b[3] === 0;
  const be = b[0] === 0x4d && b[1] === 0x4d && b[2] === 0 && (b[3] === 42 || b[3] === 43);
  return le || be;
}

type GeoKeys = Partial<Record<string, unknown>>;

function crsOf(keys: GeoKeys | null): DecodedAerial['crs'] {
  const projected = keys?.['ProjectedCSTypeGeoKey'];
  const geographic = keys?.['GeographicTypeGeoKey'];
  const model = keys?.['GTModelTypeGeoKey'];
  if (typeof projected === 'number') {
    if (MERCATOR_CODES.has(projected)) return 'EPSG:3857';
    const what = projected === USER_DEFINED ? 'a user-defined projection' : `EPSG:${projected}`;
    throw new AerialImportError(
      `This image is in ${what}. Yardwire reads WGS84 lon/lat (EPSG:4326) or web mercator (EPSG:3857): ` +
        'reproject it to one of those in your mapping tool and import it again.',
    );
  }
  if (model === 1) {
    throw new AerialImportError(
      'This image is in a projected system that its GeoKeys do not name. Reproject it to EPSG:4326 or EPSG:3857.',
    );
  }
  if (typeof geographic === 'number' && geographic !== GEOGRAPHIC_WGS84) {
    throw new AerialImportError(
      `This image uses geographic system EPSG:${geographic}, not WGS84 (EPSG:4326). Reproject it and import it again.`,
    );
  }
  return 'EPSG:4326';
}

async function checkComplete(image: GeoTIFFImage, byteLength: number): Promise<void> {
  const fd = image.getFileDirectory();
  const tiled = fd.hasTag('TileOffsets');
  const offsets = (await fd.loadValue(tiled ? 'TileOffsets' : 'StripOffsets')) as
    ArrayLike<number> | undefined;
  const counts = (await fd.loadValue(tiled ? 'TileByteCounts' : 'StripByteCounts')) as
    ArrayLike<number> | undefined;
  if (!offsets || !counts) throw new AerialImportError('The TIFF has no image data (no strips or tiles).');
  for (let i = 0; i < offsets.length; i++) {
    if ((offsets[i] ?? 0) + (counts[i] ?? 0) > byteLength) {
      throw new AerialImportError(
        'The file is truncated: its image data ends before the TIFF says it should. Copy or export it again.',
      );
    }
  }
}

function boundsOf(image: GeoTIFFImage, crs: DecodedAerial['crs']): DecodedAerial['bounds'] {
  const fd = image.getFileDirectory();
  const georeferenced =
    (fd.hasTag('ModelTiepoint') && fd.hasTag('ModelPixelScale')) || fd.hasTag('ModelTransformation');
  if (!georeferenced) {
    throw new AerialImportError(
      'This TIFF has no georeference (no ModelTiepoint and ModelPixelScale, nor ModelTransformation), ' +
        'so Yardwire cannot tell where it lies. Export it as a GeoTIFF from your mapping tool.',
    );
  }
  const [x1, y1, x2, y2] = image.getBoundingBox() as [number, number, number, number];
  const [west, south] = crs === 'EPSG:3857' ? webMercatorToLonLat(x1, y1) : [x1, y1];
  const [east, north] = crs === 'EPSG:3857' ? webMercatorToLonLat(x2, y2) : [x2, y2];
  const finite = [west, south, east, north].every(Number.isFinite);
  if (!finite || west < -180 || east > 180 || south < -90 || north > 90 || west >= east || south >= north) {
    throw new AerialImportError(
      'The georeference does not give lon/lat degrees (the corners fall outside −180…180, −90…90). ' +
        'The image is probably in a projected system its GeoKeys do not declare.',
    );
  }
  return [
    [south, west],
    [north, east],
  ];
}

function toRgba(data: ArrayLike<number>, pixels: number): Uint8ClampedArray {
  const channels = Math.round(data.length / pixels);
  if (channels !== 3 && channels !== 4) {
    throw new AerialImportError(`Unexpected pixel layout (${channels} channels); export the image as RGB.`);
  }
  const scale = data instanceof Uint16Array ? 1 / 257 : 1;
  const out = new Uint8ClampedArray(pixels * 4);
  for (let p = 0; p < pixels; p++) {
    out[p * 4] = (data[p * channels] ?? 0) * scale;
    out[p * 4 + 1] = (data[p * channels + 1] ?? 0) * scale;
    out[p * 4 + 2] = (data[p * channels + 2] ?? 0) * scale;
    out[p * 4 + 3] = channels === 4 ? (data[p * channels + 3] ?? 0) * scale : 255;
  }
  return out;
}

/** Decode a GeoTIFF into RGBA pixels and lon/lat bounds; the longer side is limited to `maxSidePx`. */
export async function decodeGeoTiff(buf: ArrayBuffer, maxSidePx = 2048): Promise<DecodedAerial> {
  if (!isTiff(buf))
    throw new AerialImportError('This file is not a TIFF image (it does not start like one).');
  let image: GeoTIFFImage;
  try {
    const tiff = await fromArrayBuffer(buf);
    image = await tiff.getImage(0);
  } catch (e) {
    throw new AerialImportError(`The TIFF cannot be read; it may be truncated or damaged (${String(e)}).`);
  }
  const crs = crsOf(image.getGeoKeys() as GeoKeys | null);
  const bounds = boundsOf(image, crs);
  await checkComplete(image, buf.byteLength);
  const w0 = image.getWidth();
  const h0 = image.getHeight();
  const k = Math.min(1, maxSidePx / Math.max(w0, h0));
  const width = Math.max(1, Math.round(w0 * k));
  const height = Math.max(1, Math.round(h0 * k));
  let data: ArrayLike<number>;
  try {
    data = (await image.readRGB({ interleave: true, enableAlpha: true, width, height })) as ArrayLike<number>;
  } catch (e) {
    throw new AerialImportError(`The image data cannot be decoded (${String(e)}).`);
  }
  return { width, height, rgba: toRgba(data, width * height), bounds, crs };
}

/** Paint decoded pixels to a canvas and return a PNG data URL (browser only). */
export function aerialToPngDataUrl(a: Pick<DecodedAerial, 'width' | 'height' | 'rgba'>): string {
  const canvas = document.createElement('canvas');
  canvas.width = a.width;
  canvas.height = a.height;
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new AerialImportError('This window cannot draw images (no 2D canvas).');
  const pixels = new Uint8ClampedArray(a.rgba.length);
  pixels.set(a.rgba);
  ctx.putImageData(new ImageData(pixels, a.width, a.height), 0, 0);
  return canvas.toDataURL('image/png');
}
