// Numeric building blocks: LU, Gauss–Legendre, root finding, Bessel ratio. Seeded randomness.
import { describe, it, expect } from 'vitest';
import { complexMatVec, luFactor, luSolve, SingularMatrixError, LU_BLOCK } from '../../../core/numeric/lu.ts';
import { gaussLegendre01 } from '../../../core/numeric/quadrature.ts';
import { brentMinimize, brentRoot, NoBracketError } from '../../../core/numeric/roots.ts';
import { besselJ0OverJ1, besselJ1OverJ0 } from '../../../core/numeric/bessel.ts';
import { c, cDiv, cSqrt } from '../../../core/numeric/complex.ts';
import { expectClose } from '../../helpers/expectClose.ts';

function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296 - 0.5;
  };
}

describe('complex LU with partial pivoting', () => {
  for (const n of [1, 7, LU_BLOCK, LU_BLOCK + 5, 3 * LU_BLOCK + 1]) {
    it(`solves a random ${n}×${n} system to 1e-11 relative`, () => {
      const r = lcg(n);
      const a = new Float64Array(2 * n * n).map(() => r());
      const x = new Float64Array(2 * n).map(() => r());
      const b = complexMatVec(n, a, x);
      const got = luSolve(luFactor(n, a.slice()), b);
      let err = 0;
      let mag = 0;
      for (let i = 0; i < 2 * n; i++) {
        err = Math.max(err, Math.abs(got[i] - x[i]));
        mag = Math.max(mag, Math.abs(x[i]));
      }
      expect(err / mag).toBeLessThan(1e-11);
    });
  }
  it('pivots: a zero leading entry is no problem', () => {
    const a = Float64Array.from([0, 0, 1, 0, 1, 0, 0, 0]); // [[0, 1], [1, 0]]
    const x = luSolve(luFactor(2, a), Float64Array.from([2, 0, 3, 0]));
    expect([...x]).toEqual([3, 0, 2, 0]);
  });
  it('throws a typed error on a singular matrix', () => {
    const a = Float64Array.from([1, 0, 2, 0, 2, 0, 4, 0]);
    expect(() => luFactor(2, a)).toThrow(SingularMatrixError);
  });
});

describe('Gauss–Legendre on [0, 1]', () => {
  it('integrates polynomials of degree 2n − 1 exactly, weights sum to 1', () => {
    for (const n of [1, 2, 5, 12, 40]) {
      const g = gaussLegendre01(n);
      expectClose(
        g.w.reduce((s, w) => s + w, 0),
        1,
        1e-14,
        'weights sum to the interval length (A&S 25.4.29)',
      );
      const deg = 2 * n - 1;
      let s = 0;
      for (let i = 0; i < n; i++) s += g.w[i] * g.x[i] ** deg;
      expectClose(s, 1 / (deg + 1), 1e-13, 'exactness for degree 2n − 1 (A&S 25.4.29)');
    }
  });
  it('matches the tabulated 3-point rule (A&S Table 25.4)', () => {
    const g = gaussLegendre01(3);
    expectClose(g.x[0], 0.5 - 0.5 * Math.sqrt(0.6), 1e-15, 'A&S Table 25.4, n = 3');
    expectClose(g.w[1], 4 / 9, 1e-15, 'A&S Table 25.4, n = 3');
  });
});

describe('Brent', () => {
  it('finds a root and a minimum', () => {
    expectClose(brentRoot((x) => x * x * x - 2, 0, 2, 1e-13).x, Math.cbrt(2), 1e-12, 'closed form');
    expectClose(brentMinimize((x) => (x - 0.7) ** 2 + 1, -3, 4, 1e-9).x, 0.7, 1e-7, 'closed form');
    expect(() => brentRoot((x) => x * x + 1, -1, 1, 1e-9)).toThrow(NoBracketError);
  });
});

describe('Bessel ratio J0/J1', () => {
  it('matches tabulated values at real argument (A&S Table 9.1: J0(1) = 0.7651976866, J1(1) = 0.4400505857)', () => {
    const r = besselJ1OverJ0(c(1));
    expectClose(r.re, 0.4400505857 / 0.7651976866, 1e-9, 'A&S Table 9.1');
    expectClose(r.im, 0, 1e-15, 'A&S Table 9.1');
  });
  it('continued fraction and asymptotic branch agree where they meet', () => {
    for (const x of [45, 61, 90]) {
      const z = c(x, -x);
      const cf = cDiv(c(1), besselJ1OverJ0(z));
      const as = besselJ0OverJ1(z);
      expectClose(as.re, cf.re, 1e-9, 'A&S 9.2.5 against 9.1.73');
      expectClose(as.im, cf.im, 1e-9, 'A&S 9.2.5 against 9.1.73');
    }
  });
  it('principal square root', () => {
    const s = cSqrt(c(-4, -1e-20));
    expectClose(s.im, -2, 1e-15, 'principal branch');
  });
});
