/**
 * Ground models behind one interface.
 *
 * The matrix fill asks the ground for the reflected interaction of each pair of segments, and
 * the far field asks it for the reflection of a plane wave. Everything about the ground lives
 * behind `GroundModel` / `GroundAtFrequency`, so that an exact half-space (Sommerfeld) model can
 * later replace the approximation pair by pair: `reflectedPair` receives both segments and may
 * compute the reflected moments any way it likes.
 *
 * Models:
 *  - free space: no ground;
 *  - perfect ground: images (Balanis, Antenna Theory, 3rd ed., 2005, §4.7): a segment's image
 *    is its mirror in z = 0 carrying the current −I along the mirrored direction, i.e. vertical
 *    current in phase and horizontal current reversed, and charge −q;
 *  - lossy ground, reflection-coefficient approximation: the same images weighted by the
 *    Fresnel coefficients (fresnel.ts) at the specular angle between the two segment centres.
 *    The image current is split into its part perpendicular to the plane of incidence (TE,
 *    weighted by −Rh) and the rest (TM, weighted by Rv); the image charge is weighted by Rv.
 *    Over a perfect conductor both weights are 1 and the model is the image model. The weights
 *    are symmetric in the pair, so the impedance matrix stays symmetric.
 *    Known limit: for wires lower than about 0.1 λ the approximation misjudges the near-field
 *    ground loss (the mesh says so in its diagnostics);
 *  - lossy ground, exact (the default for soil; core/em/halfspace/ground.ts): the reflected
 *    interaction of pairs near the ground from the Sommerfeld integrals, wrapping the
 *    reflection-coefficient model, which keeps the pairs high above the ground, the ground-system
 *    zones and the far field (space wave with Fresnel coefficients);
 *  - ground-system zones: around a wire that is connected to lossy ground, out to the radial
 *    integration limit, the radial system (or the surface-impedance loss of bare soil) is
 *    accounted for by the Wait–Pope loss resistance (radials.ts), and pairs whose specular point
 *    falls inside that disc see the perfect image, as the Wait–Pope method assumes.
 *
 * References:
 *  - C. A. Balanis, Antenna Theory: Analysis and Design, 3rd ed. (2005), §4.7 (image theory).
 *  - P. Beckmann and A. Spizzichino (1963); ITU-R P.527 (Fresnel coefficients; fresnel.ts).
 *  - J. R. Wait and W. A. Pope, Appl. Sci. Res. B4 (1954) 177–195 (radials.ts).
 */
import { c, type Complex } from '../numeric/complex.ts';
import { ETA0 } from './constants.ts';
import {
  complexPermittivity,
  fresnelCoefficients,
  soilSurfaceImpedanceOhm,
  type SoilElectrical,
} from './fresnel.ts';
import { imagePairMoments } from './kernel.ts';
import type { Mesh } from './mesh.ts';
import type { GroundSpec } from './types.ts';

/** A disc around a ground connection where the perfect image applies (radius per frequency). */
export interface GroundZone {
  x: number;
  y: number;
  radiusM: (freqHz: number) => number;
}

export interface GroundAtFrequency {
  /**
   * Add the reflected interaction of source segment q on observation segment p (squared kernel
   * radius a2, wave number k) into out[0…9]: the four vector-potential moments (M00, M10, M01,
   * M11, each complex) already multiplied by the direction factor of the pair, then the complex
   * scalar-potential moment. The fill adds these to the free-space terms (t̂p·t̂q)M and M00.
   */
  reflectedPair(mesh: Mesh, p: number, q: number, a2: number, k: number, out: Float64Array): void;
  /**
   * Optional fast path for image-based models: the same as `reflectedPair`, given the moments of
   * p with the mirror image of q (8 doubles, as kernel.ts writes them), which the fill may take
   * from its cache. Models that do not work with images (an exact half-space) leave it out.
   */
  weightImage?(mesh: Mesh, p: number, q: number, img: Float64Array, out: Float64Array): void;
  /**
   * True when `weightImage` depends on the two segments only through their relative position and
   * directions (no position-dependent zones), so the fill may reuse its result for pairs that
   * differ by a translation.
   */
  readonly translationInvariantWeights?: boolean;
  /**
   * True when the pair's specular point lies in a ground-system zone (where the perfect image
   * stands for the radial screen); the exact model leaves such pairs to the approximation.
   */
  inGroundSystemZone?(mesh: Mesh, p: number, q: number): boolean;
  /**
   * Optional, for models without `weightImage` (the exact half-space): true when `reflectedPair`
   * of a segment of wire `wa` with one of wire `wb` depends on the two segments only through
   * their relative position and directions (laterally uniform ground, every such pair taking the
   * same branch of the model), so the fill may reuse its result for pairs that differ by a
   * translation, as it does for `weightImage` with `translationInvariantWeights`.
   */
  pairsTranslationInvariant?(mesh: Mesh, wa: number, wb: number): boolean;
  /** Optional: told when the fill reused a cached `reflectedPair` result for (p, q) (counters). */
  reusedPair?(mesh: Mesh, p: number, q: number): void;
  /**
   * Plane-wave reflection at grazing angle ψ (sin ψ given): writes Rv (re, im) and Rh (re, im)
   * into out[0…3]. Perfect ground: Rv = 1, Rh = −1.
   */
  farFieldReflection(sinPsi: number, out: Float64Array): void;
  /** εc of the soil (null over perfect ground). */
  readonly epsC: Complex | null;
  /** Soil surface impedance Zg (null over perfect ground). */
  readonly zg: Complex | null;
}

/** Which lossy-ground model an input asks for: the exact half-space (default) or the approximation. */
export type GroundModelChoice = 'exact' | 'approximate';

export interface GroundModel {
  /** 'exact': the Sommerfeld half-space near the ground (core/em/halfspace), see its module note. */
  readonly kind: 'free-space' | 'perfect' | 'reflection-coefficient' | 'exact';
  readonly hasGround: boolean;
  readonly soil: SoilElectrical | null;
  at(freqHz: number): GroundAtFrequency | null;
}

const scratch = new Float64Array(8);

function imageMoments(mesh: Mesh, p: number, q: number, a2: number, k: number): void {
  imagePairMoments(mesh, p, q, a2, k, scratch);
}

class PerfectAt implements GroundAtFrequency {
  readonly translationInvariantWeights = true;
  readonly epsC = null;
  readonly zg = null;
  reflectedPair(mesh: Mesh, p: number, q: number, a2: number, k: number, out: Float64Array): void {
    imageMoments(mesh, p, q, a2, k);
    this.weightImage(mesh, p, q, scratch, out);
  }
  weightImage(mesh: Mesh, p: number, q: number, img: Float64Array, out: Float64Array): void {
    const w = -(mesh.tx[p] * mesh.tx[q] + mesh.ty[p] * mesh.ty[q] - mesh.tz[p] * mesh.tz[q]);
    for (let i = 0; i < 8; i++) out[i] = w * img[i];
    out[8] = -img[0];
    out[9] = -img[1];
  }
  farFieldReflection(_sinPsi: number, out: Float64Array): void {
    out[0] = 1;
    out[1] = 0;
    out[2] = -1;
    out[3] = 0;
  }
}

class ReflectionCoefficientAt implements GroundAtFrequency {
  readonly epsC: Complex;
  readonly zg: Complex;
  private readonly zones: { x: number; y: number; r2: number }[];
  readonly translationInvariantWeights: boolean;
  constructor(soil: SoilElectrical, freqHz: number, zones: readonly GroundZone[]) {
    this.translationInvariantWeights = zones.length === 0;
    this.epsC = complexPermittivity(soil, freqHz);
    this.zg = soilSurfaceImpedanceOhm(this.epsC, ETA0);
    this.zones = zones.map((z) => ({ x: z.x, y: z.y, r2: z.radiusM(freqHz) ** 2 }));
  }
  reflectedPair(mesh: Mesh, p: number, q: number, a2: number, k: number, out: Float64Array): void {
    imageMoments(mesh, p, q, a2, k);
    this.weightImage(mesh, p, q, scratch, out);
  }
  /** Specular point of the pair (from the centres) inside a ground-system zone. */
  private zoneAt(cqx: number, cqy: number, cqz: number, dx: number, dy: number, zs: number): boolean {
    const f = zs > 0 ? cqz / zs : 0.5;
    const spx = cqx + dx * f;
    const spy = cqy + dy * f;
    for (const z of this.zones) if ((spx - z.x) ** 2 + (spy - z.y) ** 2 <= z.r2) return true;
    return false;
  }
  inGroundSystemZone(mesh: Mesh, p: number, q: number): boolean {
    if (this.zones.length === 0) return false;
    const cqx = mesh.sx[q] + 0.5 * mesh.len[q] * mesh.tx[q];
    const cqy = mesh.sy[q] + 0.5 * mesh.len[q] * mesh.ty[q];
    const cqz = mesh.sz[q] + 0.5 * mesh.len[q] * mesh.tz[q];
    const dx = mesh.sx[p] + 0.5 * mesh.len[p] * mesh.tx[p] - cqx;
    const dy = mesh.sy[p] + 0.5 * mesh.len[p] * mesh.ty[p] - cqy;
    const zs = mesh.sz[p] + 0.5 * mesh.len[p] * mesh.tz[p] + cqz;
    return this.zoneAt(cqx, cqy, cqz, dx, dy, zs);
  }
  weightImage(mesh: Mesh, p: number, q: number, img: Float64Array, out: Float64Array): void {
    const cpx = mesh.sx[p] + 0.5 * mesh.len[p] * mesh.tx[p];
    const cpy = mesh.sy[p] + 0.5 * mesh.len[p] * mesh.ty[p];
    const cpz = mesh.sz[p] + 0.5 * mesh.len[p] * mesh.tz[p];
    const cqx = mesh.sx[q] + 0.5 * mesh.len[q] * mesh.tx[q];
    const cqy = mesh.sy[q] + 0.5 * mesh.len[q] * mesh.ty[q];
    const cqz = mesh.sz[q] + 0.5 * mesh.len[q] * mesh.tz[q];
    const dx = cpx - cqx;
    const dy = cpy - cqy;
    const zs = cpz + cqz;
    const rho = Math.hypot(dx, dy);
    // TE/TM weights: perfect image inside a ground-system zone.
    let rvr = 1,
      rvi = 0,
      mrhr = 1,
      mrhi = 0;
    const inZone = this.zoneAt(cqx, cqy, cqz, dx, dy, zs);
    if (!inZone) {
      // Fresnel coefficients (fresnel.ts), inlined with scalars: this runs once per segment pair.
      const sinPsi = zs > 0 ? zs / Math.hypot(rho, zs) : 0;
      const er = this.epsC.re;
      const ei = this.epsC.im;
      // √S, S = εc − cos²ψ (principal root)
      const sr0 = er - (1 - sinPsi * sinPsi);
      const m = Math.hypot(sr0, ei);
      let qr: number;
      let qi: number;
      if (sr0 >= 0) {
        qr = Math.sqrt(0.5 * (m + sr0));
        qi = qr > 0 ? ei / (2 * qr) : 0;
      } else {
        qi = Math.sqrt(0.5 * (m - sr0));
        qr = Math.abs(ei) / (2 * qi);
        if (ei < 0) qi = -qi;
      }
      // Rv = (εc sinψ − √S)/(εc sinψ + √S)
      const ar = er * sinPsi;
      const ai = ei * sinPsi;
      let nr = ar - qr;
      let ni = ai - qi;
      let dr = ar + qr;
      let di = ai + qi;
      let dd = dr * dr + di * di;
      rvr = (nr * dr + ni * di) / dd;
      rvi = (ni * dr - nr * di) / dd;
      // −Rh = −(sinψ − √S)/(sinψ + √S)
      nr = sinPsi - qr;
      ni = -qi;
      dr = sinPsi + qr;
      di = qi;
      dd = dr * dr + di * di;
      mrhr = -(nr * dr + ni * di) / dd;
      mrhi = -(ni * dr - nr * di) / dd;
    }
    // direction factor −[Rv (t̂p·t̂q' − (t̂p·ĥ)(t̂q'·ĥ)) − Rh (t̂p·ĥ)(t̂q'·ĥ)], t̂q' mirrored
    const tqx = mesh.tx[q];
    const tqy = mesh.ty[q];
    const tqz = -mesh.tz[q];
    const dot = mesh.tx[p] * tqx + mesh.ty[p] * tqy + mesh.tz[p] * tqz;
    let te = 0;
    if (rho > 1e-9) {
      const hx = -dy / rho;
      const hy = dx / rho;
      te = (mesh.tx[p] * hx + mesh.ty[p] * hy) * (tqx * hx + tqy * hy);
    }
    const wr = -(rvr * (dot - te) + mrhr * te);
    const wi = -(rvi * (dot - te) + mrhi * te);
    for (let i = 0; i < 8; i += 2) {
      out[i] = wr * img[i] - wi * img[i + 1];
      out[i + 1] = wr * img[i + 1] + wi * img[i];
    }
    out[8] = -(rvr * img[0] - rvi * img[1]);
    out[9] = -(rvr * img[1] + rvi * img[0]);
  }
  farFieldReflection(sinPsi: number, out: Float64Array): void {
    const fr = fresnelCoefficients(this.epsC, sinPsi);
    out[0] = fr.rv.re;
    out[1] = fr.rv.im;
    out[2] = fr.rh.re;
    out[3] = fr.rh.im;
  }
}

/** The ground model for a ground description; `zones` are the ground-system discs (soil only). */
export function createGroundModel(spec: GroundSpec, zones: readonly GroundZone[] = []): GroundModel {
  switch (spec.kind) {
    case 'free-space':
      return { kind: 'free-space', hasGround: false, soil: null, at: () => null };
    case 'perfect': {
      const at = new PerfectAt();
      return { kind: 'perfect', hasGround: true, soil: null, at: () => at };
    }
    case 'soil': {
      const soil = { permittivity: spec.permittivity, conductivitySPerM: spec.conductivitySPerM };
      return {
        kind: 'reflection-coefficient',
        hasGround: true,
        soil,
        at: (freqHz) => new ReflectionCoefficientAt(soil, freqHz, zones),
      };
    }
  }
}

/** Perfect-ground reflection as a constant, for callers that need it outside a model. */
export const PERFECT_REFLECTION = { rv: c(1), rh: c(-1) };
