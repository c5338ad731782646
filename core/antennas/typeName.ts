/**
 * The one display name of each antenna type in proper case ("Inverted-L", never the internal id),
 * for every view: the shortlist, the detail, the plots' legends, the rejected list, the exports.
 * The builder's `label` is the longer description ("Ground-mounted quarter-wave vertical with
 * radials"); this is the short name.
 */
import type { AntennaTypeId } from './types.ts';

const TYPE_NAMES: Record<string, string> = {
  dipole: 'Dipole',
  'inverted-v': 'Inverted-V',
  'half-square': 'Half-square',
  vertical: 'Vertical',
  'inverted-l': 'Inverted-L',
  'top-hat-vertical': 'Top-hat vertical',
  't-top-vertical': 'T-top vertical',
  'loaded-vertical': 'Coil-loaded vertical',
  sloper: 'Half-wave sloper',
  'sloping-vertical': 'Sloping quarter-wave',
  'vertical-pair': 'Switched vertical pair',
  'four-square': 'Four-square',
  'four-square-hung': 'Four-square (hung from supports)',
  'half-square-reflector': 'Half-square + reflector',
  'half-square-switched': 'Switched half-square pair',
  'half-square-l': 'Half-square L (switched)',
  'phased-pair': 'Phased vertical pair',
  'vertical-pair-director': 'Switched vertical pair (director)',
  'loop-reflector': 'Loop + reflector loop',
  'switched-pair': 'Two antennas, switched',
};

/** The short display name of a type; an id this version does not know reads as its words, capitalised. */
export function typeName(type: AntennaTypeId): string {
  const known = TYPE_NAMES[type];
  if (known) return known;
  const words = type.replace(/[-_]+/g, ' ').trim();
  return words ? words[0]!.toUpperCase() + words.slice(1) : 'Antenna';
}
