// The L-network design (core/match/lNetwork.ts) against the closed-form design formulas of
// Pozar, Microwave Engineering, 4th ed. (2012), §5.1, eq. (5.3a, b) and (5.6a, b)
// (core/REFERENCES.md §12), written out again here apart from the code; and a physical check that
// does not use the formulas at all: the network with the load behind it presents Z0 to the line.
import { describe, expect, it } from 'vitest';
import { expectClose, expectRelClose } from '../../helpers/expectClose.ts';
import {
  DEFAULT_Q,
  designLNetworks,
  lNetworkLossDb,
  shuntCoilMatch,
  transformerMatch,
} from '../../../core/match/lNetwork.ts';
import { candidateMatching } from '../../../core/match/candidateMatch.ts';

const POZAR = 'Pozar, Microwave Engineering, 4th ed., §5.1 eq. (5.3)/(5.6) (core/REFERENCES.md §12)';
const CIRCUIT =
  'series/parallel impedance of the network with the load (circuit law, no formula from the design)';
/** Relative tolerance of a closed form computed twice in double precision. */
const REL_FORMULA = 1e-12;
/** Ohms: the input of a lossless network against Z0. */
const TOL_ZIN_OHM = 1e-9;

/** Pozar (5.3a, b), R_L > Z0: the two solutions (B, X). */
function pozar53(RL: number, XL: number, Z0: number): [number, number][] {
  const out: [number, number][] = [];
  for (const sign of [1, -1]) {
    const B = (XL + sign * Math.sqrt(RL / Z0) * Math.sqrt(RL ** 2 + XL ** 2 - Z0 * RL)) / (RL ** 2 + XL ** 2);
    const X = 1 / B + (XL * Z0) / RL - Z0 / (B * RL);
    out.push([B, X]);
  }
  return out;
}

/** Pozar (5.6a, b), R_L < Z0: the two solutions (B, X). */
function pozar56(RL: number, XL: number, Z0: number): [number, number][] {
  return [1, -1].map((sign) => [
    (sign * Math.sqrt((Z0 - RL) / RL)) / Z0,
    sign * Math.sqrt(RL * (Z0 - RL)) - XL,
  ]);
}

/** Input impedance by plain complex arithmetic: series jX then shunt jB, in the order given. */
function zIn(RL: number, XL: number, B: number, X: number, shuntNextToLoad: boolean): [number, number] {
  const div = (a: number, b: number, c: number, d: number): [number, number] => {
    const m = c * c + d * d;
    return [(a * c + b * d) / m, (b * c - a * d) / m];
  };
  if (shuntNextToLoad) {
    // Y = 1/Z_L + jB; Z = 1/Y + jX
    const [gy, by] = div(1, 0, RL, XL);
    const [r, x] = div(1, 0, gy, by + B);
    return [r, x + X];
  }
  // Z1 = Z_L + jX; Y = 1/Z1 + jB; Z = 1/Y
  const [gy, by] = div(1, 0, RL, XL + X);
  return div(1, 0, gy, by + B);
}

const F_HZ = 1.83e6;
const W = 2 * Math.PI * F_HZ;
const Z0 = 50;

const ohms = (r: number, x: number): [number, number] => [r, x];

/** One test per load R_L + jX_L: the L-network designs for it, which must be two (both arrangements). */
function eachLoad(
  loads: [number, number][],
  check: (RL: number, XL: number, designs: ReturnType<typeof designLNetworks>) => void,
): void {
  for (const [RL, XL] of loads)
    it(`matches ${RL} ${XL < 0 ? '−' : '+'} j${Math.abs(XL)} Ω with both arrangements`, () => {
      const designs = designLNetworks([RL, XL], F_HZ, Z0);
      expect(designs).toHaveLength(2);
      check(RL, XL, designs);
    });
}

describe('L-network: R_L < Z0 (a 160 m inverted-L near 25 Ω)', () => {
  // Loads like the demo's 160 m inverted-Ls (22–29 Ω) and a vertical with reactance left.
  eachLoad([ohms(22, 0), ohms(25, 12), ohms(29, -35), ohms(12.5, 80)], (RL, XL, designs) => {
    const expected = pozar56(RL, XL, Z0);
    for (const [B, X] of expected) {
      const d = designs.find((x) => Math.sign(x.susceptanceS) === Math.sign(B))!;
      expect(d.nextToAntenna).toBe('series');
      expectRelClose(d.susceptanceS, B, REL_FORMULA, POZAR);
      expectRelClose(d.reactanceOhm, X, REL_FORMULA, POZAR);
      // Component values from the reactances: L = X/ω, C = −1/(ωX) (series); shunt reactance −1/B.
      const series = d.components.find((k) => k.position === 'series')!;
      const shunt = d.components.find((k) => k.position === 'shunt')!;
      if (X > 0) expectRelClose(series.value, (X / W) * 1e6, REL_FORMULA, 'L = X/ω');
      else expectRelClose(series.value, (-1 / (W * X)) * 1e12, REL_FORMULA, 'C = −1/(ωX)');
      if (B > 0) expectRelClose(shunt.value, (B / W) * 1e12, REL_FORMULA, 'C = B/ω');
      else expectRelClose(shunt.value, (-1 / (W * B)) * 1e6, REL_FORMULA, 'L = −1/(ωB)');
      const [r, x] = zIn(RL, XL, B, X, false);
      expectClose(r, Z0, TOL_ZIN_OHM, CIRCUIT);
      expectClose(x, 0, TOL_ZIN_OHM, CIRCUIT);
    }
  });
});

describe('L-network: R_L > Z0', () => {
  eachLoad([ohms(115, 0), ohms(200, -150), ohms(80, 60)], (RL, XL, designs) => {
    for (const [B, X] of pozar53(RL, XL, Z0)) {
      const d = designs.find((x) => Math.abs(x.susceptanceS - B) <= 1e-12 * Math.abs(B))!;
      expect(d, `solution B = ${B}`).toBeDefined();
      expect(d.nextToAntenna).toBe('shunt');
      expectRelClose(d.reactanceOhm, X, REL_FORMULA, POZAR);
      const [r, x] = zIn(RL, XL, B, X, true);
      expectClose(r, Z0, TOL_ZIN_OHM, CIRCUIT);
      expectClose(x, 0, TOL_ZIN_OHM, CIRCUIT);
    }
  });
});

describe('L-network: R_L = Z0', () => {
  it('is one series part that cancels the reactance', () => {
    const d = designLNetworks([50, 30], F_HZ, Z0);
    expect(d).toHaveLength(1);
    expect(d[0]!.components).toHaveLength(1);
    expect(d[0]!.components[0]!.kind).toBe('capacitor');
    expectRelClose(d[0]!.components[0]!.value, (1 / (W * 30)) * 1e12, REL_FORMULA, 'C = 1/(ωX_L)');
    const [r, x] = zIn(50, 30, 0, d[0]!.reactanceOhm, false);
    expectClose(r, Z0, TOL_ZIN_OHM, CIRCUIT);
    expectClose(x, 0, TOL_ZIN_OHM, CIRCUIT);
    expect(d[0]!.lossDb).toBeGreaterThan(0);
  });
});

describe('loss at a stated Q', () => {
  it('is zero for lossless parts, positive and falling as Q rises', () => {
    const [d] = designLNetworks([22, 0], F_HZ, Z0);
    const lossAt = (q: number): number =>
      lNetworkLossDb({ re: 22, im: 0 }, d!.susceptanceS, d!.reactanceOhm, 'series', {
        inductor: q,
        capacitor: q,
      });
    expect(lossAt(1e12)).toBeLessThan(1e-9);
    expect(lossAt(100)).toBeGreaterThan(lossAt(200));
    expect(lossAt(200)).toBeGreaterThan(0);
  });

  it('equals the coil loss X/(Q R_L) when only the series coil is lossy', () => {
    // Lossless-capacitor case, by circuit law (no formula from the design): the series coil
    // carries the load current I, so it loses I²·X/Q_u against I²·R_L in the load, a ratio of
    // X/(Q_u R_L) = Q_n/Q_u with Q_n = X/R_L = √(Z0/R_L − 1) for a resistive load.
    const RL = 22;
    const qu = 200;
    const d = designLNetworks([RL, 0], F_HZ, Z0, { inductor: qu, capacitor: 1e15 }).find(
      (x) => x.reactanceOhm > 0,
    )!;
    const qn = Math.sqrt(Z0 / RL - 1);
    expectClose(
      d.lossDb,
      10 * Math.log10(1 + qn / qu),
      1e-9,
      'series-resistance loss of the coil, X/(Q R_L)',
    );
  });
});

describe('ground-mounted vertical alternatives', () => {
  it('shunt coil: the shortened vertical and the coil present Z0', () => {
    const R = 25;
    const m = shuntCoilMatch(R, F_HZ, Z0)!;
    const Xa = m.targetReactanceOhm;
    expect(Xa).toBeLessThan(0);
    // Antenna R + jXa in parallel with the coil jωL.
    const XL = m.coil.reactanceOhm;
    const [gy, by] = [R / (R * R + Xa * Xa), -Xa / (R * R + Xa * Xa)];
    const b = by - 1 / XL;
    const zr = gy / (gy * gy + b * b);
    const zx = -b / (gy * gy + b * b);
    expectClose(zr, Z0, 1e-9, CIRCUIT);
    expectClose(zx, 0, 1e-9, CIRCUIT);
    expectRelClose(m.coil.value, (XL / W) * 1e6, REL_FORMULA, 'L = X/ω');
    expect(m.lossDb).toBeGreaterThan(0);
    expect(shuntCoilMatch(60, F_HZ, Z0)).toBeNull();
  });

  it('transformer: the nearest commonly sold ratio', () => {
    expect(transformerMatch(25)!.ratio).toBe(2);
    expectClose(transformerMatch(25)!.swrAfter, 1, 1e-12, 'Z0 / (2 · 25 Ω)');
    expect(transformerMatch(12)!.ratio).toBe(4);
    expect(transformerMatch(35)!.ratio).toBe(1.5);
  });
});

describe('candidate matching', () => {
  const feed = (r: number, x: number, swr: number) => ({
    zOhm: [r, x] as [number, number],
    swr,
    z0Ohm: 50,
    freqMHz: 1.83,
  });
  it('designs none for a feed already near 50 Ω', () => {
    expect(candidateMatching({ feed: feed(48, 5, 1.13), groundSystem: { kind: 'none' } })).toBeNull();
  });
  it('designs an L-network with values and loss, and the vertical alternatives with radials', () => {
    const m = candidateMatching({ feed: feed(24, 0, 2.08), groundSystem: { kind: 'radials' } })!;
    expect(m.network).toMatch(/^L-network/);
    expect(m.components).toHaveLength(2);
    for (const k of m.components) expect(k.value).toBeGreaterThan(0);
    expect(m.lossDb).toBeGreaterThan(0);
    expect(m.q).toEqual(DEFAULT_Q);
    expect(m.arrangements).toHaveLength(2);
    expect(m.vertical?.shuntCoil).not.toBeNull();
    expect(m.vertical?.transformer?.ratio).toBe(2);
    const wire = candidateMatching({ feed: feed(24, 0, 2.08), groundSystem: { kind: 'none' } })!;
    expect(wire.vertical).toBeNull();
  });
});
