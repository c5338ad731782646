/**
 * Impedance-matrix fill: thin-wire electric-field integral equation, triangle basis, Galerkin
 * testing, mixed-potential form.
 *
 *     Z_mn = (jkη/4π) [ ∫∫ f_m·f_n G dl dl' − (1/k²) ∫∫ (∇·f_m)(∇·f_n) G dl dl' ]
 *
 * Straight wires with equal segments are translation-invariant along their length; the fill
 * exploits it (TranslationCache) and computes each distinct moment once.
 *
 * (Harrington, Field Computation by Moment Methods, 1968, §4.3, the Galerkin form of Pocklington's
 * equation with the derivatives moved onto the testing functions; Gibson, The Method of Moments
 * in Electromagnetics, 2nd ed., 2014, §4.4). With a basis piece a + b·u on a segment of length Δ,
 * f = (a + b u) t̂ and ∇·f = b/Δ, so each pair of pieces on segments (p, q) contributes
 *     (jkη/4π)[ΔpΔq (t̂p·t̂q)(a a' M00 + a b' M01 + b a' M10 + b b' M11) − b b' M00/k²]
 * in terms of the segment-pair moments of kernel.ts, plus the ground's reflected terms
 * (ground.ts). Z is complex symmetric (reciprocity): the loop visits each unordered segment pair
 * once and writes both Z_mn and Z_nm.
 */
import type { GroundAtFrequency } from './ground.ts';
import { pairMoments } from './kernel.ts';
import type { Mesh } from './mesh.ts';

const mom = new Float64Array(8);
const img = new Float64Array(8);
const refl = new Float64Array(10);

/**
 * Moment cache for pairs of wires whose segment pairs differ only by a translation along the
 * wire: the same wire (equal segments), or two wires (or a wire and the mirror image of
 * another) with the same direction and segment length. The moments of segment i of wire A with
 * segment j of wire B then depend on j − i alone, so a wire pair needs N_A + N_B − 1 moment
 * integrals instead of N_A·N_B. Keyed per (wire A, wire B, image).
 */
class TranslationCache {
  private readonly tables = new Map<number, { data: Float64Array; done: Uint8Array; offset: number }>();
  constructor(private readonly mesh: Mesh) {}
  private compatible(wa: number, wb: number, image: boolean): boolean {
    const m = this.mesh;
    const sa = m.wireSegStart[wa];
    const sb = m.wireSegStart[wb];
    const zs = image ? -1 : 1;
    const tol = 1e-12;
    return (
      Math.abs(m.tx[sa] - m.tx[sb]) < tol &&
      Math.abs(m.ty[sa] - m.ty[sb]) < tol &&
      Math.abs(m.tz[sa] - zs * m.tz[sb]) < tol &&
      Math.abs(m.len[sa] - m.len[sb]) < tol * m.len[sa] &&
      m.radius[sa] === m.radius[sb]
    );
  }
  /** Cached moments of (p, q) (q mirrored when image), or null when the wires are not compatible. */
  lookup(p: number, q: number, image: boolean, a2: number, k: number): Float64Array | null {
    const m = this.mesh;
    const wa = m.segWire[p];
    const wb = m.segWire[q];
    const key = (wa * m.nWires + wb) * 2 + (image ? 1 : 0);
    let t = this.tables.get(key);
    if (t === undefined) {
      if (!this.compatible(wa, wb, image)) {
        this.tables.set(key, { data: new Float64Array(0), done: new Uint8Array(0), offset: -1 });
        return null;
      }
      const na = m.wireSegStart[wa + 1] - m.wireSegStart[wa];
      const nb = m.wireSegStart[wb + 1] - m.wireSegStart[wb];
      t = { data: new Float64Array(8 * (na + nb - 1)), done: new Uint8Array(na + nb - 1), offset: na - 1 };
      this.tables.set(key, t);
    }
    if (t.offset < 0) return null;
    const d = q - m.wireSegStart[wb] - (p - m.wireSegStart[wa]) + t.offset;
    const o = 8 * d;
    if (!t.done[d]) {
      const zs = image ? -1 : 1;
      pairMoments(
        m.sx[p],
        m.sy[p],
        m.sz[p],
        m.tx[p],
        m.ty[p],
        m.tz[p],
        m.len[p],
        m.sx[q],
        m.sy[q],
        zs * m.sz[q],
        m.tx[q],
        m.ty[q],
        zs * m.tz[q],
        m.len[q],
        a2,
        k,
        p === q && !image,
        t.data,
        o,
      );
      t.done[d] = 1;
    }
    return t.data.subarray(o, o + 8);
  }
}

/** Fill z (2n² doubles, row-major interleaved, zeroed here) for wave number k. */
export function fillImpedanceMatrix(
  mesh: Mesh,
  k: number,
  eta: number,
  ground: GroundAtFrequency | null,
  z: Float64Array,
): void {
  const n = mesh.nBasis;
  z.fill(0);
  const { sx, sy, sz, tx, ty, tz, len, radius, segPieceStart, pieceBasis, pieceA, pieceB } = mesh;
  const fr = 0; // factor jkη/4π = (0, kη/4π)
  const fi = (k * eta) / (4 * Math.PI);
  const ik2 = 1 / (k * k);
  const n2 = 2 * n;
  const cache = new TranslationCache(mesh);
  for (let p = 0; p < mesh.nSeg; p++) {
    const pa = segPieceStart[p];
    const pb = segPieceStart[p + 1];
    if (pa === pb) continue;
    for (let q = p; q < mesh.nSeg; q++) {
      const qa = segPieceStart[q];
      const qb = segPieceStart[q + 1];
      if (qa === qb) continue;
      const a2 = 0.5 * (radius[p] * radius[p] + radius[q] * radius[q]);
      let mm = cache.lookup(p, q, false, a2, k);
      if (mm === null) {
        mom.fill(0);
        pairMoments(
          sx[p],
          sy[p],
          sz[p],
          tx[p],
          ty[p],
          tz[p],
          len[p],
          sx[q],
          sy[q],
          sz[q],
          tx[q],
          ty[q],
          tz[q],
          len[q],
          a2,
          k,
          p === q,
          mom,
          0,
        );
        mm = mom;
      }
      const tt = tx[p] * tx[q] + ty[p] * ty[q] + tz[p] * tz[q];
      let v00r = tt * mm[0],
        v00i = tt * mm[1],
        v10r = tt * mm[2],
        v10i = tt * mm[3],
        v01r = tt * mm[4],
        v01i = tt * mm[5],
        v11r = tt * mm[6],
        v11i = tt * mm[7],
        s00r = mm[0],
        s00i = mm[1];
      if (ground) {
        if (ground.weightImage) {
          let im = cache.lookup(p, q, true, a2, k);
          if (im === null) {
            img.fill(0);
            pairMoments(
              sx[p],
              sy[p],
              sz[p],
              tx[p],
              ty[p],
              tz[p],
              len[p],
              sx[q],
              sy[q],
              -sz[q],
              tx[q],
              ty[q],
              -tz[q],
              len[q],
              a2,
              k,
              false,
              img,
              0,
            );
            im = img;
          }
          ground.weightImage(mesh, p, q, im, refl);
        } else ground.reflectedPair(mesh, p, q, a2, k, refl);
        v00r += refl[0];
        v00i += refl[1];
        v10r += refl[2];
        v10i += refl[3];
        v01r += refl[4];
        v01i += refl[5];
        v11r += refl[6];
        v11i += refl[7];
        s00r += refl[8];
        s00i += refl[9];
      }
      const ll = len[p] * len[q];
      for (let i = pa; i < pb; i++) {
        const m = pieceBasis[i];
        const ai = pieceA[i];
        const bi = pieceB[i];
        for (let j = qa; j < qb; j++) {
          const nn = pieceBasis[j];
          const aj = pieceA[j];
          const bj = pieceB[j];
          const c00 = ai * aj * ll;
          const c01 = ai * bj * ll;
          const c10 = bi * aj * ll;
          const c11 = bi * bj * ll;
          const cs = bi * bj * ik2;
          const tr = c00 * v00r + c01 * v01r + c10 * v10r + c11 * v11r - cs * s00r;
          const ti = c00 * v00i + c01 * v01i + c10 * v10i + c11 * v11i - cs * s00i;
          // multiply by (fr + j fi)
          const er = fr * tr - fi * ti;
          const ei = fr * ti + fi * tr;
          const idx = m * n2 + 2 * nn;
          z[idx] += er;
          z[idx + 1] += ei;
          if (p !== q) {
            const jdx = nn * n2 + 2 * m;
            z[jdx] += er;
            z[jdx + 1] += ei;
          }
        }
      }
    }
  }
}

/**
 * Add a distributed series impedance per unit length z' (Ω/m, complex) on segment s:
 * Z_mn += z' Δ ∫₀¹ (a + b u)(a' + b' u) du  (the conductor's internal impedance).
 */
export function addSegmentImpedance(mesh: Mesh, s: number, zr: number, zi: number, z: Float64Array): void {
  const n2 = 2 * mesh.nBasis;
  const l = mesh.len[s];
  for (let i = mesh.segPieceStart[s]; i < mesh.segPieceStart[s + 1]; i++) {
    for (let j = mesh.segPieceStart[s]; j < mesh.segPieceStart[s + 1]; j++) {
      const ai = mesh.pieceA[i];
      const bi = mesh.pieceB[i];
      const aj = mesh.pieceA[j];
      const bj = mesh.pieceB[j];
      const w = l * (ai * aj + 0.5 * (ai * bj + bi * aj) + (bi * bj) / 3);
      const idx = mesh.pieceBasis[i] * n2 + 2 * mesh.pieceBasis[j];
      z[idx] += w * zr;
      z[idx + 1] += w * zi;
    }
  }
}
