/**
 * Child process of test/unit/numeric/lu-kernel.test.ts, run as
 * `node --experimental-wasm-relaxed-simd --import tsx test/helpers/luFusedCheck.ts`: the kernel
 * with relaxed SIMD's multiply-add against the TypeScript path (Node 20 enables relaxed SIMD only
 * with that flag). Prints one JSON line: the kernel used and, per size, whether the pivots agree,
 * the largest factor difference relative to the largest factor element, and the largest error of
 * x in A x = A·1 (x must come back as ones).
 */
import { luFactor, luKernelKind, luSolve, useLuKernel } from '../../core/numeric/lu.ts';

function randomMatrix(n: number, seed: number): Float64Array {
  let s = seed;
  return new Float64Array(2 * n * n).map(() => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296 - 0.5;
  });
}

const sizes: Record<number, { samePivots: boolean; relDiff: number; solveErr: number }> = {};
for (const n of [24, 37, 101, 200]) {
  const a0 = randomMatrix(n, 7 + n);
  useLuKernel(false);
  const t = luFactor(n, a0.slice());
  useLuKernel(true);
  const w = luFactor(n, a0.slice());
  let big = 0;
  let diff = 0;
  for (let i = 0; i < t.a.length; i++) {
    big = Math.max(big, Math.abs(t.a[i]));
    diff = Math.max(diff, Math.abs(w.a[i] - t.a[i]));
  }
  const b = new Float64Array(2 * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      b[2 * i] += a0[2 * (i * n + j)];
      b[2 * i + 1] += a0[2 * (i * n + j) + 1];
    }
  const x = luSolve(w, b);
  let err = 0;
  for (let i = 0; i < n; i++) err = Math.max(err, Math.abs(x[2 * i] - 1), Math.abs(x[2 * i + 1]));
  sizes[n] = {
    samePivots: Array.from(w.pivots).every((p, i) => p === t.pivots[i]),
    relDiff: diff / big,
    solveErr: err,
  };
}
process.stdout.write(JSON.stringify({ kind: luKernelKind(), sizes }) + '\n');
