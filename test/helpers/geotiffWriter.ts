/**
 * A small GeoTIFF writer for tests and benchmarks: baseline TIFF 6.0, uncompressed 8-bit RGB,
 * tiled (TIFF 6.0 §15) or in one strip, with the GeoTIFF 1.0 tags ModelPixelScale (33550),
 * ModelTiepoint (33922), GeoKeyDirectory (34735) and GeoDoubleParams (34736).
 * Tiles are produced by a callback and written one at a time, so a file of any size is written
 * with memory for one tile (`writeTiledGeoTiff`), or built in memory for small test images.
 * The header and IFD are laid out by the demo aerial's generator (`tiffLayout`), the one TIFF
 * writer of the project.
 */
import { closeSync, openSync, writeSync } from 'node:fs';
import { tiffLayout as layout } from '../../renderer/demo/generate-aerial.mjs';

export interface GeoKeyValue {
  key: number;
  /** A short for GeoShortParams-style keys, or a double (stored in GeoDoubleParams). */
  value: number;
  double?: boolean;
}

export interface GeoSpec {
  /** Model x, y of the upper-left corner of pixel (0, 0). */
  tiepoint: [number, number];
  /** Pixel size in model units, x and y. */
  pixelScale: [number, number];
  keys: GeoKeyValue[];
}

export interface TiledSpec {
  width: number;
  height: number;
  tile: number;
  geo: GeoSpec | null;
  /** Fills one tile's RGB bytes (tile × tile × 3) for tile column tx, row ty. */
  fill(tx: number, ty: number, rgb: Uint8Array): void;
}

type Tag = [number, 3 | 4 | 12, number[]];

function geoTags(geo: GeoSpec): Tag[] {
  const doubles: number[] = [];
  const sorted = [...geo.keys].sort((a, b) => a.key - b.key);
  const dir = [1, 1, 0, sorted.length];
  for (const k of sorted) {
    if (k.double) {
      dir.push(k.key, 34736, 1, doubles.length);
      doubles.push(k.value);
    } else dir.push(k.key, 0, 1, k.value);
  }
  const tags: Tag[] = [
    [33550, 12, [geo.pixelScale[0], geo.pixelScale[1], 0]],
    [33922, 12, [0, 0, 0, geo.tiepoint[0], geo.tiepoint[1], 0]],
    [34735, 3, dir],
  ];
  if (doubles.length) tags.push([34736, 12, doubles]);
  return tags;
}

function tiledTags(spec: TiledSpec): { tags: Tag[]; offsets: number[]; tileBytes: number; count: number } {
  const across = Math.ceil(spec.width / spec.tile);
  const down = Math.ceil(spec.height / spec.tile);
  const count = across * down;
  const tileBytes = spec.tile * spec.tile * 3;
  const offsets = new Array<number>(count).fill(0);
  const tags: Tag[] = [
    [256, 4, [spec.width]],
    [257, 4, [spec.height]],
    [258, 3, [8, 8, 8]],
    [259, 3, [1]],
    [262, 3, [2]],
    [277, 3, [3]],
    [284, 3, [1]],
    [322, 4, [spec.tile]],
    [323, 4, [spec.tile]],
    [324, 4, offsets],
    [325, 4, new Array<number>(count).fill(tileBytes)],
    ...(spec.geo ? geoTags(spec.geo) : []),
  ];
  return { tags, offsets, tileBytes, count };
}

/** Writes a tiled GeoTIFF to `file`, one tile at a time. Returns the file size in bytes. */
export function writeTiledGeoTiff(file: string, spec: TiledSpec): number {
  const { tags, offsets, tileBytes, count } = tiledTags(spec);
  const { head } = layout(tags, (d) => offsets.forEach((_, i) => (offsets[i] = d + i * tileBytes)));
  if (head.length + count * tileBytes > 0xffff_ffff) throw new Error('larger than a classic TIFF can hold');
  const fd = openSync(file, 'w');
  try {
    writeSync(fd, head);
    const across = Math.ceil(spec.width / spec.tile);
    const rgb = new Uint8Array(tileBytes);
    for (let i = 0; i < count; i++) {
      spec.fill(i % across, Math.floor(i / across), rgb);
      writeSync(fd, rgb);
    }
  } finally {
    closeSync(fd);
  }
  return head.length + count * tileBytes;
}

/** A tiled GeoTIFF in memory (small test images). */
export function tiledGeoTiffBytes(spec: TiledSpec): ArrayBuffer {
  const { tags, offsets, tileBytes, count } = tiledTags(spec);
  const { head, dataOffset } = layout(tags, (d) =>
    offsets.forEach((_, i) => (offsets[i] = d + i * tileBytes)),
  );
  const out = new Uint8Array(dataOffset + count * tileBytes);
  out.set(head, 0);
  const across = Math.ceil(spec.width / spec.tile);
  const rgb = new Uint8Array(tileBytes);
  for (let i = 0; i < count; i++) {
    spec.fill(i % across, Math.floor(i / across), rgb);
    out.set(rgb, dataOffset + i * tileBytes);
  }
  return out.buffer;
}

/** GeoKeys of a projected system given by its EPSG code (GTModelType 1, RasterPixelIsArea). */
export const epsgProjectedKeys = (epsg: number): GeoKeyValue[] => [
  { key: 1024, value: 1 },
  { key: 1025, value: 1 },
  { key: 3072, value: epsg },
];
