/**
 * What the planning views export: the lot and its supports (and keep-outs, station) as a GeoJSON
 * FeatureCollection (RFC 7946), and the shortlist as CSV (RFC 4180: comma-separated, fields with
 * commas, quotes or line breaks quoted, quotes doubled), every figure from the planning core.
 */
import type { Project } from '../../../core/project/schema.ts';
import type { Shortlist } from '../../../core/rank/plan.ts';
import { fmtBearings, footprintAreaM2, topHeightM, wireToCutM } from './shortlistTable.ts';

export function lotGeoJson(p: Project): string {
  const features: unknown[] = [];
  if (p.boundary)
    features.push({
      type: 'Feature',
      geometry: p.boundary,
      properties: { role: 'lot boundary', name: p.name },
    });
  for (const s of p.supports) {
    features.push({
      type: 'Feature',
      geometry: { type: 'Point', coordinates: s.position },
      properties: {
        role: 'support',
        id: s.id,
        name: s.name,
        kind: s.kind,
        usableHeightM: s.usableHeightM,
        notes: s.notes,
      },
    });
  }
  for (const k of p.keepOuts) {
    features.push({
      type: 'Feature',
      geometry: k.geometry,
      properties: {
        role: 'keep-out',
        id: k.id,
        name: k.name,
        kind: k.kind,
        clearanceM: k.clearanceM,
        ...(k.heightM !== undefined ? { heightM: k.heightM } : {}),
      },
    });
  }
  if (p.station) {
    features.push({
      type: 'Feature',
      geometry: { type: 'Point', coordinates: p.station },
      properties: { role: 'station' },
    });
  }
  return JSON.stringify({ type: 'FeatureCollection', features }, null, 2);
}

export function csvField(v: string | number | null): string {
  if (v === null) return '';
  const s = typeof v === 'number' ? (Number.isFinite(v) ? String(Math.round(v * 1000) / 1000) : '') : v;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function shortlistCsv(s: Shortlist): string {
  const regions = s.paths;
  const head = [
    'band',
    'rank',
    'type',
    'best of type',
    'where',
    'supports',
    'broadside',
    'top height m',
    'score dBi',
    ...regions.map((r) => `${r.name} gain dBi`),
    'peak gain dBi',
    'peak elevation deg',
    'feed R ohm',
    'feed X ohm',
    'SWR',
    '2:1 low MHz',
    '2:1 high MHz',
    '2:1 width kHz',
    'efficiency %',
    'conductor loss dB',
    'ground loss dB',
    'radial field efficiency %',
    'radial field loss dB',
    'soil loss beyond dB (every antenna over this soil)',
    'wire to cut m',
    'footprint m2',
    'trim',
    'cut list',
    'reasons',
  ];
  const rows = s.candidates.map((c) => [
    c.band,
    c.rank,
    c.typeLabel,
    c.bestOfType ? 'yes' : '',
    c.where,
    c.supports.map((x) => x.name).join('; '),
    fmtBearings(c),
    topHeightM(c),
    c.score,
    ...regions.map((r) => c.regions.find((x) => x.id === r.id)?.gainDbi ?? null),
    c.peak.gainDbi,
    c.peak.elevationDeg,
    c.feed.zOhm[0],
    c.feed.zOhm[1],
    c.feed.swr,
    c.bandwidth2to1.lowMHz,
    c.bandwidth2to1.highMHz,
    c.bandwidth2to1.widthKHz,
    c.efficiency.percent,
    c.efficiency.conductorLossDb,
    c.efficiency.groundLossDb,
    c.efficiency.groundSystemEfficiencyPercent,
    c.efficiency.groundSystemEfficiencyPercent === null ? null : c.efficiency.groundSystemLossDb,
    c.efficiency.reflectionLossDb,
    wireToCutM(c),
    footprintAreaM2(c),
    `${c.trim.dimension} ${c.trim.valueM} m${c.trim.resonant ? '' : ' (not resonant)'}`,
    c.cutList.map((x) => `${x.count} × ${x.label} ${x.cutLengthM} m`).join('; '),
    c.fits.join('; '),
  ]);
  return [head, ...rows].map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n';
}
