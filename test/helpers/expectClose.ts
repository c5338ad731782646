import { expect } from 'vitest';

/**
 * Reference check: |actual − expected| ≤ tol, with the published source in the failure message.
 * Every comparison of the main job against the outside world goes through this helper,
 * so that the source travels with the number.
 */
export function expectClose(actual: number, expected: number, tol: number, source: string): void {
  expect(Number.isFinite(actual), `${source}: actual is not finite (${actual})`).toBe(true);
  const err = Math.abs(actual - expected);
  expect(err, `${source}: got ${actual}, expected ${expected} ± ${tol}`).toBeLessThanOrEqual(tol);
}

/** Relative form: |actual − expected| ≤ rel·|expected|. */
export function expectRelClose(actual: number, expected: number, rel: number, source: string): void {
  expectClose(actual, expected, rel * Math.abs(expected), source);
}

/** Largest element-wise difference of two arrays, relative to the largest magnitude in `ref`. */
export function maxRelDifference(got: ArrayLike<number>, ref: ArrayLike<number>): number {
  let d = 0;
  let m = 0;
  for (let i = 0; i < got.length; i++) {
    d = Math.max(d, Math.abs(got[i]! - ref[i]!));
    m = Math.max(m, Math.abs(ref[i]!));
  }
  return d / m;
}
