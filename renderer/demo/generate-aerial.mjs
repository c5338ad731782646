/**
 * Draws the demo lot's invented aerial-style picture and writes it as an uncompressed RGB GeoTIFF
 * (baseline TIFF 6.0 plus the GeoTIFF 1.0 tags ModelPixelScale, ModelTiepoint and a GeoKey
 * directory with GeographicTypeGeoKey = 4326) to renderer/public/demo/demo-aerial.tif.
 *
 *   node renderer/demo/generate-aerial.mjs
 *
 * Nothing is downloaded: fields, tree crowns at the demo supports, the house roof, the drive and
 * the road are painted from the demo layout below (metres east/north of the lot's south-west
 * corner, the same numbers as data/demo/demoProject.ts; a unit test checks they agree).
 * The output is deterministic, so the committed file can be checked against a fresh run.
 */
import { writeFileSync, mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

export const DEMO_ORIGIN = [-93.7512, 44.9021];
const M_PER_DEG_LAT = 111_132.954;
export const M_PER_DEG_LON = M_PER_DEG_LAT * Math.cos((DEMO_ORIGIN[1] * Math.PI) / 180);

export const LAYOUT = {
  boundary: [
    [0, 0],
    [165, 0],
    [172, 104],
    [4, 98],
  ],
  house: [18, 12, 36, 26], // west, south, east, north (m)
  supports: [
    { id: 'oak-west', kind: 'tree', e: 38, n: 70, h: 20 },
    { id: 'oak-north', kind: 'tree', e: 80, n: 86, h: 22 },
    { id: 'pine-ridge', kind: 'tree', e: 121, n: 72, h: 18 },
    { id: 'spruce-ne', kind: 'tree', e: 152, n: 91, h: 16 },
    { id: 'maple-yard', kind: 'tree', e: 62, n: 42, h: 14 },
    { id: 'ash-east', kind: 'tree', e: 141, n: 30, h: 12 },
    { id: 'mast-field', kind: 'mast', e: 101, n: 46, h: 15 },
    { id: 'tower-nw', kind: 'tower', e: 12, n: 88, h: 18 },
  ],
  powerLineNorthM: -7,
  road: [-17, -9.5], // south and north edge of the road (m)
};

/** Extent of the picture in metres and its resolution. */
export const EXTENT = { west: -30, east: 200, south: -30, north: 125, mPerPx: 0.5 };

/** @param {number} e @param {number} n @returns {[number, number]} */
export function lonLatOf(e, n) {
  return [DEMO_ORIGIN[0] + e / M_PER_DEG_LON, DEMO_ORIGIN[1] + n / M_PER_DEG_LAT];
}

/** Deterministic value noise in [0, 1). @param {number} x @param {number} y */
function hash(x, y) {
  let h = Math.imul(x | 0, 374761393) ^ Math.imul(y | 0, 668265263);
  h = Math.imul(h ^ (h >>> 13), 1274126177);
  return ((h ^ (h >>> 16)) >>> 0) / 4294967296;
}

/** @param {number} px @param {number} py @param {[number, number][]} poly */
function inside(px, py, poly) {
  let c = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i];
    const [xj, yj] = poly[j];
    if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) c = !c;
  }
  return c;
}

/** Distance from a point to a segment. */
function segDist(px, py, ax, ay, bx, by) {
  const dx = bx - ax;
  const dy = by - ay;
  const t = Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / (dx * dx + dy * dy)));
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

/** The colour of the ground at (e, n) metres. @returns {[number, number, number]} */
function paint(e, n) {
  const { boundary, house, supports, road } = LAYOUT;
  const g = hash(Math.floor(e * 2), Math.floor(n * 2)) * 18 - 9;
  const inLot = inside(e, n, boundary);
  // Base: crop rows outside the lot, meadow inside, a mown lawn around the house.
  let c = inLot ? [118 + g, 142 + g, 84 + g] : [150 + g, 146 + g, 96 + g];
  if (!inLot && Math.floor(n / 3) % 2 === 0) c = [c[0] - 14, c[1] - 8, c[2] - 6];
  const lawn = Math.hypot((e - 30) / 30, (n - 18) / 22) + hash(Math.floor(e / 3), Math.floor(n / 3)) * 0.15;
  if (inLot && lawn < 1) c = [104 + g, 150 + g, 80 + g];
  // Hedge along the lot line.
  for (let i = 0; i < boundary.length; i++) {
    const [ax, ay] = boundary[i];
    const [bx, by] = boundary[(i + 1) % boundary.length];
    if (segDist(e, n, ax, ay, bx, by) < 0.8) c = [86 + g, 96 + g, 60 + g];
  }
  // Road, its centre line, and the gravel drive up to the house.
  if (n > road[0] && n < road[1]) {
    c = [92 + g / 2, 94 + g / 2, 98 + g / 2];
    if (Math.abs(n - (road[0] + road[1]) / 2) < 0.15 && Math.floor(e / 3) % 2 === 0) c = [214, 198, 120];
  }
  if (e > 26 && e < 30 && n >= road[1] && n < house[1]) c = [176 + g, 168 + g, 150 + g];
  // Power poles (every 40 m) and their shadows.
  const poleE = Math.round(e / 40) * 40;
  if (Math.hypot(e - poleE, n - LAYOUT.powerLineNorthM) < 0.6) c = [60, 50, 40];
  // Tree shadows first (to the north), then crowns; the mast and the tower with theirs.
  for (const s of supports) {
    const r = 3 + s.h * 0.2;
    if (s.kind === 'tree' && Math.hypot(e - s.e, n - s.n - r * 0.6) < r)
      c = [c[0] * 0.6, c[1] * 0.6, c[2] * 0.6];
  }
  for (const s of supports) {
    const d = Math.hypot(e - s.e, n - s.n);
    if (s.kind === 'tree') {
      const r = 3 + s.h * 0.2;
      const edge = r * (0.85 + 0.2 * hash(Math.round(Math.atan2(n - s.n, e - s.e) * 3), s.h));
      if (d < edge) {
        const lobe = hash(Math.floor(e), Math.floor(n)) * 22;
        const lit = (s.n - n + (s.e - e)) / r; // brighter towards the sun (south-west)
        c = [40 + lobe + lit * 10, 84 + lobe + lit * 14, 36 + lobe / 2];
      }
    } else if (s.kind === 'mast') {
      if (d < 0.5) c = [210, 210, 214];
      for (const a of [0, 2.094, 4.189]) {
        if (d < 9 && segDist(e, n, s.e, s.n, s.e + 9 * Math.sin(a), s.n + 9 * Math.cos(a)) < 0.12)
          c = [200, 200, 200];
      }
    } else if (s.kind === 'tower') {
      if (Math.abs(e - s.e) < 1 && n - s.n > 0 && n - s.n < s.h * 0.8 && Math.abs(e - s.e) < 0.4)
        c = [c[0] * 0.55, c[1] * 0.55, c[2] * 0.55];
      if (Math.abs(e - s.e) < 0.9 && Math.abs(n - s.n) < 0.9) c = [150, 150, 156];
    }
  }
  // House: a gabled roof, ridge running east-west, its shadow to the north-east.
  const [hw, hs, he, hn] = house;
  if (e > hw + 1.5 && e < he + 2.5 && n > hn && n < hn + 3.5) c = [c[0] * 0.55, c[1] * 0.55, c[2] * 0.55];
  if (e > hw && e < he && n > hs && n < hn) {
    const ridge = (hs + hn) / 2;
    const tile = Math.floor(e * 2) % 2 === 0 ? 6 : 0;
    c = n > ridge ? [150 + tile, 92, 78] : [122 + tile, 72, 62];
    if (Math.abs(n - ridge) < 0.25) c = [90, 60, 52];
  }
  return [c[0], c[1], c[2]].map((v) => Math.max(0, Math.min(255, Math.round(v))));
}

/** Paint the whole picture. @returns {{ width: number, height: number, rgb: Uint8Array }} */
export function renderDemoAerial() {
  const { west, east, south, north, mPerPx } = EXTENT;
  const width = Math.round((east - west) / mPerPx);
  const height = Math.round((north - south) / mPerPx);
  const rgb = new Uint8Array(width * height * 3);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const [r, g, b] = paint(west + (x + 0.5) * mPerPx, north - (y + 0.5) * mPerPx);
      const i = (y * width + x) * 3;
      rgb[i] = r;
      rgb[i + 1] = g;
      rgb[i + 2] = b;
    }
  }
  return { width, height, rgb };
}

/** GeoKeys for WGS84 lon/lat (EPSG:4326), as a GeoKeyDirectory of 4 keys. */
export const GEOKEYS_4326 = [1, 1, 0, 3, 1024, 0, 1, 2, 1025, 0, 1, 1, 2048, 0, 1, 4326];
/** GeoKeys for a projected system with the given EPSG code (e.g. 3857 web mercator). */
export const geoKeysProjected = (epsg) => [1, 1, 0, 3, 1024, 0, 1, 1, 1025, 0, 1, 1, 3072, 0, 1, epsg];

/**
 * The header and IFD of a little-endian classic TIFF with these tags ([tag, type, values], type 3
 * SHORT, 4 LONG or 12 DOUBLE; sorted here), values longer than 4 bytes placed after the IFD.
 * `patch(dataOffset)` is called before any value is written, so that tags giving where the pixel
 * data lies (strip or tile offsets) can be set in place.
 * @param {[number, 3 | 4 | 12, number[]][]} tags @param {(dataOffset: number) => void} patch
 * @returns {{ head: Uint8Array, dataOffset: number }}
 */
export function tiffLayout(tags, patch) {
  tags.sort((a, b) => a[0] - b[0]);
  const size = { 3: 2, 4: 4, 12: 8 };
  const ifdBytes = 2 + tags.length * 12 + 4;
  let extra = 8 + ifdBytes;
  const placed = tags.map(([tag, type, values]) => {
    const bytes = size[type] * values.length;
    if (bytes <= 4) return { tag, type, values, offset: -1 };
    const offset = extra;
    extra += bytes + (bytes % 2);
    return { tag, type, values, offset };
  });
  const dataOffset = extra;
  patch(dataOffset);
  const out = new Uint8Array(dataOffset);
  const v = new DataView(out.buffer);
  const put = (type, at, value) =>
    type === 3
      ? v.setUint16(at, value, true)
      : type === 4
        ? v.setUint32(at, value, true)
        : v.setFloat64(at, value, true);
  out.set([0x49, 0x49, 42, 0], 0);
  v.setUint32(4, 8, true);
  v.setUint16(8, placed.length, true);
  placed.forEach(({ tag, type, values, offset }, i) => {
    const at = 10 + i * 12;
    v.setUint16(at, tag, true);
    v.setUint16(at + 2, type, true);
    v.setUint32(at + 4, values.length, true);
    if (offset < 0) values.forEach((x, k) => put(type, at + 8 + k * size[type], x));
    else {
      v.setUint32(at + 8, offset, true);
      values.forEach((x, k) => put(type, offset + k * size[type], x));
    }
  });
  v.setUint32(10 + placed.length * 12, 0, true);
  return { head: out, dataOffset };
}

/**
 * Encode an uncompressed 8-bit RGB TIFF, little-endian, one strip. With `geo`, add
 * ModelPixelScale (33550), ModelTiepoint (33922, pixel (0,0) to `tiepoint`) and GeoKeyDirectory (34735).
 * @param {number} width @param {number} height @param {Uint8Array} rgb
 * @param {{ tiepoint: [number, number], pixelScale: [number, number], geoKeys: number[] } | null} geo
 * @returns {Uint8Array}
 */
export function encodeRgbTiff(width, height, rgb, geo) {
  const tags = [
    [256, 4, [width]],
    [257, 4, [height]],
    [258, 3, [8, 8, 8]],
    [259, 3, [1]],
    [262, 3, [2]],
    [273, 4, [0]], // patched below
    [277, 3, [3]],
    [278, 4, [height]],
    [279, 4, [rgb.length]],
    [284, 3, [1]],
  ];
  if (geo) {
    tags.push([33550, 12, [geo.pixelScale[0], geo.pixelScale[1], 0]]);
    tags.push([33922, 12, [0, 0, 0, geo.tiepoint[0], geo.tiepoint[1], 0]]);
    tags.push([34735, 3, geo.geoKeys]);
  }
  const { head, dataOffset } = tiffLayout(tags, (d) => (tags.find((t) => t[0] === 273)[2][0] = d));
  const out = new Uint8Array(dataOffset + rgb.length);
  out.set(head, 0);
  out.set(rgb, dataOffset);
  return out;
}

/** The demo aerial as GeoTIFF bytes (EPSG:4326). */
export function demoAerialTiff() {
  const { width, height, rgb } = renderDemoAerial();
  const [west, north] = lonLatOf(EXTENT.west, EXTENT.north);
  const pixelScale = [EXTENT.mPerPx / M_PER_DEG_LON, EXTENT.mPerPx / M_PER_DEG_LAT];
  return encodeRgbTiff(width, height, rgb, { tiepoint: [west, north], pixelScale, geoKeys: GEOKEYS_4326 });
}

export const OUTPUT = resolve(dirname(fileURLToPath(import.meta.url)), '../public/demo/demo-aerial.tif');

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const bytes = demoAerialTiff();
  mkdirSync(dirname(OUTPUT), { recursive: true });
  writeFileSync(OUTPUT, bytes);
  console.log(`wrote ${OUTPUT} (${bytes.length} bytes)`);
}
