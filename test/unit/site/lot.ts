/** Test lots written in metres and converted with the site frame (invented geometry). */
import {
  ProjectSchema,
  PROJECT_SCHEMA_VERSION,
  type Project,
  type ProjectInput,
} from '../../../core/project/schema.ts';
import { makeSiteFrame } from '../../../core/site/frame.ts';
import { prepareSite } from '../../../core/site/feasibility.ts';
import { buildSite } from '../../../core/site/site.ts';

export const TEST_ORIGIN: [number, number] = [5.5, 47.25];
const frame = makeSiteFrame(TEST_ORIGIN);
export const ll = (x: number, y: number): [number, number] => frame.toLonLat([x, y]);
export const ring = (pts: [number, number][]): [number, number][] => {
  const r = pts.map(([x, y]) => ll(x, y));
  return [...r, r[0]];
};

/** An axis-aligned rectangle from (x0, y0) to (x1, y1), metres, as a GeoJSON polygon. */
export const box = (x0: number, y0: number, x1: number, y1: number) => ({
  type: 'Polygon' as const,
  coordinates: [
    ring([
      [x0, y0],
      [x1, y0],
      [x1, y1],
      [x0, y1],
    ]),
  ],
});

export interface LotSpec {
  /** Rectangle half-widths around the origin, metres. */
  halfX?: number;
  halfY?: number;
  supports?: { id: string; x: number; y: number; h: number }[];
  keepOuts?: ProjectInput['keepOuts'];
  settings?: Partial<Project['settings']>;
  soil?: Project['soil'];
  targets?: Project['targets'];
  bands?: Project['bands'];
  station?: [number, number];
}

/** Two supports 'a' (west) and 'b' (east), spanM apart, centred on x = 0 at y, heights hA and hB. */
export const supportPair = (spanM: number, hA: number, hB = hA, y = 0): NonNullable<LotSpec['supports']> => [
  { id: 'a', x: -spanM / 2, y, h: hA },
  { id: 'b', x: spanM / 2, y, h: hB },
];

/** A power line running east–west along y from x = −halfLengthM to +halfLengthM, as a keep-out. */
export const powerLine = (name: string, y: number, clearanceM: number, halfLengthM = 60) => ({
  id: 'line',
  name,
  kind: 'power-line' as const,
  geometry: { type: 'LineString' as const, coordinates: [ll(-halfLengthM, y), ll(halfLengthM, y)] },
  clearanceM,
});

/** A path where people walk, north–south along x from y = −halfLengthM to +halfLengthM, as a keep-out. */
export const walkway = (name: string, x: number, halfLengthM = 20) => ({
  id: 'walk',
  name,
  kind: 'path' as const,
  geometry: { type: 'LineString' as const, coordinates: [ll(x, -halfLengthM), ll(x, halfLengthM)] },
});

export function testLot(spec: LotSpec): Project {
  const hx = spec.halfX ?? 50;
  const hy = spec.halfY ?? 30;
  return ProjectSchema.parse({
    schemaVersion: PROJECT_SCHEMA_VERSION,
    id: 'test-lot',
    name: 'Test lot',
    boundary: box(-hx, -hy, hx, hy),
    supports: (spec.supports ?? []).map((s) => ({
      id: s.id,
      name: s.id,
      kind: 'tree',
      position: ll(s.x, s.y),
      usableHeightM: s.h,
    })),
    keepOuts: spec.keepOuts ?? [],
    station: ll(...(spec.station ?? [0, 0])),
    soil: spec.soil ?? { classId: 'average' },
    targets: spec.targets ?? [],
    bands: spec.bands ?? ['80m'],
    settings: { ...ProjectSchema.shape.settings.parse(undefined), ...spec.settings },
  });
}

/** A test lot as feasibility prepares it for placing antennas. */
export const preparedLot = (spec: LotSpec = {}) => prepareSite(buildSite(testLot(spec)));

/**
 * An invented open lot of 160 × 120 m with two 24 m supports 44 m apart on its south side,
 * prepared for placing antennas (the array tests and the array benchmark share it).
 */
export function twoSupportSite(settings: Partial<Project['settings']> = {}) {
  return preparedLot({
    halfX: 80,
    halfY: 60,
    supports: supportPair(44, 24, 24, -40),
    settings,
  });
}
