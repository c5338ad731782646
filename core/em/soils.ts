/**
 * Soil (ground) classes for the field solver: relative permittivity εr and conductivity σ.
 *
 * Sources:
 *  - ITU-R Recommendation P.368 (ground-wave propagation curves), the set of ground types for
 *    which its curves are drawn.
 *  - The classes radio amateurs commonly model with: common practice, tabulated in amateur antenna
 *    handbooks (no single source).
 */
export interface SoilClass {
  id: string;
  label: string;
  permittivity: number;
  conductivitySPerM: number;
  /** Plain-words description for the user: what kind of place has such ground. */
  description: string;
  source: 'ITU-R P.368' | 'common practice, no source';
}

export const SOIL_CLASSES: readonly SoilClass[] = [
  {
    id: 'very-good',
    label: 'Very good',
    permittivity: 20,
    conductivitySPerM: 0.0303,
    description: 'Rich, moist pastoral soil; low hills with heavy loam.',
    source: 'common practice, no source',
  },
  {
    id: 'average',
    label: 'Average',
    permittivity: 13,
    conductivitySPerM: 0.005,
    description: 'Typical farmland and suburban gardens; the usual choice when unsure.',
    source: 'common practice, no source',
  },
  {
    id: 'poor',
    label: 'Poor',
    permittivity: 13,
    conductivitySPerM: 0.002,
    description: 'Sandy or stony soil, drier ground.',
    source: 'common practice, no source',
  },
  {
    id: 'very-poor',
    label: 'Very poor',
    permittivity: 5,
    conductivitySPerM: 0.001,
    description: 'Cities and industrial areas, rock close under the surface.',
    source: 'common practice, no source',
  },
  {
    id: 'extremely-poor',
    label: 'Extremely poor',
    permittivity: 3,
    conductivitySPerM: 0.001,
    description: 'Dry sand, desert, bare rock.',
    source: 'common practice, no source',
  },
  {
    id: 'fresh-water-lake',
    label: 'Fresh water (lake shore)',
    permittivity: 80,
    conductivitySPerM: 0.001,
    description: 'A lot right at a fresh-water lake.',
    source: 'common practice, no source',
  },
  {
    id: 'salt-water',
    label: 'Salt water',
    permittivity: 81,
    conductivitySPerM: 5,
    description: 'Directly at the sea; the best ground there is.',
    source: 'common practice, no source',
  },
  {
    id: 'itu-sea-low-salinity',
    label: 'Sea water, low salinity',
    permittivity: 80,
    conductivitySPerM: 1,
    description: 'Brackish sea such as an enclosed gulf.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-sea-average',
    label: 'Sea water, average salinity',
    permittivity: 70,
    conductivitySPerM: 5,
    description: 'Open ocean.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-fresh-water',
    label: 'Fresh water',
    permittivity: 80,
    conductivitySPerM: 0.003,
    description: 'Lakes and rivers.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-very-wet',
    label: 'Very wet land',
    permittivity: 40,
    conductivitySPerM: 0.03,
    description: 'Marsh, wet meadows.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-wet',
    label: 'Wet ground',
    permittivity: 30,
    conductivitySPerM: 0.01,
    description: 'Moist soil, river valleys.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-land',
    label: 'Land',
    permittivity: 22,
    conductivitySPerM: 0.003,
    description: 'Ordinary land.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-medium-dry',
    label: 'Medium dry ground',
    permittivity: 15,
    conductivitySPerM: 0.001,
    description: 'Drier soil, hilly country.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-dry',
    label: 'Dry ground',
    permittivity: 7,
    conductivitySPerM: 0.0003,
    description: 'Dry, sandy or rocky ground.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-very-dry',
    label: 'Very dry ground',
    permittivity: 3,
    conductivitySPerM: 0.0001,
    description: 'Desert, very dry rock.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-ice-1c',
    label: 'Fresh-water ice, −1 °C',
    permittivity: 3,
    conductivitySPerM: 3e-5,
    description: 'Frozen lake, near melting.',
    source: 'ITU-R P.368',
  },
  {
    id: 'itu-ice-10c',
    label: 'Fresh-water ice, −10 °C',
    permittivity: 3,
    conductivitySPerM: 1e-5,
    description: 'Frozen lake, cold.',
    source: 'ITU-R P.368',
  },
];

export const SOIL_CLASS_IDS = SOIL_CLASSES.map((s) => s.id);

export function soilById(id: string): SoilClass | undefined {
  return SOIL_CLASSES.find((s) => s.id === id);
}
