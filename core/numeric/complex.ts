/**
 * Small complex-number helpers for code outside the hot loops (ground coefficients, special
 * functions, 2-port algebra). Hot loops keep complex numbers interleaved in Float64Array
 * (re, im) and do the arithmetic inline; these helpers return a fresh `Complex` and are meant
 * for a handful of numbers at a time.
 *
 * Conventions: principal square root (branch cut on the negative real axis, Re √z ≥ 0).
 */
export interface Complex {
  readonly re: number;
  readonly im: number;
}

export const c = (re: number, im = 0): Complex => ({ re, im });
export const cAdd = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
export const cSub = (a: Complex, b: Complex): Complex => ({ re: a.re - b.re, im: a.im - b.im });
export const cMul = (a: Complex, b: Complex): Complex => ({
  re: a.re * b.re - a.im * b.im,
  im: a.re * b.im + a.im * b.re,
});
export const cScale = (a: Complex, s: number): Complex => ({ re: a.re * s, im: a.im * s });
export const cConj = (a: Complex): Complex => ({ re: a.re, im: -a.im });
export const cAbs = (a: Complex): number => Math.hypot(a.re, a.im);
export const cAbs2 = (a: Complex): number => a.re * a.re + a.im * a.im;
export const cArg = (a: Complex): number => Math.atan2(a.im, a.re);

/** a / b, scaled to avoid overflow (Smith's method, Smith 1962, CACM 5(8) 435). */
export function cDiv(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

/** Principal square root, computed without cancellation. */
export function cSqrt(a: Complex): Complex {
  const m = Math.hypot(a.re, a.im);
  if (m === 0) return { re: 0, im: 0 };
  if (a.re >= 0) {
    const t = Math.sqrt(0.5 * (m + a.re));
    return { re: t, im: a.im / (2 * t) };
  }
  const t = Math.sqrt(0.5 * (m - a.re));
  return { re: Math.abs(a.im) / (2 * t), im: a.im >= 0 ? t : -t };
}

/** e^{z}. */
export function cExp(a: Complex): Complex {
  const e = Math.exp(a.re);
  return { re: e * Math.cos(a.im), im: e * Math.sin(a.im) };
}

/** Principal logarithm. */
export function cLog(a: Complex): Complex {
  return { re: Math.log(cAbs(a)), im: cArg(a) };
}

export const cIsFinite = (a: Complex): boolean => Number.isFinite(a.re) && Number.isFinite(a.im);
