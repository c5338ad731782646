/**
 * Ionospheric hop geometry over a spherical earth with a mirror-like reflecting layer at height h.
 *
 * Single hop of ground range D: θ = D/(2R) is the half-hop angle at the earth's centre and the
 * take-off (elevation) angle is
 *   Δ = arctan[(cos θ − R/(R+h)) / sin θ]            (ITU-R P.533; K. Davies, Ionospheric Radio, 1990)
 * with R = 6371 km. The longest single hop, reached at Δ = 0, is 2R·arccos(R/(R+h)).
 * A path of length D needs n hops of D/n each; the fewest hops that are geometrically possible is
 * the smallest n with Δ(D/n) ≥ the lowest take-off angle (0° by default).
 *
 * Validity: geometry only — no layer tilt, no refraction below the layer, no absorption; the
 * choice of reflection heights (default 250–400 km, night-time F2) is the user's.
 */

/** Mean earth radius used by ITU-R P.533, metres. */
export const EARTH_RADIUS_M = 6_371_000;

/**
 * Lowest take-off angle a planned hop may have, degrees. Value from memory: ITU-R P.533 uses a
 * minimum elevation angle of 3° when it counts hops; below that, ground screening and the
 * antenna's own null make a hop useless in practice. Set 0 for pure geometry.
 */
export const DEFAULT_MIN_HOP_ELEVATION_DEG = 3;

/** Default range of reflection heights, metres (night F2, value from memory: typically 300–400 km). */
export const DEFAULT_LAYER_HEIGHTS_M: readonly number[] = [250_000, 300_000, 350_000, 400_000];

/** Take-off angle in degrees for one hop of ground range `hopM` off a layer at `layerHeightM`; negative when impossible. */
export function singleHopElevationDeg(
  hopM: number,
  layerHeightM: number,
  earthRadiusM = EARTH_RADIUS_M,
): number {
  const theta = hopM / (2 * earthRadiusM);
  const ratio = earthRadiusM / (earthRadiusM + layerHeightM);
  return (Math.atan2(Math.cos(theta) - ratio, Math.sin(theta)) * 180) / Math.PI;
}

/** Longest single hop off a layer at `layerHeightM`, metres: 2R·arccos(R/(R+h)). */
export function maxSingleHopM(layerHeightM: number, earthRadiusM = EARTH_RADIUS_M): number {
  return 2 * earthRadiusM * Math.acos(earthRadiusM / (earthRadiusM + layerHeightM));
}

export interface HopSolution {
  hops: number;
  elevationDeg: number;
  layerHeightM: number;
}

/**
 * Fewest hops that are geometrically possible for a path of `distanceM` off a layer at
 * `layerHeightM`, with a take-off angle of at least `minElevationDeg`.
 */
export function fewestHops(distanceM: number, layerHeightM: number, minElevationDeg = 0): HopSolution {
  if (!(distanceM > 0)) return { hops: 1, elevationDeg: 90, layerHeightM };
  for (let n = 1; n < 1000; n++) {
    const el = singleHopElevationDeg(distanceM / n, layerHeightM);
    if (el >= minElevationDeg) return { hops: n, elevationDeg: el, layerHeightM };
  }
  throw new Error(`fewestHops: no hop count reaches ${minElevationDeg}° for ${distanceM} m`);
}
