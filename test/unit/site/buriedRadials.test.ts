/**
 * Buried radials against the hazards that can reach them (issue 19.3): the fall clearance of an
 * overhead line is for what can fall or swing onto it; a buried radial keeps
 * settings.buriedClearanceM from the line's poles and from buried cables and pipes instead. The
 * rules are common practice, no source (core/site/feasibility.ts states them).
 */
import { describe, expect, it } from 'vitest';
import { builderFor } from '../../../core/antennas/registry.ts';
import { bandPlan, placeElements } from '../../../core/antennas/common.ts';
import { num } from '../../../core/antennas/common.ts';
import {
  checkPlacement,
  clipRadial,
  POWER_LINE_MARGIN_M,
  type Element,
} from '../../../core/site/feasibility.ts';
import { parseProject } from '../../../core/project/schema.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { ll, testLot, type LotSpec, preparedLot } from './lot.ts';

const STEP = 0.25; // RADIAL_STEP_M: clipped lengths are exact to one step

/** A power line along y with poles (vertices) at the given x, metres. */
const lineWithPoles = (y: number, poles: number[], clearanceM: number) => ({
  id: 'line',
  name: 'Street line',
  kind: 'power-line' as const,
  geometry: { type: 'LineString' as const, coordinates: poles.map((x) => ll(x, y)) },
  clearanceM,
  heightM: 9,
});

const siteOf = (spec: LotSpec) => preparedLot(spec);

const radial = (label: string, to: [number, number]): Element => ({
  kind: 'radial',
  label,
  from: [0, 0, 0],
  to: [to[0], to[1], 0],
});

describe('buried radials near an overhead power line', () => {
  it('a vertical near the line keeps its whole radial field (the fall clearance does not cut it)', () => {
    // Line 20 m south of a 15 m tree with a 15 m clearance: the tree keeps its fall distance
    // (15 + 3 = 18 m ≤ 20 m), and the 40 m band radials (a quarter wave, ≈ 10.6 m) reach to 9.4 m
    // from the line, inside its 15 m clearance, where under the old rule they stopped.
    const spec: LotSpec = {
      supports: [{ id: 'a', x: 0, y: 8, h: 15 }],
      keepOuts: [lineWithPoles(-12, [-60, 60], 15)],
    };
    const ps = siteOf(spec);
    const out = builderFor('vertical').propose({ site: ps, band: bandPlan('40m') });
    const p = out.proposals.find((q) => q.groupKey === 'vertical:a');
    expect(p, JSON.stringify(out.rejections)).toBeDefined();
    const lengths = p!.design.params.radialLengthsM as number[];
    const quarter = 0.25 * bandPlan('40m').wavelengthM;
    expect(lengths.length).toBe(32);
    for (const l of lengths) expectClose(l, quarter, 0.005, 'every radial at its full quarter-wave length');
    const r = checkPlacement(
      ps,
      placeElements(builderFor('vertical').elements(p!.design, p!.design.trim.nominalM), p!.placement),
    );
    expect(r.violations).toEqual([]);
    // The southward radial itself passes within the line's clearance: only poles hold it off.
    expectClose(clipRadial(ps, [0, 8], 180, 18), 18, 1e-9, 'to 2 m from the line, poles 60 m away');
    expect(num(p!.design, 'supportHeightM')).toBe(15);
  });

  it('a radial stops buriedClearanceM short of a pole, for the default and a user value', () => {
    // Poles at x = −60, 0 and 60 on y = −10; a radial south from (0, 0) meets the middle pole.
    const line = lineWithPoles(-10, [-60, 0, 60], 15);
    const dflt = siteOf({ keepOuts: [line] });
    expect(dflt.site.settings.buriedClearanceM).toBe(3);
    expectClose(clipRadial(dflt, [0, 0], 180, 20), 10 - 3, STEP, 'pole 10 m away, keeps 3 m');
    const five = siteOf({ keepOuts: [line], settings: { buriedClearanceM: 5 } });
    expectClose(clipRadial(five, [0, 0], 180, 20), 10 - 5, STEP, 'pole 10 m away, keeps 5 m');
    // Beside the pole (3 m east of it) the radial passes under the line and goes on.
    expectClose(clipRadial(dflt, [4, 0], 180, 20), 20, 1e-9, 'passes 4 m from the pole');

    const r = checkPlacement(dflt, [radial('radial 1', [0, -9])]);
    expect(r.ok).toBe(false);
    const v = r.violations.find((x) => x.keepOutId === 'line')!;
    expect(v.code).toBe('keep-out');
    expectClose(v.byM, 2, 0.02, 'ends 1 m from the pole, 2 m inside the 3 m');
    expect(v.message).toMatch(/from a pole of "Street line"/);
    expect(v.message).toMatch(/Settings › Radials from poles and buried lines/);
    expect(checkPlacement(dflt, [radial('radial 1', [0, -6.9])]).ok).toBe(true);
  });

  it('a wire still keeps the fall distance from the same line', () => {
    const ps = siteOf({ keepOuts: [lineWithPoles(-10, [-60, 0, 60], 5)] });
    // A wire at 10 m height, 11 m from the line: it needs 10 + 3 = 13 m.
    const w: Element = { kind: 'wire', label: 'top wire', from: [-10, 1, 10], to: [10, 1, 10] };
    const r = checkPlacement(ps, [w]);
    const v = r.violations.find((x) => x.code === 'power-line');
    expect(v).toBeDefined();
    expectClose(v!.byM, 10 + POWER_LINE_MARGIN_M - 11, 0.02, 'fall distance plus margin minus distance');
    // And a radial at the same place (on the ground, away from the pole) is fine.
    expect(checkPlacement(ps, [radial('radial 1', [-10, -9])]).ok).toBe(true);
  });
});

describe('buried keep-outs', () => {
  const pipe = {
    id: 'pipe',
    name: 'Water pipe',
    kind: 'buried' as const,
    geometry: { type: 'LineString' as const, coordinates: [ll(8, -30), ll(8, 30)] },
    clearanceM: 0,
  };

  it('radials keep buriedClearanceM (or the zone clearance, if larger) from a buried line', () => {
    const ps = siteOf({ keepOuts: [pipe] });
    expectClose(clipRadial(ps, [0, 0], 90, 20), 8 - 3, STEP, 'pipe 8 m east, keeps 3 m');
    const wide = siteOf({ keepOuts: [{ ...pipe, clearanceM: 6 }] });
    expectClose(clipRadial(wide, [0, 0], 90, 20), 8 - 6, STEP, "the zone's own 6 m is larger");
    const r = checkPlacement(ps, [radial('radial 2', [7, 0])]);
    expect(r.ok).toBe(false);
    expect(r.violations[0].message).toMatch(/from the buried "Water pipe"/);
  });

  it('wires and ropes pass over a buried line; an anchor driven in keeps clear of it', () => {
    const ps = siteOf({ keepOuts: [pipe] });
    const w: Element = { kind: 'wire', label: 'top wire', from: [0, 0, 3], to: [20, 0, 3] };
    const rope: Element = { kind: 'rope', label: 'rope', from: [20, 0, 3], to: [20, 0, 0] };
    expect(checkPlacement(ps, [w, rope]).ok).toBe(true);
    const anchor: Element = { kind: 'anchor', label: 'anchor', at: [9, 0, 0] };
    const r = checkPlacement(ps, [anchor]);
    expect(r.ok).toBe(false);
    expectClose(r.violations[0].byM, 2, 0.02, '1 m from the pipe, 3 m kept');
  });

  it('radials the lot clips away are left out without turning the others toward the obstacle', () => {
    // A tree 3.5 m west of a buried pipe: the radials toward the pipe stop within 1 m and are left
    // out; every other radial keeps its own bearing, so the placement still passes its check
    // (before, the remaining radials were re-spread evenly and some crossed the pipe).
    const ps = siteOf({
      supports: [{ id: 'a', x: 0, y: 0, h: 15 }],
      keepOuts: [
        { ...pipe, geometry: { type: 'LineString' as const, coordinates: [ll(3.5, -30), ll(3.5, 30)] } },
      ],
    });
    const out = builderFor('vertical').propose({ site: ps, band: bandPlan('40m') });
    const p = out.proposals.find((q) => q.groupKey === 'vertical:a')!;
    const lengths = p.design.params.radialLengthsM as number[];
    expect(lengths).toHaveLength(32);
    expect(lengths.filter((l) => l === 0).length).toBeGreaterThan(0);
    const model = builderFor('vertical').model(p.design, p.design.trim.nominalM);
    expect(model.radials[0].count).toBe(lengths.filter((l) => l > 0).length);
    expect(model.radials[0].bearingsDeg).toHaveLength(model.radials[0].count);
    const placed = placeElements(
      builderFor('vertical').elements(p.design, p.design.trim.nominalM),
      p.placement,
    );
    expect(checkPlacement(ps, placed).violations).toEqual([]);
    // Radial k keeps bearing k·360°/32: radial 9 (east, 90°) is left out, radial 25 (west) is laid.
    const labels = placed.filter((e) => e.kind === 'radial').map((e) => e.label);
    expect(labels).not.toContain('radial 9');
    expect(labels).toContain('radial 25');
  });

  it('a project file written before the setting and kind existed still loads, with the default', () => {
    const doc = JSON.parse(JSON.stringify(testLot({})));
    delete doc.settings.buriedClearanceM;
    doc.schemaVersion = 1;
    const r = parseProject(doc);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.value.settings.buriedClearanceM).toBe(3);
  });

  it('refuses an out-of-range distance by name', () => {
    const doc = JSON.parse(JSON.stringify(testLot({})));
    doc.settings.buriedClearanceM = 25;
    const r = parseProject(doc);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0].path).toBe('settings.buriedClearanceM');
  });
});
