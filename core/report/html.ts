/**
 * The station report as one standalone, printable HTML document (no scripts, no external
 * resources): summary, lot plan, cut list, bill of materials, feed line, tuning, patterns,
 * per-region gains, SWR and bandwidth, RF exposure and cautions. Every piece of text goes through
 * `escapeHtml` — names come from the user's project and are never markup.
 */
import { PLACE_WORD } from './exposureZones.ts';
import type { BuildSheet } from './buildSheet.ts';
import type { XY } from '../site/frame.ts';
import { efficiencySummary } from '../rank/lossSplit.ts';

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
const f2 = (v: number): string => v.toFixed(2);

/** The section headings, in order (tests check each one). */
export const REPORT_SECTIONS = [
  'Summary',
  'Lot plan',
  'Cut list',
  'Bill of materials',
  'Feed line',
  'Tuning',
  'Patterns',
  'Gain per target region',
  'SWR and bandwidth',
  'RF exposure',
  'Cautions',
] as const;

function section(title: (typeof REPORT_SECTIONS)[number], body: string): string {
  const id = title.toLowerCase().replace(/[^a-z]+/g, '-');
  return `<section id="${id}"><h2>${e(title)}</h2>${body}</section>`;
}

/** A cell: its text, or its text with a class. */
type Cell = string | { text: string; cls: string };

function table(head: string[], rows: Cell[][]): string {
  const td = (c: Cell): string =>
    typeof c === 'string' ? `<td>${e(c)}</td>` : `<td class="${e(c.cls)}">${e(c.text)}</td>`;
  return `<table><thead><tr>${head.map((h) => `<th>${e(h)}</th>`).join('')}</tr></thead><tbody>${rows
    .map((r) => `<tr>${r.map(td).join('')}</tr>`)
    .join('')}</tbody></table>`;
}

/* ---------------------------------------------------------------------------------------------- */

/**
 * A plan drawing in the site frame: 'lot' shows the whole lot with the antenna, its feed route
 * and zones; 'detail' zooms on the antenna, with every wire length, end height and rope.
 */
function planSvg(s: BuildSheet, view: 'lot' | 'detail'): string {
  const { lot, candidate: c, feedLine } = s;
  const detail = view === 'detail';
  const pts: XY[] = [];
  for (const w of c.wires) pts.push([w.from[0], w.from[1]], [w.to[0], w.to[1]]);
  for (const r of lot.ropes) pts.push([r.from[0], r.from[1]], [r.to[0], r.to[1]]);
  for (const sp of lot.supports) if (sp.used) pts.push(sp.xy);
  if (detail) {
    pts.push([feedLine.feedXYZ[0], feedLine.feedXYZ[1]]);
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
  const boxes: { x0: number; y0: number; x1: number; y1: number }[] = [
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
    let best: { x: number; y: number } | null = null;
    for (const [dx, dy] of offsets) {
      let x = ax + dx - (dx < 0 ? w : 0);
      x = Math.min(Math.max(x, 2), W - 2 - w);
      const y = Math.min(Math.max(ay + dy, 11), H - 3);
      const b = { x0: x, y0: y - 10, x1: x + w, y1: y + 2 };
      if (!best) best = { x, y };
      if (!boxes.some((o) => b.x0 < o.x1 && b.x1 > o.x0 && b.y0 < o.y1 && b.y1 > o.y0)) {
        best = { x, y };
        break;
      }
    }
    const at = best!;
    boxes.push({ x0: at.x, y0: at.y - 10, x1: at.x + w, y1: at.y + 2 });
    out.push(`<text x="${at.x.toFixed(1)}" y="${at.y.toFixed(1)}" class="${cls}">${e(s)}</text>`);
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
    const n = lot.radialLengthsM.length;
    lot.radialLengthsM.forEach((L, k) => {
      const b = ((lot.radialRotationDeg + (k * 360) / n) * Math.PI) / 180;
      const [x0, y0] = lot.radialBase!;
      out.push(
        `<line x1="${X(x0)}" y1="${Y(y0)}" x2="${X(x0 + L * Math.sin(b))}" y2="${Y(y0 + L * Math.cos(b))}" class="radial"/>`,
      );
    });
  }
  out.push(`<path d="${path(feedLine.routeXY, false)}" class="coax"><title>feed line</title></path>`);
  for (const z of s.exposureOnLot.zones) {
    if (!z.rings.length) continue;
    const d = z.rings.map((r) => path(r, true)).join('');
    out.push(
      `<path d="${d}" class="zone ${z.limitId}"><title>${e(`${z.label}: ${f2(z.radiusM)} m with ground reflection`)}</title></path>`,
    );
  }
  for (const r of lot.ropes)
    out.push(
      `<line x1="${X(r.from[0])}" y1="${Y(r.from[1])}" x2="${X(r.to[0])}" y2="${Y(r.to[1])}" class="rope"><title>${e(r.label)}</title></line>`,
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
      const t = `${w.label}: ${f2(L)} m, ${f1(Math.min(w.from[2], w.to[2]))}→${f1(Math.max(w.from[2], w.to[2]))} m high`;
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
      const t = `${w.label}: ${f2(L)} m`;
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
        text(Number(X(p[0])), Number(Y(p[1])), `h ${f1(p[2])} m`, 'hlabel', AROUND);
      }
    }
    const f = feedLine.feedXYZ;
    out.push(`<circle cx="${X(f[0])}" cy="${Y(f[1])}" r="5" class="feed"><title>feed point</title></circle>`);
    text(Number(X(f[0])), Number(Y(f[1])), `feed, ${f1(f[2])} m up`, 'flabel', AROUND);
  }
  for (const sp of lot.supports) {
    if (detail && !sp.used && !inView(sp.xy)) continue;
    out.push(
      `<circle cx="${X(sp.xy[0])}" cy="${Y(sp.xy[1])}" r="${sp.used ? 5 : 3.5}" class="${sp.used ? 'support used' : 'support'}"/>`,
    );
    text(Number(X(sp.xy[0])), Number(Y(sp.xy[1])), `${sp.name} (${f1(sp.heightM)} m)`, 'slabel', AROUND);
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
  const barM = [1, 2, 5, 10, 20, 50].find((m) => m * scale >= 60) ?? 100;
  const bar = barM * scale;
  out.push(
    `<g class="north"><line x1="${W - 20}" y1="40" x2="${W - 20}" y2="12"/><path d="M${W - 25},18L${W - 20},8L${W - 15},18Z"/><text x="${W - 20}" y="54" text-anchor="middle">N</text></g>`,
    `<g class="scale"><line x1="12" y1="${H - 14}" x2="${(12 + bar).toFixed(1)}" y2="${H - 14}"/><text x="12" y="${H - 20}">${barM} m</text></g>`,
  );
  out.push('</svg>');
  return out.join('');
}

function polarSvg(
  title: string,
  pts: { deg: number; gainDbi: number }[],
  kind: 'elevation' | 'azimuth',
): string {
  const peak = Math.max(...pts.map((p) => p.gainDbi));
  const range = 30;
  const R = 130;
  const W = kind === 'elevation' ? 2 * R + 40 : 2 * R + 40;
  const H = kind === 'elevation' ? R + 40 : 2 * R + 40;
  const cx = W / 2;
  const cy = kind === 'elevation' ? R + 20 : R + 20;
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
  const spokes = kind === 'elevation' ? [0, 15, 30, 45, 60, 90] : [0, 45, 90, 135, 180, 225, 270, 315];
  for (const d of spokes) {
    const [x, y] = xy(d, R);
    out.push(`<line x1="${cx}" y1="${cy}" x2="${x.toFixed(1)}" y2="${y.toFixed(1)}" class="grid"/>`);
    const [tx, ty] = xy(d, R + 10);
    out.push(
      `<text x="${tx.toFixed(1)}" y="${ty.toFixed(1)}" class="tick" text-anchor="middle">${d}°</text>`,
    );
  }
  const seq =
    kind === 'elevation'
      ? [...pts, ...pts.map((p) => ({ deg: 180 - p.deg, gainDbi: p.gainDbi })).reverse()]
      : pts;
  const d =
    kind === 'elevation'
      ? seq
          .map((p, i) => {
            const [x, y] = xy(p.deg, rOf(p.gainDbi));
            return `${i ? 'L' : 'M'}${x.toFixed(1)},${y.toFixed(1)}`;
          })
          .join('')
      : seq
          .map((p, i) => {
            const [x, y] = xy(p.deg, rOf(p.gainDbi));
            return `${i ? 'L' : 'M'}${x.toFixed(1)},${y.toFixed(1)}`;
          })
          .join('') + 'Z';
  out.push(`<path d="${d}" class="trace"/>`);
  out.push(`</svg><figcaption>${e(title)}</figcaption></figure>`);
  return out.join('');
}

/* ---------------------------------------------------------------------------------------------- */

const STYLE = `
:root { color-scheme: light; }
body { font: 13px/1.45 system-ui, sans-serif; color: #1d232a; margin: 24px auto; max-width: 820px; padding: 0 16px; }
h1 { font-size: 22px; margin: 0 0 4px; }
h2 { font-size: 16px; border-bottom: 2px solid #2f5d7c; padding-bottom: 2px; margin: 22px 0 8px; color: #2f5d7c; }
.sub { color: #5a6570; margin: 0 0 12px; }
table { border-collapse: collapse; width: 100%; margin: 6px 0; }
th, td { border: 1px solid #c8d0d8; padding: 3px 6px; text-align: left; vertical-align: top; }
th { background: #eef2f5; }
td.n, th.n { text-align: right; }
dl { display: grid; grid-template-columns: max-content 1fr; gap: 2px 14px; margin: 6px 0; }
dt { color: #5a6570; }
dd { margin: 0; }
.note { color: #5a6570; font-size: 12px; }
.caution { border-left: 4px solid #b5541b; padding: 4px 10px; margin: 6px 0; background: #fbf3ee; }
.caution h3 { margin: 0; font-size: 13px; }
.caution p { margin: 2px 0 0; }
svg.lot { border: 1px solid #c8d0d8; background: #fbfcfd; max-width: 100%; height: auto; }
svg text { font: 10px system-ui, sans-serif; fill: #1d232a; }
.boundary { fill: #eef5ea; stroke: #4f7a3a; stroke-width: 1.5; }
.keepout { fill: #f3dcdc; stroke: #a33; stroke-width: 1; }
.keepout.line { fill: none; stroke-width: 2; stroke-dasharray: 6 3; }
.klabel { fill: #a33; }
.radial { stroke: #8c7a4b; stroke-width: 0.7; }
.rope { stroke: #6f7a80; stroke-width: 1; stroke-dasharray: 2 2; }
.feed { fill: #ffd45c; stroke: #1d232a; stroke-width: 1.5; }
.flabel { fill: #1d232a; font-weight: 600; }
.coax { fill: none; stroke: #555; stroke-width: 1.2; stroke-dasharray: 4 3; }
.keepout.path { stroke: #8a6d1f; stroke-dasharray: 2 4; }
.zone { fill: rgba(124, 58, 237, 0.14); stroke: #7c3aed; stroke-width: 1.2; fill-rule: nonzero; }
.zone.icnirp-public { fill: none; stroke: #0f766e; stroke-dasharray: 5 3; }
.reach { color: #9a2b12; font-weight: 600; }
.wire { stroke: #c0392b; stroke-width: 2.5; stroke-linecap: round; }
.wire.vertical { fill: #fff; stroke-width: 2; }
.wlabel { fill: #8a1f12; font-weight: 600; }
.hlabel { fill: #5a6570; }
.support { fill: #fff; stroke: #2f5d7c; stroke-width: 1.5; }
.support.used { fill: #2f5d7c; }
.station { fill: #1d232a; }
.north line, .scale line { stroke: #1d232a; stroke-width: 1.5; }
.north path { fill: #1d232a; }
.grid { fill: none; stroke: #c8d0d8; stroke-width: 0.8; }
.trace { fill: rgba(192, 57, 43, 0.12); stroke: #c0392b; stroke-width: 1.6; }
.tick { fill: #5a6570; font-size: 9px; }
figure { display: inline-block; margin: 4px 12px 4px 0; }
figcaption { font-size: 12px; color: #5a6570; }
@media print {
  body { margin: 0; max-width: none; font-size: 11px; }
  h2 { break-after: avoid; }
  section { break-inside: avoid-page; }
  table, figure, svg, .caution { break-inside: avoid; }
  a { color: inherit; text-decoration: none; }
  @page { size: A4; margin: 14mm; }
}
`;

/** Which places of the lot each zone reaches, and how close a person can come in each. */
function exposureReachHtml(s: BuildSheet): string {
  const lot = s.exposureOnLot;
  const zoneRows = lot.zones.map((z): Cell[] => [
    z.label,
    `${f2(z.radiusM)} m`,
    z.reached.length
      ? {
          cls: 'reach',
          text: `Reaches ${z.reached.map((p) => `${p.name} (${PLACE_WORD[p.kind]}, ${f1(p.closestM)} m)`).join('; ')}`,
        }
      : 'reaches no house, path, property line or the operating position',
    z.reachedFreeSpace.length ? z.reachedFreeSpace.map((p) => p.name).join('; ') : 'none',
  ]);
  const zones = table(
    ['Limit', 'Distance (with ground reflection)', 'Where it reaches', 'Reached in free space'],
    zoneRows,
  );
  const places = table(
    ['Place', 'Kind', 'Closest a standing person comes to a wire'],
    lot.places.map((p) => [p.name, PLACE_WORD[p.kind], `${f1(p.closestM)} m`]),
  );
  return (
    `<h3>Where the zones reach on the lot</h3>${zones}${places}` +
    lot.notes.map((n) => `<p class="note">${e(n)}</p>`).join('')
  );
}

export function renderBuildSheetHtml(s: BuildSheet, generatedAt?: string): string {
  const c = s.candidate;
  const fl = s.feedLine;
  const bw = c.bandwidth2to1;
  const [r, x] = c.feed.zOhm;
  const parts: string[] = [];
  const title = `Build sheet: ${c.typeLabel} for ${s.projectName}`;
  parts.push(
    section(
      'Summary',
      `<dl>${[
        ['Antenna', `#${c.rank} ${c.band} ${c.typeLabel}`],
        ['Where', c.where],
        [
          'Supports',
          c.supports.map((p) => `${p.name} (${f1(p.usableHeightM)} m)`).join(', ') ||
            'none (self-supporting)',
        ],
        ['Heights', c.heights.map((h) => `${h.label} ${f2(h.heightM)} m`).join(', ')],
        ['Score', `${f2(c.score)} dBi (weighted mean of the region gains)`],
        [
          'Peak gain',
          `${f1(c.peak.gainDbi)} dBi at ${f1(c.peak.elevationDeg)}° elevation, bearing ${f1(c.peak.azimuthDeg)}°`,
        ],
        ['Efficiency', `${f1(c.efficiency.percent)} % radiated (${efficiencySummary(c.efficiency)})`],
        ['Design frequency', `${fl.freqMHz.toFixed(3)} MHz`],
        [
          'Station',
          `${s.station.powerW} W PEP, ${s.station.mode}, on-time ${Math.round(s.station.onTimeFraction * 100)} %, ${s.station.coax}`,
        ],
      ]
        .map(([k, v]) => `<dt>${e(k)}</dt><dd>${e(v)}</dd>`)
        .join('')}</dl>${s.notes.map((n) => `<p class="note">${e(n)}</p>`).join('')}`,
    ),
  );
  parts.push(
    section(
      'Lot plan',
      `${planSvg(s, 'lot')}<p class="note">${e(
        'Site frame: x east, y north, metres. Red: antenna wires. Filled circles: supports used. Dashed grey: feed line from the station along its route. Thin brown: radials. Red shading and dashed red: keep-outs; dotted brown: paths. Violet shading: where a standing person would be inside the FCC general-population distance (with ground reflection); dashed teal: the same for the ICNIRP 2020 public level.',
      )}</p><h3>Antenna detail</h3>${planSvg(s, 'detail')}<p class="note">${e(
        'The same plan, closer: every wire with its length, the heights of the wire ends (h), the ropes (dotted grey) to their supports or ground anchors, and the feed point (yellow).',
      )}</p>`,
    ),
  );
  parts.push(
    section(
      'Cut list',
      table(
        ['Piece', 'Count', 'Length as modelled', 'Cut length'],
        s.cutList.map((i) => [i.label, String(i.count), `${f2(i.lengthM)} m`, `${f2(i.cutLengthM)} m`]),
      ) + `<p class="note">${e(s.cutAllowance)}</p>`,
    ),
  );
  parts.push(
    section(
      'Bill of materials',
      table(
        ['Item', 'Quantity', 'Detail', 'Basis'],
        s.bom.map((b) => [
          b.item,
          b.unit === 'm' ? `${f1(b.quantity)} m` : `${b.quantity}`,
          b.detail,
          b.source,
        ]),
      ),
    ),
  );
  parts.push(
    section(
      'Feed line',
      `<dl>${[
        ['Cable', fl.coax],
        [
          'Route',
          fl.routed
            ? `drawn by you: ${fl.routeXY.length - 2} bend point${fl.routeXY.length === 3 ? '' : 's'}`
            : 'straight from the station point (draw your real route in the app)',
        ],
        ['Plan distance, station to feed point', `${f1(fl.planDistanceM)} m`],
        ['Feed point height', `${f1(fl.feedXYZ[2])} m`],
        ['Length to buy', `${f1(fl.lengthM)} m`],
        [
          'Matched loss',
          `${f2(fl.lossDbPer100m)} dB/100 m at ${fl.freqMHz.toFixed(2)} MHz → ${f2(fl.lossDb)} dB over the run`,
        ],
        [
          'Feed impedance',
          `${f1(r)} ${x < 0 ? '−' : '+'} j${f1(Math.abs(x))} Ω, SWR ${f2(c.feed.swr)} on ${c.feed.z0Ohm} Ω`,
        ],
        ['Choke balun', s.choke ?? 'not needed for this design'],
      ]
        .map(([k, v]) => `<dt>${e(k)}</dt><dd>${e(v)}</dd>`)
        .join(
          '',
        )}</dl><p class="note">${e(`Length: ${fl.note}. Loss: ${fl.source}, scaled as √f; extra loss from SWR not included.`)}</p>`,
    ),
  );
  const t = s.tuning.measured;
  parts.push(
    section(
      'Tuning',
      `<p>${e(s.tuning.instruction)}</p>` +
        (t
          ? `<dl>${[
              ['Trim dimension', `${t.dimension}, ${f2(t.trimM)} m as designed`],
              [
                'Solver check',
                `resonance ${t.resonanceMHz.shorter.toFixed(4)} MHz at ${f2(t.trimM * 0.995)} m, ${t.resonanceMHz.longer.toFixed(4)} MHz at ${f2(t.trimM * 1.005)} m`,
              ],
              ['Rate', `${f2(Math.abs(t.kHzPerCm))} kHz per cm of the ${t.dimension} (longer → lower)`],
            ]
              .map(([k, v]) => `<dt>${e(k)}</dt><dd>${e(v)}</dd>`)
              .join(
                '',
              )}</dl><p class="note">${e('Measured from the field solver with the trim dimension at ±0.5 % of its designed value; real surroundings shift resonance, so measure first.')}</p>`
          : `<p class="note">${e('The solver rate was not measured for this report.')}</p>`),
    ),
  );
  parts.push(
    section(
      'Patterns',
      s.pattern
        ? polarSvg(
            `Elevation pattern at bearing ${f1(c.peak.azimuthDeg)}° (dBi, 30 dB scale)`,
            s.pattern.elevation,
            'elevation',
          ) +
            polarSvg(
              `Azimuth pattern at ${f1(c.peak.elevationDeg)}° elevation (dBi, 30 dB scale)`,
              s.pattern.azimuth,
              'azimuth',
            )
        : `<p class="note">${e('The pattern is not in the shortlist; the gain per region follows.')}</p>`,
    ),
  );
  parts.push(
    section(
      'Gain per target region',
      c.regions.length
        ? table(
            ['Region', 'Weight', 'Gain', 'Bearings', 'Elevation window', 'Distance'],
            c.regions.map((g) => [
              g.name,
              String(g.weight),
              `${f1(g.gainDbi)} dBi`,
              `${f1(g.bearingDeg.from)}–${f1(g.bearingDeg.to)}°`,
              `${f1(g.elevationWindowDeg.min)}–${f1(g.elevationWindowDeg.max)}°`,
              `${g.distanceKm.min.toFixed(0)}–${g.distanceKm.max.toFixed(0)} km`,
            ]),
          )
        : `<p>${e('No target regions in the project.')}</p>`,
    ),
  );
  parts.push(
    section(
      'SWR and bandwidth',
      `<dl>${[
        ['SWR at the design frequency', `${f2(c.feed.swr)} on ${c.feed.z0Ohm} Ω`],
        [
          '2:1 SWR band',
          bw.widthKHz > 0
            ? `${bw.lowMHz !== null ? `${bw.lowMHz.toFixed(3)} MHz` : 'below the sweep'} to ${bw.highMHz !== null ? `${bw.highMHz.toFixed(3)} MHz` : 'above the sweep'} (${bw.widthKHz.toFixed(0)} kHz${bw.lowMHz === null || bw.highMHz === null ? ' or more' : ''})`
            : 'none',
        ],
        ['Note', bw.note],
      ]
        .map(([k, v]) => `<dt>${e(k)}</dt><dd>${e(v)}</dd>`)
        .join('')}</dl>`,
    ),
  );
  const ex = s.exposure;
  parts.push(
    section(
      'RF exposure',
      `<p>${e(`Average power ${f1(ex.averagePowerW)} W, EIRP ${f1(ex.eirpW)} W with the peak gain ${f1(c.peak.gainDbi)} dBi.`)}</p>` +
        table(
          ['Limit', 'Averaging', 'Free space', 'With ground reflection', 'Source'],
          ex.distances.map((d) => [
            d.limit.label,
            `${d.limit.averagingMinutes} min`,
            `${f2(d.freeSpaceM)} m`,
            `${f2(d.withGroundReflectionM)} m`,
            d.limit.source,
          ]),
        ) +
        exposureReachHtml(s) +
        `<p><strong>${e(
          'At low-band frequencies these distances fall in the antenna’s near field: the figures are estimates for compliance screening; local rules and a professional evaluation govern.',
        )}</strong></p>` +
        ex.notes.map((n) => `<p class="note">${e(n)}</p>`).join(''),
    ),
  );
  parts.push(
    section(
      'Cautions',
      s.cautions.map((k) => `<div class="caution"><h3>${e(k.title)}</h3><p>${e(k.text)}</p></div>`).join('') +
        `<p class="note">${e('This sheet does not replace local codes, permits or licensed practice: where they differ, they govern.')}</p>`,
    ),
  );
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<title>${e(title)}</title><style>${STYLE}</style></head>
<body><header><h1>${e(title)}</h1><p class="sub">${e(`Yardwire station report · candidate ${c.id}${generatedAt ? ` · ${generatedAt}` : ''}`)}</p></header>
${parts.join('\n')}
</body></html>
`;
}
