// Plot scaling: linear scales, round ticks, the gain axis, compass-polar points and wedges, and
// pattern cuts read through the core's interpolation with the placement's rotation.
import { describe, expect, it } from 'vitest';
import { PATTERN_GRID } from '../../../core/rank/pattern.ts';
import { arcWidthDeg, gainAxis, linePath, linearScale, niceTicks, polar, wedgePath } from './scale.ts';
import { azimuthCut, azimuthWins, elevationCut, sweepFrequenciesHz } from './patternData.ts';

/** A canonical test pattern (invented): strongest toward canonical azimuth 90°, falling with elevation. */
function testPattern(peakAz = 90): number[] {
  const { azimuthsDeg: azs, elevationsDeg: els } = PATTERN_GRID;
  const g: number[] = [];
  for (const el of els)
    for (const az of azs) g.push(8 * Math.cos(((az - peakAz) * Math.PI) / 360) ** 2 - el / 9);
  return g;
}

describe('linear scales and ticks', () => {
  it('maps and inverts, including a reversed range (y grows down)', () => {
    const y = linearScale([-20, 10], [200, 20]);
    expect(y(-20)).toBe(200);
    expect(y(10)).toBe(20);
    expect(y(-5)).toBe(110);
    expect(y.invert(110)).toBeCloseTo(-5, 12);
  });
  it('gives round ticks that cover the domain', () => {
    expect(niceTicks(0, 90, 6)).toEqual([0, 20, 40, 60, 80]);
    expect(niceTicks(3.5, 4.0, 5)).toEqual([3.5, 3.6, 3.7, 3.8, 3.9, 4]);
    expect(niceTicks(-22, 8, 3)).toEqual([-20, -10, 0]);
    expect(niceTicks(5, 5)).toEqual([5]);
  });
  it('puts the top of the gain axis just above the peak, a fixed span below', () => {
    expect(gainAxis([1.2, 6.9, -40])).toEqual({ min: -22, max: 8 });
    expect(gainAxis([7.9])).toEqual({ min: -20, max: 10 });
    expect(gainAxis([Number.NaN, -Infinity])).toEqual({ min: -30, max: 0 });
  });
});

describe('compass-polar geometry', () => {
  it('puts north up and east right', () => {
    const [nx, ny] = polar(100, 100, 50, 0);
    const [ex, ey] = polar(100, 100, 50, 90);
    expect(nx).toBeCloseTo(100, 9);
    expect(ny).toBeCloseTo(50, 9);
    expect(ex).toBeCloseTo(150, 9);
    expect(ey).toBeCloseTo(100, 9);
  });
  it('measures arcs clockwise and across north', () => {
    expect(arcWidthDeg(350, 20)).toBe(30);
    expect(arcWidthDeg(20, 350)).toBe(330);
  });
  it('draws a wedge across north with the short-arc flag and widens a zero-width span', () => {
    const w = wedgePath(0, 0, 10, 20, 350, 20);
    expect(w).toMatch(/A20,20 0 0 1/);
    const narrow = wedgePath(0, 0, 10, 20, 45, 45, 4);
    const [x0] = polar(0, 0, 20, 43);
    expect(narrow.startsWith(`M${Math.round(x0 * 100) / 100}`)).toBe(true);
    expect(
      linePath(
        [
          [0, 0],
          [1, 2],
        ],
        true,
      ),
    ).toBe('M0,0L1,2Z');
  });
});

describe('pattern cuts through the core', () => {
  it('rotates with the placement: a pattern peaking at canonical 90° placed at +30° peaks at 120°', () => {
    const p = { gainDbi: testPattern(), rotationDeg: 30 };
    const cut = azimuthCut(p, 10, 2);
    expect(cut).toHaveLength(180);
    const best = cut.reduce((a, b) => (b.gainDbi > a.gainDbi ? b : a));
    expect(best.azimuthDeg).toBe(120);
    const el = elevationCut(p, 120);
    expect(el.map((x) => x.elevationDeg)).toEqual(PATTERN_GRID.elevationsDeg);
    expect(el[0]!.gainDbi).toBeGreaterThan(el.at(-1)!.gainDbi);
  });
  it('counts the degrees of azimuth where each pattern wins', () => {
    const a = { gainDbi: testPattern(0), rotationDeg: 0 };
    const b = { gainDbi: testPattern(0), rotationDeg: 180 };
    const w = azimuthWins(a, b, 10, 0.5);
    expect(w.aBetterDeg + w.bBetterDeg + w.tiedDeg).toBe(360);
    expect(w.aBetterDeg).toBe(w.bBetterDeg);
    expect(azimuthWins(a, a, 10).tiedDeg).toBe(360);
  });
  it('sweeps a band edge to edge', () => {
    const f = sweepFrequenciesHz('80m', 6);
    expect(f[0]).toBe(3.5e6);
    expect(f.at(-1)).toBeCloseTo(4.0e6, 3);
    expect(f).toHaveLength(6);
  });
});
