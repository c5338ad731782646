// Shortlist rows, sorting and exports over a real shortlist of the demo lot from the core.
import { describe, expect, it } from 'vitest';
import { demoPlanProject, demoShortlist } from './testShortlist.ts';
import { csvField, lotGeoJson, shortlistCsv } from './exports.ts';
import { footprintAreaM2, nextSort, sortCandidates, topHeightM, wireToCutM } from './shortlistTable.ts';

describe('shortlist table', () => {
  const s = demoShortlist();

  it('has candidates of more than one type, ranked, each best of its type marked once per band', () => {
    expect(s.candidates.length).toBeGreaterThan(3);
    const types = new Set(s.candidates.map((c) => c.type));
    expect(types.size).toBeGreaterThan(1);
    for (const t of types) expect(s.candidates.filter((c) => c.type === t && c.bestOfType)).toHaveLength(1);
  });

  it('sorts by a region gain, best first, and flips on a second click', () => {
    const key = `region:${s.paths[0]!.id}` as const;
    const first = nextSort({ key: 'rank', dir: 1 }, key);
    expect(first.dir).toBe(-1);
    const rows = sortCandidates(s.candidates, first);
    const g = rows.map((c) => c.regions[0]!.gainDbi);
    expect(g).toEqual([...g].sort((a, b) => b - a));
    const flipped = sortCandidates(s.candidates, nextSort(first, key));
    expect(flipped[0]!.id).toBe(rows.at(-1)!.id);
    expect(sortCandidates(s.candidates, { key: 'swr', dir: 1 })[0]!.feed.swr).toBe(
      Math.min(...s.candidates.map((c) => c.feed.swr)),
    );
  });

  it('derives top height, wire and footprint from the core figures', () => {
    const c = s.candidates[0]!;
    expect(topHeightM(c)).toBe(Math.max(...c.heights.map((h) => h.heightM)));
    expect(wireToCutM(c)).toBeGreaterThan(c.trim.valueM * 0.9);
    expect(footprintAreaM2(c)).toBeGreaterThan(0);
  });
});

describe('exports', () => {
  it('writes the shortlist as CSV with one row per candidate and quoted text', () => {
    const s = demoShortlist();
    const csv = shortlistCsv(s);
    const lines = csv.trimEnd().split('\r\n');
    expect(lines).toHaveLength(s.candidates.length + 1);
    expect(lines[0]).toContain('Europe gain dBi');
    expect(lines[1]!.startsWith(`80m,1,`)).toBe(true);
    expect(csvField('a, "b"')).toBe('"a, ""b"""');
    expect(csvField(Infinity)).toBe('');
  });
  it('gives the radial field efficiency apart from the soil loss beyond (empty where no radials)', () => {
    const s = demoShortlist();
    // split one CSV line, honouring quoted fields
    const cellsOf = (line: string): string[] =>
      [...line.matchAll(/("(?:[^"]|"")*"|[^,]*)(,|$)/g)]
        .filter((m, i, all) => !(m[0] === '' && i === all.length - 1))
        .map((m) => m[1]!.replace(/^"|"$/g, '').replace(/""/g, '"'));
    const lines = shortlistCsv(s).trimEnd().split('\r\n');
    const head = cellsOf(lines[0]!);
    const col = head.indexOf('radial field efficiency %');
    const beyond = head.findIndex((h) => h.startsWith('soil loss beyond dB'));
    expect(col).toBeGreaterThan(0);
    expect(beyond).toBeGreaterThan(0);
    s.candidates.forEach((c, i) => {
      const cells = cellsOf(lines[i + 1]!);
      expect(cells).toHaveLength(head.length);
      if (c.groundSystem.kind === 'radials') expect(Number(cells[col])).toBeGreaterThan(50);
      else expect(cells[col]).toBe('');
    });
  });

  it('writes the lot, supports, keep-outs and station as GeoJSON', () => {
    const p = demoPlanProject();
    const fc = JSON.parse(lotGeoJson(p));
    expect(fc.type).toBe('FeatureCollection');
    const roles = fc.features.map((f: { properties: { role: string } }) => f.properties.role);
    expect(roles.filter((r: string) => r === 'support')).toHaveLength(p.supports.length);
    expect(roles).toContain('lot boundary');
    expect(roles).toContain('station');
    expect(fc.features[0].geometry).toEqual(p.boundary);
  });
});
