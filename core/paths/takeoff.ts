/**
 * Take-off angles as a weighted distribution (model 'hop-modes-1').
 *
 * For one path (a ground distance D from the station) and one band, the model lists the
 * propagation modes that can carry the signal at night, when the low bands carry long-distance
 * contacts, and weights each by an estimate of its relative strength:
 *
 *  - layers: the E layer (reflection heights E_LAYER_HEIGHTS_M) and the night F2 layer
 *    (F2_LAYER_HEIGHTS_M); every height of a layer is one equally likely state of the ionosphere;
 *  - hop counts: for each layer height, the fewest hops whose take-off angle is at least
 *    MIN_TAKEOFF_ELEVATION_DEG, and the next MODE_COUNT − 1 hop counts;
 *  - geometry: spherical earth, mirror reflection (core/REFERENCES.md §7): hop range D/n, take-off
 *    Δ = arctan[(cos θ − R/(R+h))/sin θ], θ = D/(2nR); ray length of one hop
 *    2·√(R² + (R+h)² − 2R(R+h)cos θ); angle of incidence i at height h' from sin i = R cosΔ/(R+h')
 *    (core/REFERENCES.md §13);
 *  - a mode exists only if the layer reflects the band at that incidence: f ≤ fc·sec i (the secant
 *    law, core/REFERENCES.md §13), with the night critical frequencies NIGHT_FOE_MHZ and
 *    NIGHT_FOF2_MHZ (choices, see below). If no mode of a sample point passes, the point lies in
 *    the skip zone of that night; its modes are then kept without the gate (noted in `skipped`);
 *  - relative power of a mode, in dB below an ideal lossless hop:
 *      spreading 20·log10(total ray length)                           (free-space spreading)
 *    + 2n · ABSORPTION_DB_PER_PASS · sec i(ABSORPTION_HEIGHT_M) · ((fR + fH)/(f + fH))²
 *                                                                     (non-deviative absorption,
 *                                                                      one pass up and one down per hop)
 *    + (n − 1) · ground reflection loss at grazing angle Δ over the path's mean terrain
 *                                                                     (Fresnel, core/REFERENCES.md §3)
 *  - each sample point of a region has the same share; the region's distribution is the set of
 *    (azimuth, elevation, weight) triples of its points, weights summing to 1.
 *
 * A score over this distribution is the gain averaged in power with those weights
 * (core/rank/pattern.ts distributionGainDbi).
 *
 * What it leaves out (so its result is an estimate, not a prediction): time of day and season
 * beyond "night", layer tilts and ducted modes, focusing, polarisation coupling, sporadic E, real
 * terrain along the path. Every weight that is a choice is a named constant below.
 */
import type { Band } from '../project/schema.ts';
import { DESIGN_FREQ_HZ } from '../antennas/common.ts';
import { complexPermittivity, fresnelCoefficients, type SoilElectrical } from '../em/fresnel.ts';
import { EARTH_RADIUS_M, singleHopElevationDeg } from './hops.ts';

export const TAKEOFF_MODEL_ID = 'hop-modes-1';
export const USER_WINDOW_MODEL_ID = 'user-window';

/** Modes per layer height: the fewest-hop count and the next two (the requirement). */
export const MODE_COUNT = 3;

/**
 * Lowest take-off angle of a mode, degrees. Value from memory: ITU-R P.533 counts hops with a
 * minimum elevation angle of 3° (ground screening and terrain make lower rays unreliable).
 */
export const MIN_TAKEOFF_ELEVATION_DEG = 3;

/**
 * E-layer reflection heights, metres. ITU-R P.533 reflects E modes at 110 km (value from memory);
 * 100–120 km spans the layer's usual peak heights (value from memory).
 */
export const E_LAYER_HEIGHTS_M: readonly number[] = [100_000, 110_000, 120_000];

/** Night F2 reflection heights, metres: typically 300–400 km, down to 250 km (value from memory). */
export const F2_LAYER_HEIGHTS_M: readonly number[] = [250_000, 300_000, 350_000, 400_000];

/**
 * Night critical frequency of the E layer, MHz: about 0.4–0.6 MHz at night (value from memory).
 * A choice: with 0.5 MHz the secant law lets the E layer carry 160 m at low angles and never
 * 80 m or 40 m, which is the usual night picture (common practice, no source).
 */
export const NIGHT_FOE_MHZ = 0.5;

/**
 * Night critical frequency of the F2 layer, MHz. It ranges from about 2 MHz (solar minimum,
 * before dawn) to 8 MHz (solar maximum, evening) at mid latitudes (value from memory); 4 MHz is a
 * choice between them. It only removes high-angle 40 m modes (short hops that pass through the
 * layer); 160 m and 80 m are reflected at every angle the model uses.
 */
export const NIGHT_FOF2_MHZ = 4;

/**
 * Non-deviative absorption per pass through the lower ionosphere at vertical incidence, at night,
 * at ABSORPTION_REF_MHZ, dB. A choice (night absorption on 80 m is of the order of a dB per
 * pass; value from memory). It grows with sec i, so low rays, which cross the absorbing region
 * obliquely, lose more per hop, and with (f + fH)^−2 (the frequency law of ITU-R P.533's
 * absorption term, from memory; exponent rounded from 1.98).
 */
export const ABSORPTION_DB_PER_PASS = 0.5;
/** Frequency at which ABSORPTION_DB_PER_PASS applies, MHz (the 80 m design frequency). */
export const ABSORPTION_REF_MHZ = 3.55;
/** Electron gyrofrequency in the absorption law, MHz: about 1.2 MHz at mid latitudes (value from memory). */
export const GYROFREQUENCY_MHZ = 1.2;
/** Height at which the absorption's angle of incidence is taken, metres (ITU-R P.533 uses 110 km; from memory). */
export const ABSORPTION_HEIGHT_M = 110_000;

/**
 * The path's mean terrain for the ground reflections between hops. The project has no map of
 * land and sea, so this is a choice: half of the reflection points over sea water (ITU-R P.368,
 * average salinity, 70 / 5 S/m) and half over land (ITU-R P.368 "land", 22 / 3 mS/m),
 * core/REFERENCES.md §4. The reflection loss is the mean of the two in power.
 */
export const PATH_TERRAIN: { seaFraction: number; sea: SoilElectrical; land: SoilElectrical } = {
  seaFraction: 0.5,
  sea: { permittivity: 70, conductivitySPerM: 5 },
  land: { permittivity: 22, conductivitySPerM: 0.003 },
};

/** A layer of the model. */
export interface TakeoffLayer {
  id: 'E' | 'F2';
  heightsM: readonly number[];
  nightCriticalMHz: number;
}

export const TAKEOFF_LAYERS: readonly TakeoffLayer[] = [
  { id: 'E', heightsM: E_LAYER_HEIGHTS_M, nightCriticalMHz: NIGHT_FOE_MHZ },
  { id: 'F2', heightsM: F2_LAYER_HEIGHTS_M, nightCriticalMHz: NIGHT_FOF2_MHZ },
];

/** One mode of one sample point. */
export interface TakeoffMode {
  layer: 'E' | 'F2';
  layerHeightM: number;
  hops: number;
  elevationDeg: number;
  /** Loss relative to an ideal lossless path, dB (spreading + absorption + ground reflections). */
  lossDb: number;
  /** Weight within the sample point (the point's modes sum to 1). */
  weight: number;
}

export interface TakeoffDirection {
  azimuthDeg: number;
  elevationDeg: number;
  weight: number;
}

/** A region's take-off distribution for one band. */
export interface TakeoffDistribution {
  model: string;
  band: Band;
  /** Every (azimuth, elevation, weight) the score averages over; weights sum to 1. */
  directions: TakeoffDirection[];
  /** The elevation distribution in 1° bins (bin centre = the rounded angle); weights sum to 1. */
  weights: { elevationDeg: number; weight: number }[];
  medianDeg: number;
  p10Deg: number;
  p90Deg: number;
  /** Sample points that lie in the skip zone (no mode passed the secant-law gate). */
  skipped: number;
}

/** Angle of incidence at height `heightM` of a ray leaving the ground at `elevationDeg`, radians. */
export function incidenceAngleRad(
  elevationDeg: number,
  heightM: number,
  earthRadiusM = EARTH_RADIUS_M,
): number {
  const s = (earthRadiusM * Math.cos((elevationDeg * Math.PI) / 180)) / (earthRadiusM + heightM);
  return Math.asin(Math.min(1, s));
}

/** Ray length of one hop of ground range `hopM` off a mirror at `layerHeightM`, metres. */
export function hopRayLengthM(hopM: number, layerHeightM: number, earthRadiusM = EARTH_RADIUS_M): number {
  const theta = hopM / (2 * earthRadiusM);
  const r = earthRadiusM;
  const rh = earthRadiusM + layerHeightM;
  return 2 * Math.sqrt(r * r + rh * rh - 2 * r * rh * Math.cos(theta));
}

/** Non-deviative absorption of one hop (two passes), dB. */
export function hopAbsorptionDb(elevationDeg: number, freqMHz: number): number {
  const sec = 1 / Math.cos(incidenceAngleRad(elevationDeg, ABSORPTION_HEIGHT_M));
  const law = ((ABSORPTION_REF_MHZ + GYROFREQUENCY_MHZ) / (freqMHz + GYROFREQUENCY_MHZ)) ** 2;
  return 2 * ABSORPTION_DB_PER_PASS * sec * law;
}

/** Power reflection loss of one ground reflection at grazing angle ψ over the path's mean terrain, dB. */
export function groundReflectionLossDb(grazingDeg: number, freqHz: number): number {
  const sinPsi = Math.sin((Math.max(grazingDeg, 0) * Math.PI) / 180);
  const power = (soil: SoilElectrical): number => {
    const { rv, rh } = fresnelCoefficients(complexPermittivity(soil, freqHz), sinPsi);
    // Unknown polarisation after the ionosphere: the mean of the two in power (a choice).
    return (rv.re * rv.re + rv.im * rv.im + rh.re * rh.re + rh.im * rh.im) / 2;
  };
  const p =
    PATH_TERRAIN.seaFraction * power(PATH_TERRAIN.sea) +
    (1 - PATH_TERRAIN.seaFraction) * power(PATH_TERRAIN.land);
  return -10 * Math.log10(p);
}

/** Whether a layer at `heightM` with critical frequency `fcMHz` reflects `freqMHz` for this ray (secant law). */
export function layerReflects(
  elevationDeg: number,
  heightM: number,
  fcMHz: number,
  freqMHz: number,
): boolean {
  return freqMHz <= fcMHz / Math.cos(incidenceAngleRad(elevationDeg, heightM));
}

/**
 * The modes of one path of ground distance `distanceM` at `freqHz`, weights summing to 1, and
 * whether the secant-law gate had to be dropped (skip zone).
 */
export function pathModes(
  distanceM: number,
  freqHz: number,
  layers: readonly TakeoffLayer[] = TAKEOFF_LAYERS,
  minElevationDeg = MIN_TAKEOFF_ELEVATION_DEG,
): { modes: TakeoffMode[]; skipped: boolean } {
  const fMHz = freqHz / 1e6;
  const build = (gate: boolean): TakeoffMode[] => {
    const out: TakeoffMode[] = [];
    for (const layer of layers) {
      const share = 1 / layer.heightsM.length;
      for (const h of layer.heightsM) {
        // Fewest hops with Δ ≥ the minimum; a path shorter than a few km is one hop.
        let n = 1;
        const d = Math.max(distanceM, 1);
        while (singleHopElevationDeg(d / n, h) < minElevationDeg) n++;
        for (let k = 0; k < MODE_COUNT; k++, n++) {
          const el = singleHopElevationDeg(d / n, h);
          if (gate && !layerReflects(el, h, layer.nightCriticalMHz, fMHz)) continue;
          const lossDb =
            20 * Math.log10((n * hopRayLengthM(d / n, h)) / 1000) +
            n * hopAbsorptionDb(el, fMHz) +
            (n - 1) * groundReflectionLossDb(el, freqHz);
          out.push({
            layer: layer.id,
            layerHeightM: h,
            hops: n,
            elevationDeg: el,
            lossDb,
            weight: share * 10 ** (-lossDb / 10),
          });
        }
      }
    }
    return out;
  };
  let modes = build(true);
  let skipped = false;
  if (modes.length === 0) {
    modes = build(false);
    skipped = true;
  }
  const total = modes.reduce((s, m) => s + m.weight, 0);
  for (const m of modes) m.weight /= total;
  return { modes, skipped };
}

/** Weighted quantile (the smallest angle whose cumulative weight reaches q) of sorted pairs. */
function quantile(sorted: readonly { elevationDeg: number; weight: number }[], q: number): number {
  let cum = 0;
  for (const s of sorted) {
    cum += s.weight;
    if (cum >= q - 1e-12) return s.elevationDeg;
  }
  return sorted[sorted.length - 1].elevationDeg;
}

/** Summary of a set of weighted directions (weights summing to 1). */
export function summarize(
  model: string,
  band: Band,
  directions: TakeoffDirection[],
  skipped = 0,
): TakeoffDistribution {
  const sorted = directions
    .map((d) => ({ elevationDeg: d.elevationDeg, weight: d.weight }))
    .sort((a, b) => a.elevationDeg - b.elevationDeg);
  const bins = new Map<number, number>();
  for (const s of sorted) {
    const b = Math.round(s.elevationDeg);
    bins.set(b, (bins.get(b) ?? 0) + s.weight);
  }
  const weights = [...bins.entries()].map(([elevationDeg, weight]) => ({ elevationDeg, weight }));
  const total = weights.reduce((s, w) => s + w.weight, 0);
  for (const w of weights) w.weight /= total;
  const round2 = (v: number): number => Math.round(v * 100) / 100;
  return {
    model,
    band,
    directions,
    weights,
    medianDeg: round2(quantile(sorted, 0.5)),
    p10Deg: round2(quantile(sorted, 0.1)),
    p90Deg: round2(quantile(sorted, 0.9)),
    skipped,
  };
}

/** A region's distribution from its sample points (azimuth, distance), each point the same share. */
export function takeoffDistribution(
  samples: readonly { azimuthDeg: number; distanceM: number }[],
  band: Band,
): TakeoffDistribution {
  const directions: TakeoffDirection[] = [];
  let skipped = 0;
  const share = 1 / samples.length;
  for (const s of samples) {
    const { modes, skipped: sk } = pathModes(s.distanceM, DESIGN_FREQ_HZ[band]);
    if (sk) skipped++;
    for (const m of modes)
      directions.push({ azimuthDeg: s.azimuthDeg, elevationDeg: m.elevationDeg, weight: share * m.weight });
  }
  return summarize(TAKEOFF_MODEL_ID, band, directions, skipped);
}

/** Step of the user's own window, degrees. */
export const USER_WINDOW_STEP_DEG = 1;

/**
 * The user's own window [lo, hi] for a region: every sample point's azimuth at lo, lo + 1°, …, hi
 * (and hi itself), all with the same weight.
 */
export function userWindowDistribution(
  samples: readonly { azimuthDeg: number }[],
  windowDeg: readonly [number, number],
  band: Band,
): TakeoffDistribution {
  const [lo, hi] = windowDeg;
  const els: number[] = [];
  for (let e = lo; e < hi - 1e-9; e += USER_WINDOW_STEP_DEG) els.push(e);
  els.push(hi);
  const w = 1 / (els.length * samples.length);
  const directions = samples.flatMap((s) =>
    els.map((elevationDeg) => ({ azimuthDeg: s.azimuthDeg, elevationDeg, weight: w })),
  );
  return summarize(USER_WINDOW_MODEL_ID, band, directions);
}

/** What a plan reports of a distribution (no per-direction list). */
export interface TakeoffSummary {
  model: string;
  band: Band;
  weights: { elevationDeg: number; weight: number }[];
  medianDeg: number;
  p10Deg: number;
  p90Deg: number;
}

export function takeoffSummary(d: TakeoffDistribution): TakeoffSummary {
  return {
    model: d.model,
    band: d.band,
    weights: d.weights.map((w) => ({ elevationDeg: w.elevationDeg, weight: w.weight })),
    medianDeg: d.medianDeg,
    p10Deg: d.p10Deg,
    p90Deg: d.p90Deg,
  };
}
