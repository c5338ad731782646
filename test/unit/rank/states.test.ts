// Switchable directions (core/rank/states.ts): each region is served by its best state, and a
// fixed antenna scores exactly as before (one state).
import { describe, expect, it } from 'vitest';
import { scoreStates, type BaseScorer } from '../../../core/rank/states.ts';

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
});
