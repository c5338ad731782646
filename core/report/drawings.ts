/**
 * The build sheet's drawings as inline SVG (no scripts, no external resources): the lot plan, the
 * antenna detail (every wire length, end heights, ropes and the feed point), the radial layout,
 * and the polar pattern cuts. Lengths go through the sheet's unit formatter (./format.ts); text
 * through escapeHtml.
 */
import type { BuildSheet } from './buildSheet.ts';
import { sheetLengths } from './format.ts';
import type { XY } from '../site/frame.ts';

export function escapeHtml(s: string): string {
  return s
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

const e = escapeHtml;
const f1 = (v: number): string => v.toFixed(1);

/**
 * A plan drawing in the site frame: 'lot' shows the whole lot with the antenna, its feed route
 * and zones; 'detail' zooms on the antenna, with every wire length, end height and rope.
 */
export function planSvg(s: BuildSheet, view: 'lot' | 'detail'): string {
  const { lot, candidate: c, feedLine } = s;
  const detail = view === 'detail';
  const U = sheetLengths(s.units);
  const pts: XY[] = [];
  for (const w of c.wires) pts.push([w.from[0], w.from[1]], [w.to[0], w.to[1]]);
  for (const r of lot.ropes) pts.push([r.from[0], r.from[1]], [r.to[0], r.to[1]]);
  for (const sp of lot.supports) if (sp.used) pts.push(sp.xy);
  if (detail) {
    pts.push([feedLine.feedXYZ[0], feedLine.feedXYZ[1]]);
    // every radial's far end, so that the radial fields are drawn whole
    lot.radialLengthsM.forEach((len, k) => {
      const [x0, y0] = lot.radialBasesXY[k] ?? lot.radialBase ?? [0, 0];
      const b = (lot.radialBearingsDeg[k]! * Math.PI) / 180;
      pts.push([x0 + len * Math.sin(b), y0 + len * Math.cos(b)]);
    });
    for (const z of s.exposureOnLot.zones) for (const r of z.rings) pts.push(...r);
  } else {
    pts.push(...lot.boundary, lot.station);
    for (const sp of lot.supports) pts.push(sp.xy);
  }
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  const pad = detail ? 5 : 8;
  let minX = Math.min(...xs) - pad;
  let maxX = Math.max(...xs) + pad;
  let minY = Math.min(...ys) - pad;
  let maxY = Math.max(...ys) + pad;
  // A detail view at least 24 m across, so that a vertical is not drawn metres wide.
  const minSpan = detail ? 24 : 0;
  if (maxX - minX < minSpan) {
    const m = (maxX + minX) / 2;
    minX = m - minSpan / 2;
    maxX = m + minSpan / 2;
  }
  if (maxY - minY < minSpan * 0.5) {
    const m = (maxY + minY) / 2;
    minY = m - minSpan / 4;
    maxY = m + minSpan / 4;
  }
  const W = 700;
  const scale = W / (maxX - minX);
  const H = Math.max(200, Math.min(900, Math.round((maxY - minY) * scale)));
  const X = (x: number): string => ((x - minX) * scale).toFixed(1);
  const Y = (y: number): string => ((maxY - y) * scale).toFixed(1);
  const inView = (p: readonly number[]): boolean =>
    p[0]! >= minX && p[0]! <= maxX && p[1]! >= minY && p[1]! <= maxY;
  const path = (ring: readonly XY[], close: boolean): string =>
    ring.map((p, i) => `${i ? 'L' : 'M'}${X(p[0])},${Y(p[1])}`).join('') + (close ? 'Z' : '');
  const out: string[] = [];
  // Labels are placed greedily: the first of the offered offsets whose box overlaps no label
  // placed before (the text width is estimated at 5.6 px a character for the 10 px font, 6.3 bold), kept
  // inside the drawing.
  // The north arrow and the scale bar are there from the start.
  type Box = { x0: number; y0: number; x1: number; y1: number };
  const boxes: Box[] = [
    { x0: W - 30, y0: 4, x1: W, y1: 58 },
    { x0: 0, y0: H - 34, x1: 140, y1: H },
  ];
  const text = (
    ax: number,
    ay: number,
    s: string,
    cls: string,
    offsets: readonly [number, number][],
  ): void => {
    const w = s.length * (cls === 'wlabel' || cls === 'flabel' ? 6.3 : 5.6);
    const boxAt = (dx: number, dy: number): { x: number; y: number; b: Box } => {
      let x = ax + dx - (dx < 0 ? w : 0);
      x = Math.min(Math.max(x, 2), W - 2 - w);
      const y = Math.min(Math.max(ay + dy, 11), H - 3);
      return { x, y, b: { x0: x, y0: y - 10, x1: x + w, y1: y + 2 } };
    };
    const free = (b: Box): boolean =>
      !boxes.some((o) => b.x0 < o.x1 && b.x1 > o.x0 && b.y0 < o.y1 && b.y1 > o.y0);
    let at: { x: number; y: number; b: Box } | null = null;
    for (const [dx, dy] of offsets) {
      const c = boxAt(dx, dy);
      if (free(c.b)) {
        at = c;
        break;
      }
    }
    // None of the offered places is free: look further out in widening rings, with a leader line
    // back to the point; only when nothing is free anywhere near does the first offer stand.
    let leader = false;
    if (!at)
      search: for (const r of [28, 42, 56, 72, 90, 110])
        for (let k = 0; k < 12; k++) {
          const a = (k * Math.PI) / 6;
          const c = boxAt(r * Math.cos(a), r * Math.sin(a));
          if (free(c.b)) {
            at = c;
            leader = true;
            break search;
          }
        }
    const pick = at ?? boxAt(offsets[0]![0], offsets[0]![1]);
    boxes.push(pick.b);
    if (leader) {
      const lx = Math.min(Math.max(ax, pick.b.x0), pick.b.x1);
      const ly = Math.min(Math.max(ay, pick.b.y0), pick.b.y1);
      out.push(
        `<line x1="${ax.toFixed(1)}" y1="${ay.toFixed(1)}" x2="${lx.toFixed(1)}" y2="${ly.toFixed(1)}" class="leader"/>`,
      );
    }
    out.push(`<text x="${pick.x.toFixed(1)}" y="${pick.y.toFixed(1)}" class="${cls}">${e(s)}</text>`);
  };
  const AROUND: [number, number][] = [
    [8, -8],
    [8, 16],
    [-8, -8],
    [-8, 16],
    [8, 30],
    [-8, 30],
    [8, -22],
    [-8, -22],
    [8, 44],
    [-8, 44],
  ];
  const label = detail ? `Antenna detail of ${c.typeLabel}` : `Lot plan of ${s.projectName}`;
  out.push(
    `<svg class="lot ${view}" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" role="img" aria-label="${e(label)}" xmlns="http://www.w3.org/2000/svg">`,
    `<defs><clipPath id="clip-${view}"><rect x="0" y="0" width="${W}" height="${H}"/></clipPath></defs><g clip-path="url(#clip-${view})">`,
  );
  out.push(`<path d="${path(lot.boundary, true)}" class="boundary"/>`);
  // Keep-out names are placed last, after the antenna's own labels.
  const klabels: (() => void)[] = [];
  for (const k of lot.keepOuts) {
    const cls = k.kind === 'power-line' ? 'keepout power' : k.kind === 'path' ? 'keepout path' : 'keepout';
    if (k.shape.type === 'polygon')
      out.push(`<path d="${path(k.shape.ring, true)}" class="${cls}"><title>${e(k.name)}</title></path>`);
    else
      out.push(
        `<path d="${path(k.shape.line, false)}" class="${cls} line"><title>${e(k.name)}</title></path>`,
      );
    const line = k.shape.type === 'polygon' ? k.shape.ring : k.shape.line;
    const at = line.find(inView);
    if (!at) continue;
    klabels.push(() => text(Number(X(at[0])), Number(Y(at[1])), k.name, 'klabel', AROUND));
  }
  if (lot.radialBase) {
    const base0 = lot.radialBase;
    lot.radialLengthsM.forEach((len, k) => {
      const [x0, y0] = lot.radialBasesXY?.[k] ?? base0;
      const b = (lot.radialBearingsDeg[k]! * Math.PI) / 180;
      out.push(
        `<line x1="${X(x0)}" y1="${Y(y0)}" x2="${X(x0 + len * Math.sin(b))}" y2="${Y(y0 + len * Math.cos(b))}" class="radial"/>`,
      );
    });
  }
  out.push(`<path d="${path(feedLine.routeXY, false)}" class="coax"><title>feed line</title></path>`);
  for (const z of s.exposureOnLot.zones) {
    if (!z.rings.length) continue;
    const d = z.rings.map((r) => path(r, true)).join('');
    out.push(
      `<path d="${d}" class="zone ${z.limitId}"><title>${e(`${z.label}: ${U.len(z.radiusM, 2)} with ground reflection`)}</title></path>`,
    );
  }
  for (const r of lot.ropes)
    out.push(
      `<line x1="${X(r.from[0])}" y1="${Y(r.from[1])}" x2="${X(r.to[0])}" y2="${Y(r.to[1])}" class="rope"><title>${e(r.label)}</title></line>`,
    );
  // An array's coax to its relay box, and the box (a square) where it meets the ground.
  for (const r of lot.arrayCoax)
    out.push(
      `<line x1="${X(r.from[0])}" y1="${Y(r.from[1])}" x2="${X(r.to[0])}" y2="${Y(r.to[1])}" class="coax"><title>${e(r.label)}</title></line>`,
    );
  const box = s.array?.boxXY;
  if (box)
    out.push(
      `<rect x="${Number(X(box[0])) - 4}" y="${Number(Y(box[1])) - 4}" width="8" height="8" class="relay-box"><title>relay box</title></rect>`,
    );
  // Labels spread outward from the antenna's middle, so those at one point do not sit on each other.
  const cx = c.wires.reduce((a, w) => a + w.from[0] + w.to[0], 0) / Math.max(1, 2 * c.wires.length);
  const verticalTops: XY[] = [];
  const vLabels: (() => void)[] = [];
  const hLabels: (() => void)[] = [];
  for (const w of c.wires) {
    const L = Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]);
    const mx = (w.from[0] + w.to[0]) / 2;
    const my = (w.from[1] + w.to[1]) / 2;
    const vertical = Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1]) < 0.5;
    if (vertical) {
      verticalTops.push([mx, my]);
      out.push(
        `<circle cx="${X(mx)}" cy="${Y(my)}" r="4" class="wire vertical"><title>${e(w.label)}</title></circle>`,
      );
      if (!detail) continue;
      const left = mx < cx - 0.5;
      const t = `${w.label}: ${U.len(L, 2)}, ${U.len(Math.min(w.from[2], w.to[2]))}→${U.len(Math.max(w.from[2], w.to[2]))} high`;
      vLabels.push(() =>
        text(
          Number(X(mx)),
          Number(Y(my)),
          t,
          'wlabel',
          left
            ? [
                [-8, 16],
                [-8, 30],
                [-8, 44],
                [8, 16],
                [8, 30],
              ]
            : [
                [8, 16],
                [8, 30],
                [8, 44],
                [-8, 16],
                [-8, 30],
              ],
        ),
      );
    } else {
      out.push(
        `<line x1="${X(w.from[0])}" y1="${Y(w.from[1])}" x2="${X(w.to[0])}" y2="${Y(w.to[1])}" class="wire"><title>${e(w.label)}</title></line>`,
      );
      if (!detail) continue;
      const t = `${w.label}: ${U.len(L, 2)}`;
      const x = Number(X(mx)) - t.length * 2.8;
      hLabels.push(() =>
        text(x, Number(Y(my)), t, 'wlabel', [
          [0, -8],
          [0, 16],
          [0, -22],
          [0, 30],
        ]),
      );
    }
  }
  if (detail) {
    for (const f of [...hLabels, ...vLabels]) f();
    // End heights of the sloping and horizontal wires, except where a vertical wire's label says it.
    const seen: XY[] = [];
    for (const w of c.wires) {
      if (Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1]) < 0.5) continue;
      for (const p of [w.from, w.to]) {
        const q: XY = [p[0], p[1]];
        if ([...seen, ...verticalTops].some((o) => Math.hypot(o[0] - q[0], o[1] - q[1]) < 0.5)) continue;
        seen.push(q);
        text(Number(X(p[0])), Number(Y(p[1])), `h ${U.len(p[2])}`, 'hlabel', AROUND);
      }
    }
    // Every feed point (an array has one per element); an array's station line ends at its box.
    const box = s.array?.boxXY;
    const feeds = box ? c.feedPoints.map((p) => p.xyz) : [feedLine.feedXYZ];
    for (const f of feeds) {
      out.push(
        `<circle cx="${X(f[0])}" cy="${Y(f[1])}" r="5" class="feed"><title>feed point</title></circle>`,
      );
      text(Number(X(f[0])), Number(Y(f[1])), `feed, ${U.len(f[2])} up`, 'flabel', AROUND);
    }
    if (box) text(Number(X(box[0])), Number(Y(box[1])), 'relay box', 'flabel', AROUND);
    // a relay away from the box (a switched pair's K2 at B's feed): its own small box
    for (const b of s.array?.boxes.slice(1) ?? []) {
      if (!b.xy) continue;
      out.push(
        `<rect x="${Number(X(b.xy[0])) - 3}" y="${Number(Y(b.xy[1])) - 3}" width="6" height="6" class="relay-box"><title>${e(b.where)}</title></rect>`,
      );
      text(Number(X(b.xy[0])), Number(Y(b.xy[1])), b.where.replace(/ \(.*\)$/, ''), 'flabel', AROUND);
    }
  }
  for (const sp of lot.supports) {
    if (detail && !sp.used && !inView(sp.xy)) continue;
    out.push(
      `<circle cx="${X(sp.xy[0])}" cy="${Y(sp.xy[1])}" r="${sp.used ? 5 : 3.5}" class="${sp.used ? 'support used' : 'support'}"/>`,
    );
    text(Number(X(sp.xy[0])), Number(Y(sp.xy[1])), `${sp.name} (${U.len(sp.heightM)})`, 'slabel', AROUND);
  }
  if (inView(lot.station)) {
    out.push(
      `<rect x="${(Number(X(lot.station[0])) - 5).toFixed(1)}" y="${(Number(Y(lot.station[1])) - 5).toFixed(1)}" width="10" height="10" class="station"/>`,
    );
    text(Number(X(lot.station[0])), Number(Y(lot.station[1])), 'station', 'slabel', AROUND);
  }
  for (const f of klabels) f();
  out.push('</g>');
  // North arrow and a scale bar of a round length.
  // Scale bar of a round length in the sheet's unit.
  const unitM = U.units === 'imperial' ? 0.3048 : 1;
  const barN = [1, 2, 5, 10, 20, 50, 100, 200].find((n) => n * unitM * scale >= 60) ?? 500;
  const bar = barN * unitM * scale;
  out.push(
    `<g class="north"><line x1="${W - 20}" y1="40" x2="${W - 20}" y2="12"/><path d="M${W - 25},18L${W - 20},8L${W - 15},18Z"/><text x="${W - 20}" y="54" text-anchor="middle">N</text></g>`,
    `<g class="scale"><line x1="12" y1="${H - 14}" x2="${(12 + bar).toFixed(1)}" y2="${H - 14}"/><text x="12" y="${H - 20}">${barN} ${U.unit}</text></g>`,
  );
  out.push('</svg>');
  return out.join('');
}

/** One curve of a polar plot: its points, the opposite bearing's (elevation only), its CSS class. */
export interface PolarTrace {
  pts: { deg: number; gainDbi: number }[];
  /** Elevation only: the cut toward the opposite bearing, drawn on the left half (else a mirror of pts). */
  back?: { deg: number; gainDbi: number }[];
  /** Extra class of the curve (a switched array's direction: `trace d1`, `d2`, …). */
  cls?: string;
  /** Tooltip of the curve. */
  title?: string;
}

/**
 * A polar plot of one or more curves on a common 30 dB scale from the highest of them: an
 * elevation cut (toward the bearing on the right, the opposite one on the left) or an azimuth cut
 * (north up).
 */
export function polarSvg(
  title: string,
  traces: readonly PolarTrace[],
  kind: 'elevation' | 'azimuth',
  opts: {
    /** Elevation only: the target's elevation window, shaded. */
    windowDeg?: { min: number; max: number };
    /** Azimuth only: the target's bearings, shaded. */
    sectorDeg?: { from: number; to: number };
  } = {},
): string {
  const peak = Math.max(...traces.flatMap((t) => [...t.pts, ...(t.back ?? [])].map((p) => p.gainDbi)));
  const range = 30;
  const R = 130;
  const W = 2 * R + 40;
  const H = kind === 'elevation' ? R + 40 : 2 * R + 40;
  const cx = W / 2;
  const cy = R + 20;
  const rOf = (g: number): number => (R * Math.max(0, g - peak + range)) / range;
  const xy = (deg: number, r: number): [number, number] => {
    const a = (deg * Math.PI) / 180;
    return kind === 'elevation'
      ? [cx + r * Math.cos(a), cy - r * Math.sin(a)]
      : [cx + r * Math.sin(a), cy - r * Math.cos(a)];
  };
  const out: string[] = [
    `<figure><svg viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" role="img" aria-label="${e(title)}" xmlns="http://www.w3.org/2000/svg">`,
  ];
  for (const db of [0, 10, 20]) {
    const r = (R * (range - db)) / range;
    out.push(
      kind === 'elevation'
        ? `<path d="M${cx - r},${cy}A${r},${r} 0 0 1 ${cx + r},${cy}" class="grid"/>`
        : `<circle cx="${cx}" cy="${cy}" r="${r}" class="grid"/>`,
    );
    out.push(
      `<text x="${cx + 3}" y="${cy - r + 11}" class="tick">${db ? `−${db} dB` : `${f1(peak)} dBi`}</text>`,
    );
  }
  // A shaded sector from the centre to the outer ring between two angles of the plot.
  const sector = (a0: number, a1: number, what: string): void => {
    const [x0, y0] = xy(a0, R);
    const [x1, y1] = xy(a1, R);
    const span = (((a1 - a0) % 360) + 360) % 360;
    const sweep = kind === 'elevation' ? 0 : 1;
    out.push(
      `<path d="M${cx},${cy}L${x0.toFixed(1)},${y0.toFixed(1)}A${R},${R} 0 ${span > 180 ? 1 : 0} ${sweep} ${x1.toFixed(1)},${y1.toFixed(1)}Z" class="window"><title>${e(what)}</title></path>`,
    );
  };
  if (kind === 'elevation' && opts.windowDeg)
    sector(
      opts.windowDeg.min,
      opts.windowDeg.max,
      `elevation window ${f1(opts.windowDeg.min)}–${f1(opts.windowDeg.max)}°`,
    );
  if (kind === 'azimuth' && opts.sectorDeg)
    sector(
      opts.sectorDeg.from,
      opts.sectorDeg.to,
      `bearings ${f1(opts.sectorDeg.from)}–${f1(opts.sectorDeg.to)}°`,
    );
  const spokes = kind === 'elevation' ? [0, 15, 30, 45, 60, 90] : [0, 45, 90, 135, 180, 225, 270, 315];
  for (const d of spokes) {
    const [x, y] = xy(d, R);
    out.push(`<line x1="${cx}" y1="${cy}" x2="${x.toFixed(1)}" y2="${y.toFixed(1)}" class="grid"/>`);
    const [tx, ty] = xy(d, R + 10);
    out.push(
      `<text x="${tx.toFixed(1)}" y="${ty.toFixed(1)}" class="tick" text-anchor="middle">${d}°</text>`,
    );
  }
  for (const t of traces) {
    const seq =
      kind === 'elevation'
        ? [...t.pts, ...(t.back ?? t.pts).map((p) => ({ deg: 180 - p.deg, gainDbi: p.gainDbi })).reverse()]
        : t.pts;
    const d =
      seq
        .map((p, i) => {
          const [x, y] = xy(p.deg, rOf(p.gainDbi));
          return `${i ? 'L' : 'M'}${x.toFixed(1)},${y.toFixed(1)}`;
        })
        .join('') + (kind === 'azimuth' ? 'Z' : '');
    out.push(
      `<path d="${d}" class="trace${t.cls ? ` ${e(t.cls)}` : ''}">${t.title ? `<title>${e(t.title)}</title>` : ''}</path>`,
    );
  }
  out.push(`</svg><figcaption>${e(title)}</figcaption></figure>`);
  return out.join('');
}

/**
 * The radials as laid, seen from above: each radial from the base at its compass bearing and to
 * scale, numbered at its far end as in the radial table (north up). Numbers are placed on a ring
 * just beyond the longest radial, so they never sit on each other or on a wire.
 */
export function radialSvg(s: BuildSheet): string {
  const rows = s.radialTable;
  if (!rows.length) return '';
  const g = s.candidate.groundSystem;
  if (g.kind === 'radials' && (g.fields?.length ?? 0) > 1)
    return radialFieldsSvg(s, g.fields!, g.bonded === true);
  const U = sheetLengths(s.units);
  const W = 420;
  const cx = W / 2;
  const cy = W / 2;
  const maxL = Math.max(...rows.map((r) => r.lengthM));
  const R = W / 2 - 34;
  const k = R / maxL;
  const out: string[] = [
    `<svg class="radials" viewBox="0 0 ${W} ${W}" width="${W}" height="${W}" role="img" aria-label="Radial layout" xmlns="http://www.w3.org/2000/svg">`,
    `<circle cx="${cx}" cy="${cy}" r="${R}" class="grid"/>`,
  ];
  for (const r of rows) {
    const b = (r.bearingDeg * Math.PI) / 180;
    const x = cx + r.lengthM * k * Math.sin(b);
    const y = cy - r.lengthM * k * Math.cos(b);
    out.push(
      `<line x1="${cx}" y1="${cy}" x2="${x.toFixed(1)}" y2="${y.toFixed(1)}" class="radial"><title>${e(`${r.n}: ${f1(r.bearingDeg)}°, ${U.len(r.lengthM)}`)}</title></line>`,
    );
    const tx = cx + (R + 14) * Math.sin(b);
    const ty = cy - (R + 14) * Math.cos(b) + 3.5;
    out.push(
      `<text x="${tx.toFixed(1)}" y="${ty.toFixed(1)}" text-anchor="middle" class="tick">${r.n}</text>`,
    );
  }
  out.push(`<circle cx="${cx}" cy="${cy}" r="4" class="feed"/>`);
  out.push(`<text x="${W - 16}" y="16" text-anchor="middle">N ↑</text>`);
  out.push(
    `<text x="8" y="${W - 8}" class="tick">${e(`circle: ${U.len(maxL)} (the longest radial)`)}</text>`,
  );
  out.push('</svg>');
  return out.join('');
}

/**
 * The radial fields of an array of verticals seen from above, to scale and north up: every
 * vertical's radials from its base, the base named, each radial numbered just beyond its end as in
 * the radial table, and the bonding wire on each line midway between two bases where the fields
 * are bonded (dashed).
 */
function radialFieldsSvg(
  s: BuildSheet,
  fields: readonly { label: string; baseXY: XY; lengthsM: number[]; bearingsDeg: number[] }[],
  bonded: boolean,
): string {
  const U = sheetLengths(s.units);
  const W = 520;
  const pad = 30;
  const ends = fields.flatMap((f) =>
    f.lengthsM.map((len, k): XY => {
      const b = (f.bearingsDeg[k]! * Math.PI) / 180;
      return [f.baseXY[0] + len * Math.sin(b), f.baseXY[1] + len * Math.cos(b)];
    }),
  );
  const pts = [...ends, ...fields.map((f) => f.baseXY)];
  const minX = Math.min(...pts.map((p) => p[0]));
  const maxX = Math.max(...pts.map((p) => p[0]));
  const minY = Math.min(...pts.map((p) => p[1]));
  const maxY = Math.max(...pts.map((p) => p[1]));
  const k = (W - 2 * pad) / Math.max(maxX - minX, maxY - minY, 1);
  const H = Math.round((maxY - minY) * k + 2 * pad);
  const X = (x: number) => (pad + (x - minX) * k).toFixed(1);
  const Y = (y: number) => (H - pad - (y - minY) * k).toFixed(1);
  const out: string[] = [
    `<svg class="radials" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" role="img" aria-label="Radial layout of every vertical" xmlns="http://www.w3.org/2000/svg">`,
  ];
  let e0 = 0;
  for (const f of fields) {
    const name = f.label.replace(/^vertical /, '');
    const order = f.bearingsDeg.map((b, i) => ({ b, i })).sort((p, q) => p.b - q.b);
    order.forEach(({ i }, n) => {
      const [ex, ey] = ends[e0 + i]!;
      const b = (f.bearingsDeg[i]! * Math.PI) / 180;
      out.push(
        `<line x1="${X(f.baseXY[0])}" y1="${Y(f.baseXY[1])}" x2="${X(ex)}" y2="${Y(ey)}" class="radial"><title>${e(`${name} ${n + 1}: ${f1(f.bearingsDeg[i]!)}°, ${U.len(f.lengthsM[i]!)}`)}</title></line>`,
      );
      const tx = Number(X(ex)) + 9 * Math.sin(b);
      const ty = Number(Y(ey)) - 9 * Math.cos(b) + 3;
      out.push(
        `<text x="${tx.toFixed(1)}" y="${ty.toFixed(1)}" text-anchor="middle" class="tick">${n + 1}</text>`,
      );
    });
    e0 += f.lengthsM.length;
    out.push(`<circle cx="${X(f.baseXY[0])}" cy="${Y(f.baseXY[1])}" r="4" class="feed"/>`);
    out.push(
      `<text x="${(Number(X(f.baseXY[0])) + 7).toFixed(1)}" y="${(Number(Y(f.baseXY[1])) - 7).toFixed(1)}" class="hlabel">${e(name)}</text>`,
    );
  }
  if (bonded)
    for (let i = 0; i < fields.length; i++)
      for (let j = i + 1; j < fields.length; j++) {
        const a = fields[i]!.baseXY;
        const b = fields[j]!.baseXY;
        const d = Math.hypot(b[0] - a[0], b[1] - a[1]);
        // only neighbours: no other base nearer the midpoint than these two
        const m: XY = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
        if (
          fields.some(
            (o, q) => q !== i && q !== j && Math.hypot(o.baseXY[0] - m[0], o.baseXY[1] - m[1]) < d / 2 - 0.01,
          )
        )
          continue;
        const u: XY = [-(b[1] - a[1]) / d, (b[0] - a[0]) / d];
        // the bonding wire: the stretch of the midline the radials reach
        const along = ends
          .map((p) => (p[0] - m[0]) * u[0] + (p[1] - m[1]) * u[1])
          .filter(
            (t, q) =>
              Math.abs(
                ((ends[q]![0] - m[0]) * (b[0] - a[0])) / d + ((ends[q]![1] - m[1]) * (b[1] - a[1])) / d,
              ) < 0.05 && Number.isFinite(t),
          );
        if (!along.length) continue;
        const t0 = Math.min(...along);
        const t1 = Math.max(...along);
        out.push(
          `<line x1="${X(m[0] + t0 * u[0])}" y1="${Y(m[1] + t0 * u[1])}" x2="${X(m[0] + t1 * u[0])}" y2="${Y(m[1] + t1 * u[1])}" class="bond"><title>bonding wire</title></line>`,
        );
      }
  out.push(`<text x="${W - 16}" y="16" text-anchor="middle">N ↑</text>`);
  out.push('</svg>');
  return out.join('');
}
