// The targets state: choosing regions, weights, custom areas, the station's locator and the paths.
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { bearingDistance, toLocator } from '../../../core/paths/index.ts';
import { ProjectState } from '../state/project.svelte.ts';
import { TargetsState, parseCorners, parsePoint, stationOf } from './targets.svelte.ts';

function opened() {
  const doc = new ProjectState(async () => ({ ok: true, value: { updatedAt: 't' } }));
  const p = buildDemoProject();
  doc.open({ ...p, targets: [] });
  return { doc, targets: new TargetsState(doc) };
}

describe('TargetsState', () => {
  it('adds a built-in region once and removes it on a second toggle, each an undoable edit', () => {
    const { doc, targets } = opened();
    expect(targets.toggleRegion('europe')).toBe(true);
    expect(targets.rows).toEqual([
      expect.objectContaining({ key: 'europe', name: 'Europe', weight: 1, builtIn: true }),
    ]);
    expect(targets.isChosen('europe')).toBe(true);
    expect(targets.available.some((r) => r.id === 'europe')).toBe(false);
    expect(targets.toggleRegion('europe')).toBe(true);
    expect(targets.isChosen('europe')).toBe(false);
    expect(targets.rows).toHaveLength(0);
    doc.undo();
    expect(targets.rows.map((r) => r.key)).toEqual(['europe']);
  });

  it('refuses an unknown region', () => {
    const { targets } = opened();
    expect(targets.toggleRegion('atlantis')).toBe(false);
    expect(targets.rows).toHaveLength(0);
  });

  it('clamps weights to 0–100 and ignores a weight that does not change', () => {
    const { doc, targets } = opened();
    targets.toggleRegion('japan');
    expect(targets.setWeight('japan', 250)).toBe(true);
    expect(targets.rows[0]!.weight).toBe(100);
    expect(targets.setWeight('japan', -2)).toBe(true);
    expect(targets.rows[0]!.weight).toBe(0);
    const depth = doc.past.length;
    expect(targets.setWeight('japan', 0)).toBe(false);
    expect(targets.setWeight('japan', Number.NaN)).toBe(false);
    expect(doc.past.length).toBe(depth);
  });

  it('computes paths with the core: the bearing to a point target matches the geodesic from the station', () => {
    const { targets } = opened();
    const id = targets.addCircle('Island', [-16.6, 28.3], 50);
    expect(id).not.toBeNull();
    const path = targets.paths[0]!;
    expect(path.name).toBe('Island');
    const st = targets.station!;
    const direct = bearingDistance(st, [-16.6, 28.3]);
    expect(path.samples[0]!.azimuthDeg).toBeCloseTo(direct.azimuthDeg, 6);
    expect(path.distanceKm.min).toBeLessThan(direct.distanceM / 1000);
    expect(path.distanceKm.max).toBeGreaterThan(direct.distanceM / 1000);
    expect(path.elevationWindowDeg.min).toBeLessThan(path.elevationWindowDeg.max);
  });

  it('adds a polygon target and closes its ring', () => {
    const { doc, targets } = opened();
    const id = targets.addPolygon('Wedge', [
      [10, 40],
      [20, 40],
      [15, 50],
    ]);
    expect(id).not.toBeNull();
    const t = doc.project!.targets[0]!;
    expect('area' in t && 'coordinates' in t.area && t.area.coordinates[0]).toHaveLength(4);
    expect(targets.rows[0]!.area).toBe('area of 3 corners');
    expect(targets.addPolygon('Too few', [[0, 0]])).toBeNull();
  });

  it('refuses a custom target the schema rejects (radius over 5000 km)', () => {
    const { doc, targets } = opened();
    expect(targets.addCircle('Huge', [0, 0], 9000)).toBeNull();
    expect(doc.editError).toMatch(/radius/);
  });

  it('shows the locator of the station and places the station from a typed locator', () => {
    const { doc, targets } = opened();
    const demoStation = doc.project!.station;
    expect(targets.locator).toBe(toLocator(stationOf(doc.project)!, 6));
    // A locator elsewhere moves the station to the centre of that cell.
    expect(targets.setLocator('JN58')).toBeNull();
    expect(doc.project!.station).toEqual([11, 48.5]);
    expect(targets.locator.slice(0, 4)).toBe('JN58');
    // The lot's own square puts the station back on the lot (its centre), not kilometres away.
    const square = toLocator(demoStation ?? stationOf(doc.project)!, 4);
    expect(targets.setLocator(square)).toBeNull();
    const st = doc.project!.station!;
    expect(toLocator(st, 6)).toBe(toLocator(stationOf({ ...doc.project!, station: null })!, 6));
    expect(targets.setLocator('ZZ99')).toMatch(/not a Maidenhead locator/);
  });
});

describe('parsing places', () => {
  it('reads locators and lat, lon pairs', () => {
    expect(parsePoint('JN58')).toEqual([11, 48.5]);
    expect(parsePoint('48.5, 11')).toEqual([11, 48.5]);
    expect(parsePoint('95, 11')).toBeNull();
    expect(parsePoint('hello')).toBeNull();
  });
  it('reads a list of corners and names the bad one', () => {
    expect(parseCorners('FN20 FN42 EN61').corners).toHaveLength(3);
    expect(parseCorners('FN20; 40, -70; EN61').error).toBeNull();
    expect(parseCorners('FN20 FN42').error).toMatch(/at least 3/);
    expect(parseCorners('FN20; nowhere; EN61').error).toMatch(/"nowhere"/);
  });
});

describe('clampWeight', () => {
  it('says when a weight is clamped or rounded, and refuses what is not a number', async () => {
    const { clampWeight } = await import('./targets.svelte.ts');
    expect(clampWeight(1e6)).toEqual({
      weight: 100,
      note: '1000000 is more than the largest weight: set to 100',
    });
    expect(clampWeight(-2)).toEqual({ weight: 0, note: 'a weight cannot be negative: -2 set to 0' });
    expect(clampWeight(2.25)).toEqual({ weight: 2.3, note: 'rounded to 2.3' });
    expect(clampWeight(3)).toEqual({ weight: 3, note: '' });
    expect(clampWeight(Number.NaN)).toBeNull();
  });
});
