/**
 * Reading an input file as text: UTF-8 only (RFC 8259 §8.1 requires UTF-8 for JSON exchanged
 * between systems; core/REFERENCES.md §16). A UTF-8 byte-order mark is accepted and dropped (§8.1 allows a parser to
 * ignore it); a UTF-16 or UTF-32 file (with or without its mark) and bytes that are not valid
 * UTF-8 are refused with the reason and where, instead of turning into U+FFFD or a JSON error.
 */
import { readFile, stat } from 'node:fs/promises';

export class TextDecodeError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'TextDecodeError';
  }
}

/** Largest input file read, bytes (a project or antenna file is far smaller). */
export const MAX_INPUT_BYTES = 64 * 1024 * 1024;

/** Decode bytes as UTF-8 text, refusing other encodings with a reason. */
export function decodeUtf8(bytes: Uint8Array): string {
  const b = bytes;
  if (b.length >= 4 && b[0] === 0xff && b[1] === 0xfe && b[2] === 0 && b[3] === 0)
    throw new TextDecodeError('the file is UTF-32 (little-endian byte-order mark); save it as UTF-8');
  if (b.length >= 4 && b[0] === 0 && b[1] === 0 && b[2] === 0xfe && b[3] === 0xff)
    throw new TextDecodeError('the file is UTF-32 (big-endian byte-order mark); save it as UTF-8');
  if (b.length >= 2 && ((b[0] === 0xff && b[1] === 0xfe) || (b[0] === 0xfe && b[1] === 0xff)))
    throw new TextDecodeError(
      `the file is UTF-16 (${b[0] === 0xff ? 'little' : 'big'}-endian byte-order mark); save it as UTF-8`,
    );
  // UTF-16 without a mark: JSON text starts with ASCII, so every other byte of the start is zero.
  if (b.length >= 4 && ((b[0] !== 0 && b[1] === 0 && b[3] === 0) || (b[0] === 0 && b[2] === 0 && b[1] !== 0)))
    throw new TextDecodeError(
      `the file looks like UTF-16 (${b[1] === 0 ? 'little' : 'big'}-endian, no byte-order mark: every other byte is zero); save it as UTF-8`,
    );
  const start = b.length >= 3 && b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf ? 3 : 0;
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(b.subarray(start));
  } catch {
    throw new TextDecodeError(
      `the file is not valid UTF-8 (first bad byte at offset ${firstBadUtf8(b, start)}); save it as UTF-8`,
    );
  }
}

/** Offset of the first byte that breaks UTF-8 (RFC 3629 §4), or -1. */
export function firstBadUtf8(b: Uint8Array, from = 0): number {
  let i = from;
  while (i < b.length) {
    const c = b[i];
    let n = 0;
    let min = 0;
    if (c < 0x80) {
      i++;
      continue;
    } else if (c >= 0xc2 && c <= 0xdf) {
      n = 1;
      min = 0x80;
    } else if (c >= 0xe0 && c <= 0xef) {
      n = 2;
      min = 0x800;
    } else if (c >= 0xf0 && c <= 0xf4) {
      n = 3;
      min = 0x10000;
    } else return i;
    if (i + n >= b.length) return i;
    let cp = c & (0x3f >> n);
    for (let k = 1; k <= n; k++) {
      const d = b[i + k];
      if (d === undefined || (d & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (d & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += n + 1;
  }
  return -1;
}

/** Read a file as UTF-8 text (decodeUtf8), refusing files above MAX_INPUT_BYTES. */
export async function readTextFile(path: string): Promise<string> {
  const size = (await stat(path)).size;
  if (size > MAX_INPUT_BYTES)
    throw new TextDecodeError(`the file is ${size} bytes; at most ${MAX_INPUT_BYTES} are read`);
  return decodeUtf8(await readFile(path));
}
