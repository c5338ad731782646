/**
 * Where on the lot the RF-exposure estimate reaches: for a compliance distance R (from
 * exposure.ts), the ground area where a standing person would be closer than R to any part of the
 * antenna, drawn as rings, and which places of the lot it reaches (houses, paths, the property
 * line, the operating position).
 *
 * Geometry (ours, for screening): a person is the vertical column from the ground to head height
 * H above a ground point p. The distance from that person to the antenna is the shortest distance
 * between the column and any wire: for a wire point w it is √(|p − w_xy|² + max(0, w_z − H)²). The
 * zone of radius R is every ground point whose distance is below R. A wire higher than H + R has
 * no zone under it at all; the base of a ground-mounted vertical always has one.
 *
 * Wires are the candidate's modelled conductors above ground; radials on or in the ground are left
 * out (their currents largely cancel and a far-field estimate says nothing about them; say so
 * where it is shown). Distances to places are found by sampling each wire every SAMPLE_STEP_M, so
 * they are exact to half a step.
 */
import type { XY } from '../site/frame.ts';
import {
  distanceToRingEdges,
  insideRing,
  pointPolylineDistance,
  sampleSegment,
  type XYZ,
} from '../site/geometry.ts';
import type { Site } from '../site/site.ts';
import type { ExposureEstimate, ExposureLimitId } from './exposure.ts';

/** Head height of a standing adult, metres (common practice, no source). */
export const HEAD_HEIGHT_M = 2;
/** Wire sampling step for the distances to places, metres. */
export const SAMPLE_STEP_M = 0.05;

export interface ZoneWire {
  label?: string;
  from: XYZ;
  to: XYZ;
}

export type PlaceKind = 'house' | 'path' | 'boundary' | 'station';

/** A place kind in words. */
export const PLACE_WORD: Readonly<Record<PlaceKind, string>> = {
  house: 'house',
  path: 'path',
  boundary: 'property line',
  station: 'operating position',
};

/** One place of the lot and how close a person there can come to the antenna. */
export interface PlaceReach {
  kind: PlaceKind;
  name: string;
  /** Shortest person-to-antenna distance anywhere on (or in) the place, metres. */
  closestM: number;
  /** The ground point under the part of the antenna that comes closest (site frame). */
  nearXY: XY;
  /** The point of the place nearest to nearXY (site frame): where a flag goes. */
  placeXY: XY;
}

/** The point of a polyline nearest to p. */
export function nearestOnPolyline(p: XY, line: readonly XY[]): XY {
  let best: XY = line[0] ?? p;
  let bestD = Infinity;
  for (let i = 0; i + 1 < line.length; i++) {
    const a = line[i];
    const b = line[i + 1];
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const l2 = dx * dx + dy * dy;
    const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / l2));
    const q: XY = [a[0] + t * dx, a[1] + t * dy];
    const d = Math.hypot(p[0] - q[0], p[1] - q[1]);
    if (d < bestD) {
      bestD = d;
      best = q;
    }
  }
  return best;
}

/** Sample every wire (z > 0 or touching the ground) every `stepM`. */
export function wireSamples(wires: readonly ZoneWire[], stepM = SAMPLE_STEP_M): XYZ[] {
  const out: XYZ[] = [];
  for (const w of wires) out.push(...sampleSegment(w.from, w.to, stepM));
  return out;
}

/**
 * The shortest person-to-antenna distance over a place, given the horizontal distance from a
 * ground point under the wire to the place (0 when that point lies on or in it).
 */
function closestOver(
  samples: readonly XYZ[],
  headM: number,
  horizontal: (p: XY) => number,
): { closestM: number; nearXY: XY } {
  let best = Infinity;
  let at: XY = [NaN, NaN];
  for (const s of samples) {
    const dz = Math.max(0, s[2] - headM);
    if (dz >= best) continue;
    const h = horizontal([s[0], s[1]]);
    const d = Math.hypot(h, dz);
    if (d < best) {
      best = d;
      at = [s[0], s[1]];
    }
  }
  return { closestM: best, nearXY: at };
}

/**
 * How close a person can come to the antenna in each place of the lot: every building keep-out
 * and building support (house), every path keep-out, anywhere outside the lot boundary, and the
 * station point (where the operator sits).
 */
export function placeReach(wires: readonly ZoneWire[], site: Site, headM = HEAD_HEIGHT_M): PlaceReach[] {
  const samples = wireSamples(wires);
  const out: PlaceReach[] = [];
  for (const k of site.keepOuts) {
    if (k.kind !== 'building' && k.kind !== 'path') continue;
    const horizontal =
      k.shape.type === 'polygon'
        ? (() => {
            const ring = k.shape.ring;
            return (p: XY) => (insideRing(p, ring) ? 0 : distanceToRingEdges(p, ring));
          })()
        : (() => {
            const line = k.shape.line;
            return (p: XY) => pointPolylineDistance(p, line);
          })();
    const c = closestOver(samples, headM, horizontal);
    const edge = k.shape.type === 'polygon' ? k.shape.ring : k.shape.line;
    const inside = k.shape.type === 'polygon' && Number.isFinite(c.nearXY[0]) && insideRing(c.nearXY, edge);
    out.push({
      kind: k.kind === 'building' ? 'house' : 'path',
      name: k.name,
      ...c,
      placeXY: inside ? c.nearXY : nearestOnPolyline(c.nearXY, edge),
    });
  }
  for (const s of site.supports) {
    if (s.kind !== 'building') continue;
    out.push({
      kind: 'house',
      name: s.name,
      ...closestOver(samples, headM, (p) => Math.hypot(p[0] - s.xy[0], p[1] - s.xy[1])),
      placeXY: s.xy,
    });
  }
  if (site.boundary.length >= 4) {
    const ring = site.boundary;
    const c = closestOver(samples, headM, (p) => (insideRing(p, ring) ? distanceToRingEdges(p, ring) : 0));
    const outside = Number.isFinite(c.nearXY[0]) && !insideRing(c.nearXY, ring);
    out.push({
      kind: 'boundary',
      name: 'the property line',
      ...c,
      placeXY: outside ? c.nearXY : nearestOnPolyline(c.nearXY, ring),
    });
  }
  out.push({
    kind: 'station',
    name: 'the station point (operating position)',
    ...closestOver(samples, headM, (p) => Math.hypot(p[0] - site.station[0], p[1] - site.station[1])),
    placeXY: site.station,
  });
  return out;
}

/* ----------------------------------------------------------------------------------------------
 * Zone outlines: marching squares on the person-distance field
 * -------------------------------------------------------------------------------------------- */

/** Most grid nodes the outline may use; the cell grows to stay under it. */
const MAX_NODES = 160_000;

/**
 * The outline of the ground zone where a person is closer than `radiusM` to the antenna, as
 * closed rings in the site frame (first point repeated at the end). Empty when the zone does not
 * reach the ground (every wire higher than head height plus the radius).
 */
export function zoneRings(wires: readonly ZoneWire[], radiusM: number, headM = HEAD_HEIGHT_M): XY[][] {
  if (!(radiusM > 0)) return [];
  const step = Math.min(0.1, radiusM / 8);
  const samples = wireSamples(wires, step).filter((s) => s[2] - headM < radiusM);
  if (!samples.length) return [];
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const s of samples) {
    x0 = Math.min(x0, s[0]);
    y0 = Math.min(y0, s[1]);
    x1 = Math.max(x1, s[0]);
    y1 = Math.max(y1, s[1]);
  }
  let cell = Math.min(0.5, Math.max(0.02, radiusM / 12));
  const pad = radiusM + 2 * cell;
  for (;;) {
    const n = ((x1 - x0 + 2 * pad) / cell + 2) * ((y1 - y0 + 2 * pad) / cell + 2);
    if (n <= MAX_NODES) break;
    cell *= 1.5;
  }
  const ox = x0 - pad - cell;
  const oy = y0 - pad - cell;
  const nx = Math.ceil((x1 - x0 + 2 * pad) / cell) + 3;
  const ny = Math.ceil((y1 - y0 + 2 * pad) / cell) + 3;
  // Field value: distance − R (negative inside the zone). Each sample writes its squared distance
  // only into the nodes within R + 2 cells of it; nodes no sample reaches are farther than that
  // from every sample, so their value only needs the right sign and keeps the cap.
  const reach = radiusM + 2 * cell;
  const d2 = new Float64Array(nx * ny).fill(reach * reach);
  for (const s of samples) {
    const dz = Math.max(0, s[2] - headM);
    if (dz >= reach) continue;
    const rh = Math.sqrt(reach * reach - dz * dz);
    const i0 = Math.max(0, Math.floor((s[0] - rh - ox) / cell));
    const i1 = Math.min(nx - 1, Math.ceil((s[0] + rh - ox) / cell));
    const j0 = Math.max(0, Math.floor((s[1] - rh - oy) / cell));
    const j1 = Math.min(ny - 1, Math.ceil((s[1] + rh - oy) / cell));
    for (let j = j0; j <= j1; j++) {
      const dy = oy + j * cell - s[1];
      for (let i = i0; i <= i1; i++) {
        const dx = ox + i * cell - s[0];
        const v = dx * dx + dy * dy + dz * dz;
        const k = j * nx + i;
        if (v < d2[k]) d2[k] = v;
      }
    }
  }
  const f = new Float64Array(nx * ny);
  for (let k = 0; k < f.length; k++) f[k] = Math.sqrt(d2[k]) - radiusM;
  return marchingSquares(f, nx, ny, ox, oy, cell);
}

/** Closed contour rings of f = 0 on a regular grid (f < 0 inside); the border must be outside. */
export function marchingSquares(
  f: Float64Array,
  nx: number,
  ny: number,
  ox: number,
  oy: number,
  cell: number,
): XY[][] {
  const v = (i: number, j: number): number => f[j * nx + i];
  // Crossing points keyed by edge: horizontal edge (i,j)-(i+1,j) → "h i j", vertical (i,j)-(i,j+1) → "v i j".
  const point = (key: string): XY => {
    const [t, a, b] = key.split(' ');
    const i = Number(a);
    const j = Number(b);
    const i2 = t === 'h' ? i + 1 : i;
    const j2 = t === 'h' ? j : j + 1;
    const fa = v(i, j);
    const fb = v(i2, j2);
    const s = fa === fb ? 0.5 : fa / (fa - fb);
    return [ox + (i + s * (i2 - i)) * cell, oy + (j + s * (j2 - j)) * cell];
  };
  const next = new Map<string, string>();
  const link = (a: string, b: string): void => {
    next.set(a, b);
  };
  for (let j = 0; j + 1 < ny; j++)
    for (let i = 0; i + 1 < nx; i++) {
      const a = v(i, j) < 0; // bottom-left
      const b = v(i + 1, j) < 0; // bottom-right
      const c = v(i + 1, j + 1) < 0; // top-right
      const d = v(i, j + 1) < 0; // top-left
      const code = (a ? 1 : 0) | (b ? 2 : 0) | (c ? 4 : 0) | (d ? 8 : 0);
      if (code === 0 || code === 15) continue;
      const bottom = `h ${i} ${j}`;
      const right = `v ${i + 1} ${j}`;
      const top = `h ${i} ${j + 1}`;
      const left = `v ${i} ${j}`;
      // Each segment runs with the inside on its right (clockwise rings), so they chain up.
      switch (code) {
        case 1:
          link(left, bottom);
          break;
        case 2:
          link(bottom, right);
          break;
        case 3:
          link(left, right);
          break;
        case 4:
          link(right, top);
          break;
        case 6:
          link(bottom, top);
          break;
        case 7:
          link(left, top);
          break;
        case 8:
          link(top, left);
          break;
        case 9:
          link(top, bottom);
          break;
        case 11:
          link(top, right);
          break;
        case 12:
          link(right, left);
          break;
        case 13:
          link(right, bottom);
          break;
        case 14:
          link(bottom, left);
          break;
        case 5:
        case 10: {
          const centreInside = (v(i, j) + v(i + 1, j) + v(i + 1, j + 1) + v(i, j + 1)) / 4 < 0;
          if (code === 5) {
            if (centreInside) {
              link(left, top);
              link(right, bottom);
            } else {
              link(left, bottom);
              link(right, top);
            }
          } else if (centreInside) {
            link(bottom, left);
            link(top, right);
          } else {
            link(bottom, right);
            link(top, left);
          }
          break;
        }
      }
    }
  const rings: XY[][] = [];
  const seen = new Set<string>();
  for (const start of next.keys()) {
    if (seen.has(start)) continue;
    const ring: XY[] = [];
    let k: string | undefined = start;
    while (k !== undefined && !seen.has(k)) {
      seen.add(k);
      ring.push(point(k));
      k = next.get(k);
    }
    if (k === start && ring.length >= 3) {
      ring.push(ring[0]);
      rings.push(ring);
    }
  }
  return rings;
}

/* ----------------------------------------------------------------------------------------------
 * The exposure estimate on the lot
 * -------------------------------------------------------------------------------------------- */

export interface ZoneOnLot {
  limitId: ExposureLimitId;
  label: string;
  /** With the ground-reflection factor (the distance drawn and flagged), metres. */
  radiusM: number;
  freeSpaceM: number;
  /** Places a person could stand closer than radiusM (with reflection) / freeSpaceM. */
  reached: PlaceReach[];
  reachedFreeSpace: PlaceReach[];
  /** Ground outline at radiusM; filled only for the limits asked for. */
  rings: XY[][];
}

export interface ExposureOnLot {
  headHeightM: number;
  places: PlaceReach[];
  zones: ZoneOnLot[];
  notes: string[];
}

/**
 * The estimate's distances laid on the lot: for each limit, which places the zone reaches (with
 * and without the ground-reflection factor) and, for the limits in `ringsFor`, its outline.
 */
export function exposureOnLot(
  wires: readonly ZoneWire[],
  site: Site,
  estimate: ExposureEstimate,
  ringsFor: readonly ExposureLimitId[] = ['fcc-general', 'icnirp-public'],
  headM = HEAD_HEIGHT_M,
): ExposureOnLot {
  const places = placeReach(wires, site, headM);
  const zones = estimate.distances.map((d) => ({
    limitId: d.limit.id,
    label: d.limit.label,
    radiusM: d.withGroundReflectionM,
    freeSpaceM: d.freeSpaceM,
    reached: places.filter((p) => p.closestM < d.withGroundReflectionM),
    reachedFreeSpace: places.filter((p) => p.closestM < d.freeSpaceM),
    rings: ringsFor.includes(d.limit.id) ? zoneRings(wires, d.withGroundReflectionM, headM) : [],
  }));
  return {
    headHeightM: headM,
    places,
    zones,
    notes: [
      `A zone is the ground where a standing person (up to ${headM} m) would be closer to a wire than the compliance distance; distances are measured from the antenna's wires above ground (radials on the ground are left out).`,
    ],
  };
}

/** Signed area of a closed ring (positive counter-clockwise), m². */
export function ringArea(ring: readonly XY[]): number {
  let a = 0;
  for (let i = 0; i + 1 < ring.length; i++) a += ring[i][0] * ring[i + 1][1] - ring[i + 1][0] * ring[i][1];
  return a / 2;
}
