import { describe, expect, it } from 'vitest';
import { parseProject, supportConducts } from '../../../core/project/schema.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';

function withSupport(i: number, patch: Record<string, unknown>, settings: Record<string, unknown> = {}) {
  const doc = JSON.parse(JSON.stringify(buildDemoProject())) as Record<string, unknown> & {
    supports: Record<string, unknown>[];
    settings: Record<string, unknown>;
  };
  doc.supports[i] = { ...doc.supports[i], ...patch };
  doc.settings = { ...doc.settings, ...settings };
  return parseProject(doc);
}
const demo = buildDemoProject();
const tree = demo.supports.findIndex((s) => s.kind === 'tree');
const mast = demo.supports.findIndex((s) => s.kind === 'mast');
const tower = demo.supports.findIndex((s) => s.kind === 'tower');

describe('metal supports in the project schema', () => {
  it('keeps older documents valid (every new field is optional)', () => {
    expect(parseProject(JSON.parse(JSON.stringify(demo))).ok).toBe(true);
    expect(supportConducts(demo.supports[tower])).toBe(true);
    expect(supportConducts(demo.supports[mast])).toBe(null);
    expect(supportConducts(demo.supports[tree])).toBe(false);
  });

  it('accepts a metal mast with its diameter and grounding', () => {
    const r = withSupport(mast, { material: 'aluminium', diameterM: 0.05, grounded: false });
    expect(r.ok).toBe(true);
    if (r.ok) expect(supportConducts(r.value.supports[mast])).toBe(true);
    const f = withSupport(mast, { material: 'fibreglass' });
    expect(f.ok && supportConducts(f.value.supports[mast])).toBe(false);
  });

  it('refuses metal on a tree, naming the field', () => {
    const r = withSupport(tree, { material: 'steel' });
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.errors).toContainEqual({
        path: `supports[${tree}].material`,
        message: expect.stringMatching(/a tree is never modelled as a conductor/),
      });
  });

  it('refuses bad dimensions, naming the field', () => {
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ faceWidthM: 0 }, 'faceWidthM', /between 0.05 and 3 m/],
      [{ diameterM: 2 }, 'diameterM', /between 0.01 and 1 m/],
      [{ structureHeightM: 5 }, 'structureHeightM', /at least the usable height/],
      [{ grounded: 'yes' }, 'grounded', /must be a boolean/],
      [{ material: 'wood' }, 'material', /must be one of steel, aluminium, fibreglass/],
    ];
    for (const [patch, field, msg] of cases) {
      const r = withSupport(tower, patch);
      expect(r.ok, field).toBe(false);
      if (!r.ok)
        expect(r.errors.find((e) => e.path === `supports[${tower}].${field}`)?.message, field).toMatch(msg);
    }
  });

  it('checks the soil range setting', () => {
    expect(withSupport(0, {}, { soilRange: ['poor', 'very-good'] }).ok).toBe(true);
    const bad: [unknown, RegExp][] = [
      [[], /at least one soil class/],
      [['poor', 'poor'], /twice/],
      [['mud'], /must be one of the soil classes/],
      [['poor', 'average', 'very-good', 'very-poor', 'itu-dry'], /at most 4/],
    ];
    for (const [v, msg] of bad) {
      const r = withSupport(0, {}, { soilRange: v });
      expect(r.ok).toBe(false);
      if (!r.ok)
        expect(r.errors.map((e) => `${e.path}: ${e.message}`).join('; ')).toMatch(
          new RegExp(`settings\\.soilRange.*${msg.source}`),
        );
    }
  });
});
