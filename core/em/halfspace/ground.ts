/**
 * The exact half-space ground behind the solver's `GroundModel` interface (core/em/ground.ts).
 *
 * Per pair of segments (p observation, q source) the reflected interaction is
 *   K × (the perfect-ground image moments: image current and charge, ground.ts "perfect")
 *   + the remainder, whose field dyadic D_rem (index.ts) is smooth, tested in field form:
 *     Z_rem = (jkη/4π) ∫∫ f_m·(D_rem/k0²)·f_n dl dl′,
 * which is the electric-field form of the same Galerkin element (Harrington, Field Computation
 * by Moment Methods (1968), §4.3; valid because D_rem has no singularity for z, z′ > 0 and the
 * basis functions are continuous). With f = (a + b·u) t̂ on a segment, the four moments
 *   ∫∫ {1, u, v, uv} (t̂p·D_rem·t̂q)/k0² du dv
 * go into the vector-potential slots of `reflectedPair`, where the fill multiplies them by the
 * same coefficients as its free-space moments; the scalar slot gets only K times the image
 * charge moment.
 *
 * Where the exact interaction is used: both segments entirely within `exactHeightWavelengths`
 * of the ground, neither touching it, and the pair's specular point outside every ground-system
 * zone (a wire connected to the ground, and the pairs that see its radial screen, keep the
 * solver's ground-system treatment: perfect image inside the zone, Wait–Pope loss); elsewhere
 * the pair is delegated to the approximate model. The far
 * field stays the space wave with Fresnel coefficients (delegated).
 */
import { gaussLegendre01 } from '../../numeric/quadrature.ts';
import type { GroundAtFrequency, GroundModel } from '../ground.ts';
import { imagePairMoments } from '../kernel.ts';
import type { Mesh } from '../mesh.ts';
import { remainderCylindrical } from './index.ts';
import { halfSpace, type HalfSpace } from './medium.ts';
import { CYL_LEN } from './sommerfeld.ts';
import { remainderTable, type RemainderTable } from './table.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../units/index.ts';

export interface ExactGroundOptions {
  /** Pairs with both segments below this height (m) use the exact model; default 1 λ. */
  exactHeightWavelengths: number;
  /** Segments whose lowest point is below this (m) are treated as touching the ground. */
  contactHeightM: number;
  /** Interpolate the remainder from a table (true) or integrate it at every point. */
  useTable: boolean;
}

export const DEFAULT_EXACT_GROUND: ExactGroundOptions = {
  exactHeightWavelengths: 1,
  contactHeightM: 2e-3,
  useTable: true,
};

/** Counters for the diagnostics: how many segment pairs took which model. */
export interface ExactGroundStats {
  exactPairs: number;
  approximatePairs: number;
  tableBuildMs: number;
}

/**
 * Pairs farther apart than this many summed lengths (centre to image centre) use 2×2 points.
 * Measured against the 3…8-point rule everywhere (3.55 MHz, average soil): a dipole at 0.05 λ,
 * an inverted-V with ends at 2.5 m and a half-square with bent ends moved by at most 3e-6 Ω,
 * also with 1 instead of 2; the fill of those antennas took a third to half the time.
 */
const FAR_PAIR = 2;

const img = new Float64Array(8);
const cyl = new Float64Array(CYL_LEN);

export class ExactGroundAt implements GroundAtFrequency {
  readonly hs: HalfSpace;
  readonly stats: ExactGroundStats = { exactPairs: 0, approximatePairs: 0, tableBuildMs: 0 };
  private table: RemainderTable | null = null;
  private tableMesh: Mesh | null = null;
  private readonly hExact: number;

  constructor(
    soil: { permittivity: number; conductivitySPerM: number },
    readonly freqHz: number,
    private readonly approx: GroundAtFrequency,
    private readonly opts: ExactGroundOptions,
  ) {
    this.hs = halfSpace({ freqHz, ...soil });
    this.hExact = (opts.exactHeightWavelengths * SPEED_OF_LIGHT_M_PER_S) / freqHz;
  }
  get epsC(): GroundAtFrequency['epsC'] {
    return this.approx.epsC;
  }
  get zg(): GroundAtFrequency['zg'] {
    return this.approx.zg;
  }

  farFieldReflection(sinPsi: number, out: Float64Array): void {
    this.approx.farFieldReflection(sinPsi, out);
  }

  /** True when the pair (p, q) is computed with the exact half-space model. */
  isExact(mesh: Mesh, p: number, q: number): boolean {
    const lo = this.opts.contactHeightM;
    const zp0 = mesh.sz[p];
    const zp1 = zp0 + mesh.len[p] * mesh.tz[p];
    const zq0 = mesh.sz[q];
    const zq1 = zq0 + mesh.len[q] * mesh.tz[q];
    return (
      Math.min(zp0, zp1, zq0, zq1) > lo &&
      Math.max(zp0, zp1, zq0, zq1) <= this.hExact &&
      !(this.approx.inGroundSystemZone?.(mesh, p, q) ?? false)
    );
  }

  /**
   * True when every segment pair of wires wa and wb takes the exact branch of `isExact` (both
   * wires wholly between the contact height and the exact-height limit) and the wrapped model
   * has no ground-system zone: the reflected interaction over the laterally uniform half-space
   * then depends on the horizontal offset, the sum of the heights and the directions only, so
   * the fill reuses it for pairs related by a translation (fill.ts, the mirror relation).
   */
  pairsTranslationInvariant(mesh: Mesh, wa: number, wb: number): boolean {
    if (this.approx.translationInvariantWeights !== true) return false;
    const lo = this.opts.contactHeightM;
    for (const w of wa === wb ? [wa] : [wa, wb])
      for (let s = mesh.wireSegStart[w]; s < mesh.wireSegStart[w + 1]; s++) {
        const z0 = mesh.sz[s];
        const z1 = z0 + mesh.len[s] * mesh.tz[s];
        if (!(Math.min(z0, z1) > lo && Math.max(z0, z1) <= this.hExact)) return false;
      }
    return true;
  }

  /** Counts a pair whose exact result the fill took from its translation cache. */
  reusedPair(): void {
    this.stats.exactPairs++;
  }

  /** The table used for the last fill (null before the first exact pair or without a table). */
  get lastTable(): RemainderTable | null {
    return this.table;
  }

  private tableFor(mesh: Mesh): RemainderTable | null {
    if (!this.opts.useTable) return null;
    if (this.table && this.tableMesh === mesh) return this.table;
    let x0 = Infinity;
    let x1 = -Infinity;
    let y0 = Infinity;
    let y1 = -Infinity;
    let zMin = Infinity;
    let zMax = 0;
    for (let s = 0; s < mesh.nSeg; s++) {
      for (const f of [0, 1]) {
        const x = mesh.sx[s] + f * mesh.len[s] * mesh.tx[s];
        const y = mesh.sy[s] + f * mesh.len[s] * mesh.ty[s];
        const z = mesh.sz[s] + f * mesh.len[s] * mesh.tz[s];
        x0 = Math.min(x0, x);
        x1 = Math.max(x1, x);
        y0 = Math.min(y0, y);
        y1 = Math.max(y1, y);
        if (z > this.opts.contactHeightM) zMin = Math.min(zMin, z);
        zMax = Math.max(zMax, Math.min(z, this.hExact));
      }
    }
    if (!Number.isFinite(zMin)) return null;
    const rMin = 1.8 * zMin;
    const rMax = Math.hypot(x1 - x0, y1 - y0, 2 * zMax) * 1.05 + rMin;
    const t0 = performance.now();
    this.table = remainderTable(this.hs, rMin, rMax);
    this.stats.tableBuildMs += performance.now() - t0;
    this.tableMesh = mesh;
    return this.table;
  }

  reflectedPair(mesh: Mesh, p: number, q: number, a2: number, k: number, out: Float64Array): void {
    if (!this.isExact(mesh, p, q)) {
      this.stats.approximatePairs++;
      this.approx.reflectedPair(mesh, p, q, a2, k, out);
      return;
    }
    this.stats.exactPairs++;
    this.exactPair(mesh, p, q, a2, k, out);
  }

  private exactPair(mesh: Mesh, p: number, q: number, a2: number, k: number, out: Float64Array): void {
    const hs = this.hs;
    // K × perfect-ground image (as the solver's perfect model builds it)
    imagePairMoments(mesh, p, q, a2, k, img);
    const w = -(mesh.tx[p] * mesh.tx[q] + mesh.ty[p] * mesh.ty[q] - mesh.tz[p] * mesh.tz[q]);
    const Kr = hs.kRe;
    const Ki = hs.kIm;
    for (let i = 0; i < 8; i += 2) {
      out[i] = w * (Kr * img[i] - Ki * img[i + 1]);
      out[i + 1] = w * (Kr * img[i + 1] + Ki * img[i]);
    }
    out[8] = -(Kr * img[0] - Ki * img[1]);
    out[9] = -(Kr * img[1] + Ki * img[0]);
    // remainder, field form, Gauss–Legendre product rule
    const table = this.tableFor(mesh);
    const zp = Math.min(mesh.sz[p], mesh.sz[p] + mesh.len[p] * mesh.tz[p]);
    const zq = Math.min(mesh.sz[q], mesh.sz[q] + mesh.len[q] * mesh.tz[q]);
    const scale = zp + zq;
    // far from the image point the remainder varies on the scale of the distance R1 between the
    // centres of p and the image of q: two points per segment when R1 > FAR_PAIR · (Lp + Lq)
    const far =
      Math.hypot(
        mesh.sx[p] + 0.5 * mesh.len[p] * mesh.tx[p] - mesh.sx[q] - 0.5 * mesh.len[q] * mesh.tx[q],
        mesh.sy[p] + 0.5 * mesh.len[p] * mesh.ty[p] - mesh.sy[q] - 0.5 * mesh.len[q] * mesh.ty[q],
        mesh.sz[p] + 0.5 * mesh.len[p] * mesh.tz[p] + mesh.sz[q] + 0.5 * mesh.len[q] * mesh.tz[q],
      ) >
      FAR_PAIR * (mesh.len[p] + mesh.len[q]);
    const np = far ? 2 : Math.min(8, Math.max(3, 2 + Math.ceil((2 * mesh.len[p]) / scale)));
    const nq = far ? 2 : Math.min(8, Math.max(3, 2 + Math.ceil((2 * mesh.len[q]) / scale)));
    const gp = gaussLegendre01(np);
    const gq = gaussLegendre01(nq);
    const tpx = mesh.tx[p];
    const tpy = mesh.ty[p];
    const tpz = mesh.tz[p];
    const tqx = mesh.tx[q];
    const tqy = mesh.ty[q];
    const tqz = mesh.tz[q];
    const ik2 = 1 / (hs.k0 * hs.k0);
    let m00r = 0,
      m00i = 0,
      m10r = 0,
      m10i = 0,
      m01r = 0,
      m01i = 0,
      m11r = 0,
      m11i = 0;
    const opts = table ? { table } : { direct: true };
    for (let i = 0; i < np; i++) {
      const u = gp.x[i];
      const ox = mesh.sx[p] + u * mesh.len[p] * tpx;
      const oy = mesh.sy[p] + u * mesh.len[p] * tpy;
      const oz = mesh.sz[p] + u * mesh.len[p] * tpz;
      for (let j = 0; j < nq; j++) {
        const v = gq.x[j];
        const dx = ox - (mesh.sx[q] + v * mesh.len[q] * tqx);
        const dy = oy - (mesh.sy[q] + v * mesh.len[q] * tqy);
        const zeta = oz + mesh.sz[q] + v * mesh.len[q] * tqz;
        const rho = Math.hypot(dx, dy);
        remainderCylindrical(hs, rho, zeta, cyl, opts);
        const cx = rho > 0 ? dx / rho : 1;
        const cy = rho > 0 ? dy / rho : 0;
        const pr = tpx * cx + tpy * cy;
        const pf = -tpx * cy + tpy * cx;
        const qr = tqx * cx + tqy * cy;
        const qf = -tqx * cy + tqy * cx;
        // t̂p·D·t̂q with Gzρ = −Gρz
        const a = pr * qr;
        const b = pf * qf;
        const c1 = pr * tqz - tpz * qr;
        const d = tpz * tqz;
        const kr = (cyl[0] * a + cyl[2] * b + cyl[4] * c1 + cyl[6] * d) * ik2;
        const ki = (cyl[1] * a + cyl[3] * b + cyl[5] * c1 + cyl[7] * d) * ik2;
        const ww = gp.w[i] * gq.w[j];
        m00r += ww * kr;
        m00i += ww * ki;
        m10r += ww * u * kr;
        m10i += ww * u * ki;
        m01r += ww * v * kr;
        m01i += ww * v * ki;
        m11r += ww * u * v * kr;
        m11i += ww * u * v * ki;
      }
    }
    out[0] += m00r;
    out[1] += m00i;
    out[2] += m10r;
    out[3] += m10i;
    out[4] += m01r;
    out[5] += m01i;
    out[6] += m11r;
    out[7] += m11i;
  }
}

export interface ExactGroundModel extends GroundModel {
  readonly kind: 'exact';
  lastAt: ExactGroundAt | null;
  frequencies(): ExactGroundAt[];
}

/**
 * Wraps an approximate (reflection-coefficient) GroundModel of a soil into the exact one: same
 * soil, same ground-system zones (through the wrapped model), exact pairs near the ground.
 */
export function createExactGroundModel(
  approximate: GroundModel,
  opts: Partial<ExactGroundOptions> = {},
): ExactGroundModel {
  const soil = approximate.soil;
  if (!soil || approximate.kind !== 'reflection-coefficient')
    throw new RangeError('the exact ground needs a lossy-soil ground model to wrap');
  const o = { ...DEFAULT_EXACT_GROUND, ...opts };
  const byFreq = new Map<number, ExactGroundAt>();
  const model = {
    kind: 'exact' as const,
    hasGround: true,
    soil,
    lastAt: null as ExactGroundAt | null,
    /** The per-frequency states built so far (for the diagnostics). */
    frequencies: (): ExactGroundAt[] => [...byFreq.values()],
    at(freqHz: number): GroundAtFrequency | null {
      let g = byFreq.get(freqHz);
      if (!g) {
        const a = approximate.at(freqHz);
        if (!a) return null;
        g = new ExactGroundAt(soil, freqHz, a, o);
        byFreq.set(freqHz, g);
      }
      model.lastAt = g;
      return g;
    },
  };
  return model;
}
