/** Curve fits shared by the planner's sweep and the tuning measurement. */

/** The quadratic through three points (Lagrange form), as a function. */
export function quadraticThrough(xs: readonly number[], ys: readonly number[]): (x: number) => number {
  const [x0, x1, x2] = xs;
  const [y0, y1, y2] = ys;
  return (x) =>
    (y0 * (x - x1) * (x - x2)) / ((x0 - x1) * (x0 - x2)) +
    (y1 * (x - x0) * (x - x2)) / ((x1 - x0) * (x1 - x2)) +
    (y2 * (x - x0) * (x - x1)) / ((x2 - x0) * (x2 - x1));
}
