/**
 * Exact ground: the field reflected by a homogeneous lossy half-space (Sommerfeld integrals),
 * as a dyadic per pair of points, split into the perfect-conductor image weighted by
 * K = (εc − 1)/(εc + 1) (closed form) and a smooth remainder (integrated, or interpolated from a
 * table built once per frequency and soil).
 *
 *   E_refl(r) = (I·dl/(4πjωε0)) D(r, r′)·ŝ,   D = K·D_image + D_rem
 *
 * Modules: medium.ts (constants), sommerfeld.ts (integrals), image.ts (closed forms, dyadic
 * assembly), table.ts (tabulation, interpolation, cache), ground.ts (the solver's GroundModel).
 *
 * References:
 *  - A. Sommerfeld, "Über die Ausbreitung der Wellen in der drahtlosen Telegraphie",
 *    Ann. Phys. 28 (1909) 665–736.
 *  - A. Baños, Dipole Radiation in the Presence of a Conducting Half-Space (Pergamon, 1966).
 *  - K. A. Michalski and J. R. Mosig, "Multilayered media Green's functions in integral
 *    equation formulations", IEEE Trans. Antennas Propag. 45 (1997) 508–519.
 *  - K. A. Michalski, "Extrapolation methods for Sommerfeld integral tails", IEEE Trans.
 *    Antennas Propag. 46 (1998) 1405–1418.
 *  - W. C. Chew, Waves and Fields in Inhomogeneous Media (Van Nostrand Reinhold, 1990), ch. 2.
 *  - C. A. Balanis, Antenna Theory, 3rd ed. (2005), §4.7 (images).
 *  - J. D. Jackson, Classical Electrodynamics, 3rd ed. (1999), §4.4 (dielectric image).
 */
import { addCylindricalDyadic, addPerfectImageDyadic } from './image.ts';
import type { HalfSpace } from './medium.ts';
import { CYL_LEN, DEFAULT_SOMMERFELD, sommerfeldComponents } from './sommerfeld.ts';
import type { RemainderTable } from './table.ts';

export { halfSpace, type HalfSpace } from './medium.ts';
export { remainderTable, clearRemainderTables, RemainderTable } from './table.ts';

export type Point3 = readonly [number, number, number];

export interface DyadicOptions {
  /** Integrate the remainder directly even if a table is given. */
  direct?: boolean;
  table?: RemainderTable;
  relTol?: number;
}

const cyl = new Float64Array(CYL_LEN);

/**
 * The reflected-field dyadic D(r, r′) (18 doubles, row-major complex 3×3, m⁻³) for observer
 * `obs` and source `src`, both at z ≥ 0; returns how the remainder was obtained.
 */
export function reflectedDyadic(
  hs: HalfSpace,
  obs: Point3,
  src: Point3,
  out: Float64Array,
  opts: DyadicOptions = {},
): 'table' | 'direct' {
  const dx = obs[0] - src[0];
  const dy = obs[1] - src[1];
  const zeta = obs[2] + src[2];
  const rho = Math.hypot(dx, dy);
  out.fill(0);
  addPerfectImageDyadic(hs.k0, dx, dy, zeta, hs.kRe, hs.kIm, out);
  const how = remainderCylindrical(hs, rho, zeta, cyl, opts);
  const cx = rho > 0 ? dx / rho : 1;
  const cy = rho > 0 ? dy / rho : 0;
  addCylindricalDyadic(cyl, cx, cy, out);
  return how;
}

/** Remainder components (Gρρ, Gφφ, Gρz, Gzz) at (ρ, ζ): from the table when it covers the point. */
export function remainderCylindrical(
  hs: HalfSpace,
  rho: number,
  zeta: number,
  out: Float64Array,
  opts: DyadicOptions = {},
): 'table' | 'direct' {
  const t = opts.table;
  if (!opts.direct && t && t.covers(rho, zeta)) {
    t.interpolate(rho, zeta, out);
    return 'table';
  }
  sommerfeldComponents(hs, rho, zeta, out, {
    ...DEFAULT_SOMMERFELD,
    relTol: opts.relTol ?? DEFAULT_SOMMERFELD.relTol,
  });
  return 'direct';
}
