/**
 * The take-off distribution (core/paths/takeoff.ts): normalisation, the trends the model must
 * show, the user's own window, and its use in the score.
 */
import { describe, expect, it } from 'vitest';
import { BANDS } from '../../../core/project/schema.ts';
import { planPaths } from '../../../core/paths/index.ts';
import {
  MIN_TAKEOFF_ELEVATION_DEG,
  TAKEOFF_MODEL_ID,
  USER_WINDOW_MODEL_ID,
  pathModes,
  takeoffDistribution,
} from '../../../core/paths/takeoff.ts';
import {
  PATTERN_GRID,
  compileDirections,
  compiledGainDbi,
  distributionGainDbi,
} from '../../../core/rank/pattern.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';

const sum = (xs: readonly { weight: number }[]): number => xs.reduce((s, x) => s + x.weight, 0);
const meanElevation = (xs: readonly { elevationDeg: number; weight: number }[]): number =>
  xs.reduce((s, x) => s + x.weight * x.elevationDeg, 0);

describe('take-off distribution', () => {
  const project = buildDemoProject();
  const paths = planPaths(project.station!, project.targets);

  it('has weights summing to 1 for every region and band, in directions and in the 1° bins', () => {
    for (const p of paths) {
      for (const band of BANDS) {
        const t = p.takeoff[band];
        expect(t.model).toBe(TAKEOFF_MODEL_ID);
        expect(Math.abs(sum(t.directions) - 1)).toBeLessThan(1e-12);
        expect(Math.abs(sum(t.weights) - 1)).toBeLessThan(1e-12);
        expect(t.weights.every((w) => w.weight > 0 && Number.isFinite(w.elevationDeg))).toBe(true);
        expect(t.p10Deg).toBeLessThanOrEqual(t.medianDeg);
        expect(t.medianDeg).toBeLessThanOrEqual(t.p90Deg);
      }
    }
  });

  it('never goes below the minimum take-off angle and has at least three hop counts per layer height', () => {
    for (const dKm of [800, 2500, 6000, 9000, 14000]) {
      for (const band of BANDS) {
        const { modes } = pathModes(dKm * 1000, { '160m': 1.83e6, '80m': 3.55e6, '40m': 7.05e6 }[band]);
        expect(modes.every((m) => m.elevationDeg >= MIN_TAKEOFF_ELEVATION_DEG - 1e-9)).toBe(true);
        // On 40 m below 6000 km the highest 300 km modes climb above about 30°, where the night F2
        // does not reflect 7 MHz (secant law); the gate is tested on its own below.
        if (band === '40m' && dKm < 6000) continue;
        const f2 = modes.filter((m) => m.layer === 'F2' && m.layerHeightM === 300_000).map((m) => m.hops);
        // At 300 km all three F2 modes pass the secant-law gate at these distances.
        expect(f2.length).toBe(3);
        expect(f2[1] - f2[0]).toBe(1);
        expect(f2[2] - f2[1]).toBe(1);
      }
    }
  });

  it('moves lower as the path gets longer (mean angle at 2D below that at D, 1000–8000 km)', () => {
    // On 40 m below 2500 km the secant-law gate removes the high modes of the shorter path, so the
    // trend there is the other way round (the skip zone); it starts at 2500 km.
    for (const f of [1.83e6, 3.55e6, 7.05e6]) {
      for (let d = f > 5e6 ? 2500 : 1000; d <= 8000; d += 250) {
        const near = meanElevation(pathModes(d * 1000, f).modes);
        const far = meanElevation(pathModes(2 * d * 1000, f).modes);
        expect(far, `${f / 1e6} MHz, ${d} km vs ${2 * d} km`).toBeLessThan(near);
      }
    }
  });

  it('moves lower within one set of hop counts as the path lengthens (no hop count change)', () => {
    // Between 5000 and 5400 km no layer height changes its fewest-hop count at 3.55 MHz.
    const a = pathModes(5_000_000, 3.55e6).modes;
    const b = pathModes(5_400_000, 3.55e6).modes;
    expect(a.map((m) => `${m.layer}${m.layerHeightM}:${m.hops}`)).toEqual(
      b.map((m) => `${m.layer}${m.layerHeightM}:${m.hops}`),
    );
    a.forEach((m, i) => expect(b[i].elevationDeg).toBeLessThan(m.elevationDeg));
  });

  it('weights an extra hop down: at one layer height, more hops carry less weight', () => {
    const { modes } = pathModes(7_000_000, 3.55e6);
    for (const h of [250_000, 300_000, 350_000, 400_000]) {
      const w = modes.filter((m) => m.layerHeightM === h).map((m) => m.weight);
      expect(w[0]).toBeGreaterThan(w[1]);
      expect(w[1]).toBeGreaterThan(w[2]);
    }
  });

  it('uses the E layer on 160 m only (night critical frequency and the secant law)', () => {
    const e160 = pathModes(3_000_000, 1.83e6).modes.filter((m) => m.layer === 'E');
    const e80 = pathModes(3_000_000, 3.55e6).modes.filter((m) => m.layer === 'E');
    const e40 = pathModes(3_000_000, 7.05e6).modes.filter((m) => m.layer === 'E');
    expect(e160.length).toBeGreaterThan(0);
    expect(e80.length).toBe(0);
    expect(e40.length).toBe(0);
  });

  it('drops the secant-law gate only in the skip zone, and says so', () => {
    const near = pathModes(300_000, 7.05e6);
    expect(near.skipped).toBe(true);
    expect(near.modes.length).toBeGreaterThan(0);
    expect(Math.abs(sum(near.modes) - 1)).toBeLessThan(1e-12);
    expect(pathModes(6_000_000, 7.05e6).skipped).toBe(false);
  });

  it('of a region summarises its own directions (median and the 10–90 % span)', () => {
    const t = takeoffDistribution([{ azimuthDeg: 40, distanceM: 7_000_000 }], '80m');
    const sorted = [...t.directions].sort((x, y) => x.elevationDeg - y.elevationDeg);
    let cum = 0;
    const q = (p: number): number => {
      cum = 0;
      for (const d of sorted) {
        cum += d.weight;
        if (cum >= p - 1e-12) return d.elevationDeg;
      }
      return NaN;
    };
    expect(t.medianDeg).toBeCloseTo(q(0.5), 2);
    expect(t.p10Deg).toBeCloseTo(q(0.1), 2);
    expect(t.p90Deg).toBeCloseTo(q(0.9), 2);
  });
});

describe("a region's own window", () => {
  const project = buildDemoProject();

  it('replaces the computed distribution for that region only, on every band', () => {
    const targets = project.targets.map((t, i) =>
      i === 0 ? { ...t, takeoffWindowDeg: [10, 20] as [number, number] } : t,
    );
    const [eu, other] = planPaths(project.station!, targets);
    for (const band of BANDS) {
      const t = eu.takeoff[band];
      expect(t.model).toBe(USER_WINDOW_MODEL_ID);
      expect(t.directions.every((d) => d.elevationDeg >= 10 && d.elevationDeg <= 20)).toBe(true);
      expect(t.weights.map((w) => w.elevationDeg)).toEqual([10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20]);
      expect(Math.abs(sum(t.weights) - 1)).toBeLessThan(1e-12);
      expect(t.medianDeg).toBe(15);
      expect(other.takeoff[band].model).toBe(TAKEOFF_MODEL_ID);
    }
  });

  it('takes a single angle and a fractional top', () => {
    const one = planPaths(project.station!, [
      { regionId: 'japan', weight: 1, takeoffWindowDeg: [12, 12] },
    ])[0];
    expect(one.takeoff['80m'].weights).toEqual([{ elevationDeg: 12, weight: 1 }]);
    const frac = planPaths(project.station!, [
      { regionId: 'japan', weight: 1, takeoffWindowDeg: [5, 7.5] },
    ])[0];
    const els = [...new Set(frac.takeoff['80m'].directions.map((d) => d.elevationDeg))];
    expect(els).toEqual([5, 6, 7, 7.5]);
  });
});

describe('distributionGainDbi', () => {
  const nAz = PATTERN_GRID.azimuthsDeg.length;
  const nEl = PATTERN_GRID.elevationsDeg.length;

  it('returns the gain of a uniform pattern whatever the weights', () => {
    const g = new Array<number>(nAz * nEl).fill(3.5);
    const d = [
      { azimuthDeg: 10, elevationDeg: 5, weight: 0.2 },
      { azimuthDeg: 200, elevationDeg: 25, weight: 0.8 },
    ];
    expect(distributionGainDbi(g, 0, d)).toBeCloseTo(3.5, 12);
  });

  it('averages in power with the weights (two elevation rows at 0 dBi and 10 dBi)', () => {
    const g = new Array<number>(nAz * nEl).fill(0);
    const i20 = PATTERN_GRID.elevationsDeg.indexOf(20);
    for (let a = 0; a < nAz; a++) g[i20 * nAz + a] = 10;
    const d = [
      { azimuthDeg: 30, elevationDeg: 5, weight: 0.75 },
      { azimuthDeg: 30, elevationDeg: 20, weight: 0.25 },
    ];
    // 10·log10(0.75·1 + 0.25·10) = 10·log10(3.25)
    expect(distributionGainDbi(g, 0, d)).toBeCloseTo(10 * Math.log10(3.25), 10);
  });

  it('gives the same value compiled (grouped by azimuth) as direction by direction', () => {
    const g = Array.from({ length: nAz * nEl }, (_, i) => 6 * Math.sin(i * 0.731) + Math.cos(i * 0.0137));
    const project = buildDemoProject();
    for (const p of planPaths(project.station!, project.targets)) {
      for (const rot of [0, 35, 271.5]) {
        const d = p.takeoff['80m'].directions;
        expect(compiledGainDbi(g, rot, compileDirections(d))).toBeCloseTo(distributionGainDbi(g, rot, d), 10);
      }
    }
  });

  it('refuses a set with no weight', () => {
    const g = new Array<number>(nAz * nEl).fill(0);
    expect(() => distributionGainDbi(g, 0, [])).toThrow(/no direction carries weight/);
  });
});
