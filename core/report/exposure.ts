/**
 * RF exposure screening: the distance from the antenna at which the estimated exposure falls
 * below a limit, for the station's power, mode and on-time, using the candidate's own gain.
 *
 * Far-field estimate (FCC OET Bulletin 65, Ed. 97-01, §2, the far-field power-density equations;
 * equation numbers below are from memory):
 *   S = EIRP / (4π R²)              free space
 *   S = 2.56 · EIRP / (4π R²)       with the ground-reflection factor (1.6² for a field that
 *                                   doubles in power density by reflection, OET 65 eq. (6))
 * so R = √(F · EIRP / (4π S_limit)), F = 1 or 2.56.
 *
 * Limits (f in MHz):
 *   47 CFR §1.1310, Table 1: controlled/occupational 0.3–3 MHz 100 mW/cm², 3–30 MHz 900/f² mW/cm²
 *   (6-minute average); general population 0.3–1.34 MHz 100 mW/cm², 1.34–30 MHz 180/f² mW/cm²
 *   (30-minute average).
 *   ICNIRP 2020 guidelines (Health Physics 118 (2020) 483), Table 5 (general public) and Table 6
 *   (occupational) whole-body reference levels for 0.1–30 MHz: E = 300 f^−0.7 V/m (public),
 *   660 f^−0.7 V/m (occupational) [values from memory; check against the guidelines], expressed here
 *   as the plane-wave equivalent power density S = E²/η0.
 *
 * These distances fall in the antenna's reactive near field on the low bands (λ/2π is 13 m on
 * 80 m), where the far-field formula is only a screening estimate: local rules and a professional
 * evaluation govern.
 */
import { isOnTimeFraction, isPowerW, MAX_POWER_W } from '../project/station.ts';
import { ETA0_OHM } from '../units/index.ts';

/** Free-space wave impedance, Ω (μ0 c, from core/units). */
export { ETA0_OHM };
/** Ground-reflection factor of OET Bulletin 65 (1.6², power density). */
export const GROUND_REFLECTION_FACTOR = 2.56;

export type ExposureLimitId = 'fcc-general' | 'fcc-controlled' | 'icnirp-public' | 'icnirp-occupational';

export interface ExposureLimit {
  id: ExposureLimitId;
  label: string;
  /** Plane-wave equivalent power density limit, W/m². */
  powerDensityWPerM2: number;
  averagingMinutes: number;
  source: string;
}

const MW_PER_CM2_TO_W_PER_M2 = 10; // 1 mW/cm² = 10 W/m²

/** FCC power density, W/m²: 100 mW/cm² below `cornerMhz`, k/f² mW/cm² above (47 CFR §1.1310 Table 1). */
const fccDensityWPerM2 = (freqMhz: number, cornerMhz: number, k: number): number =>
  (freqMhz < cornerMhz ? 100 : k / (freqMhz * freqMhz)) * MW_PER_CM2_TO_W_PER_M2;

/** ICNIRP 2020 plane-wave equivalent power density, W/m²: E = k·f^−0.7 V/m, S = E²/η0 (Tables 5 and 6, from memory). */
function icnirpDensityWPerM2(freqMhz: number, k: number): number {
  const e = k * freqMhz ** -0.7;
  return (e * e) / ETA0_OHM;
}

/** Each limit's words and its power density at a frequency in MHz. */
const LIMITS: Record<
  ExposureLimitId,
  { label: string; densityWPerM2: (freqMhz: number) => number; averagingMinutes: number; source: string }
> = {
  'fcc-general': {
    label: 'FCC general population',
    densityWPerM2: (f) => fccDensityWPerM2(f, 1.34, 180),
    averagingMinutes: 30,
    source: '47 CFR §1.1310 Table 1(B)',
  },
  'fcc-controlled': {
    label: 'FCC controlled (occupational)',
    densityWPerM2: (f) => fccDensityWPerM2(f, 3, 900),
    averagingMinutes: 6,
    source: '47 CFR §1.1310 Table 1(A)',
  },
  'icnirp-public': {
    label: 'ICNIRP 2020 general public',
    densityWPerM2: (f) => icnirpDensityWPerM2(f, 300),
    averagingMinutes: 30,
    source: 'ICNIRP 2020 Table 5 (from memory)',
  },
  'icnirp-occupational': {
    label: 'ICNIRP 2020 occupational',
    densityWPerM2: (f) => icnirpDensityWPerM2(f, 660),
    averagingMinutes: 6,
    source: 'ICNIRP 2020 Table 6 (from memory)',
  },
};

/** The limit at a frequency, or throws a RangeError outside 0.3–30 MHz (the low bands lie inside). */
export function exposureLimit(id: ExposureLimitId, freqMhz: number): ExposureLimit {
  if (!(freqMhz >= 0.3 && freqMhz <= 30))
    throw new RangeError(`exposure limits are tabulated here for 0.3–30 MHz, not ${freqMhz} MHz`);
  const l = LIMITS[id];
  return {
    id,
    label: l.label,
    powerDensityWPerM2: l.densityWPerM2(freqMhz),
    averagingMinutes: l.averagingMinutes,
    source: l.source,
  };
}

export const MODE_DUTY_FACTORS = {
  /** Typical duty factors for amateur emissions, OET Bulletin 65 Supplement B, Table 1 (secondary). */
  ssb: 0.2,
  'ssb-compressed': 0.4,
  cw: 0.4,
  ft8: 1,
  rtty: 1,
  fm: 1,
} as const;
export type Mode = keyof typeof MODE_DUTY_FACTORS;

export interface ExposureInput {
  peakEnvelopePowerW: number;
  mode: Mode;
  /** Fraction of the averaging time spent transmitting, 0…1. */
  onTimeFraction: number;
  /** Feed-line loss between transmitter and antenna, dB (0 for the worst case). */
  feedLossDb: number;
  /** The candidate's gain in the direction of interest (its peak for screening), dBi. */
  gainDbi: number;
  freqMhz: number;
}

export interface ExposureDistance {
  limit: ExposureLimit;
  freeSpaceM: number;
  withGroundReflectionM: number;
}

export interface ExposureEstimate {
  averagePowerW: number;
  eirpW: number;
  distances: ExposureDistance[];
  notes: string[];
}

/** Distance at which S = F·EIRP/(4πR²) falls to the limit (OET 65 eq. (3)/(6) solved for R). */
export function complianceDistanceM(eirpW: number, limitWPerM2: number, factor: number): number {
  return Math.sqrt((factor * eirpW) / (4 * Math.PI * limitWPerM2));
}

export function estimateExposure(
  input: ExposureInput,
  limits: readonly ExposureLimitId[] = [
    'fcc-general',
    'fcc-controlled',
    'icnirp-public',
    'icnirp-occupational',
  ],
): ExposureEstimate {
  const { peakEnvelopePowerW: pep, onTimeFraction: onTime } = input;
  if (!isPowerW(pep)) throw new RangeError(`peakEnvelopePowerW must be between 0 and ${MAX_POWER_W} W`);
  if (!isOnTimeFraction(onTime)) throw new RangeError('onTimeFraction must be between 0 and 1');
  if (!(input.feedLossDb >= 0 && input.feedLossDb < 30))
    throw new RangeError('feedLossDb must be between 0 and 30 dB');
  if (!Number.isFinite(input.gainDbi)) throw new RangeError('gainDbi must be a finite number');
  const averagePowerW = pep * MODE_DUTY_FACTORS[input.mode] * onTime * 10 ** (-input.feedLossDb / 10);
  const eirpW = averagePowerW * 10 ** (input.gainDbi / 10);
  const wavelengthM = 299.792458 / input.freqMhz;
  const distances = limits.map((id) => {
    const limit = exposureLimit(id, input.freqMhz);
    return {
      limit,
      freeSpaceM: complianceDistanceM(eirpW, limit.powerDensityWPerM2, 1),
      withGroundReflectionM: complianceDistanceM(eirpW, limit.powerDensityWPerM2, GROUND_REFLECTION_FACTOR),
    };
  });
  const nearFieldM = wavelengthM / (2 * Math.PI);
  const notes = [
    `These distances are far-field estimates for compliance screening. At ${input.freqMhz} MHz the reactive near field reaches about ${nearFieldM.toFixed(0)} m (λ/2π), so close to the antenna the true fields can differ; local rules and a professional evaluation govern.`,
  ];
  return { averagePowerW, eirpW, distances, notes };
}
