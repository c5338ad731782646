/**
 * Paths from the station to the target regions: for each region, geodesic bearings and distances
 * to its sample points (an azimuth span), and the take-off elevation of each sample over a range
 * of reflection heights with the fewest hops that are geometrically possible (the fewest-hop
 * window), and per band the weighted take-off distribution of the modes that can carry the path
 * (core/paths/takeoff.ts) or the user's own window: the ranking averages a candidate's gain over
 * that distribution.
 */
import { BANDS, type Band, type LonLat, type Polygon, type Target } from '../project/schema.ts';
import { azimuthSpan, bearingDistance, destination, type AzimuthSpan } from './geodesy.ts';
import { DEFAULT_LAYER_HEIGHTS_M, DEFAULT_MIN_HOP_ELEVATION_DEG, fewestHops } from './hops.ts';
import { regionById } from './regions.ts';
import { boxOf } from '../site/frame.ts';
import { takeoffDistribution, userWindowDistribution, type TakeoffDistribution } from './takeoff.ts';

export { bearingDistance, destination, azimuthSpan, normalizeDeg } from './geodesy.ts';
export {
  singleHopElevationDeg,
  maxSingleHopM,
  fewestHops,
  DEFAULT_LAYER_HEIGHTS_M,
  DEFAULT_MIN_HOP_ELEVATION_DEG,
} from './hops.ts';
export { REGIONS, regionById } from './regions.ts';
export { toLocator, fromLocator } from './maidenhead.ts';
export {
  TAKEOFF_MODEL_ID,
  USER_WINDOW_MODEL_ID,
  takeoffDistribution,
  userWindowDistribution,
  pathModes,
  takeoffSummary,
  type TakeoffSummary,
  type TakeoffDistribution,
  type TakeoffDirection,
} from './takeoff.ts';

export class UnknownRegionError extends Error {
  override name = 'UnknownRegionError';
}

/** A target resolved to sample points. */
export interface ResolvedTarget {
  id: string;
  name: string;
  weight: number;
  points: LonLat[];
  /** The user's own take-off window, degrees, in place of the computed distribution. */
  takeoffWindowDeg?: [number, number];
}

export interface PathOptions {
  /** Reflection heights, metres (default 250, 300, 350, 400 km). */
  layerHeightsM?: readonly number[];
  /** Lowest take-off angle a hop may have, degrees (default DEFAULT_MIN_HOP_ELEVATION_DEG = 3°). */
  minHopElevationDeg?: number;
}

export interface PathSample {
  point: LonLat;
  azimuthDeg: number;
  distanceM: number;
  /** One entry per reflection height. */
  hops: { layerHeightM: number; hops: number; elevationDeg: number }[];
}

export interface RegionPath {
  id: string;
  name: string;
  weight: number;
  samples: PathSample[];
  azimuthSpan: AzimuthSpan;
  distanceKm: { min: number; max: number };
  /** Take-off angles of the fewest-hop geometry alone (min and max over samples and heights). */
  elevationWindowDeg: { min: number; max: number };
  hopRange: { min: number; max: number };
  /** Every (azimuth, elevation) pair of the fewest-hop geometry. */
  directions: { azimuthDeg: number; elevationDeg: number }[];
  /**
   * Per band, the weighted take-off distribution the ranking averages over (core/paths/takeoff.ts),
   * or the user's own window when the target sets one.
   */
  takeoff: Record<Band, TakeoffDistribution>;
}

/** Sample points of a circle: the centre and 8 points on the rim (geodesic). */
function circlePoints(center: LonLat, radiusKm: number): LonLat[] {
  const pts: LonLat[] = [center];
  for (let k = 0; k < 8; k++) pts.push(destination(center, k * 45, radiusKm * 1000));
  return pts;
}

/** Point in polygon by ray casting in [lon, lat] degrees (coarse regions only). */
function insideRing(p: LonLat, ring: readonly LonLat[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Sample points of a polygon: its corners and the points of a 5×5 grid over its box that fall inside. */
function polygonPoints(poly: Polygon): LonLat[] {
  const ring = poly.coordinates[0];
  const corners = ring.slice(0, -1);
  const {
    min: [minLon, minLat],
    max: [maxLon, maxLat],
  } = boxOf(corners);
  const pts: LonLat[] = [...corners];
  for (let i = 0; i < 5; i++) {
    for (let j = 0; j < 5; j++) {
      const p: LonLat = [
        minLon + ((i + 0.5) / 5) * (maxLon - minLon),
        minLat + ((j + 0.5) / 5) * (maxLat - minLat),
      ];
      if (insideRing(p, ring)) pts.push(p);
    }
  }
  return pts;
}

/** Resolve the project's targets to sample points; an unknown region id throws. */
export function resolveTargets(targets: readonly Target[]): ResolvedTarget[] {
  return targets.map((t) => {
    if ('regionId' in t) {
      const r = regionById(t.regionId);
      if (!r) throw new UnknownRegionError(`unknown target region "${t.regionId}"`);
      return {
        id: r.id,
        name: r.name,
        weight: t.weight,
        points: r.points.map((p) => [p[0], p[1]] as LonLat),
        ...(t.takeoffWindowDeg ? { takeoffWindowDeg: t.takeoffWindowDeg } : {}),
      };
    }
    const points = 'center' in t.area ? circlePoints(t.area.center, t.area.radiusKm) : polygonPoints(t.area);
    return {
      id: t.id,
      name: t.name,
      weight: t.weight,
      points,
      ...(t.takeoffWindowDeg ? { takeoffWindowDeg: t.takeoffWindowDeg } : {}),
    };
  });
}

/** Bearings, distances and elevation window from `station` to one resolved target. */
export function regionPath(station: LonLat, target: ResolvedTarget, options: PathOptions = {}): RegionPath {
  const heights = options.layerHeightsM ?? DEFAULT_LAYER_HEIGHTS_M;
  const minEl = options.minHopElevationDeg ?? DEFAULT_MIN_HOP_ELEVATION_DEG;
  const samples: PathSample[] = target.points.map((point) => {
    const { azimuthDeg, distanceM } = bearingDistance(station, point);
    return {
      point,
      azimuthDeg,
      distanceM,
      hops: heights.map((h) => {
        const s = fewestHops(distanceM, h, minEl);
        return { layerHeightM: h, hops: s.hops, elevationDeg: s.elevationDeg };
      }),
    };
  });
  const directions = samples.flatMap((s) =>
    s.hops.map((h) => ({ azimuthDeg: s.azimuthDeg, elevationDeg: h.elevationDeg })),
  );
  const els = directions.map((d) => d.elevationDeg);
  const dists = samples.map((s) => s.distanceM / 1000);
  const hopsAll = samples.flatMap((s) => s.hops.map((h) => h.hops));
  return {
    id: target.id,
    name: target.name,
    weight: target.weight,
    samples,
    azimuthSpan: azimuthSpan(samples.map((s) => s.azimuthDeg)),
    distanceKm: { min: Math.min(...dists), max: Math.max(...dists) },
    elevationWindowDeg: { min: Math.min(...els), max: Math.max(...els) },
    hopRange: { min: Math.min(...hopsAll), max: Math.max(...hopsAll) },
    directions,
    takeoff: Object.fromEntries(
      BANDS.map((band) => {
        const win = target.takeoffWindowDeg;
        return [band, win ? userWindowDistribution(samples, win, band) : takeoffDistribution(samples, band)];
      }),
    ) as Record<Band, TakeoffDistribution>,
  };
}

/** All targets of a project from `station`. */
export function planPaths(
  station: LonLat,
  targets: readonly Target[],
  options: PathOptions = {},
): RegionPath[] {
  return resolveTargets(targets).map((t) => regionPath(station, t, options));
}
