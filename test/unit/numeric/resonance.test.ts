/**
 * The one trim routine (trimToResonance) and the one SWR-edge routine (swrEdges), against
 * closed forms computed in the test.
 */
import { describe, expect, it } from 'vitest';
import { trimToResonance } from '../../../core/numeric/roots.ts';
import { swrEdges, swrOf, SWR_CAP } from '../../../core/em/swr.ts';

describe('trimToResonance', () => {
  it('finds the zero of a smooth rising curve from either side, inside the limits', () => {
    // A half-wave dipole's reactance rises with its length; a stand-in with its zero at 40.
    const f = (x: number): number => 3 * (x - 40) + 0.05 * (x - 40) ** 2;
    for (const start of [30, 38, 41, 55]) {
      const r = trimToResonance(f, { start, min: 20, max: 60, fTol: 1e-3, xTol: 1e-6, maxEvaluations: 20 });
      expect(r.resonant).toBe(true);
      expect(Math.abs(r.x - 40)).toBeLessThan(1e-3);
      expect(r.steps.length).toBeLessThanOrEqual(20);
    }
  });

  it('says not resonant, keeping every step, when the zero lies outside the limits', () => {
    const f = (x: number): number => x - 100;
    const r = trimToResonance(f, { start: 10, min: 5, max: 20, fTol: 1e-3, xTol: 1e-6, maxEvaluations: 8 });
    expect(r.resonant).toBe(false);
    expect(r.bracketed).toBe(false);
    expect(r.x).toBe(20); // the limit nearest the zero
  });

  it('brackets a pole (a sign change through infinity) but does not call it a zero', () => {
    // Sign change at x = 1 with |f| large there; the first two points (0.99, 1.0197) straddle it.
    const f = (x: number): number => 1 / (x - 1);
    const r = trimToResonance(f, {
      start: 0.99,
      min: 0.5,
      max: 1.5,
      fTol: 1e-3,
      xTol: 1e-9,
      maxEvaluations: 80,
    });
    expect(r.bracketed).toBe(true);
    expect(r.resonant).toBe(false);
    expect(Math.abs(r.fx)).toBeGreaterThan(1e3);
  });

  it('stays within its evaluation budget', () => {
    let n = 0;
    const f = (x: number): number => (n++, Math.atan(x - 3.3) + 1e-3 * Math.sin(40 * x));
    const r = trimToResonance(f, { start: 1, min: 0, max: 10, fTol: 1e-12, xTol: 1e-15, maxEvaluations: 6 });
    expect(n).toBeLessThanOrEqual(6);
    expect(r.steps.length).toBe(n);
  });
});

describe('swrOf and swrEdges', () => {
  it('SWR of a matched, a mismatched and a reactive load (Pozar, Microwave Engineering, 4th ed., eqs. 2.35, 2.41)', () => {
    expect(swrOf(50, 0, 50)).toBeCloseTo(1, 12);
    expect(swrOf(100, 0, 50)).toBeCloseTo(2, 12);
    expect(swrOf(25, 0, 50)).toBeCloseTo(2, 12);
    // Γ = (Z − Z0)/(Z + Z0) by hand for 30 + j40 on 50 Ω.
    const g = Math.hypot(-20, 40) / Math.hypot(80, 40);
    expect(swrOf(30, 40, 50)).toBeCloseTo((1 + g) / (1 - g), 12);
    expect(swrOf(0, 10, 50)).toBe(SWR_CAP);
  });

  it('finds the 2:1 edges of a series RLC resonator where its reactance is ±Z0/√8', () => {
    // Series R = 50 Ω, L, C resonant at 3.55 MHz: Γ = jX/(100 + jX), SWR = 2 where |Γ| = 1/3,
    // X² = 100²/8. Each edge solves ωL − 1/(ωC) = ±X, a quadratic in ω.
    const f0 = 3.55e6;
    const L = 100e-6; // 2:1 edges near ±0.8 %
    const w0 = 2 * Math.PI * f0;
    const C = 1 / (w0 * w0 * L);
    const z = (f: number): [number, number] => {
      const w = 2 * Math.PI * f;
      return [50, w * L - 1 / (w * C)];
    };
    const X = 100 / Math.sqrt(8);
    const edge = (s: 1 | -1): number => {
      const b = -s * X;
      const w = (-b + Math.sqrt(b * b + (4 * L) / C)) / (2 * L);
      return w / (2 * Math.PI);
    };
    const swrAt = (f: number): number => swrOf(...z(f), 50);
    const fs = Array.from({ length: 41 }, (_, k) => f0 * (1 + (k - 20) * 0.002));
    const r = swrEdges(swrAt, fs, fs.map(swrAt), 2, 1e-3, f0);
    expect(Math.abs(r.lowerHz! - edge(-1))).toBeLessThan(1);
    expect(Math.abs(r.upperHz! - edge(1))).toBeLessThan(1);
    // Sampled too narrowly, the edges stay open (null) rather than invented.
    const near = fs.slice(18, 23);
    const open = swrEdges(swrAt, near, near.map(swrAt), 2, 1e-3, f0);
    expect(open.lowerHz).toBeNull();
    expect(open.upperHz).toBeNull();
  });
});
