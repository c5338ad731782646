/**
 * How to tune a built antenna, in words and in the user's units: which wire to change and at
 * which end(s), and the tuning rate that measureTuning (./tuningMeasure.ts) takes from the field
 * solver, as kHz per centimetre (or per inch) and centimetres (or inches) per 10 kHz. Pure: the
 * renderer and the build sheet can both use it.
 *
 * The trim texts say the same as the build sheet's; they are common practice, no source.
 */
import type { AntennaTypeId } from '../antennas/types.ts';
import { feetToM, type UnitSystem } from '../units/index.ts';
import type { TuningMeasurement } from './tuningMeasure.ts';

/** Both four-squares, self-supporting and hung, are trimmed alike. */
const FOUR_SQUARE_TRIM =
  'Cut all four verticals alike and trim each one alone at its base before the feed box is connected (the box hides their reactance).';
/** Where to cut or add wire for each antenna type (common practice, no source). */
export const TRIM_HOW: Readonly<Record<AntennaTypeId, string>> = {
  dipole: 'Take equal amounts off both ends (half of the change at each end).',
  'inverted-v': 'Take equal amounts off both leg ends (half of the change at each end).',
  'half-square': 'Change both drops by the same amount (at their lower ends).',
  vertical: 'Change the length of the vertical wire at its top end.',
  'inverted-l': 'Change the wire at its far (top) end.',
  'top-hat-vertical': 'Change all the top-hat wires by the same amount at their outer ends.',
  't-top-vertical': 'Change both top wires by the same amount at their far ends.',
  'loaded-vertical':
    'Add or take off turns of the loading coil (a tap or a sliding clip on the winding makes it quick); the wire stays as it is.',
  sloper: 'Take equal amounts off both ends (half of the change at each end).',
  'sloping-vertical': 'Change the wire at its top end, where it meets the rope.',
  'vertical-pair':
    'Change both verticals by the same amount at their top ends; they stay identical (the relay box makes one the reflector).',
  'four-square': FOUR_SQUARE_TRIM,
  'four-square-hung': FOUR_SQUARE_TRIM,
  'loop-reflector':
    'Change the driven loop’s length at its feed corner (half of the change at each end), and the reflector loop by the same share of its length, so that it stays the larger by the same ratio.',
  'half-square-reflector':
    'Change all four drops by the same amount at their lower ends (the reflector stays identical to the driven half-square; its stub makes it the reflector).',
  'half-square-switched':
    'Change all four drops by the same amount at their lower ends; the two half-squares stay identical (the relay box makes one the reflector).',
  'half-square-l':
    'Change all four drops by the same amount at their lower ends; the two half-squares stay identical.',
  'vertical-pair-director':
    'Change both verticals by the same amount at their top ends; they stay identical (the relay box makes one the director).',
  'phased-pair':
    'Cut both verticals alike and trim each one alone at its base before the relay box is connected (the phasing lines are designed for resonant verticals).',
};

/** The trim text of a type; a general one for a type the table does not know. */
export function trimHow(type: string): string {
  return (TRIM_HOW as Readonly<Record<string, string>>)[type] ?? 'Change the trim dimension as described.';
}

/** Centimetres in an inch: 2.54, from the international foot (0.3048 m, exact) over 12. */
export const CM_PER_INCH = feetToM(1 / 12) * 100;

/**
 * How far the resonances at the two trial lengths may lie from the design frequency before the
 * rate counts as an extrapolation: three times the ±1 % span the reactance is fitted over.
 */
export const TUNING_FIT_LIMIT = 0.03;

/**
 * Why a design has no tuning rate of its own to measure, or null when it has one: a switched pair
 * (core/antennas/switchedPair.ts) keeps each antenna's own trim.
 */
export function tuningNotMeasured(design: { parts?: readonly unknown[] }): string | null {
  return design.parts?.length
    ? 'a switched pair has no trim of its own: tune each antenna alone, with the other one’s feed open, by its own rate'
    : null;
}

/**
 * Why a measurement cannot be shown, in plain words, or null when it can: every number finite,
 * resonance lower for the longer wire (physics of every type here: a longer resonant wire
 * resonates lower), and both resonances within TUNING_FIT_LIMIT of the design frequency.
 */
export function tuningProblem(m: TuningMeasurement, designFreqHz: number): string | null {
  const nums = [m.trimM, m.resonanceMHz.shorter, m.resonanceMHz.longer, m.kHzPerCm, m.cmPer10kHzUp];
  if (!nums.every(Number.isFinite))
    return 'the solver found no resonance near the design frequency, so there is no tuning rate to give';
  if (!(m.kHzPerCm < 0))
    return 'the solved resonance did not move down when the wire was made longer, so the rate is not trustworthy';
  const f0MHz = designFreqHz / 1e6;
  const far = [m.resonanceMHz.shorter, m.resonanceMHz.longer].some(
    (f) => Math.abs(f / f0MHz - 1) > TUNING_FIT_LIMIT,
  );
  if (far)
    return `the antenna does not resonate within ${TUNING_FIT_LIMIT * 100} % of ${f0MHz.toFixed(3)} MHz, so a tuning rate would be a guess; expect a matching network`;
  return null;
}

export interface TuningText {
  /** Shift of resonance per unit of length, e.g. "0.91 kHz per cm" or "2.30 kHz per inch". */
  rate: string;
  /** Length change for 10 kHz, e.g. "11.0 cm" or "4.3 in". */
  per10kHz: string;
}

/** The rate in the user's units: centimetres for metric, inches for imperial (magnitudes; the text says which way). */
export function tuningText(m: TuningMeasurement, units: UnitSystem): TuningText {
  const kHzPerCm = Math.abs(m.kHzPerCm);
  const cm = Math.abs(m.cmPer10kHzUp);
  return units === 'metric'
    ? { rate: `${kHzPerCm.toFixed(2)} kHz per cm`, per10kHz: `${cm.toFixed(1)} cm` }
    : {
        rate: `${(kHzPerCm * CM_PER_INCH).toFixed(2)} kHz per inch`,
        per10kHz: `${(cm / CM_PER_INCH).toFixed(1)} in`,
      };
}
