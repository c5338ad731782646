/**
 * Segment-pair moments of the thin-wire Green's function (reduced kernel).
 *
 * For an observation segment p (axis point r(u) = P0 + u·Δp·t̂p) and a source segment q
 * (r'(v) = Q0 + v·Δq·t̂q), u, v ∈ [0, 1], the four moments
 *     M00 = ∫∫ G du dv,  M10 = ∫∫ u G du dv,  M01 = ∫∫ v G du dv,  M11 = ∫∫ u v G du dv,
 *     G = e^{−jkR}/R,   R = √(|r(u) − r'(v)|² + a²)        (reduced thin-wire kernel)
 * are all the impedance-matrix fill needs for triangle basis functions with Galerkin testing.
 * Output layout (8 doubles): M00, M10, M01, M11 as (re, im) pairs.
 *
 * Singular part (Wilton et al. 1984; Graglia 1993 for the line-integral forms): G is split as
 *     G = [1/R − k²R/2] + r(R),   r(R) = (cos kR − 1 + (kR)²/2)/R − j sin(kR)/R,
 * where the bracket is integrated over the source segment in closed form,
 *     ∫ ds/R = asinh((s − s0)/ρ),  ∫ (s − s0) ds/R = R,
 *     ∫ R ds = ½[(s − s0)R + ρ² asinh((s − s0)/ρ)],  ∫ (s − s0) R ds = R³/3,
 * (ρ² = d² + a², d the distance of r from the source line, s0 its foot; Gradshteyn & Ryzhik,
 * Table of Integrals, 7th ed., 2.271 and 2.272), and the remainder r(R) = −jk + O(k³R²) is
 * smooth and integrated by Gauss–Legendre. The outer (observation) integral uses Gauss–Legendre
 * on sub-intervals split where the source segment's ends project onto p, with
 * panels graded geometrically (ratio 3) towards any end that lies close to the source segment,
 * from the scale (distance + radius), which resolves the logarithmic end behaviour of the inner
 * integral (a graded mesh: Davis & Rabinowitz, Methods of Numerical Integration, 2nd ed., §2.12).
 * For the self term the static part is integrated in both variables in closed form:
 * with α = a/Δ and h(w) = (w² + α²)^{−1/2},
 *     ∫∫ h(u−v) = 2(J0 − J1),   ∫∫ uv h(u−v) = 2(J0/3 − J1/2 + J3/6),   M10 = M01 = M00/2,
 *     J_n = ∫₀¹ wⁿ h(w) dw (recurrence J_n = [w^{n−1}√(w²+α²)]₀¹/n − (n−1)α² J_{n−2}/n),
 * and the same with √(w²+α²) for the R term.
 * Far pairs use a plain Gauss–Legendre product rule whose order falls with distance.
 *
 * Accuracy: self, touching and near terms within 2e-5 of |M00|, far terms within 2e-4 of the
 * element (checked against an independent brute-force quadrature in test/unit/em/kernel.test.ts).
 *
 * References:
 *  - D. R. Wilton, S. M. Rao, A. W. Glisson, D. H. Schaubert, O. M. Al-Bundak, C. M. Butler,
 *    "Potential integrals for uniform and linear source distributions on polygonal and
 *    polyhedral domains", IEEE Trans. AP-32 (1984) 276–281 (singularity subtraction).
 *  - R. D. Graglia, "On the numerical integration of the linear shape functions times the 3-D
 *    Green's function or its gradient on a plane triangle", IEEE Trans. AP-41 (1993) 1448–1455.
 *  - I. S. Gradshteyn and I. M. Ryzhik, Table of Integrals, Series, and Products, 7th ed. (2007).
 *  - A. F. Peterson, S. L. Ray, R. Mittra, Computational Methods for Electromagnetics (1998),
 *    §2 (thin-wire EFIE, reduced kernel).
 */
import { gaussLegendre01 } from '../numeric/quadrature.ts';
import type { Mesh } from './mesh.ts';

/**
 * Centre distance over the longer segment below which a pair is treated as near. The far-rule
 * thresholds (4.5, 8.5) and this one sit at half-integers: equal segments on a line lie at whole
 * multiples of the segment length, where rounding would otherwise pick the rule at random.
 */
export const NEAR_RATIO = 2.5;
/** Outer Gauss points per sub-interval of a near pair. */
export const NEAR_OUTER_POINTS = 5;
/** Gauss points for the smooth remainder over the source segment. */
export const REMAINDER_POINTS = 4;

const GR = gaussLegendre01(REMAINDER_POINTS);
const GO = gaussLegendre01(NEAR_OUTER_POINTS);
const G4 = gaussLegendre01(4);
const G3 = gaussLegendre01(3);
const G2 = gaussLegendre01(2);

/**
 * Real part of the smooth remainder r(R) = G − 1/R + k²R/2, G = e^(−jkR)/R; the
 * callers form the imaginary part, −sin(kR)/R, inline beside it.
 */
function remainderRe(kR: number, R: number): number {
  if (kR < 2e-2) {
    const k2 = kR * kR;
    return (((k2 * k2) / 24) * (1 - k2 / 30)) / R;
  }
  const sh = Math.sin(0.5 * kR);
  return (-2 * sh * sh + 0.5 * kR * kR) / R;
}

const breaks = new Float64Array(4);
const panels = new Float64Array(512);
const rightPanels = new Float64Array(128);
/** Geometric growth of the graded outer panels, and the relative scale below which to grade. */
const GRADE_RATIO = 3;
const GRADE_START = 0.25;

function pointSegmentDistance(
  x: number,
  y: number,
  z: number,
  qx: number,
  qy: number,
  qz: number,
  qtx: number,
  qty: number,
  qtz: number,
  ql: number,
): number {
  const rx = x - qx;
  const ry = y - qy;
  const rz = z - qz;
  let s = rx * qtx + ry * qty + rz * qtz;
  if (s < 0) s = 0;
  else if (s > ql) s = ql;
  const dx = rx - s * qtx;
  const dy = ry - s * qty;
  const dz = rz - s * qtz;
  return Math.sqrt(dx * dx + dy * dy + dz * dz);
}

/**
 * Moments of the pair (p, q), added into out[o … o+7].
 * `self` must be true exactly when p and q are the same segment (not an image of it).
 */
export function pairMoments(
  px: number,
  py: number,
  pz: number,
  ptx: number,
  pty: number,
  ptz: number,
  pl: number,
  qx: number,
  qy: number,
  qz: number,
  qtx: number,
  qty: number,
  qtz: number,
  ql: number,
  a2: number,
  k: number,
  self: boolean,
  out: Float64Array,
  o: number,
): void {
  if (self) {
    selfMoments(pl, a2, k, out, o);
    return;
  }
  const cx = px + 0.5 * pl * ptx - (qx + 0.5 * ql * qtx);
  const cy = py + 0.5 * pl * pty - (qy + 0.5 * ql * qty);
  const cz = pz + 0.5 * pl * ptz - (qz + 0.5 * ql * qtz);
  const D = Math.sqrt(cx * cx + cy * cy + cz * cz);
  const L = pl > ql ? pl : ql;
  if (D < NEAR_RATIO * L) {
    nearMoments(px, py, pz, ptx, pty, ptz, pl, qx, qy, qz, qtx, qty, qtz, ql, a2, k, out, o);
    return;
  }
  const rule = D < 4.5 * L ? G4 : D < 8.5 * L ? G3 : G2;
  const n = rule.x.length;
  let m00r = 0,
    m00i = 0,
    m10r = 0,
    m10i = 0,
    m01r = 0,
    m01i = 0,
    m11r = 0,
    m11i = 0;
  const ox = px - qx;
  const oy = py - qy;
  const oz = pz - qz;
  for (let i = 0; i < n; i++) {
    const u = rule.x[i];
    const wu = rule.w[i];
    const rx = ox + u * pl * ptx;
    const ry = oy + u * pl * pty;
    const rz = oz + u * pl * ptz;
    let ir = 0,
      ii = 0,
      jr = 0,
      ji = 0;
    for (let j = 0; j < n; j++) {
      const v = rule.x[j];
      const dx = rx - v * ql * qtx;
      const dy = ry - v * ql * qty;
      const dz = rz - v * ql * qtz;
      const R = Math.sqrt(dx * dx + dy * dy + dz * dz + a2);
      const kR = k * R;
      const w = rule.w[j] / R;
      const gr = w * Math.cos(kR);
      const gi = -w * Math.sin(kR);
      ir += gr;
      ii += gi;
      jr += v * gr;
      ji += v * gi;
    }
    m00r += wu * ir;
    m00i += wu * ii;
    m10r += wu * u * ir;
    m10i += wu * u * ii;
    m01r += wu * jr;
    m01i += wu * ji;
    m11r += wu * u * jr;
    m11i += wu * u * ji;
  }
  out[o] += m00r;
  out[o + 1] += m00i;
  out[o + 2] += m10r;
  out[o + 3] += m10i;
  out[o + 4] += m01r;
  out[o + 5] += m01i;
  out[o + 6] += m11r;
  out[o + 7] += m11i;
}

function nearMoments(
  px: number,
  py: number,
  pz: number,
  ptx: number,
  pty: number,
  ptz: number,
  pl: number,
  qx: number,
  qy: number,
  qz: number,
  qtx: number,
  qty: number,
  qtz: number,
  ql: number,
  a2: number,
  k: number,
  out: Float64Array,
  o: number,
): void {
  // Break points: where the source segment's ends project onto p.
  let nb = 0;
  breaks[nb++] = 0;
  const tt = ptx * qtx + pty * qty + ptz * qtz;
  const u0 = ((qx - px) * ptx + (qy - py) * pty + (qz - pz) * ptz) / pl;
  const u1 = u0 + (tt * ql) / pl;
  const lo = Math.min(u0, u1);
  const hi = Math.max(u0, u1);
  if (lo > 1e-3 && lo < 1 - 1e-3) breaks[nb++] = lo;
  if (hi > 1e-3 && hi < 1 - 1e-3 && hi - lo > 1e-3) breaks[nb++] = hi;
  breaks[nb++] = 1;
  // Panels: each interval between break points is graded geometrically towards an end that
  // lies close to the source segment (scale = its distance plus the radius).
  const a = Math.sqrt(a2);
  let np = 0;
  for (let b = 0; b + 1 < nb; b++) {
    const ua = breaks[b];
    const ub = breaks[b + 1];
    const ha =
      (pointSegmentDistance(
        px + ua * pl * ptx,
        py + ua * pl * pty,
        pz + ua * pl * ptz,
        qx,
        qy,
        qz,
        qtx,
        qty,
        qtz,
        ql,
      ) +
        a) /
      pl;
    const hb =
      (pointSegmentDistance(
        px + ub * pl * ptx,
        py + ub * pl * pty,
        pz + ub * pl * ptz,
        qx,
        qy,
        qz,
        qtx,
        qty,
        qtz,
        ql,
      ) +
        a) /
      pl;
    const mid = 0.5 * (ua + ub);
    let x = ua;
    if (ha < GRADE_START * (ub - ua)) {
      let w = ha;
      while (x + w < mid) {
        panels[np++] = x;
        panels[np++] = w;
        x += w;
        w *= GRADE_RATIO;
      }
    }
    let y = ub;
    let nRight = 0;
    if (hb < GRADE_START * (ub - ua)) {
      let w = hb;
      while (y - w > x) {
        rightPanels[nRight++] = w;
        y -= w;
        w *= GRADE_RATIO;
      }
    }
    panels[np++] = x;
    panels[np++] = y - x;
    for (let r = nRight - 1; r >= 0; r--) {
      panels[np++] = y;
      panels[np++] = rightPanels[r];
      y += rightPanels[r];
    }
  }
  const k2h = 0.5 * k * k;
  // offsets relative to the source start, formed once (coordinates may be large)
  const ox = px - qx;
  const oy = py - qy;
  const oz = pz - qz;
  let m00r = 0,
    m00i = 0,
    m10r = 0,
    m10i = 0,
    m01r = 0,
    m01i = 0,
    m11r = 0,
    m11i = 0;
  const no = GO.x.length;
  const nr = GR.x.length;
  for (let b = 0; b < np; b += 2) {
    const ua = panels[b];
    const span = panels[b + 1];
    for (let i = 0; i < no; i++) {
      const u = ua + span * GO.x[i];
      const wu = GO.w[i] * span;
      const rx = ox + u * pl * ptx;
      const ry = oy + u * pl * pty;
      const rz = oz + u * pl * ptz;
      const s0 = rx * qtx + ry * qty + rz * qtz;
      // distance from the source line by the cross product: no cancellation for collinear pairs
      const cx = ry * qtz - rz * qty;
      const cy = rz * qtx - rx * qtz;
      const cz = rx * qty - ry * qtx;
      const d2 = cx * cx + cy * cy + cz * cz;
      const rho2 = d2 + a2;
      const rho = Math.sqrt(rho2);
      const R0 = Math.sqrt(s0 * s0 + rho2);
      const e1 = ql - s0;
      const R1 = Math.sqrt(e1 * e1 + rho2);
      let A0: number;
      if (s0 < 0) A0 = Math.log((e1 + R1) / (-s0 + R0));
      else if (s0 > ql) A0 = Math.log((s0 + R0) / (-e1 + R1));
      else A0 = Math.asinh(e1 / rho) + Math.asinh(s0 / rho);
      const A1 = R1 - R0 + s0 * A0;
      const B0 = 0.5 * (e1 * R1 + s0 * R0 + rho2 * A0);
      const B1 = (R1 * R1 * R1 - R0 * R0 * R0) / 3 + s0 * B0;
      let i0r = (A0 - k2h * B0) / ql;
      let i1r = (A1 - k2h * B1) / (ql * ql);
      let i0i = 0;
      let i1i = 0;
      for (let j = 0; j < nr; j++) {
        const v = GR.x[j];
        const dx = rx - v * ql * qtx;
        const dy = ry - v * ql * qty;
        const dz = rz - v * ql * qtz;
        const R = Math.sqrt(dx * dx + dy * dy + dz * dz + a2);
        const kR = k * R;
        const w = GR.w[j];
        const rr = w * remainderRe(kR, R);
        const ri = (-w * Math.sin(kR)) / R;
        i0r += rr;
        i0i += ri;
        i1r += v * rr;
        i1i += v * ri;
      }
      m00r += wu * i0r;
      m00i += wu * i0i;
      m10r += wu * u * i0r;
      m10i += wu * u * i0i;
      m01r += wu * i1r;
      m01i += wu * i1i;
      m11r += wu * u * i1r;
      m11i += wu * u * i1i;
    }
  }
  out[o] += m00r;
  out[o + 1] += m00i;
  out[o + 2] += m10r;
  out[o + 3] += m10i;
  out[o + 4] += m01r;
  out[o + 5] += m01i;
  out[o + 6] += m11r;
  out[o + 7] += m11i;
}

/** Self moments of a straight segment of length l (static part in closed form). */
function selfMoments(l: number, a2: number, k: number, out: Float64Array, o: number): void {
  const al = Math.sqrt(a2) / l;
  const al2 = al * al;
  const s1 = Math.sqrt(1 + al2);
  // J_n = ∫₀¹ wⁿ/√(w²+α²) dw
  const J0 = Math.asinh(1 / al);
  const J1 = s1 - al;
  const J3 = s1 / 3 - ((2 * al2) / 3) * J1;
  // K_n = ∫₀¹ wⁿ √(w²+α²) dw
  const K0 = 0.5 * (s1 + al2 * J0);
  const K1 = (s1 * s1 * s1 - al2 * al) / 3;
  const K3 = (Math.pow(1 + al2, 2.5) - Math.pow(al, 5)) / 5 - al2 * K1;
  const k2h = 0.5 * k * k;
  // ∫∫ du dv (1/R) with R = l·√((u−v)²+α²): (1/l)·…; ∫∫ R: l·…
  const s00 = (2 * (J0 - J1)) / l - k2h * l * 2 * (K0 - K1);
  const s11 = (2 * (J0 / 3 - J1 / 2 + J3 / 6)) / l - k2h * l * 2 * (K0 / 3 - K1 / 2 + K3 / 6);
  let m00r = s00,
    m00i = 0,
    m10r = 0.5 * s00,
    m10i = 0,
    m11r = s11,
    m11i = 0;
  // remainder, smooth: product Gauss rule
  const n = G4.x.length;
  let r10r = 0,
    r10i = 0,
    r00r = 0,
    r00i = 0,
    r11r = 0,
    r11i = 0;
  for (let i = 0; i < n; i++) {
    const u = G4.x[i];
    for (let j = 0; j < n; j++) {
      const v = G4.x[j];
      const du = (u - v) * l;
      const R = Math.sqrt(du * du + a2);
      const kR = k * R;
      const w = G4.w[i] * G4.w[j];
      const rr = w * remainderRe(kR, R);
      const ri = (-w * Math.sin(kR)) / R;
      r00r += rr;
      r00i += ri;
      r10r += u * rr;
      r10i += u * ri;
      r11r += u * v * rr;
      r11i += u * v * ri;
    }
  }
  m00r += r00r;
  m00i += r00i;
  m10r += r10r;
  m10i += r10i;
  m11r += r11r;
  m11i += r11i;
  out[o] += m00r;
  out[o + 1] += m00i;
  out[o + 2] += m10r;
  out[o + 3] += m10i;
  out[o + 4] += m10r;
  out[o + 5] += m10i;
  out[o + 6] += m11r;
  out[o + 7] += m11i;
}

/**
 * The moments of segment p against the perfect-ground image of segment q (q mirrored in z = 0),
 * written to `out` from 0: the image term both ground models build on.
 */
export function imagePairMoments(
  mesh: Mesh,
  p: number,
  q: number,
  a2: number,
  k: number,
  out: Float64Array,
): void {
  out.fill(0);
  pairMoments(
    mesh.sx[p],
    mesh.sy[p],
    mesh.sz[p],
    mesh.tx[p],
    mesh.ty[p],
    mesh.tz[p],
    mesh.len[p],
    mesh.sx[q],
    mesh.sy[q],
    -mesh.sz[q],
    mesh.tx[q],
    mesh.ty[q],
    -mesh.tz[q],
    mesh.len[q],
    a2,
    k,
    false,
    out,
    0,
  );
}
