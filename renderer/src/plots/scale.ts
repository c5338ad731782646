/**
 * Scales and path helpers for the hand-written SVG plots: linear scales with round ticks, the
 * dB range of a pattern plot, compass-polar coordinates (north up, bearings clockwise) and
 * wedges for azimuth spans that may cross north.
 */

export interface LinearScale {
  (v: number): number;
  invert(px: number): number;
  domain: [number, number];
}

export function linearScale(domain: [number, number], range: [number, number]): LinearScale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const k = d1 === d0 ? 0 : (r1 - r0) / (d1 - d0);
  const f = ((v: number) => r0 + (v - d0) * k) as LinearScale;
  f.invert = (px: number) => (k === 0 ? d0 : d0 + (px - r0) / k);
  f.domain = [d0, d1];
  return f;
}

/** Round tick values covering [min, max], about `count` of them, on steps of 1, 2 or 5 × 10ⁿ. */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!(max > min) || !Number.isFinite(min) || !Number.isFinite(max)) return [min];
  const raw = (max - min) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let v = Math.ceil(min / step - 1e-9) * step; v <= max + step * 1e-9; v += step) {
    out.push(Math.abs(v) < step * 1e-9 ? 0 : Number(v.toPrecision(12)));
  }
  return out;
}

/** Gain axis for pattern plots: top at the peak rounded up to 2 dB, `spanDb` below it. */
export function gainAxis(valuesDbi: readonly number[], spanDb = 30): { min: number; max: number } {
  const finite = valuesDbi.filter(Number.isFinite);
  if (finite.length === 0) return { min: -spanDb, max: 0 };
  const peak = Math.max(...finite);
  const max = Math.ceil((peak + 0.25) / 2) * 2;
  return { min: max - spanDb, max };
}

/** Point at compass bearing `azDeg` (clockwise from north) and radius r around (cx, cy); y grows down. */
export function polar(cx: number, cy: number, r: number, azDeg: number): [number, number] {
  const a = (azDeg * Math.PI) / 180;
  return [cx + r * Math.sin(a), cy - r * Math.cos(a)];
}

const fmt = (v: number): string => (Math.round(v * 100) / 100).toString();

/** SVG path through the points (moveto then linetos); `close` adds Z. */
export function linePath(points: readonly (readonly [number, number])[], close = false): string {
  if (points.length === 0) return '';
  const body = points.map((p, i) => `${i === 0 ? 'M' : 'L'}${fmt(p[0])},${fmt(p[1])}`).join('');
  return close ? `${body}Z` : body;
}

/** Clockwise width of the arc from `fromDeg` to `toDeg`, degrees in [0, 360). */
export function arcWidthDeg(fromDeg: number, toDeg: number): number {
  return (((toDeg - fromDeg) % 360) + 360) % 360;
}

/**
 * Ring-sector path between radii r0 < r1 from bearing `fromDeg` clockwise to `toDeg` (crossing north
 * when toDeg < fromDeg). A span narrower than `minWidthDeg` is widened about its middle so it shows.
 */
export function wedgePath(
  cx: number,
  cy: number,
  r0: number,
  r1: number,
  fromDeg: number,
  toDeg: number,
  minWidthDeg = 2,
): string {
  let w = arcWidthDeg(fromDeg, toDeg);
  let a = fromDeg;
  if (w < minWidthDeg) {
    a = fromDeg + w / 2 - minWidthDeg / 2;
    w = minWidthDeg;
  }
  const b = a + w;
  const large = w > 180 ? 1 : 0;
  const [x0, y0] = polar(cx, cy, r1, a);
  const [x1, y1] = polar(cx, cy, r1, b);
  const [x2, y2] = polar(cx, cy, r0, b);
  const [x3, y3] = polar(cx, cy, r0, a);
  return (
    `M${fmt(x0)},${fmt(y0)}A${fmt(r1)},${fmt(r1)} 0 ${large} 1 ${fmt(x1)},${fmt(y1)}` +
    `L${fmt(x2)},${fmt(y2)}A${fmt(r0)},${fmt(r0)} 0 ${large} 0 ${fmt(x3)},${fmt(y3)}Z`
  );
}

/** A Cartesian plot: its size in px, the margins around the plotting area, and its two scales. */
export interface XYFrame {
  width: number;
  height: number;
  margin: { l: number; r: number; t: number; b: number };
  x: LinearScale;
  y: LinearScale;
}

/**
 * The plotting area of a Cartesian plot inside its margins: the attributes of a full-height band
 * between two x values (at least `minPx` wide, so a narrow one shows) and of a full-height line.
 */
export function plotArea({ height, margin, x }: XYFrame): {
  band(a: number, b: number, minPx: number): { x: number; y: number; width: number; height: number };
  vline(v: number): { x1: number; x2: number; y1: number; y2: number };
} {
  const top = margin.t;
  const bottom = height - margin.b;
  return {
    band: (a, b, minPx) => ({ x: x(a), y: top, width: Math.max(minPx, x(b) - x(a)), height: bottom - top }),
    vline: (v) => ({ x1: x(v), x2: x(v), y1: top, y2: bottom }),
  };
}
