/**
 * Feasibility of a placement on the site: every wire, rope, radial, anchor and mast stays inside
 * the lot minus the setback and outside every keep-out zone with its clearance, in plan and in
 * height; wire ends stay at or above the lowest allowed end height.
 *
 * Rules (common practice, no source, stated here so that the user can read them):
 *  - Buildings and other zones: a point of wire or rope may not come horizontally closer than the
 *    zone's clearance while it is lower than the zone's height plus that clearance (a wire may
 *    pass high over a house; a zone without a height is kept clear at every height).
 *  - Power lines: each point at height z keeps a horizontal distance of at least
 *    max(clearanceM, z + POWER_LINE_MARGIN_M) from the line, so that nothing that falls or swings
 *    (a wire, a rope, a support of height z) can reach it. A used support counts with its full
 *    usable height; a radial on the ground counts with z = 0.
 *  - Existing supports are not subject to the setback (they stand where they stand), but wires
 *    tied to them are.
 * Wires and ropes are checked at points at most SAMPLE_STEP_M apart (the result is exact to
 * within half a step of the worst approach).
 */
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { whereToChange } from '../project/settingLimits.ts';
import { polygon as turfPolygon } from '@turf/helpers';
import type { XY } from './frame.ts';
import { distanceToRingEdges, pointPolylineDistance, sampleSegment, type XYZ } from './geometry.ts';
import type { Site, SiteKeepOut } from './site.ts';

/** Extra horizontal margin beyond fall distance around a power line, metres (common practice, no source). */
export const POWER_LINE_MARGIN_M = 3;
/** Spacing of the check points along wires and ropes, metres. */
export const SAMPLE_STEP_M = 0.5;

export type Element =
  | {
      kind: 'wire';
      label: string;
      from: XYZ;
      to: XYZ;
      /** What the conductor does: the default is a radiator; a horizontal top section says so. */
      role?: 'radiator' | 'top-wire';
    }
  | { kind: 'rope'; label: string; from: XYZ; to: XYZ }
  /** Coax an array's builder lays between its elements and its relay box (checked like a rope). */
  | { kind: 'coax'; label: string; from: XYZ; to: XYZ }
  | { kind: 'radial'; label: string; from: XYZ; to: XYZ }
  | { kind: 'end'; label: string; at: XYZ }
  | { kind: 'anchor'; label: string; at: XYZ }
  | { kind: 'support'; label: string; supportId: string; at: XY; heightM: number }
  | { kind: 'mast'; label: string; at: XY; heightM: number };

export type ViolationCode =
  'outside-lot' | 'setback' | 'keep-out' | 'power-line' | 'end-height' | 'mast-height' | 'geometry';

export interface Violation {
  code: ViolationCode;
  element: string;
  keepOutId?: string;
  /** How far the rule is missed, metres. */
  byM: number;
  message: string;
}

export interface FeasibilityResult {
  ok: boolean;
  violations: Violation[];
  /** Plain-words reasons the placement fits (closest approaches against the rules). */
  fits: string[];
  /** Smallest distance from any element to the boundary, metres (negative when outside). */
  boundaryMarginM: number;
}

const f1 = (v: number): string => v.toFixed(1);

/** Site geometry prepared once for many checks. */
export interface PreparedSite {
  site: Site;
  boundaryPoly: ReturnType<typeof turfPolygon>;
  keepOutPolys: (ReturnType<typeof turfPolygon> | null)[];
}

export function prepareSite(site: Site): PreparedSite {
  return {
    site,
    boundaryPoly: turfPolygon([site.boundary]),
    keepOutPolys: site.keepOuts.map((k) => (k.shape.type === 'polygon' ? turfPolygon([k.shape.ring]) : null)),
  };
}

/** Signed distance to the boundary: positive inside (distance to the nearest edge), negative outside. */
export function boundaryDistance(ps: PreparedSite, p: XY): number {
  const d = distanceToRingEdges(p, ps.site.boundary);
  return booleanPointInPolygon(p, ps.boundaryPoly) ? d : -d;
}

/** Horizontal distance from p to a keep-out zone (0 inside a polygon). */
export function keepOutDistance(ps: PreparedSite, index: number, p: XY): number {
  const k = ps.site.keepOuts[index];
  if (k.shape.type === 'line') return pointPolylineDistance(p, k.shape.line);
  const poly = ps.keepOutPolys[index];
  if (poly && booleanPointInPolygon(p, poly)) return 0;
  return distanceToRingEdges(p, k.shape.ring);
}

/** Horizontal distance a point at height z must keep from a keep-out, or 0 if it may pass (high over a building). */
export function requiredClearance(k: SiteKeepOut, zM: number): number {
  if (k.kind === 'power-line') return Math.max(k.clearanceM, zM + POWER_LINE_MARGIN_M);
  // A path is walked on, not built up: wires may pass over it; its clearance keeps anchors and
  // low parts off it. Other zones of unknown height reach up without limit.
  const top = k.heightM ?? (k.kind === 'path' ? 0 : Infinity);
  return zM < top + k.clearanceM ? k.clearanceM : 0;
}

interface Sample {
  p: XYZ;
  element: string;
  kind: Element['kind'];
}

function samplesOf(e: Element): Sample[] {
  switch (e.kind) {
    case 'wire':
    case 'rope':
    case 'coax':
    case 'radial':
      return sampleSegment(e.from, e.to, SAMPLE_STEP_M).map((p) => ({ p, element: e.label, kind: e.kind }));
    case 'end':
    case 'anchor':
      return [{ p: e.at, element: e.label, kind: e.kind }];
    case 'support':
    case 'mast':
      return [{ p: [e.at[0], e.at[1], e.heightM], element: e.label, kind: e.kind }];
  }
}

/** Check a placement's elements against the site rules. */
export function checkPlacement(ps: PreparedSite, elements: readonly Element[]): FeasibilityResult {
  const { site } = ps;
  const setback = site.settings.setbackM;
  const minEnd = site.settings.minEndHeightM;
  const violations: Violation[] = [];
  const worst = new Map<string, Violation>();
  const note = (key: string, v: Violation): void => {
    const old = worst.get(key);
    if (!old || v.byM > old.byM) worst.set(key, v);
  };
  let boundaryMargin = Infinity;
  const closest = site.keepOuts.map(() => ({ spareM: Infinity, element: '', distM: 0, needM: 0 }));
  let lowestEnd = Infinity;

  for (const e of elements) {
    if (e.kind === 'end') {
      lowestEnd = Math.min(lowestEnd, e.at[2]);
      if (e.at[2] < minEnd - 1e-6) {
        const by = minEnd - e.at[2];
        note(`end:${e.label}`, {
          code: 'end-height',
          element: e.label,
          byM: by,
          message: `${e.label} is ${f1(e.at[2])} m above ground, ${f1(by)} m below the ${f1(minEnd)} m end-height limit${whereToChange('minEndHeightM')}`,
        });
      }
    }
    if (e.kind === 'mast' && e.heightM > site.settings.maxVerticalHeightM + 1e-6) {
      const by = e.heightM - site.settings.maxVerticalHeightM;
      note(`mast:${e.label}`, {
        code: 'mast-height',
        element: e.label,
        byM: by,
        message: `${e.label} would be ${f1(e.heightM)} m tall, ${f1(by)} m over the ${f1(site.settings.maxVerticalHeightM)} m self-supporting limit${whereToChange('maxVerticalHeightM')}`,
      });
    }
    for (const s of samplesOf(e)) {
      const xy: XY = [s.p[0], s.p[1]];
      if (s.kind !== 'support') {
        const bd = boundaryDistance(ps, xy);
        boundaryMargin = Math.min(boundaryMargin, bd);
        if (bd < 0) {
          note(`lot:${s.element}`, {
            code: 'outside-lot',
            element: s.element,
            byM: -bd + setback,
            message: `${s.element} leaves the lot by ${f1(-bd)} m`,
          });
        } else if (bd < setback - 1e-6) {
          note(`setback:${s.element}`, {
            code: 'setback',
            element: s.element,
            byM: setback - bd,
            message: `${s.element} comes ${f1(bd)} m from the boundary, inside the ${f1(setback)} m setback by ${f1(setback - bd)} m${whereToChange('setbackM')}`,
          });
        }
      }
      site.keepOuts.forEach((k, i) => {
        // A used support: only the fall rule of power lines applies to it.
        if (s.kind === 'support' && k.kind !== 'power-line') return;
        const need = requiredClearance(k, s.p[2]);
        const d = keepOutDistance(ps, i, xy);
        const c = closest[i];
        if (d - need < c.spareM) {
          c.spareM = d - need;
          c.element = s.element;
          c.distM = d;
          c.needM = need;
        }
        if (need > 0 && d < need - 1e-6) {
          const by = need - d;
          const message =
            k.kind === 'power-line'
              ? `${s.element} crosses the power-line clearance of "${k.name}" by ${f1(by)} m (needs ${f1(need)} m, has ${f1(d)} m)`
              : `${s.element} comes within ${f1(d)} m of "${k.name}" (clearance ${f1(k.clearanceM)} m${
                  k.heightM !== undefined ? ` below ${f1(k.heightM + k.clearanceM)} m` : ''
                }) by ${f1(by)} m`;
          note(`ko:${k.id}:${s.element}`, {
            code: k.kind === 'power-line' ? 'power-line' : 'keep-out',
            element: s.element,
            keepOutId: k.id,
            byM: by,
            message,
          });
        }
      });
    }
  }
  // A part that leaves the lot needs no separate setback message.
  for (const [k, v] of worst) {
    if (v.code === 'setback' && worst.has(`lot:${v.element}`)) worst.delete(k);
  }
  // One violation per rule and zone: the worst part, naming how many other parts miss it too.
  const byRule = new Map<string, { v: Violation; others: Set<string> }>();
  for (const v of worst.values()) {
    const k = `${v.code}:${v.keepOutId ?? ''}`;
    const r = byRule.get(k);
    if (!r) byRule.set(k, { v, others: new Set() });
    else if (v.byM > r.v.byM) {
      r.others.add(r.v.element);
      r.v = v;
    } else r.others.add(v.element);
  }
  for (const { v, others } of byRule.values()) {
    others.delete(v.element);
    violations.push(others.size ? { ...v, message: `${v.message} (also ${[...others].join(', ')})` } : v);
  }
  violations.sort((a, b) => b.byM - a.byM);
  const fits: string[] = [];
  if (violations.length === 0) {
    if (Number.isFinite(boundaryMargin)) {
      fits.push(
        `everything stays at least ${f1(boundaryMargin)} m inside the boundary (setback ${f1(setback)} m)`,
      );
    }
    site.keepOuts.forEach((k, i) => {
      const c = closest[i];
      if (!Number.isFinite(c.spareM)) return;
      fits.push(
        k.kind === 'power-line'
          ? `closest to "${k.name}": ${c.element} at ${f1(c.distM)} m, needs ${f1(c.needM)} m (fall distance plus ${POWER_LINE_MARGIN_M} m)`
          : k.kind === 'path'
            ? `path "${k.name}": closest ${c.element} at ${f1(c.distM)} m${c.needM > 0 ? ` (keeps ${f1(c.needM)} m)` : ''}; see the RF-exposure zones for people walking there`
            : `clear of "${k.name}": closest ${c.element} at ${f1(c.distM)} m${c.needM > 0 ? ` (needs ${f1(c.needM)} m)` : ', passing above it'}`,
      );
    });
    if (Number.isFinite(lowestEnd)) {
      fits.push(`lowest wire end ${f1(lowestEnd)} m above ground (limit ${f1(minEnd)} m)`);
    }
  }
  return { ok: violations.length === 0, violations, fits, boundaryMarginM: boundaryMargin };
}

/**
 * Longest buried radial, up to `nominalM`, from `base` along `bearingDeg` that stays inside the lot
 * minus the setback and outside every keep-out with its ground-level clearance. Clipped to
 * RADIAL_STEP_M.
 */
export const RADIAL_STEP_M = 0.25;
export function clipRadial(ps: PreparedSite, base: XY, bearingDeg: number, nominalM: number): number {
  const r = (bearingDeg * Math.PI) / 180;
  const ux = Math.sin(r);
  const uy = Math.cos(r);
  const setback = ps.site.settings.setbackM;
  let ok = 0;
  for (let t = RADIAL_STEP_M; t <= nominalM + 1e-9; t += RADIAL_STEP_M) {
    const p: XY = [base[0] + ux * t, base[1] + uy * t];
    if (boundaryDistance(ps, p) < setback) break;
    let blocked = false;
    for (let i = 0; i < ps.site.keepOuts.length && !blocked; i++) {
      const need = requiredClearance(ps.site.keepOuts[i], 0);
      if (keepOutDistance(ps, i, p) < need) blocked = true;
    }
    if (blocked) break;
    ok = t;
  }
  return ok + RADIAL_STEP_M > nominalM ? nominalM : ok;
}
