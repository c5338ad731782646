/**
 * A lot typed rather than clicked: a rectangle of width × depth whose front side runs at a
 * compass bearing, or sides walked from a first corner, each by its length and compass bearing;
 * and a point given as an offset (distance and bearing) from a known point. Metres and degrees in,
 * [lon, lat] out, through the local azimuthal-equidistant frame (frame.ts) centred on the anchor,
 * so lengths come out as typed (to well under a millimetre at lot size).
 */
import type { LonLat } from '../project/schema.ts';
import { makeSiteFrame, type XY } from './frame.ts';

export interface TypedSide {
  lengthM: number;
  /** Compass bearing of the side as walked, degrees from north, clockwise. */
  bearingDeg: number;
}

/** A typed value that cannot make a lot: which field and why. */
export class TypedLotError extends Error {
  readonly field: string;
  constructor(field: string, message: string) {
    super(message);
    this.name = 'TypedLotError';
    this.field = field;
  }
}

/** Largest side a typed lot may have, metres (a lot, not a county). */
export const MAX_TYPED_SIDE_M = 5000;
/** A walk of sides that ends farther than this from its first corner is refused, metres. */
export const MAX_CLOSING_GAP_M = 1;

const step = (at: XY, lengthM: number, bearingDeg: number): XY => {
  const r = (bearingDeg * Math.PI) / 180;
  return [at[0] + lengthM * Math.sin(r), at[1] + lengthM * Math.cos(r)];
};

function checkLength(field: string, v: number): void {
  if (!Number.isFinite(v) || v <= 0 || v > MAX_TYPED_SIDE_M)
    throw new TypedLotError(field, `${field} must be a length above 0 and at most ${MAX_TYPED_SIDE_M} m`);
}

function checkBearing(field: string, v: number): void {
  if (!Number.isFinite(v) || v < 0 || v > 360)
    throw new TypedLotError(field, `${field} must be a bearing from 0 to 360°`);
}

/**
 * The corners of a rectangle `widthM` along the front (running at `bearingDeg`) and `depthM` to
 * its right (bearing + 90°), with its first corner at `corner`. Four corners, not closed.
 */
export function rectangleLot(corner: LonLat, widthM: number, depthM: number, bearingDeg: number): LonLat[] {
  checkLength('width', widthM);
  checkLength('depth', depthM);
  checkBearing('bearing', bearingDeg);
  const f = makeSiteFrame(corner);
  const a: XY = [0, 0];
  const b = step(a, widthM, bearingDeg);
  const c = step(b, depthM, bearingDeg + 90);
  const d = step(a, depthM, bearingDeg + 90);
  return [a, b, c, d].map((p) => f.toLonLat(p));
}

/**
 * The corners reached by walking the sides from `corner`. The walk must come back to the first
 * corner (within MAX_CLOSING_GAP_M, the gap is then reported); or the last side may be left out,
 * and the lot is closed straight back to the first corner. Returns the corners (not closed).
 */
export function walkedLot(corner: LonLat, sides: readonly TypedSide[]): { corners: LonLat[]; gapM: number } {
  if (sides.length < 2) throw new TypedLotError('sides', 'give at least two sides (a lot has three or more)');
  sides.forEach((s, i) => {
    checkLength(`side ${i + 1} length`, s.lengthM);
    checkBearing(`side ${i + 1} bearing`, s.bearingDeg);
  });
  const f = makeSiteFrame(corner);
  const pts: XY[] = [[0, 0]];
  for (const s of sides) pts.push(step(pts[pts.length - 1]!, s.lengthM, s.bearingDeg));
  const end = pts[pts.length - 1]!;
  const gapM = Math.hypot(end[0], end[1]);
  // Back at the first corner: the last point repeats it. Otherwise the lot closes straight from
  // the last corner reached (the side left out).
  const closed = gapM <= MAX_CLOSING_GAP_M;
  if (closed) pts.pop();
  if (pts.length < 3) throw new TypedLotError('sides', 'the sides do not enclose an area');
  return { corners: pts.map((p) => f.toLonLat(p)), gapM: closed ? gapM : 0 };
}

/** Parse "45 @ 90; 30 @ 180; …" (length @ bearing, lengths in metres): the sides of a walk. */
export function parseSides(text: string, toMetres: (v: number) => number = (v) => v): TypedSide[] {
  const parts = text
    .split(/[;\n]+/)
    .map((s) => s.trim())
    .filter(Boolean);
  return parts.map((p, i) => {
    const m = /^([0-9]+(?:\.[0-9]+)?)\s*(?:@|at)\s*([0-9]+(?:\.[0-9]+)?)\s*°?$/i.exec(p);
    if (!m)
      throw new TypedLotError(
        'sides',
        `side ${i + 1} ("${p}") is not "length @ bearing", e.g. 45 @ 90 for 45 along a bearing of 90°`,
      );
    return { lengthM: toMetres(Number(m[1])), bearingDeg: Number(m[2]) };
  });
}

/** The point `distanceM` from `from` at a compass bearing (a support placed by offset). */
export function offsetPoint(from: LonLat, distanceM: number, bearingDeg: number): LonLat {
  if (!Number.isFinite(distanceM) || distanceM < 0 || distanceM > MAX_TYPED_SIDE_M)
    throw new TypedLotError('distance', `distance must be from 0 to ${MAX_TYPED_SIDE_M} m`);
  checkBearing('bearing', bearingDeg);
  return makeSiteFrame(from).toLonLat(step([0, 0], distanceM, bearingDeg));
}
