// Mesh building (core/em/mesh.ts): junctions, ground contacts, segmentation defaults and the
// geometry diagnostics; loads (core/em/solver.ts) against circuit theory.
import { describe, it, expect } from 'vitest';
import { buildMesh } from '../../../core/em/mesh.ts';
import { loadImpedance } from '../../../core/em/solver.ts';
import { tryEvaluateAntenna } from '../../../core/em/index.ts';
import type { AntennaModel } from '../../../core/em/types.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../../core/units/index.ts';

const F = 7.1e6;
const codes = (m: AntennaModel) => buildMesh(m, { maxFreqHz: F }).diagnostics.map((d) => d.code);
const base = (
  wires: AntennaModel['wires'],
  ground: AntennaModel['ground'] = { kind: 'free-space' },
): AntennaModel => ({
  wires,
  feeds: [{ wire: 0, position: 0.5 }],
  ground,
});
const AVERAGE = { kind: 'soil' as const, permittivity: 13, conductivitySPerM: 0.005 };

describe('mesh', () => {
  it('a junction of three wires carries two basis functions; free ends none', () => {
    const m = buildMesh(
      base([
        { from: [0, 0, 5], to: [0, 0, 10], radiusM: 0.001, segments: 4 },
        { from: [0, 0, 10], to: [3, 0, 12], radiusM: 0.001, segments: 3 },
        { from: [0, 0, 10], to: [-3, 0, 12], radiusM: 0.001, segments: 3 },
      ]),
      { maxFreqHz: F },
    );
    expect(m.nBasis).toBe(3 + 2 + 2 + 2);
  });
  it('a vertical touching perfect ground gets a base basis function and a ground contact', () => {
    const m = buildMesh(
      base([{ from: [0, 0, 0], to: [0, 0, 10], radiusM: 0.001, segments: 5 }], { kind: 'perfect' }),
      { maxFreqHz: F },
    );
    expect(m.nBasis).toBe(5);
    expect(m.groundContacts).toHaveLength(1);
  });
  it('default segmentation: 80 per wavelength, even count for a centre feed', () => {
    const m = buildMesh(base([{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001 }]), { maxFreqHz: F });
    expect(m.nSeg % 2).toBe(0);
    expect(m.len[0]).toBeLessThanOrEqual(SPEED_OF_LIGHT_M_PER_S / F / 80 + 1e-9);
  });
  it('diagnostics: long segments, short segments, crossing wires, near misses', () => {
    expect(codes(base([{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001, segments: 2 }]))).toContain(
      'segment-long',
    );
    expect(codes(base([{ from: [-1, 0, 10], to: [1, 0, 10], radiusM: 0.1, segments: 20 }]))).toContain(
      'segment-short',
    );
    expect(
      codes(
        base([
          { from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001 },
          { from: [0, -10, 10], to: [0, 10, 10], radiusM: 0.001 },
        ]),
      ),
    ).toContain('wires-cross');
    expect(
      codes(
        base([
          { from: [-10, 0, 10], to: [0, 0, 10], radiusM: 0.001 },
          { from: [0.003, 0, 10], to: [10, 0, 10], radiusM: 0.001 },
        ]),
      ),
    ).toContain('ends-nearly-meet');
  });
  it('diagnostics over lossy ground: low horizontal wire, wire slightly below ground clamped', () => {
    expect(codes(base([{ from: [-10, 0, 3], to: [10, 0, 3], radiusM: 0.001 }], AVERAGE))).toContain(
      'low-horizontal-wire',
    );
    expect(codes(base([{ from: [-10, 0, 12], to: [10, 0, 12], radiusM: 0.001 }], AVERAGE))).not.toContain(
      'low-horizontal-wire',
    );
    expect(codes(base([{ from: [0, 0, -0.0005], to: [0, 0, 10], radiusM: 0.001 }], AVERAGE))).toContain(
      'wire-below-ground',
    );
  });
  it('models that cannot be built are error values naming the field', () => {
    const r = tryEvaluateAntenna(base([{ from: [0, 0, -2], to: [0, 0, 10], radiusM: 0.001 }], AVERAGE), {
      frequenciesHz: [F],
    });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.field).toBe('wires[0].from[2]');
    const s = tryEvaluateAntenna(
      {
        ...base([{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001 }]),
        feeds: [{ wire: 0, position: 0 }],
      },
      { frequenciesHz: [F] },
    );
    expect(!s.ok && s.error.field).toBe('feeds[0].position');
  });
});

describe('loads', () => {
  it('series and parallel RLC against circuit theory', () => {
    const w = 2 * Math.PI * F;
    const s = loadImpedance({ kind: 'series-rlc', wire: 0, position: 0, rOhm: 3, lH: 1e-6, cF: 100e-12 }, F);
    expectClose(s.im, w * 1e-6 - 1 / (w * 100e-12), 1e-9, 'series RLC: X = ωL − 1/ωC');
    const p = loadImpedance(
      { kind: 'parallel-rlc', wire: 0, position: 0, rOhm: 1000, lH: 1e-6, cF: 1 / (w * w * 1e-6) },
      F,
    );
    expectClose(p.re, 1000, 1e-6, 'parallel RLC at resonance: Z = R');
    expectClose(p.im, 0, 1e-6, 'parallel RLC at resonance: Z = R');
  });
  it('a load at the feed point adds in series to the input impedance', () => {
    const ant: AntennaModel = {
      wires: [{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001 }],
      feeds: [{ wire: 0, position: 0.5 }],
      ground: AVERAGE,
    };
    const none = { elevationsDeg: [], azimuthsDeg: [] };
    const z0 = tryEvaluateAntenna(ant, { frequenciesHz: [F], pattern: none });
    const z1 = tryEvaluateAntenna(
      { ...ant, loads: [{ kind: 'impedance', wire: 0, position: 0.5, rOhm: 12, xOhm: -30 }] },
      { frequenciesHz: [F], pattern: none },
    );
    if (!z0.ok || !z1.ok) throw new Error('unexpected');
    const a = z0.value.frequencies[0].feeds[0].impedanceOhm;
    const b = z1.value.frequencies[0].feeds[0].impedanceOhm;
    expectClose(b[0] - a[0], 12, 1e-8, 'series circuit: Z_in = Z_antenna + Z_load');
    expectClose(b[1] - a[1], -30, 1e-8, 'series circuit: Z_in = Z_antenna + Z_load');
    expectClose(
      z1.value.frequencies[0].loadLossW / z1.value.frequencies[0].inputPowerW,
      12 / b[0],
      1e-9,
      'P_load / P_in = R_L / R_in',
    );
  });
});

describe('peak search', () => {
  it('finds a free-space peak below the horizon', () => {
    // two horizontal dipoles a quarter wave apart, the lower one fed 90° behind: end-fire downwards
    const lam = SPEED_OF_LIGHT_M_PER_S / 14e6;
    const d = lam / 4;
    const w = (z: number) => ({
      from: [-lam / 4, 0, z] as const,
      to: [lam / 4, 0, z] as const,
      radiusM: 0.001,
      material: 'perfect' as const,
    });
    const r = tryEvaluateAntenna(
      {
        wires: [w(30), w(30 - d)],
        feeds: [
          { wire: 0, position: 0.5, voltage: [1, 0] },
          { wire: 1, position: 0.5, voltage: [0, -1] },
        ],
        ground: { kind: 'free-space' },
      },
      { frequenciesHz: [14e6], pattern: { elevationsDeg: [], azimuthsDeg: [] } },
    );
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.frequencies[0].peak.elevationDeg).toBeLessThan(-60);
  });
});
