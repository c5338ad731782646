import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { candidateGainAt, planSite, type Candidate, type Shortlist } from '../../../core/rank/plan.ts';
import {
  COAX_LOSS_DB_PER_100M,
  COAX_TYPES,
  awgDiameterMm,
  buildSheet,
  coaxLossDbPer100m,
  measureTuning,
  TUNING_STEP,
  nearestAwg,
  type BuildSheet,
} from '../../../core/report/buildSheet.ts';
import { REPORT_SECTIONS, escapeHtml, renderBuildSheetHtml } from '../../../core/report/html.ts';
import { stationReport } from '../../../core/report/stationReport.ts';
import { feetInches } from '../../../core/report/format.ts';
import { lengthsInText } from '../../../core/units/index.ts';
import type { Project } from '../../../core/project/schema.ts';
import { resonantAt, testEvaluator } from '../../helpers/testEvaluator.ts';
import { evaluationModel } from '../../../core/antennas/conductors.ts';

// Planning mechanics only: the test evaluator is not physics (see its header). Verticals resonate
// near a quarter wave, wire antennas near a half wave.
const ev = testEvaluator({ resonantM: resonantAt(0.47, 0.24) });

const len = (w: Candidate['wires'][number]): number =>
  Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]);

function sheetFor(project: Project, s: Shortlist, c: Candidate): BuildSheet {
  return buildSheet({
    project,
    shortlist: s,
    candidate: c,
    gainAt: (az, el) => candidateGainAt(s, c.id, az, el),
  });
}

describe('build sheet', () => {
  const project = buildDemoProject();
  const shortlist = planSite(project, {
    evaluator: ev,
    bands: ['80m'],
    types: ['dipole', 'inverted-v', 'vertical', 'half-square'],
  });
  const byType = (t: string): Candidate => {
    const c = shortlist.candidates.find((x) => x.type === t);
    if (!c) throw new Error(`no ${t} in the shortlist`);
    return c;
  };

  it('bill of materials follows the candidate geometry', () => {
    for (const t of ['dipole', 'inverted-v', 'vertical', 'half-square']) {
      const c = byType(t);
      const s = sheetFor(project, shortlist, c);
      const wires = c.wires.reduce((a, w) => a + len(w), 0);
      const allowance = c.cutList
        .filter((i) => i.kind === 'wire')
        .reduce((a, i) => a + i.count * (i.cutLengthM - i.lengthM), 0);
      expect(allowance).toBeGreaterThan(0);
      expect(s.wire.totalM).toBeCloseTo(wires + allowance, 9);
      const bomWire = s.bom.find((b) => b.item === 'Antenna wire');
      expect(bomWire?.quantity).toBeCloseTo(wires + allowance, 9);
      // Feed line at least the plan distance from the station to the feed point, plus its height.
      const fl = s.feedLine;
      const plan = Math.hypot(fl.feedXYZ[0] - fl.stationXY[0], fl.feedXYZ[1] - fl.stationXY[1]);
      expect(fl.planDistanceM).toBeCloseTo(plan, 9);
      expect(fl.lengthM).toBeGreaterThanOrEqual(plan + fl.feedXYZ[2]);
      expect(fl.lengthM).toBeCloseTo((plan + fl.feedXYZ[2]) * 1.1, 9);
      // One pulley and one halyard of 2 × height + margin per support used.
      expect(s.ropes.length).toBe(c.supports.length);
      for (const r of s.ropes) expect(r.lengthM).toBeCloseTo(2 * r.heightM + 5, 9);
      // Choke balun for centre-fed designs only.
      expect(s.choke !== null).toBe(t === 'dipole' || t === 'inverted-v');
    }
  });

  it('radial total is the sum of the modelled radials and matches the cut list', () => {
    const c = byType('vertical');
    const s = sheetFor(project, shortlist, c);
    expect(s.radials).not.toBeNull();
    const fromCuts = c.cutList.filter((i) => i.kind === 'radial');
    const count = fromCuts.reduce((a, i) => a + i.count, 0);
    const total = fromCuts.reduce((a, i) => a + i.count * i.lengthM, 0);
    expect(s.radials!.count).toBe(count);
    expect(s.radials!.totalM).toBeCloseTo(total, 1);
    expect(s.lot.radialLengthsM.length).toBe(count);
  });

  it('counts insulators at free ends and at supports that hold a joint', () => {
    // Inverted-V: two leg ends plus the apex at its support. Dipole: its two ends.
    expect(sheetFor(project, shortlist, byType('inverted-v')).insulators.count).toBe(3);
    expect(sheetFor(project, shortlist, byType('dipole')).insulators.count).toBe(2);
    // Half-square: two lower ends plus the two top corners at the supports.
    expect(sheetFor(project, shortlist, byType('half-square')).insulators.count).toBe(4);
  });

  it('takes the feed point of a centre-fed dipole from the candidate, at the middle of its wire', () => {
    const c = byType('dipole');
    const s = sheetFor(project, shortlist, c);
    const w = c.wires[0];
    // The candidate's feed points are rounded to the centimetre.
    for (let k = 0; k < 3; k++) expect(s.feedLine.feedXYZ[k]).toBeCloseTo((w.from[k] + w.to[k]) / 2, 2);
  });

  it('measures a tuning rate through the evaluator', () => {
    const c = byType('dipole');
    // The test evaluator's reactance is X = 20 Ω/m·(L·f/f0 − 0.47·c/f0) for total wire length L:
    // resonance at f = 0.47·c/L, so longer wire, lower resonance, and f_short/f_long = L_long/L_short.
    const t = measureTuning(c.design, c.trim.valueM, project.soil, testEvaluator({ pattern: 'flat' }));
    expect(t.kHzPerCm).toBeLessThan(0);
    expect(t.resonanceMHz.shorter).toBeGreaterThan(t.resonanceMHz.longer);
    expect(t.cmPer10kHzUp).toBeGreaterThan(0);
    const total = (trimM: number): number =>
      evaluationModel(c.design, trimM).wires.reduce(
        (s, w) => s + Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]),
        0,
      );
    const lo = c.trim.valueM * (1 - TUNING_STEP);
    const hi = c.trim.valueM * (1 + TUNING_STEP);
    expect(t.resonanceMHz.shorter / t.resonanceMHz.longer).toBeCloseTo(total(hi) / total(lo), 6);
  });

  it('states the wire gauge from the model radius', () => {
    expect(nearestAwg(2.0)).toBe(12);
    expect(awgDiameterMm(12)).toBeCloseTo(2.05, 2);
    expect(nearestAwg(1.6)).toBe(14);
    const s = sheetFor(project, shortlist, byType('dipole'));
    expect(s.wire.gauge).toMatch(/2\.0 mm diameter copper \(≈ 12 AWG/);
  });

  it('renders every section and escapes a hostile project name and support name', () => {
    const hostile = '<img src=x onerror=alert(1)>&"\'';
    const p2: Project = {
      ...project,
      name: hostile,
      supports: project.supports.map((s, i) => (i === 0 ? { ...s, name: `<script>x</script>${s.name}` } : s)),
    };
    const s2 = planSite(p2, { evaluator: ev, bands: ['80m'], types: ['dipole'] });
    const c = s2.candidates[0];
    const html = renderBuildSheetHtml(sheetFor(p2, s2, c));
    expect(html).not.toContain('<img src=x');
    expect(html).not.toContain('<script>');
    expect(html).toContain(escapeHtml(hostile));
    expect(html).toContain('&lt;script&gt;x&lt;/script&gt;');
    for (const h of REPORT_SECTIONS) expect(html).toContain(`<h2>${escapeHtml(h)}</h2>`);
    expect(html).toContain('@media print');
    expect(html).toMatch(/near field/);
    // Standalone: no scripts and nothing loaded from elsewhere.
    expect(html).not.toMatch(/<script|<link|\ssrc="|\shref="/i);
  });
});

describe('imperial build sheet', () => {
  const project = buildDemoProject();
  const shortlist = planSite(project, { evaluator: ev, bands: ['160m', '80m'] });
  /** Visible text: tags and the stylesheet removed. */
  const text = (html: string): string =>
    html
      .replace(/<style>[\s\S]*?<\/style>/, '')
      .replace(/<title>[\s\S]*?<\/title>/g, ' ')
      .replace(/<[^>]+>/g, ' ');
  /** A metric length: a number then m, cm, mm or metre(s); band names ("80 m band") aside. */
  const METRIC = /\d\s?(?:m|cm|mm|metres?)\b(?!\s*band)/;

  it('holds no metre lengths for any type, and says feet', () => {
    const seen = new Set<string>();
    for (const c of shortlist.candidates) {
      if (seen.has(c.type)) continue;
      seen.add(c.type);
      const { html, sheet } = stationReport({ project, shortlist, candidate: c, units: 'imperial' });
      expect(sheet.units).toBe('imperial');
      const t = text(html);
      expect(
        t.match(METRIC)?.[0] ?? null,
        `${c.type}: ${t.slice(Math.max(0, t.search(METRIC) - 60), t.search(METRIC) + 20)}`,
      ).toBeNull();
      expect(t).toMatch(/\d ft \d+(?:¼|½|¾)? in/); // cut lengths in feet and inches
      expect(t).toMatch(/dB\/100 ft/);
    }
    expect(seen.size).toBeGreaterThanOrEqual(5);
  });

  it('the metric sheet of the same candidate does print metres (the check can fail)', () => {
    const c = shortlist.candidates[0]!;
    const t = text(stationReport({ project, shortlist, candidate: c, units: 'metric' }).html);
    expect(t).toMatch(METRIC);
  });

  it('converts lengths in sentences made in core, leaving band names', () => {
    expect(lengthsInText('over the 40 m rope limit', 'imperial')).toBe('over the 131 ft rope limit');
    expect(lengthsInText('limits (24.57–54.06 m)', 'imperial')).toBe('limits (80.61–177.36 ft)');
    expect(lengthsInText('the 160 m band', 'imperial')).toBe('the 160 m band');
    expect(lengthsInText('span 12.3 m', 'metric')).toBe('span 12.3 m');
  });

  it('prints cut lengths to the nearest quarter inch', () => {
    // 20 m = 65.6168 ft = 65 ft 7.40 in → 7½ in to the nearest quarter.
    expect(feetInches(20)).toBe('65 ft 7½ in');
    expect(feetInches(0.2)).toBe('7¾ in'); // 7.874 in
  });
});

describe('coax loss', () => {
  it('is the table value at the tabulated frequencies', () => {
    for (const t of COAX_TYPES) {
      expect(coaxLossDbPer100m(t, 1.8)).toBeCloseTo(COAX_LOSS_DB_PER_100M[t][0], 12);
      expect(coaxLossDbPer100m(t, 7)).toBeCloseTo(COAX_LOSS_DB_PER_100M[t][2], 12);
    }
  });
  it('scales as √f near a tabulated frequency', () => {
    const a = coaxLossDbPer100m('RG-213', 3.5);
    const b = coaxLossDbPer100m('RG-213', 3.8);
    expect(b / a).toBeCloseTo(Math.sqrt(3.8 / 3.5), 12);
    expect(coaxLossDbPer100m('RG-58', 14) / coaxLossDbPer100m('RG-58', 7)).toBeCloseTo(Math.SQRT2, 12);
  });
  it('orders the cables from lossiest to lowest loss at every band', () => {
    for (const f of [1.83, 3.55, 7.05]) {
      const l = COAX_TYPES.map((t) => coaxLossDbPer100m(t, f));
      for (let i = 1; i < l.length; i++) expect(l[i]).toBeLessThan(l[i - 1]);
    }
  });
});
