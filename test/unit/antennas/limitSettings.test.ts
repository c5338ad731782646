// Every limit a rejection cites is a setting, and the rejection says where to change it
// (issue 14.7). Planning mechanics only: enumeration, no solver.
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../core/demo/demoProject.ts';
import { enumeratePlan } from '../../../core/rank/plan.ts';
import { parseProject, type Project } from '../../../core/project/schema.ts';
import { LIMIT_SETTINGS } from '../../../core/project/settingLimits.ts';

const reasonsOf = (p: Project): string[] =>
  enumeratePlan(p, { bands: ['160m', '80m'] }).bands.flatMap((b) => b.rejections.flatMap((r) => r.reasons));

describe('limit settings', () => {
  const demo = buildDemoProject();

  it('the rope limit is settings.maxRopeM (default 40 m), and its rejections name the setting', () => {
    expect(demo.settings.maxRopeM).toBe(40);
    const rope = reasonsOf(demo).filter((r) => /rope limit/.test(r));
    expect(rope.length).toBeGreaterThan(0);
    for (const r of rope) {
      expect(r).toMatch(/over the 40 m rope limit/);
      expect(r).toContain(`change it in Settings › ${LIMIT_SETTINGS.maxRopeM}`);
    }
  });

  it('a longer rope limit lets more placements through, and the cited number follows it', () => {
    const longer: Project = { ...demo, settings: { ...demo.settings, maxRopeM: 150 } };
    const before = reasonsOf(demo).filter((r) => /rope limit/.test(r)).length;
    const after = reasonsOf(longer).filter((r) => /rope limit/.test(r));
    expect(after.length).toBeLessThan(before);
    for (const r of after) expect(r).toMatch(/over the 150 m rope limit/);
  });

  it('every "limit" a rejection cites on the demo names the setting to change', () => {
    const tight: Project = {
      ...demo,
      settings: { ...demo.settings, maxVerticalHeightM: 5, minEndHeightM: 8, setbackM: 6 },
    };
    const cited = reasonsOf(tight).filter((r) => /limit|setback/.test(r));
    expect(cited.length).toBeGreaterThan(0);
    for (const r of cited) expect(r, r).toMatch(/change it in Settings › /);
  });

  it('the schema refuses a rope limit out of range, naming the field', () => {
    const bad = parseProject({ ...demo, settings: { ...demo.settings, maxRopeM: 0 } });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors.map((e) => e.path)).toContain('settings.maxRopeM');
  });
});
