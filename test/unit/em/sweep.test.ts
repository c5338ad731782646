// Sweeps, SWR bandwidth and trimming (core/em/sweep.ts), checked against direct solves.
import { describe, it, expect } from 'vitest';
import { sweepImpedance, swrBandwidth, trimDimension } from '../../../core/em/sweep.ts';
import { evaluateAntenna, swrOf } from '../../../core/em/evaluate.ts';
import type { AntennaModel } from '../../../core/em/types.ts';

const dipole = (len: number): AntennaModel => ({
  wires: [{ from: [-len / 2, 0, 12], to: [len / 2, 0, 12], radiusM: 0.001 }],
  feeds: [{ wire: 0, position: 0.5 }],
  ground: { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 },
});
const freqs = Array.from({ length: 31 }, (_, i) => 6.8e6 + i * 0.02e6);

describe('sweeps', () => {
  it('a direct sweep equals separate evaluations', () => {
    const s = sweepImpedance(dipole(20.1), [7.0e6, 7.1e6, 7.2e6]);
    const e = evaluateAntenna(dipole(20.1), {
      frequenciesHz: [7.0e6, 7.1e6, 7.2e6],
      pattern: { elevationsDeg: [], azimuthsDeg: [] },
    });
    s.points.forEach((p, i) => {
      expect(p.impedanceOhm.re).toBeCloseTo(e.frequencies[i].feeds[0].impedanceOhm[0], 9);
      expect(p.impedanceOhm.im).toBeCloseTo(e.frequencies[i].feeds[0].impedanceOhm[1], 9);
    });
  });
  it('an interpolated sweep solves fewer points and reports its error honestly', () => {
    const direct = sweepImpedance(dipole(20.1), freqs);
    const inter = sweepImpedance(dipole(20.1), freqs, { anchorEvery: 3 });
    expect(inter.solves).toBeLessThan(direct.solves / 2); // 11 anchors + 1 check for 31 points
    expect(inter.interpolationError).not.toBeNull();
    let worst = 0;
    inter.points.forEach((p, i) => {
      const d = direct.points[i].impedanceOhm;
      worst = Math.max(
        worst,
        Math.hypot(p.impedanceOhm.re - d.re, p.impedanceOhm.im - d.im) / Math.hypot(d.re, d.im),
      );
    });
    expect(worst).toBeLessThan(1e-3); // measured 4e-4 (an anchor every 60 kHz on 40 m)
    // the reported figure is of the same order as the true worst error
    expect(inter.interpolationError!).toBeGreaterThan(worst / 3);
  });
});

describe('SWR bandwidth', () => {
  it('finds the 2:1 crossings between samples', () => {
    const bw = swrBandwidth(dipole(20.1), freqs, { ratio: 2 });
    expect(bw.lowerHz).not.toBeNull();
    expect(bw.upperHz).not.toBeNull();
    const check = sweepImpedance(dipole(20.1), [bw.lowerHz!, bw.upperHz!]);
    for (const p of check.points)
      expect(Math.abs(swrOf(p.impedanceOhm.re, p.impedanceOhm.im, 50) - 2)).toBeLessThan(1e-3);
    expect(bw.bandwidthHz!).toBeGreaterThan(0);
  });
});

describe('trimming', () => {
  it('trims a dipole to zero reactance and to lowest SWR', () => {
    const t = trimDimension({ build: dipole, range: [18, 22], frequencyHz: 7.1e6, target: 'zero-reactance' });
    expect(Math.abs(t.impedanceOhm.im)).toBeLessThan(0.05);
    expect(t.value).toBeGreaterThan(19);
    expect(t.value).toBeLessThan(21);
    const m = trimDimension({ build: dipole, range: [18, 22], frequencyHz: 7.1e6, target: 'min-swr' });
    for (const d of [-0.05, 0.05]) {
      const z = sweepImpedance(dipole(m.value + d), [7.1e6]).points[0];
      expect(z.swr).toBeGreaterThanOrEqual(m.swr - 1e-6);
    }
  });
  it('trims the top length of a half-square given as a wires callback', () => {
    const wires = (top: number) => [
      { from: [0, 0, 2.5] as const, to: [0, 0, 23.5] as const, radiusM: 0.001 },
      { from: [0, 0, 23.5] as const, to: [top, 0, 23.5] as const, radiusM: 0.001 },
      { from: [top, 0, 23.5] as const, to: [top, 0, 2.5] as const, radiusM: 0.001 },
    ];
    const t = trimDimension({
      build: wires,
      base: {
        feeds: [{ wire: 1, position: 0 }],
        ground: { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 },
      },
      range: [38, 46],
      frequencyHz: 3.6e6,
      target: 'zero-reactance',
    });
    expect(Math.abs(t.impedanceOhm.im)).toBeLessThan(0.05);
    expect(t.value).toBeGreaterThan(40);
    expect(t.value).toBeLessThan(44);
  });
});
