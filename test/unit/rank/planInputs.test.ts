import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import {
  changedPlanInputs,
  describePlanChanges,
  planInputsHash,
  stableJson,
} from '../../../core/rank/planInputs.ts';

describe('the hash of what a plan reads', () => {
  const demo = buildDemoProject();

  it('is the same for the same inputs, whatever the key order', () => {
    expect(stableJson({ b: 1, a: [2, { d: 3, c: 4 }] })).toBe('{"a":[2,{"c":4,"d":3}],"b":1}');
    const reordered = JSON.parse(stableJson(demo)) as typeof demo;
    expect(planInputsHash(reordered, ['80m'])).toEqual(planInputsHash(demo, ['80m']));
  });

  it('ignores what the plan does not read: name, notes, units, imagery, transmitter, feed routes', () => {
    const other = {
      ...demo,
      name: 'Renamed',
      notes: 'a note',
      feedRoutes: { x: [[0, 0] as [number, number]] },
      settings: {
        ...demo.settings,
        units: 'imperial' as const,
        tileUrlTemplate: 'https://tiles.invalid/{z}/{x}/{y}.png',
        station: { ...demo.settings.station, powerW: 1000 },
      },
    };
    expect(changedPlanInputs(planInputsHash(demo, ['80m']), planInputsHash(other, ['80m']))).toEqual([]);
  });

  it('names every part that changed', () => {
    const made = planInputsHash(demo, ['80m']);
    const moved = {
      ...demo,
      supports: demo.supports.map((s, i) => (i === 0 ? { ...s, usableHeightM: s.usableHeightM + 1 } : s)),
      soil: { classId: 'poor' },
      settings: { ...demo.settings, setbackM: demo.settings.setbackM + 1 },
    };
    const changed = changedPlanInputs(made, planInputsHash(moved, ['80m', '40m']));
    expect(changed).toEqual(['supports', 'soil', 'bands', 'settings']);
    expect(describePlanChanges(changed)).toBe(
      'the supports, soil, bands and planning settings changed since this plan',
    );
    expect(describePlanChanges(['boundary'])).toBe('the lot boundary changed since this plan');
    expect(describePlanChanges([])).toBe('');
  });
});
