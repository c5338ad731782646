/**
 * Dense complex LU factorisation with partial (row) pivoting, PA = LU, in place.
 *
 * Storage: an n×n complex matrix is one Float64Array of length 2n², row-major, interleaved
 * (re, im): element (i, j) lives at [2(i·n + j), 2(i·n + j) + 1]. L is unit lower triangular
 * (its ones are not stored), U upper triangular; both overwrite the input, so the matrix and its
 * factors are one allocation plus an Int32Array of pivot rows.
 *
 * Algorithm: right-looking blocked LU (the LAPACK getrf/getf2 partition): factor a panel of
 * `LU_BLOCK` columns with rank-1 updates confined to the panel, solve the block row of U with
 * the panel's unit lower triangle, then update the trailing matrix with the panel as a rank-nb
 * product. The trailing update takes four trailing rows against two panel rows at a time
 * (register blocking), and the trailing rows stay in the first-level cache while they receive the
 * whole panel's contribution.
 * Where WebAssembly SIMD is available (Node, Chromium and Electron workers) matrices of
 * LU_WASM_MIN_N unknowns or more are factored in the kernel's memory: the panel is split in
 * halves of at most 8 columns, each factored by one WebAssembly call (pivot search, row swaps,
 * column scaling and the rank-1 updates inside it), the right half updated by the left; that
 * update, the block row of U and the trailing update go to one WebAssembly block update,
 * A[i][j] −= Σ A[i][q]·A[q][j] over a block, in register tiles of 2 rows × 2 complex columns on
 * 128-bit f64x2 lanes. The kernel is generated and assembled by tools/build-lu-kernel.mjs into
 * wasm/luKernel.generated.ts. Same pivots (on these matrices; the sums are grouped differently),
 * so the factors agree with the TypeScript path up to rounding (test/unit/numeric/lu-kernel.test.ts).
 * Growth and stability as for Gaussian elimination with partial pivoting (Golub & Van Loan).
 *
 * References:
 *  - G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed. (2013), §3.2 (Gaussian
 *    elimination, algorithm 3.2.1), §3.4 (pivoting), §3.2.11 (block LU).
 *  - E. Anderson et al., LAPACK Users' Guide, 3rd ed. (1999), routines xGETRF / xGETF2.
 */

import { LU_KERNEL_FMA_WASM_BASE64, LU_KERNEL_WASM_BASE64 } from './wasm/luKernel.generated.ts';

/** Panel width of the blocked factorisation (columns). */
export const LU_BLOCK = 16;

export class SingularMatrixError extends Error {
  constructor(readonly column: number) {
    super(`matrix is singular to working precision (zero pivot in column ${column})`);
    this.name = 'SingularMatrixError';
  }
}

/** A factored matrix: the LU factors in place of the matrix, and the pivot row of each step. */
export interface LuFactors {
  readonly n: number;
  readonly a: Float64Array;
  readonly pivots: Int32Array;
}

/**
 * Factor the n×n complex matrix `a` in place. Throws SingularMatrixError on an exactly zero
 * pivot; near-singular matrices are the caller's to diagnose (see `estimateConditionLower`).
 */
export function luFactor(n: number, a: Float64Array, pivots: Int32Array = new Int32Array(n)): LuFactors {
  if (a.length !== 2 * n * n) throw new RangeError(`matrix storage ${a.length} does not match n = ${n}`);
  const k = n >= LU_WASM_MIN_N ? wasmKernel() : null;
  if (!k) {
    factorBlocked(n, a, pivots);
    return { n, a, pivots };
  }
  // factor in the kernel's memory (one copy in, one out), the trailing update in WebAssembly
  const bytes = 16 * n * n + 4 * n; // the matrix, then the pivot rows (i32)
  const have = k.memory.buffer.byteLength;
  if (have < bytes) k.memory.grow(Math.ceil((bytes - have) / 65536));
  const view = new Float64Array(k.memory.buffer, 0, 2 * n * n);
  view.set(a);
  try {
    factorWithKernel(n, view, pivots, k);
  } finally {
    a.set(view);
    pivots.set(new Int32Array(k.memory.buffer, 16 * n * n, n));
  }
  return { n, a, pivots };
}

/**
 * The same blocked algorithm as `factorBlocked`, every multiply-add of its three steps done by
 * the kernel's one block update (pivot search, row swaps and the column scaling stay here).
 */
function factorWithKernel(n: number, a: Float64Array, pivots: Int32Array, kern: LuKernel): void {
  const pv = 16 * n * n;
  for (let j0 = 0; j0 < n; j0 += LU_BLOCK) {
    const jEnd = Math.min(j0 + LU_BLOCK, n);
    factorPanel(n, j0, jEnd, pv, kern);
    if (jEnd === n) break;
    // block row of U, row by row, then the trailing matrix
    for (let r = j0 + 1; r < jEnd; r++) kern.update(n, r, r + 1, j0, r, jEnd, n);
    kern.update(n, jEnd, n, j0, jEnd, jEnd, n);
  }
}

/** Panel columns factored by the kernel's unblocked panel step; wider panels are split. */
const LU_PANEL_LEAF = 8;

/**
 * Step 1 on columns j0…j1−1, recursively (Toledo's recursive LU restricted to the panel): factor
 * the left half, update the right half with it (block row, then the rows below, in the block
 * update), factor the right half. The panel step swaps whole rows, so the right half is already
 * permuted. Same pivots as the unblocked panel; the sums are grouped differently (rounding only).
 * (S. Toledo, "Locality of reference in LU decomposition with partial pivoting", SIAM J. Matrix
 * Anal. Appl. 18(4), 1997.)
 */
function factorPanel(n: number, j0: number, j1: number, pv: number, kern: LuKernel): void {
  if (j1 - j0 <= LU_PANEL_LEAF) {
    const bad = kern.panel(n, j0, j1, pv);
    if (bad >= 0) throw new SingularMatrixError(bad);
    return;
  }
  const m = j0 + ((j1 - j0) >> 1);
  factorPanel(n, j0, m, pv, kern);
  for (let r = j0 + 1; r < m; r++) kern.update(n, r, r + 1, j0, r, m, j1);
  kern.update(n, m, n, j0, m, m, j1);
  factorPanel(n, m, j1, pv, kern);
}

/** Matrices smaller than this are factored in TypeScript (the copies would cost more). */
export const LU_WASM_MIN_N = 24;

interface LuKernel {
  memory: WebAssembly.Memory;
  /** A[i][j] −= Σ_{q0 ≤ q < q1} A[i][q]·A[q][j], r0 ≤ i < r1, c0 ≤ j < c1 (build-lu-kernel.mjs). */
  update(n: number, r0: number, r1: number, q0: number, q1: number, c0: number, c1: number): void;
  /**
   * Step 1 (getf2 on columns j0…j1−1) with pivot rows stored as i32 from byte pv; −1, or the
   * column of an exactly zero pivot (build-lu-kernel.mjs).
   */
  panel(n: number, j0: number, j1: number, pv: number): number;
}

/** Which kernel runs: relaxed SIMD's fused multiply-add, plain f64x2 multiply and add, or none. */
export type LuKernelKind = 'fused' | 'plain' | null;

const kernels: Partial<Record<'fused' | 'plain', LuKernel | null>> = {};
let kernelAllowed = true;
let fusedAllowed = true;

function instantiate(base64: string): LuKernel | null {
  try {
    const bin = atob(base64);
    const bytes = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
    if (!WebAssembly.validate(bytes)) return null;
    const inst = new WebAssembly.Instance(new WebAssembly.Module(bytes), {});
    const memory = inst.exports.memory;
    const update = inst.exports.update;
    const panel = inst.exports.panel;
    if (memory instanceof WebAssembly.Memory && typeof update === 'function' && typeof panel === 'function')
      return { memory, update: update as LuKernel['update'], panel: panel as LuKernel['panel'] };
  } catch {
    /* no WebAssembly, no SIMD, or a content policy refuses it */
  }
  return null;
}

function kernelOf(kind: 'fused' | 'plain'): LuKernel | null {
  let k = kernels[kind];
  if (k === undefined)
    k = kernels[kind] = instantiate(kind === 'fused' ? LU_KERNEL_FMA_WASM_BASE64 : LU_KERNEL_WASM_BASE64);
  return k;
}

/**
 * The WebAssembly kernel (tools/build-lu-kernel.mjs): the one whose block update uses relaxed
 * SIMD's f64x2 multiply-add where the engine has it (Chromium and Electron; Node 20 only with
 * --experimental-wasm-relaxed-simd), else the one with f64x2 multiply and add, else null where
 * WebAssembly or its SIMD is unavailable: then everything runs in TypeScript. The results agree
 * up to rounding (the multiply-add may round once where multiply and add round twice).
 */
function wasmKernel(): LuKernel | null {
  if (!kernelAllowed) return null;
  return (fusedAllowed ? kernelOf('fused') : null) ?? kernelOf('plain');
}

/** The kernel luFactor uses now (see `useLuKernel`). */
export function luKernelKind(): LuKernelKind {
  if (!kernelAllowed) return null;
  if (fusedAllowed && kernelOf('fused')) return 'fused';
  return kernelOf('plain') ? 'plain' : null;
}

/**
 * Whether luFactor uses a WebAssembly kernel: `allow` false forces TypeScript, `fused` false the
 * kernel without multiply-add (tests, benchmarks).
 */
export function useLuKernel(allow: boolean, fused = true): boolean {
  kernelAllowed = allow;
  fusedAllowed = fused;
  return allow && wasmKernel() !== null;
}

/** Steps 1–3 of the blocked factorisation on `a` in TypeScript. */
function factorBlocked(n: number, a: Float64Array, pivots: Int32Array): void {
  const n2 = 2 * n;
  for (let j0 = 0; j0 < n; j0 += LU_BLOCK) {
    const jEnd = Math.min(j0 + LU_BLOCK, n);
    // 1. Panel: columns j0..jEnd−1, all rows below the diagonal (unblocked getf2).
    for (let k = j0; k < jEnd; k++) {
      let p = k;
      let best = -1;
      for (let i = k; i < n; i++) {
        const idx = i * n2 + 2 * k;
        const m = a[idx] * a[idx] + a[idx + 1] * a[idx + 1];
        if (m > best) {
          best = m;
          p = i;
        }
      }
      if (!(best > 0)) throw new SingularMatrixError(k);
      pivots[k] = p;
      if (p !== k) {
        const rk = k * n2;
        const rp = p * n2;
        for (let j = 0; j < n2; j++) {
          const t = a[rk + j];
          a[rk + j] = a[rp + j];
          a[rp + j] = t;
        }
      }
      const kk = k * n2 + 2 * k;
      const pr = a[kk];
      const pi = a[kk + 1];
      const d = pr * pr + pi * pi;
      const ir = pr / d;
      const ii = -pi / d;
      const rowK = k * n2;
      for (let i = k + 1; i < n; i++) {
        const ri = i * n2;
        const idx = ri + 2 * k;
        const xr = a[idx];
        const xi = a[idx + 1];
        const lr = xr * ir - xi * ii;
        const li = xr * ii + xi * ir;
        a[idx] = lr;
        a[idx + 1] = li;
        for (let j = 2 * (k + 1); j < 2 * jEnd; j += 2) {
          const ur = a[rowK + j];
          const ui = a[rowK + j + 1];
          a[ri + j] -= lr * ur - li * ui;
          a[ri + j + 1] -= lr * ui + li * ur;
        }
      }
    }
    if (jEnd === n) break;
    const c0 = 2 * jEnd;
    // 2. Block row of U: U12 = L11⁻¹ A12 (unit lower triangular solve, row by row).
    for (let r = j0 + 1; r < jEnd; r++) {
      const rr = r * n2;
      for (let q = j0; q < r; q++) {
        const lr = a[rr + 2 * q];
        const li = a[rr + 2 * q + 1];
        const rq = q * n2;
        for (let j = c0; j < n2; j += 2) {
          const ur = a[rq + j];
          const ui = a[rq + j + 1];
          a[rr + j] -= lr * ur - li * ui;
          a[rr + j + 1] -= lr * ui + li * ur;
        }
      }
    }
    trailingUpdateTs(n, a, j0, jEnd);
  }
}

/**
 * Step 3 in TypeScript: trailing update A22 −= L21·U12 for panel columns j0…jEnd−1,
 * register-blocked: four trailing rows against two panel rows per sweep (then two rows, then
 * one), so each loaded element of U12 serves four rows and each trailing element receives two
 * updates per load and store.
 */
function trailingUpdateTs(n: number, a: Float64Array, j0: number, jEnd: number): void {
  const n2 = 2 * n;
  const c0 = 2 * jEnd;
  let i = jEnd;
  for (; i + 3 < n; i += 4) {
    const ri = i * n2;
    const rj = ri + n2;
    const rk = rj + n2;
    const rl = rk + n2;
    let q = j0;
    for (; q + 1 < jEnd; q += 2) {
      const q2 = 2 * q;
      const a0r = a[ri + q2];
      const a0i = a[ri + q2 + 1];
      const a1r = a[ri + q2 + 2];
      const a1i = a[ri + q2 + 3];
      const b0r = a[rj + q2];
      const b0i = a[rj + q2 + 1];
      const b1r = a[rj + q2 + 2];
      const b1i = a[rj + q2 + 3];
      const c0r = a[rk + q2];
      const c0i = a[rk + q2 + 1];
      const c1r = a[rk + q2 + 2];
      const c1i = a[rk + q2 + 3];
      const d0r = a[rl + q2];
      const d0i = a[rl + q2 + 1];
      const d1r = a[rl + q2 + 2];
      const d1i = a[rl + q2 + 3];
      const r0 = q * n2;
      const r1 = r0 + n2;
      for (let j = c0; j < n2; j += 2) {
        const u0r = a[r0 + j];
        const u0i = a[r0 + j + 1];
        const u1r = a[r1 + j];
        const u1i = a[r1 + j + 1];
        a[ri + j] -= a0r * u0r - a0i * u0i + (a1r * u1r - a1i * u1i);
        a[ri + j + 1] -= a0r * u0i + a0i * u0r + (a1r * u1i + a1i * u1r);
        a[rj + j] -= b0r * u0r - b0i * u0i + (b1r * u1r - b1i * u1i);
        a[rj + j + 1] -= b0r * u0i + b0i * u0r + (b1r * u1i + b1i * u1r);
        a[rk + j] -= c0r * u0r - c0i * u0i + (c1r * u1r - c1i * u1i);
        a[rk + j + 1] -= c0r * u0i + c0i * u0r + (c1r * u1i + c1i * u1r);
        a[rl + j] -= d0r * u0r - d0i * u0i + (d1r * u1r - d1i * u1i);
        a[rl + j + 1] -= d0r * u0i + d0i * u0r + (d1r * u1i + d1i * u1r);
      }
    }
    for (; q < jEnd; q++) {
      const q2 = 2 * q;
      const rq = q * n2;
      const ar = a[ri + q2];
      const ai = a[ri + q2 + 1];
      const br = a[rj + q2];
      const bi = a[rj + q2 + 1];
      const cr = a[rk + q2];
      const ci = a[rk + q2 + 1];
      const dr = a[rl + q2];
      const di = a[rl + q2 + 1];
      for (let j = c0; j < n2; j += 2) {
        const ur = a[rq + j];
        const ui = a[rq + j + 1];
        a[ri + j] -= ar * ur - ai * ui;
        a[ri + j + 1] -= ar * ui + ai * ur;
        a[rj + j] -= br * ur - bi * ui;
        a[rj + j + 1] -= br * ui + bi * ur;
        a[rk + j] -= cr * ur - ci * ui;
        a[rk + j + 1] -= cr * ui + ci * ur;
        a[rl + j] -= dr * ur - di * ui;
        a[rl + j + 1] -= dr * ui + di * ur;
      }
    }
  }
  for (; i + 1 < n; i += 2) {
    const ri = i * n2;
    const rj = ri + n2;
    let q = j0;
    for (; q + 1 < jEnd; q += 2) {
      const a0r = a[ri + 2 * q];
      const a0i = a[ri + 2 * q + 1];
      const a1r = a[ri + 2 * q + 2];
      const a1i = a[ri + 2 * q + 3];
      const b0r = a[rj + 2 * q];
      const b0i = a[rj + 2 * q + 1];
      const b1r = a[rj + 2 * q + 2];
      const b1i = a[rj + 2 * q + 3];
      const r0 = q * n2;
      const r1 = r0 + n2;
      for (let j = c0; j < n2; j += 2) {
        const u0r = a[r0 + j];
        const u0i = a[r0 + j + 1];
        const u1r = a[r1 + j];
        const u1i = a[r1 + j + 1];
        a[ri + j] -= a0r * u0r - a0i * u0i + (a1r * u1r - a1i * u1i);
        a[ri + j + 1] -= a0r * u0i + a0i * u0r + (a1r * u1i + a1i * u1r);
        a[rj + j] -= b0r * u0r - b0i * u0i + (b1r * u1r - b1i * u1i);
        a[rj + j + 1] -= b0r * u0i + b0i * u0r + (b1r * u1i + b1i * u1r);
      }
    }
    for (; q < jEnd; q++) {
      const lr = a[ri + 2 * q];
      const li = a[ri + 2 * q + 1];
      const mr = a[rj + 2 * q];
      const mi = a[rj + 2 * q + 1];
      const rq = q * n2;
      for (let j = c0; j < n2; j += 2) {
        const ur = a[rq + j];
        const ui = a[rq + j + 1];
        a[ri + j] -= lr * ur - li * ui;
        a[ri + j + 1] -= lr * ui + li * ur;
        a[rj + j] -= mr * ur - mi * ui;
        a[rj + j + 1] -= mr * ui + mi * ur;
      }
    }
  }
  for (; i < n; i++) {
    const ri = i * n2;
    for (let q = j0; q < jEnd; q++) {
      const lr = a[ri + 2 * q];
      const li = a[ri + 2 * q + 1];
      const rq = q * n2;
      for (let j = c0; j < n2; j += 2) {
        const ur = a[rq + j];
        const ui = a[rq + j + 1];
        a[ri + j] -= lr * ur - li * ui;
        a[ri + j + 1] -= lr * ui + li * ur;
      }
    }
  }
}

/**
 * Solve A x = b with the factors of A. `b` (length 2n, interleaved) is overwritten by x and
 * returned.
 */
export function luSolve(f: LuFactors, b: Float64Array): Float64Array {
  const { n, a, pivots } = f;
  const n2 = 2 * n;
  for (let k = 0; k < n; k++) {
    const p = pivots[k];
    if (p !== k) {
      let t = b[2 * k];
      b[2 * k] = b[2 * p];
      b[2 * p] = t;
      t = b[2 * k + 1];
      b[2 * k + 1] = b[2 * p + 1];
      b[2 * p + 1] = t;
    }
  }
  // forward: L y = Pb (unit diagonal)
  for (let i = 1; i < n; i++) {
    const ri = i * n2;
    let sr = b[2 * i];
    let si = b[2 * i + 1];
    for (let j = 0; j < i; j++) {
      const lr = a[ri + 2 * j];
      const li = a[ri + 2 * j + 1];
      sr -= lr * b[2 * j] - li * b[2 * j + 1];
      si -= lr * b[2 * j + 1] + li * b[2 * j];
    }
    b[2 * i] = sr;
    b[2 * i + 1] = si;
  }
  // back: U x = y
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * n2;
    let sr = b[2 * i];
    let si = b[2 * i + 1];
    for (let j = i + 1; j < n; j++) {
      const ur = a[ri + 2 * j];
      const ui = a[ri + 2 * j + 1];
      sr -= ur * b[2 * j] - ui * b[2 * j + 1];
      si -= ur * b[2 * j + 1] + ui * b[2 * j];
    }
    const dr = a[ri + 2 * i];
    const di = a[ri + 2 * i + 1];
    const d = dr * dr + di * di;
    b[2 * i] = (sr * dr + si * di) / d;
    b[2 * i + 1] = (si * dr - sr * di) / d;
  }
  return b;
}

/** y = A x for an n×n interleaved complex matrix (unfactored). */
export function complexMatVec(
  n: number,
  a: Float64Array,
  x: Float64Array,
  y = new Float64Array(2 * n),
): Float64Array {
  const n2 = 2 * n;
  for (let i = 0; i < n; i++) {
    let sr = 0;
    let si = 0;
    const ri = i * n2;
    for (let j = 0; j < n; j++) {
      const ar = a[ri + 2 * j];
      const ai = a[ri + 2 * j + 1];
      sr += ar * x[2 * j] - ai * x[2 * j + 1];
      si += ar * x[2 * j + 1] + ai * x[2 * j];
    }
    y[2 * i] = sr;
    y[2 * i + 1] = si;
  }
  return y;
}
