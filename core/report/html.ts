/**
 * The station report as one standalone, printable HTML document (no scripts, no external
 * resources): summary, lot plan, cut list, bill of materials, feed line, tuning, patterns,
 * per-region gains, SWR and bandwidth, RF exposure and cautions. Every piece of text goes through
 * `escapeHtml` — names come from the user's project and are never markup.
 */
import { PLACE_WORD } from './exposureZones.ts';
import type { BuildSheet } from './buildSheet.ts';
import { escapeHtml, planSvg, polarSvg, radialSvg } from './drawings.ts';
import { sheetLengths } from './format.ts';
import { lengthsInText } from '../units/index.ts';
import { tuningText } from './tuning.ts';
import { matchingText } from '../match/matchText.ts';
import { TUNING_STEP, TUNING_STEP_TEXT } from './tuningMeasure.ts';
import { efficiencySummary } from '../rank/lossSplit.ts';
import { STATE_COLOURS } from '../rank/candidateStates.ts';

export { escapeHtml };

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
  'Matching',
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
 * Where a point of the lot is, as a builder finds it: its distance and bearing from the nearest
 * support the antenna uses (else the station point), and from the station point.
 */
function whereOnLot(s: BuildSheet, xy: readonly [number, number]): string {
  const U = sheetLengths(s.units);
  const from = (p: readonly [number, number]) => ({
    d: Math.hypot(xy[0] - p[0], xy[1] - p[1]),
    // compass bearing from p to the point (x east, y north)
    b: ((Math.atan2(xy[0] - p[0], xy[1] - p[1]) * 180) / Math.PI + 360) % 360,
  });
  const st = from(s.lot.station);
  const near = s.lot.supports
    .filter((p) => p.used)
    .map((p) => ({ name: p.name, ...from(p.xy) }))
    .sort((p, q) => p.d - q.d)[0];
  const fromSupport = !near
    ? ''
    : near.d < 0.5
      ? `at ${near.name}, `
      : `${U.len(near.d)} from ${near.name} at bearing ${Math.round(near.b)}°, `;
  return `${fromSupport}${U.len(st.d)} from the station point at bearing ${Math.round(st.b)}°`;
}

/** An array's relay box, relays, control wiring, directions and achieved feed (./arrayWiring.ts). */
function arrayHtml(s: BuildSheet): string {
  const a = s.array;
  if (!a) return '';
  const U = sheetLengths(s.units);
  const box = a.boxXY
    ? `${a.boxWhere}: ${whereOnLot(s, a.boxXY)}. The station's feed line ends at the box.`
    : a.boxWhere;
  return (
    `<h3 id="array-wiring">Array: relay box and control wiring</h3><p>${e(box)}</p>` +
    (a.relays.length ? `<ul>${a.relays.map((r) => `<li>${e(r)}</li>`).join('')}</ul>` : '') +
    (a.directions.length
      ? `<h3>Which relays for which direction</h3>` +
        table(
          ['Direction', 'Relay coils energised', 'Beam', 'What it does', 'Serves'],
          a.directions.map((d) => [
            String(d.n),
            d.coils,
            `${Math.round(d.beamDeg) % 360}°`,
            d.name,
            d.serves.join(', ') || '—',
          ]),
        )
      : '') +
    (a.coax.length
      ? `<h3>Coax of the array</h3>` +
        table(
          ['Coax', 'Count', 'Cut length'],
          [
            [`feed line, station to the relay box (${s.feedLine.coax})`, '1', U.len(s.feedLine.lengthM)],
            ...a.coax.map((k) => [k.label, String(k.count), U.cut(k.cutLengthM)]),
          ],
        ) +
        `<p class="note">${e('Cut each piece to the length given (connectors included in the allowance); a line cut to a designed electrical length is not to be shortened or lengthened to fit: coil any spare.')}</p>`
      : '') +
    (a.boxParts.length
      ? `<h3>In the relay box</h3><ul>${a.boxParts.map((p) => `<li>${e(`${p.item}: ${p.detail}`)}</li>`).join('')}</ul>`
      : '') +
    (a.controlRuns.length
      ? `<h3>Control cable</h3>` +
        table(
          ['From', 'To', 'Conductors', 'Length'],
          a.controlRuns.map((r) => [
            r.from,
            r.to,
            String(r.conductors),
            U.len(r.lengthM ?? s.feedLine.lengthM),
          ]),
        )
      : '') +
    (a.control.length ? `<ul>${a.control.map((r) => `<li>${e(r)}</li>`).join('')}</ul>` : '') +
    (a.feed.length
      ? `<h3>What the feed network achieves (direction 1)</h3>` +
        table(
          ['Element feed', 'Drive impedance', 'Current (relative, phase)'],
          a.feed.map((f) => [f.label, f.zText, f.current]),
        ) +
        `<p class="note">${e(
          `Solved with the wires and every line with its loss; currents relative to the element at 1.00; a parasitic or idle element's figure is the voltage over the current at its gap, set by what the relay leaves there (a stub, or an open line).${
            a.networkLossPercent !== null
              ? ` The lines and stubs take ${a.networkLossPercent.toFixed(1)} % of the power.`
              : ''
          } The relay and control practice is common practice, no source; follow the relay maker's ratings.`,
        )}</p>`
      : '') +
    a.otherPhasings
      .map(
        (o) =>
          `<h3>What the feed network achieves (direction ${o.n}: ${e(o.name)})</h3>` +
          table(
            ['Element feed', 'Drive impedance', 'Current (relative, phase)'],
            o.feed.map((f) => [f.label, f.zText, f.current]),
          ) +
          `<p class="note">${e(
            `The station's line sees ${o.feedText} at the box in this direction; the lines take ${o.networkLossPercent.toFixed(1)} % of the power.`,
          )}</p>`,
      )
      .join('')
  );
}

const ELEVATION_NOTE =
  'Each elevation cut is drawn on a 30 dB scale from its own peak: toward the region on the right, the opposite bearing on the left; the shaded sector is the elevation window of the region’s paths.';

/** Each direction's line: the app's ink for it (STATE_COLOURS) and a dash pattern of its own, for a print in grey. */
const DIRECTION_DASHES = ['none', '6 3', '2 2', '8 3 2 3'];
const DIRECTION_STYLES = Math.min(STATE_COLOURS.length, DIRECTION_DASHES.length);
const DIRECTION_CSS = STATE_COLOURS.slice(0, DIRECTION_STYLES)
  .map(
    (c, i) =>
      `.trace.d${i + 1} { fill: none; stroke-width: 1.2; stroke: ${c}; stroke-dasharray: ${DIRECTION_DASHES[i]}; }`,
  )
  .join('\n');
const directionCls = (n: number): string => `d${((n - 1) % DIRECTION_STYLES) + 1}`;
const directionName = (d: { n: number; beamDeg: number }): string =>
  `direction ${d.n} (beam ${Math.round(d.beamDeg) % 360}°)`;

/**
 * A switched array's patterns: a key of its directions, then for each target region the elevation
 * cut toward it and the azimuth cut at its median take-off angle, every direction drawn, the one
 * that serves the region in bold.
 */
function directionsHtml(dirs: NonNullable<NonNullable<BuildSheet['pattern']>['directions']>): string {
  const key =
    `<ul class="dir-key" aria-label="Directions">` +
    dirs.states
      .map(
        (d) =>
          `<li><svg width="34" height="10" aria-hidden="true"><line x1="1" y1="5" x2="33" y2="5" class="trace ${directionCls(d.n)}"/></svg> ${e(`${directionName(d)}: ${d.name}`)}</li>`,
      )
      .join('') +
    '</ul>';
  const groups = dirs.toward.map((t) => {
    const served = dirs.states[t.servedBy - 1]!;
    const traces = (
      cuts: { pts: { deg: number; gainDbi: number }[]; back?: { deg: number; gainDbi: number }[] }[],
    ) =>
      cuts
        .map((cut, i) => {
          const d = dirs.states[i]!;
          return {
            ...cut,
            cls: `${directionCls(d.n)}${d.n === t.servedBy ? ' serving' : ''}`,
            title: `${directionName(d)}: ${d.name}`,
          };
        })
        // the serving direction last, on top
        .sort((a, b) => Number(a.cls.endsWith('serving')) - Number(b.cls.endsWith('serving')));
    const where = t.name
      ? `${t.name}, bearing ${f1(t.bearingDeg.center)}°`
      : `the peak bearing ${f1(t.bearingDeg.center)}° (no target regions)`;
    const head = t.name
      ? `Toward ${where}: served by ${directionName(served)}, ${served.name}, ${f1(t.gainDbi)} dBi`
      : `Toward ${where}`;
    return (
      `<div class="dir-group"><h3>${e(head)}</h3>` +
      polarSvg(
        `Elevation toward ${where}${t.windowDeg ? `; window ${f1(t.windowDeg.min)}–${f1(t.windowDeg.max)}° shaded` : ''}`,
        traces(t.elevation.map((x) => ({ pts: x.cut, back: x.back }))),
        'elevation',
        t.windowDeg ? { windowDeg: t.windowDeg } : {},
      ) +
      polarSvg(
        `Azimuth at ${f1(t.elevationDeg)}° elevation (${t.name ? 'its median take-off' : 'the peak'}); ${t.name ? 'its bearings shaded' : 'dBi, 30 dB scale'}`,
        traces(t.azimuth.map((pts) => ({ pts }))),
        'azimuth',
        t.name ? { sectorDeg: { from: t.bearingDeg.from, to: t.bearingDeg.to } } : {},
      ) +
      '</div>'
    );
  });
  return (
    `<p>${e(`The array has ${dirs.states.length} directions, chosen by its relays (Feed line: relay box). Every direction is drawn in each plot; the one that serves the region is the bold line.`)}</p>` +
    key +
    groups.join('') +
    `<p class="note">${e(`${ELEVATION_NOTE} Azimuth cuts: north up, bearings clockwise, on a 30 dB scale from the highest direction’s peak.`)}</p>`
  );
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
.bond { stroke: #1d232a; stroke-width: 1.2; stroke-dasharray: 4 3; }
.rope { stroke: #6f7a80; stroke-width: 1; stroke-dasharray: 2 2; }
.relay-box { fill: #fff; stroke: #1d232a; stroke-width: 2; }
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
${DIRECTION_CSS}
.trace.serving { stroke-width: 2.6; }
.dir-key { list-style: none; padding: 0; margin: 4px 0; display: flex; flex-wrap: wrap; gap: 4px 18px; }
.dir-key svg { vertical-align: middle; }
.dir-group { break-inside: avoid; }
.dir-group h3 { font-size: 13px; margin: 10px 0 0; }
.tick { fill: #5a6570; font-size: 9px; }
.leader { stroke: #8a949c; stroke-width: 0.6; }
.window { fill: rgba(47, 93, 124, 0.12); stroke: none; }
.radial-layout { display: flex; flex-wrap: wrap; gap: 12px; align-items: flex-start; }
.radial-layout table { width: auto; min-width: 260px; font-size: 11px; }
svg.radials { border: 1px solid #c8d0d8; background: #fbfcfd; max-width: 100%; height: auto; }
figure { display: inline-block; vertical-align: top; max-width: 300px; margin: 4px 12px 4px 0; }
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
  const U = sheetLengths(s.units);
  const lot = s.exposureOnLot;
  const zoneRows = lot.zones.map((z): Cell[] => [
    z.label,
    U.len(z.radiusM, 2),
    z.reached.length
      ? {
          cls: 'reach',
          text: `Reaches ${z.reached.map((p) => `${p.name} (${PLACE_WORD[p.kind]}, ${U.len(p.closestM)})`).join('; ')}`,
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
    lot.places.map((p) => [p.name, PLACE_WORD[p.kind], U.len(p.closestM)]),
  );
  return (
    `<h3>Where the zones reach on the lot</h3>${zones}${places}` +
    lot.notes.map((n) => `<p class="note">${e(n)}</p>`).join('')
  );
}

/** The designed match, or why none is needed (core/match through the sheet). */
function matchingHtml(s: BuildSheet): string {
  const c = s.candidate;
  if (!s.matching)
    return `<p>${e(`None needed: the SWR is ${c.feed.swr.toFixed(2)} on ${c.feed.z0Ohm} Ω at ${c.feed.freqMHz.toFixed(3)} MHz; the coax connects at the feed point.`)}</p>`;
  const t = matchingText(s.matching, c.feed);
  const rows = s.matching.components.map((k) => [
    k.kind === 'inductor' ? 'Coil' : 'Capacitor',
    k.position === 'series' ? 'in series' : 'across the line',
    `${k.value} ${k.unit}`,
  ]);
  return (
    `<p>${e(t.summary)}</p>` +
    table(['Part (transmitter side first)', 'Where', 'Value'], rows) +
    `<ul>${[...t.arrangements, ...t.alternatives].map((a) => `<li>${e(a)}</li>`).join('')}</ul>` +
    `<p class="note">${e(t.adjust)}</p>`
  );
}

export function renderBuildSheetHtml(s: BuildSheet, generatedAt?: string): string {
  const c = s.candidate;
  const U = sheetLengths(s.units);
  const fl = s.feedLine;
  const bw = c.bandwidth2to1;
  const [r, x] = c.feed.zOhm;
  const parts: string[] = [];
  const title = `Build sheet: ${c.typeLabel} for ${s.projectName}`;
  parts.push(
    section(
      'Summary',
      `<dl>${[
        ['Antenna', `${c.typeLabel}, #${c.rank} on the ${c.band.replace('m', ' m')} band`],
        ['Where', c.where],
        ...(c.adaptations?.length
          ? [['Fitted to the lot', lengthsInText(c.adaptations.join('; '), s.units)] as [string, string]]
          : []),
        [
          'Supports',
          c.supports.map((p) => `${p.name} (${U.len(p.usableHeightM)})`).join(', ') ||
            'none (self-supporting)',
        ],
        ['Heights', c.heights.map((h) => `${h.label} ${U.len(h.heightM, 2)}`).join(', ')],
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
        `Site frame: x east, y north, ${U.units === 'imperial' ? 'feet' : 'metres'}. Red: antenna wires. Filled circles: supports used. Dashed grey: feed line from the station along its route. Thin brown: radials. Red shading and dashed red: keep-outs; dotted brown: paths. Violet shading: where a standing person would be inside the FCC general-population distance (with ground reflection); dashed teal: the same for the ICNIRP 2020 public level.`,
      )}</p><h3>Antenna detail</h3>${planSvg(s, 'detail')}<p class="note">${e(
        `The same plan, closer: every wire with its length, the heights of the wire ends (h), the ropes (dotted grey) to their supports or ground anchors, and the feed point (yellow).${s.array?.boxXY ? ' The array’s coax (dashed grey) runs from each fed corner or base to the relay box (white square).' : ''}`,
      )}</p>`,
    ),
  );
  parts.push(
    section(
      'Cut list',
      table(
        ['Piece', 'Count', 'Length as modelled', 'Cut length'],
        s.cutList.map((i) => [i.label, String(i.count), U.len(i.lengthM, 2), U.cut(i.cutLengthM)]),
      ) +
        `<p class="note">${e(s.cutAllowance)}</p>` +
        (s.radialTable.length
          ? `<h3>Radials: bearing and length of each</h3><div class="radial-layout">${radialSvg(s)}${
              s.radialTable.some((r) => r.vertical)
                ? table(
                    ['Vertical', 'Radial', 'Bearing from its base', 'Length', 'Where it ends'],
                    s.radialTable.map((r) => [
                      r.vertical,
                      String(r.n),
                      `${f1(r.bearingDeg)}°`,
                      U.len(r.lengthM, 2),
                      r.end || 'full length',
                    ]),
                  )
                : table(
                    ['Radial', 'Bearing from the base', 'Length'],
                    s.radialTable.map((r) => [String(r.n), `${f1(r.bearingDeg)}°`, U.len(r.lengthM, 2)]),
                  )
            }</div><p class="note">${e(
              s.radialTable.some((r) => r.vertical)
                ? `Each vertical has its own radials, numbered from 1 at its base. Bearings are compass bearings (clockwise from true north) from that vertical’s base; lay each radial straight at its bearing, on or just under the ground, shortened where the lot ends as modelled.${
                    s.radialTable.some((r) => /midway/.test(r.end))
                      ? ' Where a radial ends on the line midway to the next vertical, lay a bonding wire along that line (dashed in the drawing) and join every radial that ends on it to it, as the field solver models the fields (common practice, no source).'
                      : ''
                  }`
                : 'Bearings are compass bearings (clockwise from true north) from the feed point at the base; lay each radial straight at its bearing, on or just under the ground, shortened where the lot ends as modelled.',
            )}</p>`
          : ''),
    ),
  );
  parts.push(
    section(
      'Bill of materials',
      table(
        ['Item', 'Quantity', 'Detail', 'Basis'],
        s.bom.map((b) => [b.item, b.unit === 'm' ? U.len(b.quantity) : `${b.quantity}`, b.detail, b.source]),
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
        ...(s.array?.boxXY
          ? [['Plan distance, station to the relay box', U.len(fl.planDistanceM)]]
          : [
              ['Plan distance, station to feed point', U.len(fl.planDistanceM)],
              ['Feed point height', U.len(fl.feedXYZ[2])],
            ]),
        ['Length to buy', U.len(fl.lengthM)],
        [
          'Matched loss',
          `${U.per100(fl.lossDbPer100m)} at ${fl.freqMHz.toFixed(2)} MHz → ${f2(fl.lossDb)} dB over the run`,
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
        )}</dl><p class="note">${e(`Length: ${fl.note}. Loss: ${fl.source}, scaled as √f; extra loss from SWR not included.`)}</p>${arrayHtml(s)}`,
    ),
  );
  const t = s.tuning.measured;
  parts.push(
    section(
      'Tuning',
      `<p>${e(s.tuning.instruction)}</p>` +
        (t
          ? `<dl>${[
              ['Trim dimension', `${t.dimension}, ${U.cut(t.trimM)} as designed`],
              [
                'Solver check',
                `resonance ${t.resonanceMHz.shorter.toFixed(4)} MHz at ${U.cut(t.trimM * (1 - TUNING_STEP))}, ${t.resonanceMHz.longer.toFixed(4)} MHz at ${U.cut(t.trimM * (1 + TUNING_STEP))}`,
              ],
              ['Rate', `${tuningText(t, s.units).rate} of the ${t.dimension} (longer → lower)`],
            ]
              .map(([k, v]) => `<dt>${e(k)}</dt><dd>${e(v)}</dd>`)
              .join(
                '',
              )}</dl><p class="note">${e(`Measured from the field solver with the trim dimension at ${TUNING_STEP_TEXT} of its designed value; real surroundings shift resonance, so measure first.`)}</p>`
          : `<p class="note">${e('The solver rate was not measured for this report.')}</p>`),
    ),
  );
  parts.push(section('Matching', matchingHtml(s)));
  const pat = s.pattern;
  parts.push(
    section(
      'Patterns',
      !pat
        ? `<p class="note">${e('The pattern is not in the shortlist; the gain per region follows.')}</p>`
        : pat.directions
          ? directionsHtml(pat.directions)
          : (pat.towardTargets.length
              ? pat.towardTargets
                  .map((t) =>
                    polarSvg(
                      `Elevation toward ${t.name}, bearing ${f1(t.bearingDeg)}°: ${f1(t.gainDbi)} dBi over its window ${f1(t.windowDeg.min)}–${f1(t.windowDeg.max)}° (shaded)`,
                      [{ pts: t.cut, back: t.back }],
                      'elevation',
                      { windowDeg: t.windowDeg },
                    ),
                  )
                  .join('')
              : polarSvg(
                  `Elevation pattern at bearing ${f1(c.peak.azimuthDeg)}° (the peak; no target regions)`,
                  [{ pts: pat.elevation }],
                  'elevation',
                )) +
            polarSvg(
              `Azimuth pattern at ${f1(c.peak.elevationDeg)}° elevation (dBi, 30 dB scale)`,
              [{ pts: pat.azimuth }],
              'azimuth',
            ) +
            `<p class="note">${e(ELEVATION_NOTE)}</p>`,
    ),
  );
  parts.push(
    section(
      'Gain per target region',
      c.regions.length
        ? table(
            ['Region', 'Weight', 'Gain', 'Bearings', 'Take-off, median (10–90 %)', 'Distance'],
            c.regions.map((g) => [
              g.name,
              String(g.weight),
              `${f1(g.gainDbi)} dBi`,
              `${f1(g.bearingDeg.from)}–${f1(g.bearingDeg.to)}°`,
              `${f1(g.takeoff.medianDeg)}° (${f1(g.takeoff.p10Deg)}–${f1(g.takeoff.p90Deg)}°)${g.takeoff.model === 'user-window' ? ', own window' : ''}`,
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
          'Where you operate',
          `${s.operating.label} (${s.operating.lowMHz.toFixed(3)}–${s.operating.highMHz.toFixed(3)} MHz): ${s.operating.covered ? 'inside the 2:1 band' : 'not all inside the 2:1 band; retune, or use the matching network or an antenna tuner at the band edges'}`,
        ],
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
            U.len(d.freeSpaceM, 2),
            U.len(d.withGroundReflectionM, 2),
            d.limit.source,
          ]),
        ) +
        exposureReachHtml(s) +
        // The one near-field statement of the sheet (core/report/exposure.ts), in bold.
        ex.notes
          .map((n) =>
            /near field/.test(n) ? `<p><strong>${e(n)}</strong></p>` : `<p class="note">${e(n)}</p>`,
          )
          .join(''),
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
<body><header><h1>${e(title)}</h1><p class="sub">${e(`Yardwire station report · ${c.band.replace('m', ' m')} band, #${c.rank}${generatedAt ? ` · ${generatedAt}` : ''}`)}</p></header>
${parts.join('\n')}
</body></html>
`;
}
