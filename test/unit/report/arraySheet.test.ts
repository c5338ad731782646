// The build sheet of an array of verticals (issue 16): every vertical's radials in the radial
// table and drawing, with where each ends (full length, or on the line midway to the other
// vertical, bonded there), and the station's line ending at the relay box (the sheet, the plan's
// feed-line element). Planning mechanics only (the fake evaluator is not physics).
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../core/demo/demoProject.ts';
import { planSite } from '../../../core/rank/plan.ts';
import { stationReport } from '../../../core/report/stationReport.ts';
import { radialRows } from '../../../core/report/buildSheet.ts';
import { relayBoxXY, stationLineEnd } from '../../../core/report/arrayWiring.ts';
import { servingState } from '../../../core/rank/candidateStates.ts';
import { resonantAt, testEvaluator } from '../../helpers/testEvaluator.ts';

const ev = testEvaluator({ resonantM: resonantAt(0.47, 0.24) });
const project = buildDemoProject();
const shortlist = planSite(project, {
  evaluator: ev,
  bands: ['40m'],
  types: ['phased-pair', 'vertical-pair', 'four-square'],
  arrays: true,
});

describe('the sheet of an array of verticals', () => {
  for (const type of ['phased-pair', 'vertical-pair', 'four-square']) {
    it(`${type}: lists every vertical's radials and where each ends`, () => {
      const c = shortlist.candidates.find((x) => x.type === type);
      expect(c, `a ${type} on the demo lot at 40 m`).toBeDefined();
      const g = c!.groundSystem;
      if (g.kind !== 'radials') throw new Error('no radials');
      const verticals = c!.elementCount;
      expect(g.fields).toHaveLength(verticals);
      const { sheet, html } = stationReport({ project, shortlist, candidate: c! });
      expect(sheet.radialTable).toHaveLength(g.count);
      const names = [...new Set(sheet.radialTable.map((r) => r.vertical))];
      expect(names).toHaveLength(verticals);
      for (const f of g.fields!) {
        const rows = sheet.radialTable.filter((r) => r.vertical === f.label);
        expect(rows.map((r) => r.n)).toEqual(f.lengthsM.map((_, k) => k + 1));
        // equally spaced around its own base
        const step = 360 / f.lengthsM.length;
        rows.forEach((r, k) => expect(r.bearingDeg - rows[0]!.bearingDeg).toBeCloseTo(k * step, 1));
      }
      // the fields meet: some radials end on the line midway and are bonded there
      expect(sheet.radialTable.some((r) => /midway to vertical/.test(r.end))).toBe(true);
      // and the one facing straight at the other base ends at the midpoint: half the spacing
      const [a, b] = g.fields!;
      const d = Math.hypot(a!.baseXY[0] - b!.baseXY[0], a!.baseXY[1] - b!.baseXY[1]);
      expect(Math.min(...a!.lengthsM)).toBeLessThanOrEqual(d / 2 + 0.05);
      const svg = html.match(/<svg class="radials"[\s\S]*?<\/svg>/)?.[0] ?? '';
      expect(svg.match(/class="radial"/g)?.length).toBe(g.count);
      expect(svg).toContain('class="bond"');
      expect(html).toContain('Where it ends');
    });
  }

  it('ends the station line at the relay box, in the sheet and in the plan', () => {
    const c = shortlist.candidates.find((x) => x.type === 'phased-pair')!;
    const box = relayBoxXY(c.type, c.elements, c.placement.originXY)!;
    expect(box).toEqual([c.placement.originXY[0], c.placement.originXY[1]]);
    expect(stationLineEnd(c)).toEqual([box[0], box[1], 0]);
    const line = c.elements.find((e) => e.role === 'feed-line');
    expect(line && 'to' in line ? line.to : null).toEqual([box[0], box[1], 0]);
    const { sheet } = stationReport({ project, shortlist, candidate: c });
    expect(sheet.feedLine.feedXYZ).toEqual([box[0], box[1], 0]);
    // a single vertical's line still ends at its feed point
    expect(relayBoxXY('vertical', c.elements, c.placement.originXY)).toBeNull();
  });

  it('four-square: draws its four directions toward each region, each the first turned by 90°', () => {
    const c = shortlist.candidates.find((x) => x.type === 'four-square')!;
    const { sheet, html } = stationReport({ project, shortlist, candidate: c });
    const dirs = sheet.pattern!.directions!;
    expect(dirs.states).toHaveLength(4);
    for (const t of dirs.toward) {
      expect(t.azimuth).toHaveLength(4);
      // the states are the one pattern turned by 90° steps (Design.states): direction k's cut at
      // bearing b is direction 1's at b − 90°·(k − 1), on the 2° grid of the cut
      const beamStep = dirs.states[1]!.beamDeg - dirs.states[0]!.beamDeg;
      expect(Math.abs(beamStep)).toBeCloseTo(90, 0);
      for (let k = 1; k < 4; k++)
        t.azimuth[k]!.forEach((p, j) => {
          const back = (j - (k * beamStep) / 2 + 10 * 180) % 180;
          expect(p.gainDbi).toBeCloseTo(t.azimuth[0]![back]!.gainDbi, 6);
        });
      expect(t.servedBy).toBe(servingState(c, c.regions.find((r) => r.name === t.name)!.id)!.n);
    }
    for (const k of [1, 2, 3, 4]) expect(html).toContain(`class="trace d${k}`);
  });

  it('four-square: its box holds the hybrid, the load resistor and the inverting transformer of its model; three control wires', () => {
    const c = shortlist.candidates.find((x) => x.type === 'four-square')!;
    const { sheet, html } = stationReport({ project, shortlist, candidate: c });
    const items = sheet.bom.map((b) => b.item);
    expect(items).toContain('90° hybrid coupler, 50 Ω');
    expect(items).toContain('Load resistor, 50 Ω non-inductive');
    expect(items).toContain('Transformer 1:1, wired to invert');
    expect(sheet.array!.controlRuns).toEqual([
      { from: 'the station', to: 'the relay box, along the feed line', conductors: 3, lengthM: null },
    ]);
    const control = sheet.bom.find((b) => b.item === 'Control cable')!;
    expect(control.quantity).toBeCloseTo(sheet.feedLine.lengthM, 6);
    expect(html).toContain('Which relays for which direction');
    expect(html).toContain('Coax of the array');
  });

  it('names the vertical of a lone radial field when asked (an array with one vertical among its antennas)', () => {
    const c = shortlist.candidates.find((x) => x.type === 'phased-pair')!;
    const g = c.groundSystem;
    if (g.kind !== 'radials') throw new Error('no radials');
    const one = {
      ...g,
      fields: [g.fields![0]!],
      lengthsM: g.fields![0]!.lengthsM,
      bearingsDeg: g.fields![0]!.bearingsDeg,
    };
    expect(new Set(radialRows(one).map((r) => r.vertical))).toEqual(new Set(['']));
    expect(new Set(radialRows(one, true).map((r) => r.vertical))).toEqual(new Set([g.fields![0]!.label]));
  });
});
