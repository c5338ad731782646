// Feed networks solved together with the wires (core/em/network.ts), checked against sources
// computed here, each named beside its check (core/REFERENCES.md §2, §15):
//  - the transmission-line equations (Pozar, Microwave Engineering, 4th ed., §2.3, §2.7);
//  - reciprocity of the network-plus-wires system (Harrington, Time-Harmonic Electromagnetic
//    Fields, 1961, §3-8);
//  - power balance with lossy lines (power conservation; the far field integrated on its own);
//  - mutual impedance of two λ/4 monopoles over perfect ground = half of Carter's closed form for
//    two λ/2 dipoles (image theory, Balanis, Antenna Theory, 3rd ed., §4.7; Carter 1932 via the
//    registry's Si/Ci, @stdlib/math-base-special-sici);
//  - the pattern of two forced-current elements = element pattern × array factor (Kraus,
//    Antennas, 2nd ed., 1988, ch. 4, two-element arrays and pattern multiplication).
// Wavelength 1 m (F_LAMBDA_1M) so lengths read in wavelengths.
import { describe, expect, it } from 'vitest';
import sici from '@stdlib/math-base-special-sici';
import { c, cAbs, cAbs2, cAdd, cDiv, cMul, cSub, type Complex } from '../../../core/numeric/complex.ts';
import { evaluateAntenna } from '../../../core/em/evaluate.ts';
import type { AntennaModel, WireSpec } from '../../../core/em/types.ts';
import type { NetworkElement, NetworkSpec } from '../../../core/em/network.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../../core/units/index.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { F_LAMBDA_1M, NO_PATTERN } from './helpers.ts';

const POZAR =
  'transmission-line equations, Pozar, Microwave Engineering, 4th ed., §2.3/§2.7 (core/REFERENCES.md §15)';
const RECIP = 'reciprocity, Harrington, Time-Harmonic EM Fields (1961) §3-8';
const CARTER =
  "half of Carter's closed form (Carter 1932; Balanis §4.7 image theory; core/REFERENCES.md §2) via stdlib Si/Ci";
const KRAUS = 'pattern multiplication, Kraus, Antennas, 2nd ed., ch. 4 (two-element array)';

const VF = 0.66;
const Z0 = 50;

const dipole = (x: number, len = 0.48, radiusM = 1e-4): WireSpec => ({
  from: [x, 0, -len / 2],
  to: [x, 0, len / 2],
  radiusM,
  material: 'perfect',
});

function solve(model: AntennaModel) {
  return evaluateAntenna(model, { frequenciesHz: [F_LAMBDA_1M], pattern: NO_PATTERN }).frequencies[0];
}

/** Zin of a line of length ℓ, Z0, γ = α + jβ terminated in ZL (Pozar §2.7, computed here). */
function lineInput(zl: Complex, lengthM: number, alphaNpPerM: number): Complex {
  const beta = (2 * Math.PI * F_LAMBDA_1M) / (VF * SPEED_OF_LIGHT_M_PER_S);
  const a = alphaNpPerM * lengthM;
  const b = beta * lengthM;
  // tanh(a + jb) = (sinh 2a + j sin 2b)/(cosh 2a + cos 2b)
  const den = Math.cosh(2 * a) + Math.cos(2 * b);
  const th = c(Math.sinh(2 * a) / den, Math.sin(2 * b) / den);
  const num = cAdd(zl, cMul(c(Z0), th));
  const dn = cAdd(c(Z0), cMul(zl, th));
  return cMul(c(Z0), cDiv(num, dn));
}

describe('a line between a source and the wires', () => {
  const quarter = (VF * SPEED_OF_LIGHT_M_PER_S) / F_LAMBDA_1M / 4;
  const bare = solve({
    wires: [dipole(0)],
    feeds: [{ wire: 0, position: 0.5 }],
    ground: { kind: 'free-space' },
  });
  const zl = c(bare.feeds[0].impedanceOhm[0], bare.feeds[0].impedanceOhm[1]);

  function throughLine(lengthM: number, lossDbPer100m: number) {
    const line: NetworkElement = {
      kind: 'line',
      a: 'g',
      b: 'e',
      lengthM,
      z0Ohm: Z0,
      velocityFactor: VF,
      lossDbPer100m,
    };
    return solve({
      wires: [dipole(0)],
      feeds: [{ wire: 0, position: 0.5 }],
      ground: { kind: 'free-space' },
      network: {
        portNodes: ['e'],
        elements: [line],
        sources: [{ node: 'g', kind: 'voltage', value: [1, 0] }],
      },
    });
  }

  it('a lossless quarter-wave line inverts the load: Zin = Z0²/ZL', () => {
    const r = throughLine(quarter, 0);
    const zin = c(r.sources[0].impedanceOhm[0], r.sources[0].impedanceOhm[1]);
    const expected = cDiv(c(Z0 * Z0), zl);
    expectClose(zin.re, expected.re, 1e-6 * cAbs(expected), POZAR);
    expectClose(zin.im, expected.im, 1e-6 * cAbs(expected), POZAR);
    // the element itself still sees its own impedance
    expectClose(r.feeds[0].impedanceOhm[0], zl.re, 1e-6 * cAbs(zl), 'same wires, same port impedance');
  });

  for (const [lengthM, dbPer100m] of [
    [quarter, 3],
    [0.37, 6],
    [1.3, 2],
  ] as const) {
    it(`a lossy line of ${lengthM.toFixed(3)} λ, ${dbPer100m} dB/100 m transforms and dissipates as the line equations say`, () => {
      const r = throughLine(lengthM, dbPer100m);
      const alpha = dbPer100m / 100 / (20 / Math.LN10);
      const expected = lineInput(zl, lengthM, alpha);
      const zin = c(r.sources[0].impedanceOhm[0], r.sources[0].impedanceOhm[1]);
      expectClose(cAbs(cSub(zin, expected)), 0, 1e-6 * cAbs(expected), POZAR);
      // power delivered to the load over power into the line, real Z0:
      // (1 − |Γ|²) e^{−2αℓ} / (1 − |Γ|² e^{−4αℓ}), Γ at the load
      const g2 = cAbs2(cDiv(cSub(zl, c(Z0)), cAdd(zl, c(Z0))));
      const ratio = ((1 - g2) * Math.exp(-2 * alpha * lengthM)) / (1 - g2 * Math.exp(-4 * alpha * lengthM));
      const pin = r.inputPowerW;
      const pPort = pin - r.networkLossW;
      expectClose(pPort / pin, ratio, 1e-6, POZAR);
      expect(r.networkLossW).toBeGreaterThan(0);
    });
  }
});

/** Two parallel dipoles fed from two generator nodes through a hybrid, lines and a transformer. */
function twoPortArray(v1: Complex, v2: Complex, extra: NetworkElement[] = []): AntennaModel {
  const network: NetworkSpec = {
    portNodes: ['e1', 'e2'],
    elements: [
      { kind: 'hybrid', ports: ['g1', 'h2', 'h3', 'g2'], z0Ohm: 50 },
      { kind: 'line', a: 'h2', b: 'e1', lengthM: 0.21, z0Ohm: 75, velocityFactor: 0.8, lossDbPer100m: 4 },
      { kind: 'line', a: 'h3', b: 't', lengthM: 0.33, z0Ohm: 50, velocityFactor: VF, lossDbPer100m: 2.5 },
      { kind: 'transformer', primary: ['t', 'common'], secondary: ['e2', 'common'], turnsRatio: 1.4 },
      { kind: 'impedance', a: 'e1', b: 'e2', rOhm: 30, xOhm: 45 },
      ...extra,
    ],
    sources: [
      { node: 'g1', kind: 'voltage', value: [v1.re, v1.im] },
      { node: 'g2', kind: 'voltage', value: [v2.re, v2.im] },
    ],
  };
  return {
    wires: [dipole(0), { ...dipole(0.23, 0.5), from: [0.23, 0.05, -0.25] }],
    feeds: [
      { wire: 0, position: 0.5 },
      { wire: 1, position: 0.45 },
    ],
    ground: { kind: 'free-space' },
    network,
  };
}

describe('network plus wires', () => {
  it('is reciprocal: the transfer admittance between the two generators is the same both ways', () => {
    const a = solve(twoPortArray(c(1), c(0)));
    const b = solve(twoPortArray(c(0), c(1)));
    const y21 = c(a.sources[1].currentA[0], a.sources[1].currentA[1]);
    const y12 = c(b.sources[0].currentA[0], b.sources[0].currentA[1]);
    expect(cAbs(y21)).toBeGreaterThan(1e-4); // coupled, so the check has something to compare
    expectClose(cAbs(cSub(y21, y12)), 0, 1e-8 * cAbs(y21), RECIP);
  });

  it('balances its power with lossy lines: sources = radiated + network loss (free space, perfect wires)', () => {
    const r = evaluateAntenna(twoPortArray(c(1), c(0.3, -0.8)), {
      frequenciesHz: [F_LAMBDA_1M],
      pattern: NO_PATTERN,
    }).frequencies[0];
    expect(r.networkLossW).toBeGreaterThan(0.02 * r.inputPowerW);
    // radiated power from the far-field integral, independent of the source power
    expectClose(
      r.powerBalanceError!,
      0,
      0.005,
      'power conservation (Balanis §2; core/em/README.md 0.5 % budget)',
    );
  });

  it('refuses a floating node and a feed with its own voltage, naming the field', () => {
    const floating = twoPortArray(c(1), c(0), [{ kind: 'switch', a: 'x', b: 'y', closed: false }]);
    expect(() => solve(floating)).toThrow(/network.*undetermined/);
    const withVoltage = twoPortArray(c(1), c(0));
    withVoltage.feeds = [{ wire: 0, position: 0.5, voltage: [1, 0] }, withVoltage.feeds[1]];
    expect(() => solve(withVoltage)).toThrow(/feeds\[0\]\.voltage/);
  });
});

/** Carter's mutual impedance of two side-by-side λ/2 dipoles (η0 = 120π, core/REFERENCES.md §2). */
function carter(d: number): Complex {
  const eta = 120 * Math.PI;
  const k = 2 * Math.PI;
  const L = 0.5;
  const [s0, c0] = sici(k * d);
  const [s1, c1] = sici(k * (Math.sqrt(d * d + L * L) + L));
  const [s2, c2] = sici(k * (Math.sqrt(d * d + L * L) - L));
  return c((eta / (4 * Math.PI)) * (2 * c0 - c1 - c2), (-eta / (4 * Math.PI)) * (2 * s0 - s1 - s2));
}

const monopole = (x: number, y = 0, h = 0.25, radiusM = 1e-9): WireSpec => ({
  from: [x, y, 0],
  to: [x, y, h],
  radiusM,
  material: 'perfect',
});

/** Two monopoles over perfect ground, fed at their bases through ports 'a' and 'b', nothing else between. */
const monopolePair = (wires: [WireSpec, WireSpec], sources: NetworkSpec['sources']): AntennaModel => ({
  wires,
  feeds: [
    { wire: 0, position: 0 },
    { wire: 1, position: 0 },
  ],
  ground: { kind: 'perfect' },
  network: { portNodes: ['a', 'b'], elements: [], sources },
});

describe('two λ/4 monopoles over perfect ground', () => {
  // Thin-wire limit as in test/reference/em/mutual.test.ts; half its ±3 Ω dipole tolerance.
  const MONO_TOL = 1.5;
  for (const d of [0.1, 0.25, 0.5, 0.75]) {
    it(`mutual impedance at d = ${d} λ is half of Carter's dipole value (open second port)`, () => {
      // 1 A forced into port 1, port 2 open: V1 = Z11, V2 = Z21
      const r = solve(
        monopolePair([monopole(0), monopole(d)], [{ node: 'a', kind: 'current', value: [1, 0] }]),
      );
      const z21 = c(r.feeds[1].voltageV[0], r.feeds[1].voltageV[1]);
      const half = carter(d);
      expectClose(z21.re, half.re / 2, MONO_TOL, CARTER);
      expectClose(z21.im, half.im / 2, MONO_TOL, CARTER);
      // the open port carries no current
      expect(Math.hypot(...r.feeds[1].currentA)).toBeLessThan(1e-9);
    });
  }
});

describe('two forced-current verticals', () => {
  it('follow element pattern × array factor (λ/4 apart, 90° phasing: the cardioid)', () => {
    const d = 0.25;
    const az = [0, 30, 60, 90, 120, 150, 210, 300];
    const el = [5, 20, 40];
    const r = evaluateAntenna(
      monopolePair(
        [monopole(0, 0, 0.25, 1e-5), monopole(d, 0, 0.25, 1e-5)],
        [
          { node: 'a', kind: 'current', value: [0, 1] }, // leads by 90°: fires toward +x (east)
          { node: 'b', kind: 'current', value: [1, 0] },
        ],
      ),
      { frequenciesHz: [F_LAMBDA_1M], pattern: { elevationsDeg: el, azimuthsDeg: az } },
    ).frequencies[0];
    // element (λ/4 monopole, sinusoidal current): cos(π/2 sin Δ)/cos Δ; array factor of two
    // equal sources with phase δ: |1 + e^{j(kd cos ψ + δ)}|, cos ψ = cos Δ sin(az) (axis east)
    const k = 2 * Math.PI;
    const rel = (e: number, a: number) => {
      const de = (e * Math.PI) / 180;
      const ae = (a * Math.PI) / 180;
      const elem = Math.cos((Math.PI / 2) * Math.sin(de)) / Math.cos(de);
      const psi = k * d * Math.cos(de) * Math.sin(ae) - Math.PI / 2; // element 2 lags by 90°
      const af2 = 2 + 2 * Math.cos(psi);
      return elem * elem * af2;
    };
    const ref = r.pattern.find((p) => p.elevationDeg === 20 && p.azimuthDeg === 90)!;
    const refTheory = rel(20, 90);
    // Forced base currents, not forced current distributions: coupling bends each element's
    // current a little, so the two element patterns are not quite identical. Stated budget: the
    // field within 2 % of the reference direction's field everywhere, and 0.15 dB in the beam.
    for (const p of r.pattern) {
      const theory = rel(p.elevationDeg, p.azimuthDeg) / refTheory;
      const got = 10 ** ((p.gainDbi - ref.gainDbi) / 10);
      expectClose(Math.sqrt(got), Math.sqrt(theory), 0.02, KRAUS);
      if (theory > 0.5) expectClose(10 * Math.log10(got), 10 * Math.log10(theory), 0.15, KRAUS);
    }
    // and the rear is deep: 30° off the back, 5° up, more than 15 dB down
    const back = r.pattern.find((p) => p.elevationDeg === 5 && p.azimuthDeg === 300)!;
    expect(back.gainDbi - ref.gainDbi).toBeLessThan(-15);
  });
});
