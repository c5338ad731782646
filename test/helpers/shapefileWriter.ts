/**
 * Writes polygon shapefiles for tests: .shp per the ESRI Shapefile Technical Description (July
 * 1998: 100-byte header, big-endian record headers, little-endian shape content, shape type 5),
 * .dbf as dBASE III (character fields; layout common practice, no source), and a stored
 * (uncompressed) .zip (PKWARE APPNOTE 6.3 §4.3, local headers, central directory, end record).
 */

export type Ring = [number, number][];

export function polygonShp(polygons: Ring[]): Uint8Array {
  const contents = polygons.map((ring) => {
    const bytes = 44 + 4 + ring.length * 16;
    const b = new DataView(new ArrayBuffer(bytes));
    b.setInt32(0, 5, true);
    const xs = ring.map((p) => p[0]);
    const ys = ring.map((p) => p[1]);
    [Math.min(...xs), Math.min(...ys), Math.max(...xs), Math.max(...ys)].forEach((v, i) =>
      b.setFloat64(4 + i * 8, v, true),
    );
    b.setInt32(36, 1, true);
    b.setInt32(40, ring.length, true);
    b.setInt32(44, 0, true);
    ring.forEach(([x, y], i) => {
      b.setFloat64(48 + i * 16, x, true);
      b.setFloat64(56 + i * 16, y, true);
    });
    return new Uint8Array(b.buffer);
  });
  const total = 100 + contents.reduce((s, c) => s + 8 + c.length, 0);
  const out = new Uint8Array(total);
  const v = new DataView(out.buffer);
  v.setInt32(0, 9994, false);
  v.setInt32(24, total / 2, false);
  v.setInt32(28, 1000, true);
  v.setInt32(32, 5, true);
  const all = polygons.flat();
  const xs = all.map((p) => p[0]);
  const ys = all.map((p) => p[1]);
  [Math.min(...xs), Math.min(...ys), Math.max(...xs), Math.max(...ys)].forEach((x, i) =>
    v.setFloat64(36 + i * 8, x, true),
  );
  let at = 100;
  contents.forEach((c, i) => {
    v.setInt32(at, i + 1, false);
    v.setInt32(at + 4, c.length / 2, false);
    out.set(c, at + 8);
    at += 8 + c.length;
  });
  return out;
}

/** A dBASE III table of character fields. */
export function textDbf(fields: { name: string; length: number }[], rows: string[][]): Uint8Array {
  const headerLen = 32 + 32 * fields.length + 1;
  const recordLen = 1 + fields.reduce((s, f) => s + f.length, 0);
  const out = new Uint8Array(headerLen + rows.length * recordLen + 1);
  const v = new DataView(out.buffer);
  out[0] = 0x03;
  out.set([126, 1, 1], 1);
  v.setUint32(4, rows.length, true);
  v.setUint16(8, headerLen, true);
  v.setUint16(10, recordLen, true);
  const enc = new TextEncoder();
  fields.forEach((f, i) => {
    const at = 32 + i * 32;
    out.set(enc.encode(f.name.slice(0, 10)), at);
    out[at + 11] = 'C'.charCodeAt(0);
    out[at + 16] = f.length;
  });
  out[headerLen - 1] = 0x0d;
  rows.forEach((row, r) => {
    let at = headerLen + r * recordLen;
    out[at++] = 0x20;
    fields.forEach((f, i) => {
      const cell = enc.encode((row[i] ?? '').padEnd(f.length, ' ').slice(0, f.length));
      out.set(cell.slice(0, f.length), at);
      at += f.length;
    });
  });
  out[out.length - 1] = 0x1a;
  return out;
}

/** A rectangle from (x, y) of width w and height h, clockwise (as shapefile outer rings run), closed. */
export const clockwiseRect = (x: number, y: number, w: number, h: number): Ring => [
  [x, y],
  [x, y + h],
  [x + w, y + h],
  [x + w, y],
  [x, y],
];

/** The attributes county parcel exports carry: a parcel id and a site address. */
export const PARCEL_FIELDS = [
  { name: 'PIN', length: 14 },
  { name: 'SITEADDR', length: 32 },
];

/** `n` rows of PARCEL_FIELDS, the i-th (from 0) with pinOf(i) and addressOf(i). */
export const parcelRows = (
  pinOf: (i: number) => string,
  addressOf: (i: number) => string,
  n = 3,
): string[][] => Array.from({ length: n }, (_, i) => [pinOf(i), addressOf(i)]);

/** A parcel layer's files `path`.shp, .dbf (PARCEL_FIELDS, these rows) and .prj (this text). */
export function parcelLayer(
  path: string,
  rings: Ring[],
  rows: string[][],
  prj: string,
): { name: string; data: Uint8Array }[] {
  return [
    { name: `${path}.shp`, data: polygonShp(rings) },
    { name: `${path}.dbf`, data: textDbf(PARCEL_FIELDS, rows) },
    { name: `${path}.prj`, data: new TextEncoder().encode(prj) },
  ];
}

function crc32(data: Uint8Array): number {
  let c = 0xffffffff;
  for (const byte of data) {
    c ^= byte;
    for (let k = 0; k < 8; k++) c = c & 1 ? (c >>> 1) ^ 0xedb88320 : c >>> 1;
  }
  return (c ^ 0xffffffff) >>> 0;
}

/** A zip archive with the files stored (method 0), or deflated (method 8) by `deflateRaw` when given. */
export function storedZip(
  files: { name: string; data: Uint8Array }[],
  deflateRaw?: (data: Uint8Array) => Uint8Array,
): Uint8Array {
  const enc = new TextEncoder();
  const locals: Uint8Array[] = [];
  const centrals: Uint8Array[] = [];
  let offset = 0;
  for (const f of files) {
    const name = enc.encode(f.name);
    const crc = crc32(f.data);
    const body = deflateRaw ? deflateRaw(f.data) : f.data;
    const method = deflateRaw ? 8 : 0;
    // The fields the local and the central header share, from "version needed" (at `at`) to the
    // name's length; the central header has "version made by" before them.
    const shared = (v: DataView, at: number): void => {
      v.setUint16(at, 20, true);
      v.setUint16(at + 4, method, true);
      v.setUint32(at + 10, crc, true);
      v.setUint32(at + 14, body.length, true);
      v.setUint32(at + 18, f.data.length, true);
      v.setUint16(at + 22, name.length, true);
    };
    const local = new Uint8Array(30 + name.length + body.length);
    const lv = new DataView(local.buffer);
    lv.setUint32(0, 0x04034b50, true);
    shared(lv, 4);
    local.set(name, 30);
    local.set(body, 30 + name.length);
    const central = new Uint8Array(46 + name.length);
    const cv = new DataView(central.buffer);
    cv.setUint32(0, 0x02014b50, true);
    cv.setUint16(4, 20, true);
    shared(cv, 6);
    cv.setUint32(42, offset, true);
    central.set(name, 46);
    locals.push(local);
    centrals.push(central);
    offset += local.length;
  }
  const cdSize = centrals.reduce((s, c) => s + c.length, 0);
  const end = new Uint8Array(22);
  const ev = new DataView(end.buffer);
  ev.setUint32(0, 0x06054b50, true);
  ev.setUint16(8, files.length, true);
  ev.setUint16(10, files.length, true);
  ev.setUint32(12, cdSize, true);
  ev.setUint32(16, offset, true);
  const out = new Uint8Array(offset + cdSize + 22);
  let at = 0;
  for (const part of [...locals, ...centrals, end]) {
    out.set(part, at);
    at += part.length;
  }
  return out;
}
