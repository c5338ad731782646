// Switchable directions (core/rank/states.ts): each region is served by its best state, and a
// fixed antenna scores exactly as before (one state).
import { describe, expect, it } from 'vitest';
import { scoreStates, statePattern, type BaseScorer } from '../../../core/rank/states.ts';
import { PATTERN_GRID } from '../../../core/rank/pattern.ts';

// An invented pattern scorer over two regions, one north (bearing 0°) and one south (180°): the
// "pattern" beams toward its rotation, 6 dB in the beam and −4 dB behind.
const base: BaseScorer = (_g, rot) => {
  const toward = (bearing: number) => Math.cos(((bearing - rot) * Math.PI) / 180);
  const regionGains = [0, 180].map((b) => 1 + 5 * toward(b));
  return { score: (regionGains[0] * 2 + regionGains[1]) / 3, regionGains };
};

describe('relay states', () => {
  it('a fixed antenna has one state and the base score', () => {
    const r = scoreStates(base, [2, 1], [], 30, {}, 15);
    expect(r.states).toHaveLength(1);
    expect(r.states[0].name).toBe('fixed');
    expect(r.states[0].beamDeg).toBe(45);
    expect(r.score).toBeCloseTo(base([], 30).score, 12);
    expect(r.regionGains).toEqual(base([], 30).regionGains);
  });

  it('a two-state array serves each region from its best state', () => {
    const design = {
      states: [
        { name: 'north', rotationDeg: 0 },
        { name: 'south', rotationDeg: 180 },
      ],
    };
    const r = scoreStates(base, [2, 1], [], 0, design);
    expect(r.states.map((s) => s.beamDeg)).toEqual([0, 180]);
    expect(r.regionGains[0]).toBeCloseTo(6, 12); // north served by 'north'
    expect(r.regionGains[1]).toBeCloseTo(6, 12); // south served by 'south'
    expect(r.score).toBeCloseTo(6, 12);
    expect(r.score).toBeGreaterThan(Math.max(...r.states.map((s) => s.score)));
  });

  it('a mirrored state reads the pattern across its axis (az → 2φ − az) on every elevation row', () => {
    const az = PATTERN_GRID.azimuthsDeg;
    const rows = PATTERN_GRID.elevationsDeg.length;
    // an invented pattern that peaks at 10° on each row, distinct per row
    const g = Array.from({ length: rows * az.length }, (_, i) => {
      const a = az[i % az.length];
      return Math.floor(i / az.length) + Math.cos(((a - 10) * Math.PI) / 180);
    });
    const m = statePattern(g, { name: 'mirrored', rotationDeg: 0, mirrorAxisDeg: 45 });
    const at = (p: readonly number[], row: number, deg: number) => p[row * az.length + az.indexOf(deg)];
    for (const row of [0, 7, rows - 1]) {
      expect(at(m, row, 80)).toBeCloseTo(at(g, row, 10), 12); // the peak moves to 2·45 − 10
      expect(at(m, row, 90)).toBeCloseTo(at(g, row, 0), 12);
      expect(at(m, row, 270)).toBeCloseTo(at(g, row, 180), 12);
    }
    expect(statePattern(g, { name: 'turned', rotationDeg: 90 })).toBe(g);
    // beam bearing of the mirrored state: canonical north mirrored (90°) plus the placement's 30°
    const r = scoreStates(base, [1, 1], g, 30, {
      states: [
        { name: 'one', rotationDeg: 0 },
        { name: 'two', rotationDeg: 0, mirrorAxisDeg: 45 },
      ],
    });
    expect(r.states.map((s) => s.beamDeg)).toEqual([30, 120]);
  });

  it('a state of another phasing reads its own solved pattern, and its beam bearing', () => {
    const n = PATTERN_GRID.azimuthsDeg.length * PATTERN_GRID.elevationsDeg.length;
    const g = Array.from({ length: n }, () => 1);
    const v = Array.from({ length: n }, () => 2);
    const s = { name: 'broadside', rotationDeg: 0, variant: 1, beamDeg: 90 };
    expect(statePattern(g, s, [v])).toBe(v);
    expect(() => statePattern(g, s, [])).toThrow(/variant 1/);
    // the scorer sees the variant's pattern: here the base scorer reads only the rotation, so the
    // beam bearing is what is checked (canonical 90° plus the placement's 30°)
    const r = scoreStates(base, [1, 1], g, 30, { states: [{ name: 'one', rotationDeg: 0 }, s] }, 0, [v]);
    expect(r.states.map((x) => x.beamDeg)).toEqual([30, 120]);
    const seen: (readonly number[])[] = [];
    scoreStates(
      (gain, rot) => {
        seen.push(gain);
        return base(gain, rot);
      },
      [1, 1],
      g,
      0,
      { states: [{ name: 'one', rotationDeg: 0 }, s] },
      0,
      [v],
    );
    expect(seen).toEqual([g, v]);
  });
});
