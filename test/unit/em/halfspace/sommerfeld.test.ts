// Sommerfeld integrals of the half-space model: internal consistency of the quasi-static split,
// reciprocity of the dyadic, convergence under tolerance.
import { describe, expect, it } from 'vitest';
import { addCylindricalDyadic, addPerfectImageDyadic } from '../../../../core/em/halfspace/image.ts';
import { halfSpace } from '../../../../core/em/halfspace/medium.ts';
import { CYL_LEN, sommerfeldComponents } from '../../../../core/em/halfspace/sommerfeld.ts';
import { reflectedDyadic } from '../../../../core/em/halfspace/index.ts';
import { maxRelDifference } from '../../../helpers/expectClose.ts';

const AVERAGE_80M = { freqHz: 3.6e6, permittivity: 13, conductivitySPerM: 0.005 };
const SPLIT_TOL = 1e-9;

describe('Sommerfeld integrals', () => {
  it('spectral identity λ²P − R_TE = R_TM (makes Gzρ = −Gρz)', () => {
    // P of Sommerfeld's HED potential Π_z, 2(u0 − u)/(k2² u0 + k0² u) (Baños 1966 ch. 2),
    // evaluated here from its own formula at sample real and complex λ
    const hs = halfSpace(AVERAGE_80M);
    const k0 = hs.k0;
    const sq = (r: number, i: number): [number, number] => {
      const m = Math.hypot(r, i);
      const t = Math.sqrt(0.5 * (m + Math.abs(r)));
      return r >= 0 ? [t, i / (2 * t)] : [Math.abs(i) / (2 * t), i >= 0 ? t : -t];
    };
    const mul = (a: [number, number], b: [number, number]): [number, number] => [
      a[0] * b[0] - a[1] * b[1],
      a[0] * b[1] + a[1] * b[0],
    ];
    const div = (a: [number, number], b: [number, number]): [number, number] => {
      const d = b[0] * b[0] + b[1] * b[1];
      return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
    };
    const k2sq: [number, number] = [k0 * k0 * hs.epsRe, k0 * k0 * hs.epsIm];
    for (const [lr, li] of [
      [0.3 * k0, 0],
      [1.7 * k0, 0],
      [25 * k0, 0],
      [2 * k0, 0.4 * k0],
    ]) {
      const l2 = mul([lr, li], [lr, li]);
      const u0 = sq(l2[0] - k0 * k0, l2[1]);
      const u = sq(l2[0] - k2sq[0], l2[1] - k2sq[1]);
      const eps: [number, number] = [hs.epsRe, hs.epsIm];
      const eu0 = mul(eps, u0);
      const rtm = div([eu0[0] - u[0], eu0[1] - u[1]], [eu0[0] + u[0], eu0[1] + u[1]]);
      const rte = div([u0[0] - u[0], u0[1] - u[1]], [u0[0] + u[0], u0[1] + u[1]]);
      const den = mul(k2sq, u0);
      const P = div(
        [2 * (u0[0] - u[0]), 2 * (u0[1] - u[1])],
        [den[0] + k0 * k0 * u[0], den[1] + k0 * k0 * u[1]],
      );
      const lhs = mul(l2, P);
      expect(Math.hypot(lhs[0] - rte[0] - rtm[0], lhs[1] - rte[1] - rtm[1])).toBeLessThan(
        1e-12 * Math.hypot(rtm[0], rtm[1]),
      );
    }
  });

  it('split (K·image + remainder) equals the un-split integral', () => {
    // the closed forms of image.ts against direct integration of R_TM, R_TE (Sommerfeld 1909)
    const hs = halfSpace(AVERAGE_80M);
    for (const [rho, zeta] of [
      [5, 10],
      [30, 4],
      [0, 6],
      [2, 1],
      [60, 0.5],
    ]) {
      const a = new Float64Array(CYL_LEN);
      const b = new Float64Array(CYL_LEN);
      sommerfeldComponents(hs, rho, zeta, a, { relTol: 1e-11, subtractStatic: true, maxTailIntervals: 300 });
      sommerfeldComponents(hs, rho, zeta, b, { relTol: 1e-11, subtractStatic: false, maxTailIntervals: 300 });
      const Ds = new Float64Array(18);
      const Du = new Float64Array(18);
      addPerfectImageDyadic(hs.k0, rho, 0, zeta, hs.kRe, hs.kIm, Ds);
      addCylindricalDyadic(a, 1, 0, Ds);
      addCylindricalDyadic(b, 1, 0, Du);
      expect(maxRelDifference(Ds, Du), `ρ=${rho} ζ=${zeta}`).toBeLessThan(SPLIT_TOL);
    }
  });

  it('dyadic reciprocity D_ij(r, r′) = D_ji(r′, r)', () => {
    // reciprocity of the reflected field (Chew 1990, §1.3.2 (Lorentz reciprocity), from memory)
    const hs = halfSpace(AVERAGE_80M);
    let seed = 7;
    const rnd = (): number => (seed = (seed * 16807) % 2147483647) / 2147483647;
    for (let n = 0; n < 6; n++) {
      const r: [number, number, number] = [40 * rnd() - 20, 40 * rnd() - 20, 0.5 + 10 * rnd()];
      const s: [number, number, number] = [40 * rnd() - 20, 40 * rnd() - 20, 0.5 + 10 * rnd()];
      const A = new Float64Array(18);
      const B = new Float64Array(18);
      reflectedDyadic(hs, r, s, A, { direct: true });
      reflectedDyadic(hs, s, r, B, { direct: true });
      let d = 0;
      let m = 0;
      for (let i = 0; i < 3; i++)
        for (let j = 0; j < 3; j++)
          for (let c = 0; c < 2; c++) {
            d = Math.max(d, Math.abs(A[2 * (3 * i + j) + c] - B[2 * (3 * j + i) + c]));
            m = Math.max(m, Math.abs(A[2 * (3 * i + j) + c]));
          }
      expect(d / m).toBeLessThan(1e-12);
    }
  });

  it('converges: tolerance 1e-6 and 1e-8 land within 10× of a 1e-11 reference', () => {
    const hs = halfSpace({ freqHz: 7.1e6, permittivity: 13, conductivitySPerM: 0.005 });
    for (const [rho, zeta] of [
      [85, 22],
      [0.3, 0.4],
      [12, 0],
    ]) {
      const ref = new Float64Array(CYL_LEN);
      expect(
        sommerfeldComponents(hs, rho, zeta, ref, {
          relTol: 1e-11,
          subtractStatic: true,
          maxTailIntervals: 400,
        }).converged,
      ).toBe(true);
      for (const tol of [1e-6, 1e-8]) {
        const a = new Float64Array(CYL_LEN);
        sommerfeldComponents(hs, rho, zeta, a, { relTol: tol, subtractStatic: true, maxTailIntervals: 400 });
        expect(maxRelDifference(a, ref), `ρ=${rho} ζ=${zeta} tol ${tol}`).toBeLessThan(10 * tol);
      }
    }
  });
});
