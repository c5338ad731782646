// The build sheet you can take to the yard (issue 14.9): each radial with its bearing and length
// in a table and a drawing, the elevation pattern toward the targets, no internal ids, one
// near-field statement, and antenna-detail labels that do not overlap. Planning mechanics only
// (the fake evaluator is not physics).
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../core/demo/demoProject.ts';
import { planSite, type Candidate } from '../../../core/rank/plan.ts';
import { stationReport } from '../../../core/report/stationReport.ts';
import { INSULATOR_RULE } from '../../../core/report/bom.ts';
import { resonantAt, testEvaluator } from '../../helpers/testEvaluator.ts';

const ev = testEvaluator({ resonantM: resonantAt(0.47, 0.24) });
const project = buildDemoProject();
const shortlist = planSite(project, { evaluator: ev, bands: ['160m', '80m'] });
const firstOf = (t: string): Candidate => shortlist.candidates.find((c) => c.type === t)!;
const visible = (html: string): string =>
  html
    .replace(/<style>[\s\S]*?<\/style>/, '')
    .replace(/<title>[\s\S]*?<\/title>/g, ' ')
    .replace(/<[^>]+>/g, ' ');

describe('radials', () => {
  it('lists every radial with its bearing and length, and draws each one', () => {
    const c = firstOf('vertical');
    const g = c.groundSystem;
    if (g.kind !== 'radials') throw new Error('the vertical has no radials');
    const { sheet, html } = stationReport({ project, shortlist, candidate: c });
    expect(sheet.radialTable).toHaveLength(g.count);
    const byBearing = g.bearingsDeg.map((b, k) => [b, g.lengthsM[k]!] as const).sort((a, b) => a[0] - b[0]);
    sheet.radialTable.forEach((r, k) => {
      expect(r.n).toBe(k + 1);
      expect(r.bearingDeg).toBe(byBearing[k]![0]);
      expect(r.lengthM).toBe(byBearing[k]![1]);
    });
    expect(html).toContain('Radials: bearing and length of each');
    const svg = html.match(/<svg class="radials"[\s\S]*?<\/svg>/)?.[0] ?? '';
    expect(svg.match(/class="radial"/g)?.length).toBe(g.count);
  });

  it('has no radial table for a wire antenna', () => {
    const { sheet, html } = stationReport({ project, shortlist, candidate: firstOf('dipole') });
    expect(sheet.radialTable).toEqual([]);
    expect(html).not.toContain('class="radials"');
  });
});

describe('patterns toward the targets', () => {
  it('gives an elevation cut toward each region with its window', () => {
    const c = firstOf('half-square');
    expect(c.regions.length).toBeGreaterThan(0);
    const { sheet, html } = stationReport({ project, shortlist, candidate: c });
    expect(sheet.pattern!.towardTargets.map((t) => t.name)).toEqual(c.regions.map((r) => r.name));
    for (const r of c.regions) {
      expect(html).toContain(`Elevation toward ${r.name}`);
      const t = sheet.pattern!.towardTargets.find((x) => x.name === r.name)!;
      expect(t.bearingDeg).toBe(r.bearingDeg.center);
      expect(t.cut).toHaveLength(90);
    }
    expect(html.match(/class="window"/g)?.length).toBe(c.regions.length);
  });
});

describe('the sheet reads as a document', () => {
  for (const t of ['dipole', 'inverted-v', 'half-square', 'vertical', 'inverted-l']) {
    it(`${t}: no internal ids, one near-field statement, the insulator rule stated`, () => {
      const c = firstOf(t);
      const { sheet, html } = stationReport({ project, shortlist, candidate: c });
      const text = visible(html);
      expect(text).not.toContain(c.id);
      expect(text).not.toContain(c.evaluationKey);
      expect(text).not.toContain(c.type === 'inverted-l' ? 'inverted-l ' : `${c.type}-`);
      expect(text.match(/near field/g)?.length, 'near-field statements').toBe(1);
      expect(html).toContain(INSULATOR_RULE);
      expect(sheet.insulators.count).toBe(sheet.insulators.where.length);
    });

    it(`${t}: antenna detail labels do not overlap`, () => {
      const html = stationReport({ project, shortlist, candidate: firstOf(t) }).html;
      const svg = html.match(/<svg class="lot detail"[\s\S]*?<\/svg>/)?.[0] ?? '';
      // The drawing's own estimate of a label box: 5.6 px a character (6.3 bold), 12 px tall.
      const boxes = [...svg.matchAll(/<text x="([\d.]+)" y="([\d.]+)" class="(\w+)">([^<]*)<\/text>/g)].map(
        (m) => {
          const w = m[4]!.length * (m[3] === 'wlabel' || m[3] === 'flabel' ? 6.3 : 5.6);
          const x = Number(m[1]);
          const y = Number(m[2]);
          return { s: m[4]!, x0: x, y0: y - 10, x1: x + w, y1: y + 2 };
        },
      );
      expect(boxes.length).toBeGreaterThan(2);
      for (let i = 0; i < boxes.length; i++)
        for (let j = i + 1; j < boxes.length; j++) {
          const a = boxes[i]!;
          const b = boxes[j]!;
          const overlap = a.x0 < b.x1 && a.x1 > b.x0 && a.y0 < b.y1 && a.y1 > b.y0;
          expect(overlap, `"${a.s}" and "${b.s}"`).toBe(false);
        }
    });
  }
});
