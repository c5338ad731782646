/**
 * Child process of test/unit/numeric/lu-kernel.test.ts, run as
 * `node --experimental-wasm-relaxed-simd --import tsx test/helpers/luFusedCheck.ts`: the kernel
 * with relaxed SIMD's multiply-add against the TypeScript path (Node 20 enables relaxed SIMD only
 * with that flag). Prints one JSON line: the kernel used and, per size, whether the pivots agree,
 * the largest factor difference relative to the largest factor element, and the largest error of
 * x in A x = A·1 (x must come back as ones).
 */
import { luKernelKind } from '../../core/numeric/lu.ts';
import { compareKernelWithTypeScript, type KernelComparison } from './luCompare.ts';

const sizes: Record<number, Omit<KernelComparison, 'kernel'>> = {};
for (const n of [24, 37, 101, 200]) {
  const { samePivots, relDiff, solveErr } = compareKernelWithTypeScript(n);
  sizes[n] = { samePivots, relDiff, solveErr };
}
process.stdout.write(JSON.stringify({ kind: luKernelKind(), sizes }) + '\n');
