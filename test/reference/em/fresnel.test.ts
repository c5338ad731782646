// Fresnel reflection coefficients (core/em/fresnel.ts) at grazing, normal and pseudo-Brewster
// incidence. Sources: Beckmann & Spizzichino (1963); ITU-R P.527; values core/REFERENCES.md §3
// (computed independently, ±0.05° for the pseudo-Brewster angles).
import { describe, it } from 'vitest';
import { cAbs, cArg, cSqrt, c } from '../../../core/numeric/complex.ts';
import { brentMinimize, brentRoot } from '../../../core/numeric/roots.ts';
import { complexPermittivity, fresnelCoefficients } from '../../../core/em/fresnel.ts';
import { createGroundModel } from '../../../core/em/ground.ts';
import { expectClose } from '../../helpers/expectClose.ts';

const SRC = 'Beckmann & Spizzichino 1963 / ITU-R P.527 (core/REFERENCES.md §3)';
const F = 3.6e6;
const EPS = 1e-9;

describe('Fresnel coefficients', () => {
  it('grazing incidence: Rv = Rh = −1', () => {
    for (const g of [
      { permittivity: 13, conductivitySPerM: 0.005 },
      { permittivity: 70, conductivitySPerM: 5 },
      { permittivity: 3, conductivitySPerM: 1e-4 },
    ]) {
      const r = fresnelCoefficients(complexPermittivity(g, F), 0);
      expectClose(r.rv.re, -1, EPS, SRC);
      expectClose(r.rv.im, 0, EPS, SRC);
      expectClose(r.rh.re, -1, EPS, SRC);
      expectClose(r.rh.im, 0, EPS, SRC);
    }
  });
  it('normal incidence: Rv = −Rh = (√εc − 1)/(√εc + 1); average ground 0.7103 − j0.1440', () => {
    const ec = complexPermittivity({ permittivity: 13, conductivitySPerM: 0.005 }, F);
    const r = fresnelCoefficients(ec, 1);
    expectClose(r.rv.re, 0.7103, 2e-4, SRC);
    expectClose(r.rv.im, -0.144, 2e-4, SRC);
    expectClose(r.rh.re, -r.rv.re, EPS, SRC);
    expectClose(r.rh.im, -r.rv.im, EPS, SRC);
    const s = cSqrt(ec);
    const want = { re: 0, im: 0 };
    const d = (s.re + 1) ** 2 + s.im ** 2;
    want.re = ((s.re - 1) * (s.re + 1) + s.im * s.im) / d;
    want.im = (s.im * (s.re + 1) - (s.re - 1) * s.im) / d;
    expectClose(r.rv.re, want.re, EPS, SRC);
    expectClose(r.rv.im, want.im, EPS, SRC);
  });
  it('perfect ground: Rv = +1, −Rh = +1', () => {
    const out = new Float64Array(4);
    createGroundModel({ kind: 'perfect' }).at(F)!.farFieldReflection(0.3, out);
    expectClose(out[0], 1, 0, SRC);
    expectClose(-out[2], 1, 0, SRC);
    // and a soil of huge conductivity tends to it
    const r = fresnelCoefficients(complexPermittivity({ permittivity: 10, conductivitySPerM: 1e9 }, F), 0.3);
    expectClose(r.rv.re, 1, 1e-4, SRC);
    expectClose(-r.rh.re, 1, 1e-4, SRC);
    expectClose(cAbs(c(r.rv.re, r.rv.im)), 1, 1e-4, SRC);
  });
  const brewster: [string, number, number, number][] = [
    ['sea water', 70, 5, 0.36],
    ['fresh water', 80, 0.003, 6.33],
    ['wet ground', 30, 0.01, 7.5],
    ['medium dry', 15, 0.001, 14.14],
    ['very dry', 3, 0.0001, 29.89],
    ['very good', 20, 0.0303, 4.64],
    ['average', 13, 0.005, 10.77],
    ['poor', 13, 0.002, 13.96],
    ['very poor', 5, 0.001, 20.99],
  ];
  // The REFERENCES table lists the angle where |Rv| is least (the usual definition of the
  // pseudo-Brewster angle); its text says arg Rv = −90° there, which holds to within 0.2° (the two
  // differ most over low-loss ground: 0.12° for εr = 5, 1 mS/m). Both are checked.
  for (const [name, er, sig, want] of brewster) {
    it(`pseudo-Brewster angle, ${name}: ${want}°`, () => {
      const ec = complexPermittivity({ permittivity: er, conductivitySPerM: sig }, F);
      const rvAt = (deg: number) => fresnelCoefficients(ec, Math.sin((deg * Math.PI) / 180)).rv;
      const least = brentMinimize((deg) => cAbs(rvAt(deg)), 0.01, 60, 1e-7);
      expectClose(least.x, want, 0.05, `${SRC}: minimum of |Rv|`);
      const quarter = brentRoot((deg) => (cArg(rvAt(deg)) * 180) / Math.PI + 90, 0.01, 60, 1e-7);
      expectClose(quarter.x, least.x, 0.2, `${SRC}: arg Rv = −90° at the pseudo-Brewster angle`);
    });
  }
});
