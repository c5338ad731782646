// Consistency of the feed-network path with the plain feed path (the same physics two ways; not
// a check against an outside source): a 1 A current source straight into a port must give the
// plain feed's impedance, also with a radial system (the Wait–Pope loss updates the network
// solution through the Woodbury identity), and a network without loss reports none. The ideal
// hybrid is also checked against its defining behaviour (Pozar §7.5, core/REFERENCES.md §15).
import { describe, expect, it } from 'vitest';
import { evaluateAntenna } from '../../../core/em/evaluate.ts';
import { hybridAdmittance } from '../../../core/em/network.ts';
import type { AntennaModel } from '../../../core/em/types.ts';
import { c, cAbs, cAdd, cArg, cDiv, cMul } from '../../../core/numeric/complex.ts';
import { luFactor, luSolve } from '../../../core/numeric/lu.ts';

const F = 3.6e6;
const NONE = { elevationsDeg: [], azimuthsDeg: [] };

function vertical(withNetwork: boolean): AntennaModel {
  return {
    wires: [{ from: [0, 0, 0], to: [0, 0, 19.5], radiusM: 0.01 }],
    feeds: [{ wire: 0, position: 0 }],
    radials: [{ wire: 0, count: 16, lengthsM: Array(16).fill(20), radiusM: 0.001 }],
    ground: { kind: 'soil', permittivity: 13, conductivitySPerM: 0.005 },
    ...(withNetwork
      ? {
          network: {
            portNodes: ['a'],
            elements: [],
            sources: [{ node: 'a', kind: 'current', value: [1, 0] }],
          },
        }
      : {}),
  } as AntennaModel;
}

describe('feed network path', () => {
  it('a current source into a port reproduces the plain feed, radial loss included', () => {
    const plain = evaluateAntenna(vertical(false), { frequenciesHz: [F], pattern: NONE }).frequencies[0];
    const net = evaluateAntenna(vertical(true), { frequenciesHz: [F], pattern: NONE }).frequencies[0];
    const zp = plain.feeds[0].impedanceOhm;
    const zn = net.sources[0].impedanceOhm;
    expect(Math.abs(zn[0] - zp[0])).toBeLessThan(1e-6 * Math.hypot(...zp));
    expect(Math.abs(zn[1] - zp[1])).toBeLessThan(1e-6 * Math.hypot(...zp));
    expect(net.groundSystems[0].lossResistanceOhm).toBeCloseTo(plain.groundSystems[0].lossResistanceOhm, 6);
    expect(net.networkLossW).toBe(0);
  });

  it('the ideal hybrid is lossless and reciprocal: Y symmetric with zero real part of its Hermitian part', () => {
    const y = hybridAdmittance(50);
    for (let i = 0; i < 4; i++)
      for (let j = 0; j < 4; j++) {
        expect(cAbs(c(y[i * 4 + j].re - y[j * 4 + i].re, y[i * 4 + j].im - y[j * 4 + i].im))).toBeLessThan(
          1e-12,
        );
        // lossless and reciprocal: Y symmetric and purely imaginary
        expect(Math.abs(y[i * 4 + j].re)).toBeLessThan(1e-12);
      }
    // matched: port 1 at 1 V with 50 Ω on ports 2–4: ports 2 and 3 at 1/√2, 3 lagging 2 by 90°,
    // port 4 isolated, and port 1 sees 50 Ω (Pozar §7.5; core/REFERENCES.md §15)
    const a = new Float64Array(18);
    const b = new Float64Array(6);
    for (let r = 0; r < 3; r++) {
      for (let q = 0; q < 3; q++) {
        a[2 * (r * 3 + q)] = y[(r + 1) * 4 + q + 1].re + (r === q ? 1 / 50 : 0);
        a[2 * (r * 3 + q) + 1] = y[(r + 1) * 4 + q + 1].im;
      }
      b[2 * r] = -y[(r + 1) * 4].re;
      b[2 * r + 1] = -y[(r + 1) * 4].im;
    }
    const u = luSolve(luFactor(3, a), b);
    const u2 = c(u[0], u[1]);
    const u3 = c(u[2], u[3]);
    const u4 = c(u[4], u[5]);
    expect(cAbs(u2)).toBeCloseTo(Math.SQRT1_2, 10);
    expect(cAbs(u3)).toBeCloseTo(Math.SQRT1_2, 10);
    expect(cAbs(u4)).toBeLessThan(1e-12);
    expect(cArg(cDiv(u3, u2))).toBeCloseTo(-Math.PI / 2, 10);
    let i1 = y[0];
    for (let q = 1; q < 4; q++) i1 = cAdd(i1, cMul(y[q], c(u[2 * q - 2], u[2 * q - 1])));
    const zin = cDiv(c(1), i1);
    expect(zin.re).toBeCloseTo(50, 8);
    expect(zin.im).toBeCloseTo(0, 8);
  });
});
