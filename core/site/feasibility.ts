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
 *    usable height.
 *  - Buried radials cannot fall onto a line: the fall rule does not apply to them. They keep
 *    settings.buriedClearanceM from the line's poles (every vertex of a drawn power line, its
 *    ends included, is taken as a pole: its ground rod and down conductor are there) and from every
 *    `buried` keep-out (a buried cable or pipe; the larger of that distance and the zone's own
 *    clearance). Anchors and self-supporting masts, which are driven into the ground, keep the same
 *    distance from `buried` zones; wires, ropes and ends pass over a buried zone freely.
 *  - Existing supports are not subject to the setback (they stand where they stand), but wires
 *    tied to them are.
 * Wires and ropes are checked at points at most SAMPLE_STEP_M apart (the result is exact to
 * within half a step of the worst approach).
 */
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { whereToChange } from '../project/settingLimits.ts';
import { polygon as turfPolygon } from '@turf/helpers';
import type { XY } from './frame.ts';
import { distanceToRingEdges, pointPolylineDistance, type XYZ } from './geometry.ts';
import type { Site, SiteKeepOut } from './site.ts';

/** Extra horizontal margin beyond fall distance around a power line, metres (common practice, no source). */
export const POWER_LINE_MARGIN_M = 3;
/** Spacing of the check points along wires and ropes, metres. */
export const SAMPLE_STEP_M = 0.5;

/** Element kinds that go into the ground (checked against poles and buried zones, not the fall rule). */
const GROUND_KINDS: ReadonlySet<Element['kind']> = new Set(['radial', 'anchor', 'mast']);

/**
 * How a point of an element of `kind` at height zM is held off keep-out k: the distance it must
 * keep and what that distance is measured to ('zone': the zone itself; 'poles': the vertices of a
 * power line), or null when the rule does not apply to it (a wire over a buried pipe).
 */
export function clearanceRule(
  k: SiteKeepOut,
  kind: Element['kind'],
  zM: number,
  buriedClearanceM: number,
): { needM: number; to: 'zone' | 'poles' } | null {
  if (k.kind === 'buried')
    return GROUND_KINDS.has(kind) ? { needM: Math.max(k.clearanceM, buriedClearanceM), to: 'zone' } : null;
  if (kind === 'radial' && k.kind === 'power-line') return { needM: buriedClearanceM, to: 'poles' };
  return { needM: requiredClearance(k, zM), to: 'zone' };
}

/** Horizontal distance from p to the nearest pole (vertex) of a line or polygon keep-out. */
export function poleDistance(k: SiteKeepOut, p: XY): number {
  const pts = k.shape.type === 'line' ? k.shape.line : k.shape.ring;
  let d = Infinity;
  for (const q of pts) d = Math.min(d, Math.hypot(p[0] - q[0], p[1] - q[1]));
  return d;
}

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

let edgeScratch = new Float64Array(64);

/**
 * Distance from p to the edges of a closed ring and whether p lies inside it, in one pass (the
 * same arithmetic as pointSegmentDistance, geometry.ts). Inside is the even-odd crossing test;
 * a point within 1e-9 m of an edge (where a crossing test and Turf may disagree by rounding) is
 * decided by Turf, as before.
 */
function ringDistance(p: XY, ring: readonly XY[], poly: ReturnType<typeof turfPolygon> | null): number {
  const px = p[0];
  const py = p[1];
  // Squared distances first; Math.hypot (as pointSegmentDistance computes it) only for the edges
  // within rounding of the nearest, so the minimum is the one the per-edge distances give.
  const nE = ring.length - 1;
  if (edgeScratch.length < 3 * nE) edgeScratch = new Float64Array(3 * nE);
  const q = edgeScratch;
  let best = Infinity;
  let inside = false;
  for (let i = 0; i < nE; i++) {
    const ax = ring[i][0];
    const ay = ring[i][1];
    const bx = ring[i + 1][0];
    const by = ring[i + 1][1];
    const dx = bx - ax;
    const dy = by - ay;
    const len2 = dx * dx + dy * dy;
    let t = len2 === 0 ? 0 : ((px - ax) * dx + (py - ay) * dy) / len2;
    t = Math.max(0, Math.min(1, t));
    const qx = px - ax - t * dx;
    const qy = py - ay - t * dy;
    const q2 = qx * qx + qy * qy;
    q[3 * i] = qx;
    q[3 * i + 1] = qy;
    q[3 * i + 2] = q2;
    if (q2 < best) best = q2;
    if (ay > py !== by > py && px < ((bx - ax) * (py - ay)) / (by - ay) + ax) inside = !inside;
  }
  let d = Infinity;
  const within = best * (1 + 1e-9) + 1e-300;
  for (let i = 0; i < nE; i++)
    if (q[3 * i + 2] <= within) d = Math.min(d, Math.hypot(q[3 * i], q[3 * i + 1]));
  if (poly === null) return d;
  if (d < 1e-9) inside = booleanPointInPolygon(p, poly);
  return inside ? d : -d;
}

/** Signed distance to the boundary: positive inside (distance to the nearest edge), negative outside. */
export function boundaryDistance(ps: PreparedSite, p: XY): number {
  return ringDistance(p, ps.site.boundary, ps.boundaryPoly);
}

/** Horizontal distance from p to a keep-out zone (0 inside a polygon). */
export function keepOutDistance(ps: PreparedSite, index: number, p: XY): number {
  const k = ps.site.keepOuts[index];
  if (k.shape.type === 'line') return pointPolylineDistance(p, k.shape.line);
  const poly = ps.keepOutPolys[index];
  if (!poly) return distanceToRingEdges(p, k.shape.ring);
  const d = ringDistance(p, k.shape.ring, poly);
  return d < 0 ? -d : 0;
}

/** Horizontal distance a point at height z must keep from a keep-out, or 0 if it may pass (high over a building). */
export function requiredClearance(k: SiteKeepOut, zM: number): number {
  // A buried cable or pipe: only what goes into the ground keeps clear of it (clearanceRule).
  if (k.kind === 'buried') return 0;
  if (k.kind === 'power-line') return Math.max(k.clearanceM, zM + POWER_LINE_MARGIN_M);
  // A path is walked on, not built up: wires may pass over it; its clearance keeps anchors and
  // low parts off it. Other zones of unknown height reach up without limit.
  const top = k.heightM ?? (k.kind === 'path' ? 0 : Infinity);
  return zM < top + k.clearanceM ? k.clearanceM : 0;
}

/**
 * A rule missed at one check point, kept as numbers: the message is written once, for the worst
 * point of each part and rule (writing it at every point cost most of a failed check).
 */
interface Miss {
  code: ViolationCode;
  element: string;
  keepOutId?: string;
  byM: number;
  /** The number the message quotes: the height (end), boundary distance (lot, setback) or zone distance. */
  value: number;
  /** The keep-out's required distance, or the mast's height. */
  need: number;
  keepOut: number;
  /** The rule measured to a power line's poles or a buried zone (a part in the ground). */
  ground?: 'poles' | 'buried';
}

/** The words of a missed rule (as each was written at the point before the messages were deferred). */
function missMessage(m: Miss, site: Site, setback: number, minEnd: number): string {
  switch (m.code) {
    case 'end-height':
      return `${m.element} is ${f1(m.value)} m above ground, ${f1(m.byM)} m below the ${f1(minEnd)} m end-height limit${whereToChange('minEndHeightM')}`;
    case 'mast-height':
      return `${m.element} would be ${f1(m.value)} m tall, ${f1(m.byM)} m over the ${f1(site.settings.maxVerticalHeightM)} m self-supporting limit${whereToChange('maxVerticalHeightM')}`;
    case 'outside-lot':
      return `${m.element} leaves the lot by ${f1(-m.value)} m`;
    case 'setback':
      return `${m.element} comes ${f1(m.value)} m from the boundary, inside the ${f1(setback)} m setback by ${f1(m.byM)} m${whereToChange('setbackM')}`;
    default: {
      const k = site.keepOuts[m.keepOut];
      if (m.ground === 'poles')
        return `${m.element} comes ${f1(m.value)} m from a pole of "${k.name}", ${f1(m.byM)} m inside the ${f1(m.need)} m kept around poles and buried lines${whereToChange('buriedClearanceM')}`;
      if (m.ground === 'buried')
        return `${m.element} comes ${f1(m.value)} m from the buried "${k.name}", ${f1(m.byM)} m inside the ${f1(m.need)} m kept from buried lines${whereToChange('buriedClearanceM')}`;
      return k.kind === 'power-line'
        ? `${m.element} crosses the power-line clearance of "${k.name}" by ${f1(m.byM)} m (needs ${f1(m.need)} m, has ${f1(m.value)} m)`
        : `${m.element} comes within ${f1(m.value)} m of "${k.name}" (clearance ${f1(k.clearanceM)} m${
            k.heightM !== undefined ? ` below ${f1(k.heightM + k.clearanceM)} m` : ''
          }) by ${f1(m.byM)} m`;
    }
  }
}

/** Check a placement's elements against the site rules. */
export function checkPlacement(ps: PreparedSite, elements: readonly Element[]): FeasibilityResult {
  const { site } = ps;
  const setback = site.settings.setbackM;
  const minEnd = site.settings.minEndHeightM;
  const buriedM = site.settings.buriedClearanceM;
  const keepOuts = site.keepOuts;
  const nK = keepOuts.length;
  const violations: Violation[] = [];
  const worst = new Map<string, Miss>();
  const note = (key: string, v: Miss): void => {
    const old = worst.get(key);
    if (!old || v.byM > old.byM) worst.set(key, v);
  };
  let boundaryMargin = Infinity;
  const closest = keepOuts.map(() => ({ spareM: Infinity, element: '', distM: 0, needM: 0 }));
  /** The same for the parts in the ground measured to a power line's poles or a buried zone. */
  const closestGround = keepOuts.map(() => ({ spareM: Infinity, element: '', distM: 0, needM: 0 }));
  let lowestEnd = Infinity;
  const xy: [number, number] = [0, 0];

  /** One check point of element `label` (of kind `kind`) at (x, y, z). */
  const checkPoint = (label: string, kind: Element['kind'], x: number, y: number, z: number): void => {
    xy[0] = x;
    xy[1] = y;
    if (kind !== 'support') {
      const bd = boundaryDistance(ps, xy);
      boundaryMargin = Math.min(boundaryMargin, bd);
      if (bd < 0) {
        note(`lot:${label}`, {
          code: 'outside-lot',
          element: label,
          byM: -bd + setback,
          value: bd,
          need: 0,
          keepOut: -1,
        });
      } else if (bd < setback - 1e-6) {
        note(`setback:${label}`, {
          code: 'setback',
          element: label,
          byM: setback - bd,
          value: bd,
          need: 0,
          keepOut: -1,
        });
      }
    }
    for (let i = 0; i < nK; i++) {
      const k = keepOuts[i];
      // A used support: only the fall rule of power lines applies to it.
      if (kind === 'support' && k.kind !== 'power-line') continue;
      const rule = clearanceRule(k, kind, z, buriedM);
      if (!rule) continue;
      const need = rule.needM;
      const ground = rule.to === 'poles' ? 'poles' : k.kind === 'buried' ? 'buried' : undefined;
      const d = rule.to === 'poles' ? poleDistance(k, xy) : keepOutDistance(ps, i, xy);
      const c = ground ? closestGround[i] : closest[i];
      if (d - need < c.spareM) {
        c.spareM = d - need;
        c.element = label;
        c.distM = d;
        c.needM = need;
      }
      if (need > 0 && d < need - 1e-6) {
        note(`ko:${k.id}:${ground ?? ''}:${label}`, {
          code: k.kind === 'power-line' && !ground ? 'power-line' : 'keep-out',
          element: label,
          keepOutId: k.id,
          byM: need - d,
          value: d,
          need,
          keepOut: i,
          ...(ground ? { ground } : {}),
        });
      }
    }
  };

  for (const e of elements) {
    if (e.kind === 'end') {
      lowestEnd = Math.min(lowestEnd, e.at[2]);
      if (e.at[2] < minEnd - 1e-6) {
        note(`end:${e.label}`, {
          code: 'end-height',
          element: e.label,
          byM: minEnd - e.at[2],
          value: e.at[2],
          need: 0,
          keepOut: -1,
        });
      }
    }
    if (e.kind === 'mast' && e.heightM > site.settings.maxVerticalHeightM + 1e-6) {
      note(`mast:${e.label}`, {
        code: 'mast-height',
        element: e.label,
        byM: e.heightM - site.settings.maxVerticalHeightM,
        value: e.heightM,
        need: 0,
        keepOut: -1,
      });
    }
    if ('from' in e) {
      // A line element (wire, rope, radial, …): the points of sampleSegment(e.from, e.to,
      // SAMPLE_STEP_M) (geometry.ts), with the same arithmetic.
      const a = e.from;
      const b = e.to;
      const len = Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
      const n = Math.max(1, Math.ceil(len / SAMPLE_STEP_M));
      for (let i = 0; i <= n; i++) {
        const t = i / n;
        checkPoint(
          e.label,
          e.kind,
          a[0] + t * (b[0] - a[0]),
          a[1] + t * (b[1] - a[1]),
          a[2] + t * (b[2] - a[2]),
        );
      }
    } else if (e.kind === 'support' || e.kind === 'mast')
      checkPoint(e.label, e.kind, e.at[0], e.at[1], e.heightM);
    else checkPoint(e.label, e.kind, e.at[0], e.at[1], e.at[2]);
  }
  // A part that leaves the lot needs no separate setback message.
  for (const [k, v] of worst) {
    if (v.code === 'setback' && worst.has(`lot:${v.element}`)) worst.delete(k);
  }
  const missed: (Violation & { ground?: string })[] = [...worst.values()].map((m) => ({
    code: m.code,
    element: m.element,
    ...(m.keepOutId !== undefined ? { keepOutId: m.keepOutId } : {}),
    byM: m.byM,
    message: missMessage(m, site, setback, minEnd),
    ...(m.ground ? { ground: m.ground } : {}),
  }));
  // One violation per rule and zone: the worst part, naming how many other parts miss it too.
  const byRule = new Map<string, { v: Violation; others: Set<string> }>();
  for (const { ground, ...v } of missed) {
    const k = `${v.code}:${v.keepOutId ?? ''}:${ground ?? ''}`;
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
    site.keepOuts.forEach((k, i) => {
      const c = closestGround[i];
      if (!Number.isFinite(c.spareM)) return;
      fits.push(
        k.kind === 'buried'
          ? `clear of the buried "${k.name}": closest ${c.element} at ${f1(c.distM)} m (keeps ${f1(c.needM)} m)`
          : `buried radials keep clear of the poles of "${k.name}": closest ${c.element} at ${f1(c.distM)} m (keeps ${f1(c.needM)} m)`,
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
 * minus the setback and outside every keep-out with its ground-level clearance (from a power line:
 * settings.buriedClearanceM from its poles only; clearanceRule). Clipped to RADIAL_STEP_M.
 */
export const RADIAL_STEP_M = 0.25;
export function clipRadial(ps: PreparedSite, base: XY, bearingDeg: number, nominalM: number): number {
  const memo = clipMemo(ps);
  const key = `${base[0]},${base[1]},${bearingDeg},${nominalM}`;
  let len = memo.get(key);
  if (len === undefined) {
    if (memo.size >= CLIP_MEMO_MAX) memo.clear();
    memo.set(key, (len = clipRadialOnce(ps, base, bearingDeg, nominalM)));
  }
  return len;
}

/**
 * Clipped radial lengths kept by what clipRadial reads of the site (the boundary, the keep-outs
 * and the settings: never the supports), so that the builders that lay radials from one base
 * (the vertical, inverted-L, short and sloping verticals) clip each bearing once, and a re-plan
 * after a support moved clips only the radials of the moved support. The value is the one a
 * fresh clip gives (the key holds the site as text and the arguments exactly).
 */
const CLIP_MEMO_MAX = 200_000;
const CLIP_SITES_KEPT = 4;
const clipBySite = new Map<string, Map<string, number>>();
const siteTextOf = new WeakMap<PreparedSite, string>();

/** Forget every kept clip (a benchmark's cold plan in a process that planned before). */
export function forgetClippedRadials(): void {
  clipBySite.clear();
}

function clipMemo(ps: PreparedSite): Map<string, number> {
  let text = siteTextOf.get(ps);
  if (text === undefined) {
    const { boundary, keepOuts, settings } = ps.site;
    text = JSON.stringify([boundary, keepOuts, settings]);
    siteTextOf.set(ps, text);
  }
  let memo = clipBySite.get(text);
  if (memo) {
    // most recently used last
    clipBySite.delete(text);
    clipBySite.set(text, memo);
  } else {
    clipBySite.set(text, (memo = new Map()));
    while (clipBySite.size > CLIP_SITES_KEPT) clipBySite.delete(clipBySite.keys().next().value!);
  }
  return memo;
}

function clipRadialOnce(ps: PreparedSite, base: XY, bearingDeg: number, nominalM: number): number {
  const r = (bearingDeg * Math.PI) / 180;
  const ux = Math.sin(r);
  const uy = Math.cos(r);
  const setback = ps.site.settings.setbackM;
  const buriedM = ps.site.settings.buriedClearanceM;
  const clear = (t: number): boolean => {
    const p: XY = [base[0] + ux * t, base[1] + uy * t];
    if (boundaryDistance(ps, p) < setback) return false;
    for (let i = 0; i < ps.site.keepOuts.length; i++) {
      const k = ps.site.keepOuts[i];
      const rule = clearanceRule(k, 'radial', 0, buriedM);
      if (!rule) continue;
      const d = rule.to === 'poles' ? poleDistance(k, p) : keepOutDistance(ps, i, p);
      if (d < rule.needM) return false;
    }
    return true;
  };
  let ok = 0;
  for (let t = RADIAL_STEP_M; t <= nominalM + 1e-9; t += RADIAL_STEP_M) {
    if (!clear(t)) return ok;
    ok = t;
  }
  // The last part, shorter than a step, is checked at its end too (it was taken unchecked before).
  return ok + 1e-9 >= nominalM || clear(nominalM) ? nominalM : ok;
}
