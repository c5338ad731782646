/**
 * Soil (ground) classes for the field solver: relative permittivity εr and conductivity σ.
 *
 * Sources:
 *  - ITU-R Recommendation P.368 (ground-wave propagation curves), the set of ground types for
 *    which its curves are drawn.
 *  - The classes radio amateurs commonly model with: common practice, tabulated in amateur antenna
 *    handbooks (no single source).
 */
import type { GroundSpec } from './types.ts';

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

/**
 * The one conversion from a soil (a class id or its own values) to the solver's ground model;
 * the planner and the `evaluate` input both use it. Undefined for an unknown class id (callers
 * refuse it in their own words).
 */
export function soilGround(
  soil: string | { classId: string } | { permittivity: number; conductivitySPerM: number },
): GroundSpec | undefined {
  if (typeof soil === 'string' || 'classId' in soil) {
    const s = soilById(typeof soil === 'string' ? soil : soil.classId);
    if (!s) return undefined;
    return {
      kind: 'soil',
      permittivity: s.permittivity,
      conductivitySPerM: s.conductivitySPerM,
      label: s.id,
    };
  }
  return { kind: 'soil', permittivity: soil.permittivity, conductivitySPerM: soil.conductivitySPerM };
}

/**
 * Soil classes from wettest to driest, one ladder per family of classes: the amateur classes and
 * the ITU-R P.368 land classes. Water and ice classes are on no ladder (their electrical values
 * do not depend on how wet the ground is). The order follows the conductivity of each class.
 */
export const SOIL_LADDERS: readonly (readonly string[])[] = [
  ['very-good', 'average', 'poor', 'very-poor', 'extremely-poor'],
  ['itu-very-wet', 'itu-wet', 'itu-land', 'itu-medium-dry', 'itu-dry', 'itu-very-dry'],
];

/**
 * The soil classes next to a soil: one drier and one wetter on its ladder (either may be missing
 * at the end of a ladder). A soil given by its values takes the amateur classes whose
 * conductivity brackets its own. Water and ice classes have no neighbours.
 */
export function neighbourSoils(
  soil: { classId: string } | { permittivity: number; conductivitySPerM: number },
): { drier: string | null; wetter: string | null } {
  if ('classId' in soil) {
    for (const ladder of SOIL_LADDERS) {
      const i = ladder.indexOf(soil.classId);
      if (i >= 0) return { wetter: ladder[i - 1] ?? null, drier: ladder[i + 1] ?? null };
    }
    return { drier: null, wetter: null };
  }
  const ladder = SOIL_LADDERS[0];
  const sigma = (id: string): number => soilById(id)?.conductivitySPerM ?? 0;
  let wetter: string | null = null;
  let drier: string | null = null;
  for (const id of ladder) {
    // Conductivity falls along the ladder; the last class above and the first one below.
    if (sigma(id) > soil.conductivitySPerM) wetter = id;
    else if (sigma(id) < soil.conductivitySPerM && drier === null) drier = id;
  }
  return { drier, wetter };
}
