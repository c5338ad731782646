/**
 * Tabulated remainder of the Sommerfeld integrals (the smooth part left after the quasi-static
 * split, sommerfeld.ts), once per frequency and soil, and its interpolation.
 *
 * Grid: the (ρ, ζ) quarter plane in polar form about the image point, R1 = √(ρ² + ζ²) and
 * θ = atan2(ζ, ρ) ∈ [0, π/2], uniform in s = ln R1 and in θ. The remainder behaves like
 * k0²·f(θ)/R1 near the image point and like e^{−jk0R1}·(slowly varying) far from it, so the
 * tabulated quantity is W = R1 e^{jk0R1} G_rem, which is smooth in (s, θ). Interpolation:
 * 4-point Lagrange in each variable (tensor-product cubic; error O(h⁴); P. J. Davis,
 * Interpolation and Approximation (1963), §2.5 / A&S 25.2.13). Measured accuracy: see
 * test/unit/em/halfspace/table.test.ts (relative to the largest remainder component at the
 * point; about 1e-5 at spacing 0.08 / 40 intervals for the amateur soil classes at 1.8–7.3 MHz;
 * the default below is twice as coarse, about 16 times the error, see its note).
 *
 * Cache: tables are kept by (frequency, εr, σ, range) so that a plan over many candidates
 * pays for each table once; a request inside an existing table's range reuses it.
 */
import { halfSpace, type HalfSpace } from './medium.ts';
import { CYL_LEN as CYL_LEN_IMPORTED, sommerfeldComponents, type SommerfeldOptions } from './sommerfeld.ts';

/**
 * Module-local copy: an imported binding is read through the module record on every access in
 * some loaders (a getter call inside the interpolation's inner loop cost more than the loop).
 */
const CYL_LEN: number = CYL_LEN_IMPORTED;

export interface TableOptions {
  /** Smallest R1 = √(ρ² + ζ²) covered, m. */
  rMinM: number;
  /** Largest R1 covered, m. */
  rMaxM: number;
  /** Grid step in ln R1. */
  stepLn: number;
  /** Number of θ intervals over [0, π/2]. */
  thetaIntervals: number;
  /** Relative tolerance of the Sommerfeld integrals at the nodes. */
  relTol: number;
}

/**
 * Default spacing and tolerance. Chosen by the feed impedance against direct integration at
 * every point (no table), 3.6 MHz, average soil, a λ/2 dipole with a second wire 3 m above it:
 * at 0.05 λ, 0.02 λ and 0.2 λ the difference was 2e-4, 2e-4 and 4e-5 Ω with this setting,
 * 1.5e-5 Ω with half the steps (0.08, 40 intervals, 1e-8) at four times the build time.
 */
export const DEFAULT_TABLE: Omit<TableOptions, 'rMinM' | 'rMaxM'> = {
  stepLn: 0.16,
  thetaIntervals: 20,
  relTol: 1e-6,
};

export interface TableStats {
  nodes: number;
  buildMs: number;
  evaluations: number;
  unconverged: number;
}

export class RemainderTable {
  readonly s0: number;
  readonly hs: number;
  readonly ns: number;
  readonly ht: number;
  readonly nt: number;
  /** Values W at node (is, it): 8 reals at 8·(is·nt + it). */
  readonly w: Float64Array;
  readonly stats: TableStats;

  constructor(
    readonly hs_: HalfSpace,
    readonly options: TableOptions,
    /** The values of a table built with the same half-space and options (another thread's): no build. */
    built?: { w: Float64Array; stats: TableStats },
  ) {
    const { rMinM, rMaxM, stepLn, thetaIntervals } = options;
    if (!(rMinM > 0) || !(rMaxM > rMinM))
      throw new RangeError(`table range needs 0 < rMin < rMax (${rMinM}, ${rMaxM})`);
    // one extra node each side of the range keeps the 4-point stencil centred inside it
    const s0 = Math.log(rMinM) - stepLn;
    const s1 = Math.log(rMaxM) + stepLn;
    this.ns = Math.max(4, Math.ceil((s1 - s0) / stepLn) + 1);
    this.hs = (s1 - s0) / (this.ns - 1);
    this.s0 = s0;
    this.nt = thetaIntervals + 1;
    this.ht = (0.5 * Math.PI) / thetaIntervals;
    if (built) {
      if (built.w.length !== CYL_LEN * this.ns * this.nt)
        throw new RangeError('table values of another size');
      this.w = built.w;
      this.stats = built.stats;
      return;
    }
    this.w = new Float64Array(CYL_LEN * this.ns * this.nt);
    const t0 = performance.now();
    const so: SommerfeldOptions = { relTol: options.relTol, subtractStatic: true, maxTailIntervals: 200 };
    const cyl = new Float64Array(CYL_LEN);
    let evaluations = 0;
    let unconverged = 0;
    const k0 = hs_.k0;
    for (let is = 0; is < this.ns; is++) {
      const R = Math.exp(s0 + is * this.hs);
      const cr = R * Math.cos(k0 * R);
      const ci = R * Math.sin(k0 * R);
      for (let it = 0; it < this.nt; it++) {
        const th = it * this.ht;
        const rho = it === this.nt - 1 ? 0 : R * Math.cos(th);
        const zeta = R * Math.sin(th);
        const st = sommerfeldComponents(hs_, rho, zeta, cyl, so);
        evaluations += st.evaluations;
        if (!st.converged) unconverged++;
        const o = CYL_LEN * (is * this.nt + it);
        for (let c = 0; c < CYL_LEN; c += 2) {
          this.w[o + c] = cyl[c] * cr - cyl[c + 1] * ci;
          this.w[o + c + 1] = cyl[c] * ci + cyl[c + 1] * cr;
        }
      }
    }
    this.stats = { nodes: this.ns * this.nt, buildMs: performance.now() - t0, evaluations, unconverged };
  }

  /** Smallest and largest R1 the table answers for. */
  get rMinM(): number {
    return this.options.rMinM;
  }
  get rMaxM(): number {
    return this.options.rMaxM;
  }

  covers(rho: number, zeta: number): boolean {
    const R = Math.hypot(rho, zeta);
    return R >= this.options.rMinM && R <= this.options.rMaxM && zeta >= 0;
  }

  /**
   * Interpolated remainder components (Gρρ, Gφφ, Gρz, Gzz) at (ρ, ζ) into out[0…7].
   * Caller checks `covers` first.
   */
  interpolate(rho: number, zeta: number, out: Float64Array): void {
    const R = Math.hypot(rho, zeta);
    const s = (Math.log(R) - this.s0) / this.hs;
    const t = Math.atan2(zeta, rho) / this.ht;
    const i0 = stencilStart(s, this.ns);
    const j0 = stencilStart(t, this.nt);
    lagrange4(s - i0, ws);
    lagrange4(t - j0, wt);
    out.fill(0);
    const w = this.w;
    const nt = this.nt;
    for (let a = 0; a < 4; a++) {
      for (let b = 0; b < 4; b++) {
        const wab = ws[a] * wt[b];
        const o = CYL_LEN * ((i0 + a) * nt + j0 + b);
        for (let c = 0; c < CYL_LEN; c++) out[c] += wab * w[o + c];
      }
    }
    // undo the scaling: G = W e^{−jk0R}/R
    const k0 = this.hs_.k0;
    const er = Math.cos(k0 * R) / R;
    const ei = -Math.sin(k0 * R) / R;
    for (let c = 0; c < CYL_LEN; c += 2) {
      const xr = out[c];
      const xi = out[c + 1];
      out[c] = xr * er - xi * ei;
      out[c + 1] = xr * ei + xi * er;
    }
  }
}

const ws = new Float64Array(4);
const wt = new Float64Array(4);

/** First node of the 4-point stencil around fractional index x on nodes 0…n−1. */
function stencilStart(x: number, n: number): number {
  let i = Math.floor(x) - 1;
  if (i < 0) i = 0;
  if (i > n - 4) i = n - 4;
  return i;
}

/** Lagrange weights for nodes 0, 1, 2, 3 at x (A&S 25.2.13, four-point formula). */
function lagrange4(x: number, w: Float64Array): void {
  const x0 = x;
  const x1 = x - 1;
  const x2 = x - 2;
  const x3 = x - 3;
  w[0] = (-x1 * x2 * x3) / 6;
  w[1] = (x0 * x2 * x3) / 2;
  w[2] = (-x0 * x1 * x3) / 2;
  w[3] = (x0 * x1 * x2) / 6;
}

// ---- cache ---------------------------------------------------------------------------------

/** A table is a few tens of kB; a 31-point sweep keeps all its frequencies. */
const CACHE_LIMIT = 64;
const cache = new Map<string, RemainderTable>();

const keyOf = (hs: HalfSpace): string => `${hs.freqHz}|${hs.permittivity}|${hs.conductivitySPerM}`;

/**
 * A table covering [rMinM, rMaxM] for this half-space: reused from the cache when one covers
 * the range at the same spacing and tolerance, else built (its range widened as noted below and
 * rounded outward to powers of 2) and cached (least recently used dropped).
 */
export function remainderTable(
  hs: HalfSpace,
  rMinM: number,
  rMaxM: number,
  opts: Partial<typeof DEFAULT_TABLE> = {},
): RemainderTable {
  const o = { ...DEFAULT_TABLE, ...opts };
  const key = `${keyOf(hs)}|${o.stepLn}|${o.thetaIntervals}|${o.relTol}`;
  for (const [k, t] of cache) {
    if (k.startsWith(key + '|') && t.rMinM <= rMinM && t.rMaxM >= rMaxM) {
      cache.delete(k);
      cache.set(k, t);
      return t;
    }
  }
  // One table per (frequency, soil) serves a whole plan: the range is widened to at least
  // [0.02 λ, 1.5 λ] (a few hundred ms at the default spacing) and to the union with the tables
  // it replaces, so that candidates of other sizes find it instead of building their own.
  const lambda = (2 * Math.PI) / hs.k0;
  let lo = 2 ** Math.floor(Math.log2(Math.min(rMinM, 0.02 * lambda)));
  let hi = 2 ** Math.ceil(Math.log2(Math.max(rMaxM, 1.5 * lambda)));
  for (const [k, t] of [...cache]) {
    if (!k.startsWith(key + '|')) continue;
    lo = Math.min(lo, t.rMinM);
    hi = Math.max(hi, t.rMaxM);
    cache.delete(k);
  }
  const table = new RemainderTable(hs, { ...o, rMinM: lo, rMaxM: hi });
  cache.set(`${key}|${lo}|${hi}`, table);
  while (cache.size > CACHE_LIMIT) {
    const first = cache.keys().next().value;
    if (first === undefined) break;
    cache.delete(first);
  }
  return table;
}

/** A cached table as plain data, to hand to another thread (structured-cloneable). */
export interface RemainderTableData {
  key: string;
  soil: { freqHz: number; permittivity: number; conductivitySPerM: number };
  options: TableOptions;
  w: Float64Array;
  stats: TableStats;
}

/** Every cached table as data (the values are a pure function of key and options). */
export function exportRemainderTables(): RemainderTableData[] {
  return [...cache].map(([key, t]) => ({
    key,
    soil: {
      freqHz: t.hs_.freqHz,
      permittivity: t.hs_.permittivity,
      conductivitySPerM: t.hs_.conductivitySPerM,
    },
    options: t.options,
    w: t.w,
    stats: t.stats,
  }));
}

/**
 * Puts tables another thread built into this thread's cache, where a later request finds them as
 * if built here (a table already cached under the same key is kept).
 */
export function importRemainderTables(tables: readonly RemainderTableData[]): void {
  for (const d of tables) {
    if (cache.has(d.key)) continue;
    cache.set(d.key, new RemainderTable(halfSpace(d.soil), d.options, { w: d.w, stats: d.stats }));
  }
  while (cache.size > CACHE_LIMIT) {
    const first = cache.keys().next().value;
    if (first === undefined) break;
    cache.delete(first);
  }
}

/** Empties the table cache (tests, memory pressure). */
export function clearRemainderTables(): void {
  cache.clear();
}

/** Number of cached tables. */
export function cachedTableCount(): number {
  return cache.size;
}
