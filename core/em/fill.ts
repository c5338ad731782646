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
 * Translation invariance: segment i of wire A and segment j of wire B differ only by a
 * translation when A and B (or A and the mirror image of B) have the same direction, segment
 * length and radius — in particular a straight wire with itself. Their moments then depend on
 * j − i alone. When B runs the opposite way (anti-parallel: two legs of a half-square, or a
 * vertical wire and its own image) they depend on i + j alone. Either way a wire pair needs
 * N_A + N_B − 1 moment integrals instead of N_A·N_B; the ground's weighted image terms likewise
 * when the ground says its weights depend on relative position only (the centre offsets and the
 * sum of the heights follow the same index combination).
 * Returns +1 (parallel, key j − i), −1 (anti-parallel, key i + j) or 0.
 */
function wireRelation(mesh: Mesh, wa: number, wb: number, mirror: boolean): number {
  const sa = mesh.wireSegStart[wa];
  const sb = mesh.wireSegStart[wb];
  const zs = mirror ? -1 : 1;
  const tol = 1e-12;
  if (!(Math.abs(mesh.len[sa] - mesh.len[sb]) < tol * mesh.len[sa] && mesh.radius[sa] === mesh.radius[sb]))
    return 0;
  const bx = mesh.tx[sb];
  const by = mesh.ty[sb];
  const bz = zs * mesh.tz[sb];
  if (
    Math.abs(mesh.tx[sa] - bx) < tol &&
    Math.abs(mesh.ty[sa] - by) < tol &&
    Math.abs(mesh.tz[sa] - bz) < tol
  )
    return 1;
  if (
    Math.abs(mesh.tx[sa] + bx) < tol &&
    Math.abs(mesh.ty[sa] + by) < tol &&
    Math.abs(mesh.tz[sa] + bz) < tol
  )
    return -1;
  return 0;
}

let freeTable = new Float64Array(0);
let imageTable = new Float64Array(0);
let reflTable = new Float64Array(0);
let freeDone = new Uint8Array(0);
let imageDone = new Uint8Array(0);
let reflDone = new Uint8Array(0);

function ensureTables(size: number): void {
  if (freeDone.length < size) {
    freeTable = new Float64Array(8 * size);
    imageTable = new Float64Array(8 * size);
    reflTable = new Float64Array(10 * size);
    freeDone = new Uint8Array(size);
    imageDone = new Uint8Array(size);
    reflDone = new Uint8Array(size);
  }
  freeDone.fill(0, 0, size);
  imageDone.fill(0, 0, size);
  reflDone.fill(0, 0, size);
}

/** Fill z (2n² doubles, row-major interleaved, zeroed here) for wave number k. */
export function fillImpedanceMatrix(
  mesh: Mesh,
  k: number,
  eta: number,
  ground: GroundAtFrequency | null,
  z: Float64Array,
  useCache = true,
): void {
  const n = mesh.nBasis;
  z.fill(0);
  const { sx, sy, sz, tx, ty, tz, len, radius, segPieceStart, pieceBasis, pieceA, pieceB } = mesh;
  const fi = (k * eta) / (4 * Math.PI); // factor jkη/4π = j·fi
  const ik2 = 1 / (k * k);
  const n2 = 2 * n;
  for (let wa = 0; wa < mesh.nWires; wa++) {
    const a0 = mesh.wireSegStart[wa];
    const a1 = mesh.wireSegStart[wa + 1];
    for (let wb = wa; wb < mesh.nWires; wb++) {
      const b0 = mesh.wireSegStart[wb];
      const b1 = mesh.wireSegStart[wb + 1];
      const freeRel = useCache ? wireRelation(mesh, wa, wb, false) : 0;
      // image models: the image moments are cached by the mirror relation, and their weighted
      // result too when the weights are translation-invariant; other models (the exact
      // half-space) cache their result when they say it is translation-invariant for this pair
      const imageModel = ground !== null && ground.weightImage !== undefined;
      const invariantPairs =
        useCache &&
        ground !== null &&
        !imageModel &&
        ground.pairsTranslationInvariant?.(mesh, wa, wb) === true;
      const imageRel = (useCache && imageModel) || invariantPairs ? wireRelation(mesh, wa, wb, true) : 0;
      const freeCached = freeRel !== 0;
      const imageCached = imageRel !== 0 && imageModel;
      const reflCached =
        imageRel !== 0 && (imageModel ? ground!.translationInvariantWeights === true : invariantPairs);
      const offset = a1 - a0 - 1;
      ensureTables(a1 - a0 + b1 - b0 - 1);
      for (let p = a0; p < a1; p++) {
        const pa = segPieceStart[p];
        const pb = segPieceStart[p + 1];
        if (pa === pb) continue;
        for (let q = wa === wb ? p : b0; q < b1; q++) {
          const qa = segPieceStart[q];
          const qb = segPieceStart[q + 1];
          if (qa === qb) continue;
          const a2 = 0.5 * (radius[p] * radius[p] + radius[q] * radius[q]);
          const dDiff = q - b0 - (p - a0) + offset;
          const dSum = q - b0 + (p - a0);
          const d = freeRel < 0 ? dSum : dDiff;
          const di = imageRel < 0 ? dSum : dDiff;
          let mm: Float64Array;
          let mo = 0;
          if (freeCached) {
            mm = freeTable;
            mo = 8 * d;
            if (!freeDone[d]) {
              for (let i = 0; i < 8; i++) freeTable[mo + i] = 0;
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
                freeTable,
                mo,
              );
              freeDone[d] = 1;
            }
          } else {
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
          let v00r = tt * mm[mo],
            v00i = tt * mm[mo + 1],
            v10r = tt * mm[mo + 2],
            v10i = tt * mm[mo + 3],
            v01r = tt * mm[mo + 4],
            v01i = tt * mm[mo + 5],
            v11r = tt * mm[mo + 6],
            v11i = tt * mm[mo + 7],
            s00r = mm[mo],
            s00i = mm[mo + 1];
          if (ground) {
            let rf: Float64Array = refl;
            let ro = 0;
            if (reflCached && reflDone[di]) {
              rf = reflTable;
              ro = 10 * di;
              ground.reusedPair?.(mesh, p, q);
            } else {
              let im: Float64Array = img;
              if (imageCached) {
                if (!imageDone[di]) {
                  const io = 8 * di;
                  for (let i = 0; i < 8; i++) imageTable[io + i] = 0;
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
                    imageTable,
                    io,
                  );
                  imageDone[di] = 1;
                }
                im = imageTable.subarray(8 * di, 8 * di + 8);
              } else if (ground.weightImage) {
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
              }
              if (ground.weightImage) ground.weightImage(mesh, p, q, im, refl);
              else ground.reflectedPair(mesh, p, q, a2, k, refl);
              if (reflCached) {
                for (let i = 0; i < 10; i++) reflTable[10 * di + i] = refl[i];
                reflDone[di] = 1;
              }
            }
            v00r += rf[ro];
            v00i += rf[ro + 1];
            v10r += rf[ro + 2];
            v10i += rf[ro + 3];
            v01r += rf[ro + 4];
            v01i += rf[ro + 5];
            v11r += rf[ro + 6];
            v11i += rf[ro + 7];
            s00r += rf[ro + 8];
            s00i += rf[ro + 9];
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
              // times j·fi
              const er = -fi * ti;
              const ei = fi * tr;
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
