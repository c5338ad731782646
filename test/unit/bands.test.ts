// The one bands module (core/bands.ts): edges, segments and the user's operating choice, which
// the planner designs for, the schema validates by name, and the SWR function is one.
import { describe, expect, it } from 'vitest';
import { BAND_INFO, operatingFit, operatingSpan } from '../../core/bands.ts';
import { DESIGN_FREQ_HZ, bandPlan } from '../../core/antennas/common.ts';
import { buildDemoProject } from '../../core/demo/demoProject.ts';
import { enumeratePlan } from '../../core/rank/plan.ts';
import { parseProject, BANDS, type Project } from '../../core/project/schema.ts';

describe('bands', () => {
  it('segments lie inside the band edges and the default design frequency is the CW centre', () => {
    for (const b of BANDS) {
      const i = BAND_INFO[b];
      for (const s of Object.values(i.segments)) {
        expect(s.lowMHz).toBeGreaterThanOrEqual(i.edgesMHz[0]);
        expect(s.highMHz).toBeLessThanOrEqual(i.edgesMHz[1]);
        expect(s.designMHz).toBeGreaterThanOrEqual(s.lowMHz);
        expect(s.designMHz).toBeLessThanOrEqual(s.highMHz);
      }
      expect(DESIGN_FREQ_HZ[b]).toBeCloseTo(i.defaultDesignMHz * 1e6, 3);
      expect(bandPlan(b).designFreqHz).toBe(DESIGN_FREQ_HZ[b]);
    }
  });

  it("says whether the user's span lies inside a candidate's 2:1 band", () => {
    const cand = (swr: number, lowMHz: number | null, highMHz: number | null, widthKHz: number) => ({
      feed: { swr },
      bandwidth2to1: { lowMHz, highMHz, widthKHz },
    });
    const cw = operatingSpan('80m', { part: 'cw' }); // 3.5–3.6 MHz
    expect(operatingFit(cand(1.2, 3.48, 3.62, 140), cw)).toBe('inside');
    expect(operatingFit(cand(1.2, 3.52, 3.58, 60), cw)).toBe('partly');
    expect(operatingFit(cand(1.2, 3.62, 3.7, 80), cw)).toBe('outside');
    // An edge beyond the sweep (null) reaches past the span.
    expect(operatingFit(cand(1.1, null, 3.61, 200), cw)).toBe('inside');
    // SWR above 2 at the design frequency: no 2:1 band without a match.
    expect(operatingFit(cand(2.4, 3.5, 3.6, 100), cw)).toBe('outside');
    expect(operatingFit(cand(1.9, 3.5, 3.6, 0), cw)).toBe('outside');
  });

  it('a custom span is designed at its centre', () => {
    expect(operatingSpan('80m', { part: 'custom', lowMHz: 3.7, highMHz: 3.8 }).designMHz).toBeCloseTo(
      3.75,
      12,
    );
    expect(bandPlan('80m', { part: 'phone' }).designFreqHz).toBe(3.8e6);
  });

  it('the planner designs every proposal for the part the user chose', () => {
    const demo = buildDemoProject();
    const phone: Project = {
      ...demo,
      settings: { ...demo.settings, operating: { '80m': { part: 'phone' } } },
    };
    const a = enumeratePlan(demo, { bands: ['80m'] });
    const b = enumeratePlan(phone, { bands: ['80m'] });
    const fa = new Set(a.bands[0]!.proposed.map((p) => p.proposal.design.designFreqHz));
    const fb = new Set(b.bands[0]!.proposed.map((p) => p.proposal.design.designFreqHz));
    expect([...fa]).toEqual([3.55e6]);
    expect([...fb]).toEqual([3.8e6]);
  });

  it('the schema refuses a custom span outside the band, naming the field', () => {
    const demo = buildDemoProject();
    const bad = parseProject({
      ...demo,
      settings: { ...demo.settings, operating: { '40m': { part: 'custom', lowMHz: 7.05, highMHz: 7.4 } } },
    });
    expect(bad.ok).toBe(false);
    if (!bad.ok) {
      const e = bad.errors.find((x) => x.path === 'settings.operating.40m.highMHz');
      expect(e?.message).toMatch(/inside the 40m band, 7–7.3 MHz/);
    }
  });
});
