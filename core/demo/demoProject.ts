/**
 * The built-in demo project: an invented rural lot for trying Yardwire out. Nothing here is a
 * real place or a real station; the numbers are chosen to make a believable low-band puzzle:
 * about 1.7 ha, eight supports of 12–22 m, a house near the road, and a power line along the
 * road on the south side.
 *
 * The layout is written in metres east/north of the lot's south-west corner and converted to
 * [lon, lat] with a local tangent-plane approximation, which is ample for demo data.
 */
import { PROJECT_SCHEMA_VERSION, ProjectSchema, type LonLat, type Project } from '../project/schema.ts';

export const DEMO_PROJECT_ID = 'demo-larkspur-ridge';
/** South-west corner of the invented lot. */
export const DEMO_ORIGIN: LonLat = [-93.7512, 44.9021];

const M_PER_DEG_LAT = 111_132.954; // mean metres per degree of latitude near 45° (WGS84, rounded)

/** Metres east/north of the demo origin to [lon, lat]. */
export function demoLonLat(eastM: number, northM: number): LonLat {
  const lat0 = DEMO_ORIGIN[1];
  const mPerDegLon = M_PER_DEG_LAT * Math.cos((lat0 * Math.PI) / 180);
  const lon = DEMO_ORIGIN[0] + eastM / mPerDegLon;
  const lat = lat0 + northM / M_PER_DEG_LAT;
  return [Math.round(lon * 1e7) / 1e7, Math.round(lat * 1e7) / 1e7];
}

function ring(pointsM: [number, number][]): LonLat[] {
  const r = pointsM.map(([e, n]) => demoLonLat(e, n));
  const first = r[0];
  if (first === undefined) throw new Error('empty ring');
  return [...r, first];
}

export function buildDemoProject(): Project {
  return ProjectSchema.parse({
    schemaVersion: PROJECT_SCHEMA_VERSION,
    id: DEMO_PROJECT_ID,
    name: 'Larkspur Ridge (demo lot)',
    notes:
      'An invented 1.7 ha rural lot for trying Yardwire: eight usable supports, the house by the road, ' +
      'and a distribution line along the road to the south.',
    boundary: {
      type: 'Polygon',
      coordinates: [
        ring([
          [0, 0],
          [165, 0],
          [172, 104],
          [4, 98],
        ]),
      ],
    },
    supports: [
      {
        id: 'oak-west',
        name: 'West oak',
        kind: 'tree',
        position: demoLonLat(38, 70),
        usableHeightM: 20,
        notes: 'Big limb on the south side at about 20 m.',
      },
      {
        id: 'oak-north',
        name: 'North oak',
        kind: 'tree',
        position: demoLonLat(80, 86),
        usableHeightM: 22,
        notes: '',
      },
      {
        id: 'pine-ridge',
        name: 'Ridge pine',
        kind: 'tree',
        position: demoLonLat(121, 72),
        usableHeightM: 18,
        notes: '',
      },
      {
        id: 'spruce-ne',
        name: 'North-east spruce',
        kind: 'tree',
        position: demoLonLat(152, 91),
        usableHeightM: 16,
        notes: '',
      },
      {
        id: 'maple-yard',
        name: 'Yard maple',
        kind: 'tree',
        position: demoLonLat(62, 42),
        usableHeightM: 14,
        notes: '',
      },
      {
        id: 'ash-east',
        name: 'East ash',
        kind: 'tree',
        position: demoLonLat(141, 30),
        usableHeightM: 12,
        notes: 'Leaning a little to the east.',
      },
      {
        id: 'mast-field',
        name: 'Field mast',
        kind: 'mast',
        position: demoLonLat(101, 46),
        usableHeightM: 15,
        notes: 'Guyed push-up mast.',
      },
      {
        id: 'tower-nw',
        name: 'North-west tower',
        kind: 'tower',
        position: demoLonLat(12, 88),
        usableHeightM: 18,
        notes: 'Lattice tower; pulley on the top section.',
      },
    ],
    keepOuts: [
      {
        id: 'house',
        name: 'House',
        kind: 'building',
        geometry: {
          type: 'Polygon',
          coordinates: [
            ring([
              [18, 12],
              [36, 12],
              [36, 26],
              [18, 26],
            ]),
          ],
        },
        clearanceM: 2,
        heightM: 8,
        notes: '',
      },
      {
        id: 'road-line',
        name: 'Distribution line along the road',
        kind: 'power-line',
        geometry: { type: 'LineString', coordinates: [demoLonLat(-20, -7), demoLonLat(190, -7)] },
        clearanceM: 25,
        heightM: 9,
        notes: 'Keep every wire, rope and support farther away than anything could fall.',
      },
      {
        id: 'garden-path',
        name: 'Garden path',
        kind: 'path',
        geometry: {
          type: 'LineString',
          coordinates: [demoLonLat(36, 22), demoLonLat(58, 50), demoLonLat(77, 82), demoLonLat(96, 96)],
        },
        clearanceM: 0,
        notes: 'Gravel path from the house to the garden shed; the children walk here.',
      },
    ],
    station: demoLonLat(30, 20),
    soil: { classId: 'average' },
    targets: [
      { regionId: 'europe', weight: 3 },
      { regionId: 'japan', weight: 2 },
      { regionId: 'south-america', weight: 1 },
    ],
    bands: ['80m'],
    settings: {
      units: 'metric',
      setbackM: 1,
      minEndHeightM: 2.5,
      maxVerticalHeightM: 12,
      radialCount: 32,
      tileUrlTemplate: '',
      tileAttribution: '',
    },
  });
}
