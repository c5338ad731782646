// Segment-pair moments (core/em/kernel.ts) against an independent brute-force quadrature:
// the inner integral with the substitution s = s0 + ρ·sinh t (which turns ds/R into dt), the
// outer with a geometrically graded composite Gauss rule. No published value is involved; the
// check is that two different quadratures of the same integral agree.
import { describe, it, expect } from 'vitest';
import { pairMoments } from '../../../core/em/kernel.ts';
import { gaussLegendre01 } from '../../../core/numeric/quadrature.ts';

type V = [number, number, number];
interface Seg {
  p: V;
  t: V;
  l: number;
}

const g20 = gaussLegendre01(20);

function bruteMoments(P: Seg, Q: Seg, a: number, k: number): number[] {
  const m = new Array<number>(8).fill(0);
  // outer panels graded towards both ends
  const edges: number[] = [0];
  const ratio = 0.35;
  let h = 0.5;
  const left: number[] = [];
  while (h > 1e-9) {
    left.push(h);
    h *= ratio;
  }
  left.reverse().forEach((x) => edges.push(x));
  [...left].reverse().forEach((x) => edges.push(1 - x));
  edges.push(1);
  const uniq = [...new Set(edges)].sort((x, y) => x - y);
  for (let b = 0; b + 1 < uniq.length; b++) {
    const ua = uniq[b];
    const span = uniq[b + 1] - ua;
    for (let i = 0; i < g20.x.length; i++) {
      const u = ua + span * g20.x[i];
      const wu = span * g20.w[i];
      const r: V = [P.p[0] + u * P.l * P.t[0], P.p[1] + u * P.l * P.t[1], P.p[2] + u * P.l * P.t[2]];
      const w: V = [r[0] - Q.p[0], r[1] - Q.p[1], r[2] - Q.p[2]];
      const s0 = w[0] * Q.t[0] + w[1] * Q.t[1] + w[2] * Q.t[2];
      const d2 = Math.max(0, w[0] ** 2 + w[1] ** 2 + w[2] ** 2 - s0 * s0);
      const rho = Math.sqrt(d2 + a * a);
      const ta = Math.asinh((0 - s0) / rho);
      const tb = Math.asinh((Q.l - s0) / rho);
      // inner: ∫ (1, v) e^{-jkR} dt, split into 40 panels
      let i0r = 0,
        i0i = 0,
        i1r = 0,
        i1i = 0;
      const np = 40;
      for (let pnl = 0; pnl < np; pnl++) {
        const t0 = ta + ((tb - ta) * pnl) / np;
        const dt = (tb - ta) / np;
        for (let j = 0; j < g20.x.length; j++) {
          const t = t0 + dt * g20.x[j];
          const s = s0 + rho * Math.sinh(t);
          const R = rho * Math.cosh(t);
          const v = s / Q.l;
          const ww = (dt * g20.w[j]) / Q.l;
          i0r += ww * Math.cos(k * R);
          i0i -= ww * Math.sin(k * R);
          i1r += ww * v * Math.cos(k * R);
          i1i -= ww * v * Math.sin(k * R);
        }
      }
      m[0] += wu * i0r;
      m[1] += wu * i0i;
      m[2] += wu * u * i0r;
      m[3] += wu * u * i0i;
      m[4] += wu * i1r;
      m[5] += wu * i1i;
      m[6] += wu * u * i1r;
      m[7] += wu * u * i1i;
    }
  }
  return m;
}

function fast(P: Seg, Q: Seg, a: number, k: number, self = false): number[] {
  const out = new Float64Array(8);
  pairMoments(
    P.p[0],
    P.p[1],
    P.p[2],
    P.t[0],
    P.t[1],
    P.t[2],
    P.l,
    Q.p[0],
    Q.p[1],
    Q.p[2],
    Q.t[0],
    Q.t[1],
    Q.t[2],
    Q.l,
    a * a,
    k,
    self,
    out,
    0,
  );
  return [...out];
}

const unit = (v: V): V => {
  const n = Math.hypot(...v);
  return [v[0] / n, v[1] / n, v[2] / n];
};

// Relative accuracy of each moment against the brute-force value, relative to |M00|.
const TOL_NEAR = 2e-5;
const TOL_FAR = 2e-4;

describe('segment-pair moments against brute-force quadrature', () => {
  const k = (2 * Math.PI) / 1; // wavelength 1 m
  const l = 1 / 40;
  // Segments of length l (or a fraction of it) starting at p along the unit vector t.
  const seg = (p: V, t: V, frac = 1): Seg => ({ p, t, l: frac * l });
  const O: V = [0, 0, 0];
  const X: V = [1, 0, 0];
  const Z: V = [0, 0, 1];
  // Wire radius a = 1e-4 λ unless given.
  const cases: { name: string; P: Seg; Q: Seg; a?: number; self?: boolean; tol: number }[] = [
    { name: 'self, a = 1e-5 λ', P: seg(O, Z), Q: seg(O, Z), a: 1e-5, self: true, tol: TOL_NEAR },
    { name: 'self, thick a = 5e-3 λ', P: seg(O, X), Q: seg(O, X), a: 5e-3, self: true, tol: TOL_NEAR },
    { name: 'collinear neighbour', P: seg(O, X), Q: seg([l, 0, 0], X), tol: TOL_NEAR },
    { name: 'collinear, unequal lengths', P: seg(O, X), Q: seg([l, 0, 0], X, 0.4), tol: TOL_NEAR },
    { name: 'bent 90° at a shared end', P: seg(O, X), Q: seg([l, 0, 0], Z), tol: TOL_NEAR },
    { name: 'bent 150° (acute V)', P: seg(O, X), Q: seg([l, 0, 0], unit([-0.866, 0.5, 0])), tol: TOL_NEAR },
    { name: 'second neighbour', P: seg(O, X), Q: seg([1.5 * l, 0, 0], X), tol: TOL_NEAR },
    { name: 'parallel, 0.3 segment apart', P: seg(O, X), Q: seg([0.2 * l, 0.3 * l, 0], X), tol: TOL_NEAR },
    { name: 'image of a ground-touching vertical', P: seg(O, Z), Q: seg(O, [0, 0, -1]), tol: TOL_NEAR },
    { name: 'far, 3 segments', P: seg(O, X), Q: seg([0, 3 * l, 0], unit([1, 1, 0])), tol: TOL_FAR },
    { name: 'far, 6 segments', P: seg(O, X), Q: seg([6 * l, 0, 0], X), tol: TOL_FAR },
    { name: 'far, 20 segments', P: seg(O, X), Q: seg([5 * l, 20 * l, 0], Z), tol: TOL_FAR },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const a = c.a ?? 1e-4;
      const ref = bruteMoments(c.P, c.Q, a, k);
      const got = fast(c.P, c.Q, a, k, c.self ?? false);
      const scale = Math.hypot(ref[0], ref[1]);
      for (let i = 0; i < 8; i++) {
        expect(Math.abs(got[i] - ref[i]) / scale, `moment ${i}: ${got[i]} vs ${ref[i]}`).toBeLessThan(c.tol);
      }
    });
  }
});
