/**
 * The dense LU's kernel path against its TypeScript path on one random complex matrix (shared by
 * test/unit/numeric/lu-kernel.test.ts and its child process test/helpers/luFusedCheck.ts).
 */
import { luFactor, luSolve, useLuKernel } from '../../core/numeric/lu.ts';

/** A reproducible random complex n × n matrix (interleaved re, im), entries in [−0.5, 0.5). */
export function randomMatrix(n: number, seed: number): Float64Array {
  let s = seed;
  return new Float64Array(2 * n * n).map(() => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296 - 0.5;
  });
}

export interface KernelComparison {
  /** The kernel path was available (useLuKernel(true) succeeded). */
  kernel: boolean;
  samePivots: boolean;
  /** Largest factor difference relative to the largest factor element. */
  relDiff: number;
  /** Largest error of x in A x = A·1 solved with the kernel's factors (x must come back as ones). */
  solveErr: number;
}

/** Factor the matrix of size n (seed 7 + n) by both paths and compare; leaves the kernel on. */
export function compareKernelWithTypeScript(n: number): KernelComparison {
  const a0 = randomMatrix(n, 7 + n);
  useLuKernel(false);
  const t = luFactor(n, a0.slice());
  const kernel = useLuKernel(true);
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
  return {
    kernel,
    samePivots: Array.from(w.pivots).every((p, i) => p === t.pivots[i]),
    relDiff: diff / big,
    solveErr: err,
  };
}
