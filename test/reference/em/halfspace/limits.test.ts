// Limits of the exact half-space model against published asymptotic results.
import { describe, expect, it } from 'vitest';
import { addCylindricalDyadic, addPerfectImageDyadic } from '../../../../core/em/halfspace/image.ts';
import { halfSpace, type HalfSpace } from '../../../../core/em/halfspace/medium.ts';
import { CYL_LEN, sommerfeldComponents } from '../../../../core/em/halfspace/sommerfeld.ts';
import { expectClose, maxRelDifference } from '../../../helpers/expectClose.ts';

/** The whole reflected field by direct (un-split) integration of R_TM, R_TE. */
function wholeField(hs: HalfSpace, rho: number, zeta: number): Float64Array {
  const cyl = new Float64Array(CYL_LEN);
  sommerfeldComponents(hs, rho, zeta, cyl, { relTol: 1e-10, subtractStatic: false, maxTailIntervals: 300 });
  const D = new Float64Array(18);
  addCylindricalDyadic(cyl, 1, 0, D);
  return D;
}
function image(hs: HalfSpace, rho: number, zeta: number, wr: number, wi: number): Float64Array {
  const D = new Float64Array(18);
  addPerfectImageDyadic(hs.k0, rho, 0, zeta, wr, wi, D);
  return D;
}

/** Fresnel coefficients, written out from core/REFERENCES.md §3 (Beckmann & Spizzichino 1963). */
function fresnelCoefficients(
  e: { re: number; im: number },
  sinPsi: number,
): { rv: { re: number; im: number }; rh: { re: number; im: number } } {
  const sr = e.re - (1 - sinPsi * sinPsi);
  const m = Math.hypot(sr, e.im);
  const qr = Math.sqrt(0.5 * (m + sr));
  const qi = e.im / (2 * qr);
  const div = (ar: number, ai: number, br: number, bi: number): { re: number; im: number } => {
    const d = br * br + bi * bi;
    return { re: (ar * br + ai * bi) / d, im: (ai * br - ar * bi) / d };
  };
  const esr = e.re * sinPsi;
  const esi = e.im * sinPsi;
  return { rv: div(esr - qr, esi - qi, esr + qr, esi + qi), rh: div(sinPsi - qr, -qi, sinPsi + qr, qi) };
}

describe('exact ground: limits', () => {
  it('tends to the perfect-ground image as σ grows without bound', () => {
    // image theory for a perfect conductor: Balanis, Antenna Theory, 3rd ed. (2005), §4.7.
    // The correction is O(1/|√εc|) (Baños 1966 ch. 2, from memory), so the error must fall
    // about √10 per decade of σ.
    const errs = [1e3, 1e5, 1e7].map((s) => {
      const hs = halfSpace({ freqHz: 3.6e6, permittivity: 10, conductivitySPerM: s });
      return maxRelDifference(wholeField(hs, 8, 5), image(hs, 8, 5, 1, 0));
    });
    expect(errs[2]).toBeLessThan(1e-4);
    expect(errs[1] / errs[0]).toBeLessThan(0.15);
    expect(errs[2] / errs[1]).toBeLessThan(0.15);
  });

  it('quasi-static limit: K times the perfect image near the source, error ∝ (|k2|R1)²', () => {
    // electrostatic image in a dielectric half-space, factor (ε − 1)/(ε + 1): Jackson,
    // Classical Electrodynamics, 3rd ed. (1999), §4.4, eq. 4.45 (ε → εc)
    const hs = halfSpace({ freqHz: 3.6e6, permittivity: 13, conductivitySPerM: 0.005 });
    const k2 = Math.hypot(hs.k2Re, hs.k2Im);
    const rel = [0.1, 0.01].map((x) => {
      const R = x / k2;
      return maxRelDifference(wholeField(hs, 0.6 * R, 0.8 * R), image(hs, 0.6 * R, 0.8 * R, hs.kRe, hs.kIm));
    });
    expect(rel[1]).toBeLessThan(1e-5);
    expectClose(rel[0] / rel[1], 100, 20, 'quadratic approach to the static image (Jackson §4.4)');
  });

  it('far zone: the image field times Rv (θ part) and −Rh (φ part) at the specular angle', () => {
    // saddle-point (geometrical-optics) limit of the Sommerfeld integrals: Baños 1966, ch. 3;
    // Chew 1990, ch. 2 (section from memory). Error O(1/(k0R1)), larger near grazing.
    const hs = halfSpace({ freqHz: 3.6e6, permittivity: 13, conductivitySPerM: 0.005 });
    const k0 = hs.k0;
    const epsC = { re: hs.epsRe, im: hs.epsIm };
    const errAt = (kR: number, psiDeg: number): [number, number] => {
      const psi = (psiDeg * Math.PI) / 180;
      const R = kR / k0;
      const rho = R * Math.cos(psi);
      const zeta = R * Math.sin(psi);
      const D = wholeField(hs, rho, zeta);
      const P = image(hs, rho, zeta, 1, 0);
      const th = [Math.sin(psi), 0, -Math.cos(psi)];
      const proj = (M: Float64Array, v: number[], j: number): [number, number] => {
        let r = 0;
        let i = 0;
        for (let a = 0; a < 3; a++) {
          r += v[a] * M[2 * (3 * a + j)];
          i += v[a] * M[2 * (3 * a + j) + 1];
        }
        return [r, i];
      };
      const ratio = (a: [number, number], b: [number, number]): [number, number] => {
        const d = b[0] * b[0] + b[1] * b[1];
        return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
      };
      const f = fresnelCoefficients(epsC, Math.sin(psi));
      const rv = ratio(proj(D, th, 0), proj(P, th, 0)); // horizontal source in the plane
      const mrh = ratio(proj(D, [0, 1, 0], 1), proj(P, [0, 1, 0], 1)); // source across it
      return [
        Math.hypot(rv[0] - f.rv.re, rv[1] - f.rv.im) / Math.hypot(f.rv.re, f.rv.im),
        Math.hypot(mrh[0] + f.rh.re, mrh[1] + f.rh.im) / Math.hypot(f.rh.re, f.rh.im),
      ];
    };
    const e400 = errAt(400, 30);
    const e1600 = errAt(1600, 30);
    expect(e1600[0]).toBeLessThan(1e-3);
    expect(e1600[1]).toBeLessThan(1e-3);
    // O(1/(k0R1)): four times the distance, about a quarter of the error
    expect(e1600[0] / e400[0]).toBeLessThan(0.35);
    expect(e1600[1] / e400[1]).toBeLessThan(0.35);
    const e60 = errAt(400, 60);
    expect(Math.max(...e60)).toBeLessThan(1e-3);
  });
});
