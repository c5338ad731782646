/**
 * Maidenhead locator encoding and decoding (the grid system radio amateurs use: field of
 * 20°×10° lettered A–R, square of 2°×1° numbered 0–9, subsquare of 5′×2.5′ lettered a–x, extended
 * square of 30″×15″ numbered 0–9). Encoding gives 2, 4, 6 or 8 characters; decoding returns the
 * centre of the named cell and its south-west corner and size.
 */
import type { LonLat } from '../project/schema.ts';

const LETTERS = 'ABCDEFGHIJKLMNOPQRSTUVWX';

export class LocatorError extends Error {
  override name = 'LocatorError';
}

/** Cell sizes [lon, lat] in degrees at each pair of characters. */
const CELL_DEG: readonly [number, number][] = [
  [20, 10],
  [2, 1],
  [2 / 24, 1 / 24],
  [2 / 240, 1 / 240],
];
const BASES = [18, 10, 24, 10];

/** Encode [lon, lat] degrees as a Maidenhead locator of `length` characters (2, 4, 6 or 8). */
export function toLocator([lon, lat]: LonLat, length: 2 | 4 | 6 | 8 = 6): string {
  if (!(lon >= -180 && lon <= 180 && lat >= -90 && lat <= 90)) {
    throw new LocatorError(`position out of range: [${lon}, ${lat}]`);
  }
  // Shift to [0, 360) × [0, 180); the east and north edges belong to the last cell.
  let x = Math.min(lon + 180, 360 - 1e-9);
  let y = Math.min(lat + 90, 180 - 1e-9);
  let out = '';
  for (let i = 0; i < length / 2; i++) {
    const [cx, cy] = CELL_DEG[i];
    const ix = Math.min(Math.floor(x / cx + 1e-9), BASES[i] - 1);
    const iy = Math.min(Math.floor(y / cy + 1e-9), BASES[i] - 1);
    x -= ix * cx;
    y -= iy * cy;
    if (i % 2 === 0) {
      const letters = i === 0 ? LETTERS : LETTERS.toLowerCase();
      out += letters[ix] + letters[iy];
    } else {
      out += String(ix) + String(iy);
    }
  }
  return out;
}

export interface LocatorCell {
  /** South-west corner [lon, lat]. */
  southWest: LonLat;
  /** Size of the cell [lon, lat] degrees. */
  sizeDeg: [number, number];
  center: LonLat;
}

/** Decode a locator of 2, 4, 6 or 8 characters (case-insensitive). */
export function fromLocator(locator: string): LocatorCell {
  const s = locator.trim();
  if (!/^[A-Ra-r]{2}(\d\d([A-Xa-x]{2}(\d\d)?)?)?$/.test(s)) {
    throw new LocatorError(`"${locator}" is not a Maidenhead locator of 2, 4, 6 or 8 characters`);
  }
  let lon = -180;
  let lat = -90;
  for (let i = 0; i < s.length / 2; i++) {
    const a = s[2 * i];
    const b = s[2 * i + 1];
    const [cx, cy] = CELL_DEG[i];
    const ix = i % 2 === 0 ? LETTERS.indexOf(a.toUpperCase()) : Number(a);
    const iy = i % 2 === 0 ? LETTERS.indexOf(b.toUpperCase()) : Number(b);
    lon += ix * cx;
    lat += iy * cy;
  }
  const [sx, sy] = CELL_DEG[s.length / 2 - 1];
  return { southWest: [lon, lat], sizeDeg: [sx, sy], center: [lon + sx / 2, lat + sy / 2] };
}
