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
