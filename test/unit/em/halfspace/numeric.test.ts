// Numerical building blocks of the half-space ground model: Gauss–Kronrod exactness, Wynn's ε
// algorithm, real-argument J0/J1.
import { describe, expect, it } from 'vitest';
import { besselJ01, SERIES_LIMIT } from '../../../../core/numeric/halfspace-bessel.ts';
import {
  gaussKronrod15,
  integrateAdaptive,
  WynnEpsilon,
} from '../../../../core/numeric/halfspace-quadrature.ts';
import { expectClose } from '../../../helpers/expectClose.ts';

const EXACTNESS_TOL = 1e-14;
const BESSEL_TOL = 5e-12;

describe('Gauss–Kronrod 7/15', () => {
  it('integrates x^d exactly up to degree 22 (Kronrod) and the Gauss part up to 13', () => {
    // exactness degrees of the 15-point Kronrod and 7-point Gauss rules: Piessens et al.,
    // QUADPACK (1983), §2.2 (3n+1 and 2n−1 for n = 7)
    const res = new Float64Array(1);
    for (let d = 0; d <= 22; d++) {
      const err = gaussKronrod15((x, o) => (o[0] = x ** d), 0, 1, 1, res);
      expectClose(res[0], 1 / (d + 1), EXACTNESS_TOL, `Kronrod 15 exact for x^${d}`);
      // the Gauss–Kronrod difference vanishes while the Gauss rule is exact too
      if (d <= 13) expect(err).toBeLessThan(EXACTNESS_TOL);
    }
    // the Gauss part is not exact at degree 14: the error indicator must see it
    expect(gaussKronrod15((x, o) => (o[0] = x ** 14), 0, 1, 1, res)).toBeGreaterThan(1e-9);
  });

  it('adaptive vector integration of an oscillating integrand meets its tolerance', () => {
    const acc = new Float64Array(2);
    const r = integrateAdaptive(
      (x, o) => {
        o[0] = Math.cos(40 * x);
        o[1] = Math.sqrt(x);
      },
      0,
      1,
      2,
      { relTol: 1e-12, absTol: 0, maxIntervals: 200 },
      acc,
    );
    expect(r.converged).toBe(true);
    expectClose(acc[0], Math.sin(40) / 40, 1e-11, 'closed form ∫cos 40x');
    expectClose(acc[1], 2 / 3, 1e-11, 'closed form ∫√x');
  });
});

describe("Wynn's ε algorithm", () => {
  it('sums the alternating harmonic series to ln 2 from 20 terms', () => {
    // Σ (−1)^k/(k+1) = ln 2 (A&S 4.1.24); the plain partial sum is off by ~2.4e-2
    const w = new WynnEpsilon(32);
    const e = new Float64Array(2);
    let s = 0;
    for (let k = 0; k < 20; k++) {
      s += (k % 2 ? -1 : 1) / (k + 1);
      w.push(s, 0, e);
    }
    expectClose(e[0], Math.LN2, 1e-12, 'A&S 4.1.24, ln 2');
  });
});

describe('J0, J1 of real argument', () => {
  it('agrees with the integral representation J_n(x) = (1/π)∫₀^π cos(nt − x sin t) dt', () => {
    // A&S 9.1.21, integrated here by adaptive Gauss–Kronrod, independent of the series
    const o = new Float64Array(2);
    for (const x of [0.3, 1, 2.4048, 5, 9.7, SERIES_LIMIT - 1e-9, SERIES_LIMIT + 1e-9, 17.5, 40, 123.4]) {
      besselJ01(x, o);
      const acc = new Float64Array(2);
      integrateAdaptive(
        (t, r) => {
          r[0] = Math.cos(x * Math.sin(t)) / Math.PI;
          r[1] = Math.cos(t - x * Math.sin(t)) / Math.PI;
        },
        0,
        Math.PI,
        2,
        { relTol: 1e-14, absTol: 1e-16, maxIntervals: 400 },
        acc,
      );
      expectClose(o[0], acc[0], BESSEL_TOL, `A&S 9.1.21 J0(${x})`);
      expectClose(o[1], acc[1], BESSEL_TOL, `A&S 9.1.21 J1(${x})`);
    }
  });

  it('matches tabulated values', () => {
    // A&S Table 9.1 (values remembered and reproduced by the integral check above)
    const o = new Float64Array(2);
    besselJ01(1, o);
    expectClose(o[0], 0.7651976866, 1e-10, 'A&S Table 9.1, J0(1)');
    expectClose(o[1], 0.4400505857, 1e-10, 'A&S Table 9.1, J1(1)');
    besselJ01(10, o);
    expectClose(o[0], -0.2459357645, 1e-10, 'A&S Table 9.1, J0(10)');
    expectClose(o[1], 0.0434727462, 1e-10, 'A&S Table 9.1, J1(10)');
  });
});
