/**
 * Reads the entries of a .zip archive that a caller asks for, with bounded memory: sizes are
 * checked against a limit from the central directory before anything is inflated, and inflation
 * stops as soon as an entry grows past the size it declares (a "zip bomb" is refused, not
 * unpacked). Layout from PKWARE's APPNOTE.TXT 6.3 (§4.3.7 local header, §4.3.12 central
 * directory, §4.3.16 end of central directory); methods 0 (stored) and 8 (deflate, inflated by the
 * platform's DecompressionStream). Pure: no node:* imports.
 */
export class ZipError extends Error {
  override name = 'ZipError';
}

export interface ZipEntry {
  name: string;
  data: Uint8Array;
}

const EOCD = 0x06054b50;
const CENTRAL = 0x02014b50;
const LOCAL = 0x04034b50;

async function inflateRaw(data: Uint8Array, expected: number, name: string): Promise<Uint8Array> {
  const stream = new Blob([data as BlobPart]).stream().pipeThrough(new DecompressionStream('deflate-raw'));
  const reader = stream.getReader();
  const out = new Uint8Array(expected);
  let at = 0;
  for (;;) {
    let chunk: ReadableStreamReadResult<Uint8Array>;
    try {
      chunk = (await reader.read()) as ReadableStreamReadResult<Uint8Array>;
    } catch (e) {
      throw new ZipError(
        `${name}: the compressed data is damaged (${e instanceof Error ? e.message : String(e)})`,
      );
    }
    if (chunk.done) break;
    if (at + chunk.value.length > expected) {
      await reader.cancel();
      throw new ZipError(`${name}: unpacks to more than the ${expected} bytes the archive declares; refused`);
    }
    out.set(chunk.value, at);
    at += chunk.value.length;
  }
  if (at !== expected)
    throw new ZipError(`${name}: unpacks to ${at} bytes, not the ${expected} the archive declares`);
  return out;
}

/**
 * The entries whose name `wanted` accepts, unpacked. Refuses an archive whose wanted entries
 * would unpack to more than `maxBytes` in total, before unpacking any of them.
 */
export async function readZipEntries(
  zip: Uint8Array,
  wanted: (name: string) => boolean,
  maxBytes: number,
): Promise<ZipEntry[]> {
  const v = new DataView(zip.buffer, zip.byteOffset, zip.byteLength);
  let end = -1;
  for (let i = zip.length - 22; i >= Math.max(0, zip.length - 22 - 65_535); i--) {
    if (v.getUint32(i, true) === EOCD) {
      end = i;
      break;
    }
  }
  if (end < 0) throw new ZipError('the archive has no end record (not a zip file, or cut short)');
  const count = v.getUint16(end + 10, true);
  const cdSize = v.getUint32(end + 12, true);
  const cdOffset = v.getUint32(end + 16, true);
  if (cdOffset === 0xffffffff || count === 0xffff)
    throw new ZipError('the archive is in the zip64 format; unpack it and choose the files themselves');
  if (cdOffset + cdSize > end)
    throw new ZipError(`the central directory (byte ${cdOffset}) lies outside the archive`);
  const picked: { name: string; method: number; csize: number; usize: number; local: number }[] = [];
  let at = cdOffset;
  const dec = new TextDecoder();
  for (let k = 0; k < count; k++) {
    if (at + 46 > end || v.getUint32(at, true) !== CENTRAL)
      throw new ZipError(`central directory entry ${k + 1} (byte ${at}) is damaged`);
    const flags = v.getUint16(at + 8, true);
    const method = v.getUint16(at + 10, true);
    const csize = v.getUint32(at + 20, true);
    const usize = v.getUint32(at + 24, true);
    const nameLen = v.getUint16(at + 28, true);
    const extraLen = v.getUint16(at + 30, true);
    const commentLen = v.getUint16(at + 32, true);
    const local = v.getUint32(at + 42, true);
    const name = dec.decode(zip.subarray(at + 46, at + 46 + nameLen));
    at += 46 + nameLen + extraLen + commentLen;
    if (!wanted(name) || name.endsWith('/')) continue;
    if (flags & 1) throw new ZipError(`${name}: the entry is encrypted`);
    if (method !== 0 && method !== 8)
      throw new ZipError(`${name}: compression method ${method} is not supported (stored or deflate only)`);
    picked.push({ name, method, csize, usize, local });
  }
  const total = picked.reduce((s, p) => s + p.usize, 0);
  if (total > maxBytes)
    throw new ZipError(
      `the files wanted would unpack to ${(total / 1e6).toFixed(1)} MB; at most ${(maxBytes / 1e6).toFixed(0)} MB are accepted`,
    );
  const out: ZipEntry[] = [];
  for (const p of picked) {
    if (p.local + 30 > zip.length || v.getUint32(p.local, true) !== LOCAL)
      throw new ZipError(`${p.name}: its local header (byte ${p.local}) is damaged`);
    const start = p.local + 30 + v.getUint16(p.local + 26, true) + v.getUint16(p.local + 28, true);
    if (start + p.csize > zip.length) throw new ZipError(`${p.name}: the archive ends inside this entry`);
    const raw = zip.subarray(start, start + p.csize);
    if (p.method === 0) {
      if (p.csize !== p.usize) throw new ZipError(`${p.name}: stored entry with two different sizes`);
      out.push({ name: p.name, data: raw.slice() });
    } else out.push({ name: p.name, data: await inflateRaw(raw, p.usize, p.name) });
  }
  return out;
}
