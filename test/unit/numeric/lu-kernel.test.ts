// The WebAssembly SIMD path of the dense LU (core/numeric/lu.ts, core/numeric/wasm/) against the
// TypeScript path: the same factors up to rounding, the same pivots, the same refusal of a
// singular matrix; and the committed kernel is what its build script makes (regression guards,
// not reference checks: the LU itself is checked in numeric.test.ts).
import { spawnSync } from 'node:child_process';
import { afterEach, describe, expect, it } from 'vitest';
import { luFactor, luKernelKind, SingularMatrixError, useLuKernel } from '../../../core/numeric/lu.ts';
import { compareKernelWithTypeScript, randomMatrix } from '../../helpers/luCompare.ts';
import { LU_KERNEL_FMA_WASM_BASE64 } from '../../../core/numeric/wasm/luKernel.generated.ts';

/** Largest factor difference between the two paths, relative to the largest factor element. */
const PATH_TOL = 1e-12;

afterEach(() => {
  useLuKernel(true);
});

describe('dense LU: WebAssembly kernel against TypeScript', () => {
  it('the kernel loads here (Node has WebAssembly SIMD)', () => {
    expect(useLuKernel(true)).toBe(true);
    // Node 20 has relaxed SIMD only behind a flag: the plain kernel runs here
    expect(luKernelKind()).toBe(
      WebAssembly.validate(Uint8Array.from(atob(LU_KERNEL_FMA_WASM_BASE64), (c) => c.charCodeAt(0)))
        ? 'fused'
        : 'plain',
    );
  });
  it('the kernel with relaxed SIMD multiply-add (child process with the flag): same pivots, factors within tolerance', () => {
    const r = spawnSync(
      process.execPath,
      ['--experimental-wasm-relaxed-simd', '--import', 'tsx', 'test/helpers/luFusedCheck.ts'],
      { encoding: 'utf8' },
    );
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as {
      kind: string;
      sizes: Record<string, { samePivots: boolean; relDiff: number; solveErr: number }>;
    };
    expect(out.kind).toBe('fused');
    expect(Object.keys(out.sizes)).toHaveLength(4);
    for (const s of Object.values(out.sizes)) {
      expect(s.samePivots).toBe(true);
      expect(s.relDiff).toBeLessThan(PATH_TOL);
      expect(s.solveErr).toBeLessThan(1e-9);
    }
  });
  for (const n of [24, 37, 101, 200])
    it(`n = ${n}: same pivots, factors within ${PATH_TOL}, and the solve reproduces b`, () => {
      const r = compareKernelWithTypeScript(n);
      expect(r.kernel).toBe(true);
      expect(r.samePivots).toBe(true);
      expect(r.relDiff).toBeLessThan(PATH_TOL);
      // A x = b with b = A·1: x must come back as ones (residual check of the kernel's factors)
      expect(r.solveErr).toBeLessThan(1e-9);
    });
  it('refuses a singular matrix in the kernel path too, and leaves a usable kernel behind', () => {
    const n = 40;
    const a = randomMatrix(n, 3);
    // column 30 (in the second panel) all zero: its pivot is exactly zero
    for (let i = 0; i < n; i++) a[2 * (i * n + 30)] = a[2 * (i * n + 30) + 1] = 0;
    expect(() => luFactor(n, a)).toThrow(SingularMatrixError);
    const ok = randomMatrix(n, 4);
    expect(() => luFactor(n, ok)).not.toThrow();
  });
  it('the committed kernel is what tools/build-lu-kernel.mjs builds', () => {
    const r = spawnSync(process.execPath, ['tools/build-lu-kernel.mjs', '--check'], {
      encoding: 'utf8',
    });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
  });
});
