// `plan --json` and `report`: each candidate's cautions as strings and its feed points on the
// site and on the map; the station report shows exactly the candidate's cautions. Planning
// mechanics only (the fake evaluator is not physics).
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../core/demo/demoProject.ts';
import { BUILDERS } from '../../../core/antennas/registry.ts';

/** The types a plan builds by default (the array types are opt-in and tested apart). */
const PLANNED = BUILDERS.filter((b) => !b.array);
import { shortlistJson } from '../../../core/cli/plan.ts';
import { planSite, type Candidate } from '../../../core/rank/plan.ts';
import { buildSite } from '../../../core/site/site.ts';
import { stationReport } from '../../../core/report/stationReport.ts';
import { resonantAt, testEvaluator } from '../../helpers/testEvaluator.ts';

const ev = testEvaluator({ resonantM: resonantAt(0.47, 0.24) });
const project = buildDemoProject();
const shortlist = planSite(project, { evaluator: ev, bands: ['160m', '80m'] });

describe('plan --json', () => {
  const json = JSON.parse(JSON.stringify(shortlistJson(shortlist, false))) as {
    candidates: (Omit<Candidate, 'cautions'> & { cautions: unknown })[];
    patterns?: unknown;
  };

  it('covers every antenna type the planner builds on the demo', () => {
    const types = new Set(json.candidates.map((c) => c.type));
    for (const b of PLANNED) expect(types.has(b.type), b.type).toBe(true);
  });

  it('gives each candidate its cautions as strings, the same list the planner made', () => {
    for (const [i, c] of json.candidates.entries()) {
      const made = shortlist.candidates[i]!;
      expect(c.cautions).toEqual(made.cautions.map((k) => `${k.title}: ${k.text}`));
      expect((c.cautions as string[]).length).toBeGreaterThan(0);
    }
  });

  it('gives each candidate its feed points in the site frame and as [lon, lat] that agree', () => {
    const site = buildSite(project);
    for (const c of json.candidates) {
      expect(c.feedPoints.length, c.id).toBeGreaterThan(0);
      for (const f of c.feedPoints) {
        expect(f.xyz).toHaveLength(3);
        const back = site.frame.toLocal(f.lonLat);
        // Rounded to the centimetre in the site frame; the map position agrees to a millimetre.
        expect(Math.hypot(back[0] - f.xyz[0], back[1] - f.xyz[1])).toBeLessThan(1e-3);
      }
    }
  });

  it('gives a designed match to each candidate above 1.5:1 and none to the others', () => {
    for (const [i, c] of json.candidates.entries()) {
      const made = shortlist.candidates[i]!;
      const m = (
        c as {
          matching?: {
            network: string;
            components: { kind: string; value: number; unit: string }[];
            lossDb: number;
          };
        }
      ).matching;
      if (made.feed.swr > 1.5) {
        expect(m, c.id).toBeDefined();
        expect(m!.network).toMatch(/^L-network/);
        // Two parts; one series part when the resistance is already 50 Ω (the fake's is).
        expect(m!.components.length).toBeGreaterThanOrEqual(1);
        for (const k of m!.components) {
          expect(['inductor', 'capacitor']).toContain(k.kind);
          expect(k.unit).toBe(k.kind === 'inductor' ? 'µH' : 'pF');
          expect(k.value).toBeGreaterThan(0);
        }
        expect(m!.lossDb).toBeGreaterThanOrEqual(0);
      } else expect(m, c.id).toBeUndefined();
    }
  });

  it('leaves the patterns out unless asked for', () => {
    expect(json.patterns).toBeUndefined();
    expect((shortlistJson(shortlist, true) as { patterns?: unknown }).patterns).toBeDefined();
  });
});

describe('station report cautions', () => {
  it('show exactly the candidate’s cautions for every type, in its order', () => {
    const seen = new Set<string>();
    for (const c of shortlist.candidates) {
      if (seen.has(c.type)) continue;
      seen.add(c.type);
      const { sheet, html } = stationReport({ project, shortlist, candidate: c });
      expect(sheet.cautions).toEqual(c.cautions);
      const shown = [...html.matchAll(/<div class="caution"><h3>([^<]*)<\/h3><p>([^<]*)<\/p><\/div>/g)].map(
        (m) => m[1],
      );
      expect(shown, c.type).toEqual(c.cautions.map((k) => k.title));
    }
    expect(seen.size).toBe(PLANNED.length);
  });
});
