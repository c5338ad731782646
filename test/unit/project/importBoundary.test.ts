import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { importBoundary } from '../../../core/project/importBoundary.ts';
import { parseProject } from '../../../core/project/schema.ts';

const square = [
  [-93.75, 44.9],
  [-93.749, 44.9],
  [-93.749, 44.901],
  [-93.75, 44.901],
  [-93.75, 44.9],
];

const kml = (coords: string, extra = '') => `<?xml version="1.0" encoding="UTF-8"?>
<kml xmlns="http://www.opengis.net/kml/2.2"><Document><Placemark><name>Parcel 12</name>
<Polygon><outerBoundaryIs><LinearRing><coordinates>${coords}</coordinates></LinearRing></outerBoundaryIs>${extra}</Polygon>
</Placemark></Document></kml>`;
const kmlCoords = square.map(([x, y]) => `${x},${y},0`).join(' ');

describe('lot boundary import', () => {
  it('reads a GeoJSON Polygon, Feature, FeatureCollection and single MultiPolygon', () => {
    const g = { type: 'Polygon', coordinates: [square] };
    for (const doc of [
      g,
      { type: 'Feature', properties: {}, geometry: g },
      {
        type: 'FeatureCollection',
        features: [
          { type: 'Feature', geometry: { type: 'Point', coordinates: [0, 0] } },
          { type: 'Feature', geometry: g },
        ],
      },
      { type: 'MultiPolygon', coordinates: [[square]] },
    ]) {
      const r = importBoundary(JSON.stringify(doc));
      expect(r.ok, JSON.stringify(r)).toBe(true);
      if (r.ok) expect(r.boundary.coordinates[0]).toEqual(square);
    }
  });

  it('reads a KML parcel, closing an open ring with a warning', () => {
    const r = importBoundary(kml(kmlCoords), 'parcel.kml');
    expect(r.ok).toBe(true);
    const open = importBoundary(
      kml(
        square
          .slice(0, 4)
          .map(([x, y]) => `${x},${y}`)
          .join('\n'),
      ),
    );
    expect(open.ok).toBe(true);
    if (open.ok) {
      expect(open.boundary.coordinates[0]).toHaveLength(5);
      expect(open.warnings.join(' ')).toMatch(/not closed/);
    }
  });

  it('drops holes with a warning', () => {
    const hole = [
      [-93.7498, 44.9002],
      [-93.7495, 44.9002],
      [-93.7495, 44.9005],
      [-93.7498, 44.9002],
    ];
    const r = importBoundary(JSON.stringify({ type: 'Polygon', coordinates: [square, hole] }));
    expect(r.ok && r.warnings.join(' ')).toMatch(/hole/);
  });

  const bad: [string, string, RegExp][] = [
    [
      'self-intersecting (bow tie)',
      JSON.stringify({
        type: 'Polygon',
        coordinates: [
          [
            [0, 0],
            [1, 1],
            [1, 0],
            [0, 1],
            [0, 0],
          ],
        ],
      }),
      /crosses itself/,
    ],
    [
      'unclosed GeoJSON ring',
      JSON.stringify({ type: 'Polygon', coordinates: [square.slice(0, 4)] }),
      /not closed/,
    ],
    [
      'longitude out of range',
      JSON.stringify({
        type: 'Polygon',
        coordinates: [
          [
            [0, 0],
            [190, 0],
            [1, 1],
            [0, 0],
          ],
        ],
      }),
      /longitude 190/,
    ],
    [
      'latitude out of range',
      JSON.stringify({
        type: 'Polygon',
        coordinates: [
          [
            [0, 0],
            [1, 95],
            [1, 1],
            [0, 0],
          ],
        ],
      }),
      /latitude 95/,
    ],
    ['a point', JSON.stringify({ type: 'Point', coordinates: [0, 0] }), /must be a Polygon/],
    [
      'a line',
      JSON.stringify({
        type: 'Feature',
        geometry: {
          type: 'LineString',
          coordinates: [
            [0, 0],
            [1, 1],
          ],
        },
      }),
      /must be a Polygon/,
    ],
    [
      'several parcels',
      JSON.stringify({ type: 'MultiPolygon', coordinates: [[square], [square]] }),
      /2 separate polygons/,
    ],
    [
      'no polygon feature',
      JSON.stringify({ type: 'FeatureCollection', features: [] }),
      /none of the 0 features/,
    ],
    [
      'text coordinates',
      JSON.stringify({
        type: 'Polygon',
        coordinates: [
          [
            ['a', 'b'],
            [1, 1],
            [1, 0],
            ['a', 'b'],
          ],
        ],
      }),
      /must be numbers/,
    ],
    [
      'two distinct corners',
      JSON.stringify({
        type: 'Polygon',
        coordinates: [
          [
            [0, 0],
            [1, 1],
            [0, 0],
            [0, 0],
          ],
        ],
      }),
      /3 distinct corners/,
    ],
    ['not JSON nor KML', '{"type": "Polygon", ', /neither KML nor valid JSON/],
    ['deep nesting', '['.repeat(100000) + ']'.repeat(100000), /nested deeper/],
    ['huge file', ' '.repeat(21 * 1024 * 1024), /larger than 20 MB/],
    ['wrong encoding', 'Gr\uFFFDnstra\uFFFDe', /UTF-8/],
    ['KML with entities', '<?xml version="1.0"?><!DOCTYPE kml [<!ENTITY x "y">]><kml/>', /DOCTYPE/],
    [
      'KML without polygon',
      '<kml><Document><Placemark><Point><coordinates>0,0</coordinates></Point></Placemark></Document></kml>',
      /no Polygon/,
    ],
    ['KML with broken coordinates', kml('1,2 3;4 5,6'), /position 2/],
    ['malformed XML', '<kml><Document><Placemark></Document>', /not well-formed XML|no Polygon/],
  ];
  it.each(bad)('refuses %s with a message that says where and what', (_label, text, message) => {
    const r = importBoundary(text);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors[0]!.path.length).toBeGreaterThan(0);
      expect(r.errors[0]!.message).toMatch(message);
    }
  });

  it('never crashes on random text or random JSON (property test, seeded)', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 400 }), fc.json({ maxDepth: 6 })), (text) => {
        const r = importBoundary(text);
        expect(typeof r.ok).toBe('boolean');
        if (r.ok)
          expect(parseProject({ schemaVersion: 1, id: 'p', name: 'p', boundary: r.boundary }).ok).toBe(true);
      }),
      { seed: 20261202, numRuns: Number(process.env.YARDWIRE_PROPERTY_RUNS ?? 300) },
    );
  });

  it('every accepted random polygon is a valid project boundary (property test, seeded)', () => {
    const pos = fc.tuple(
      fc.double({ min: -180, max: 180, noNaN: true }),
      fc.double({ min: -90, max: 90, noNaN: true }),
    );
    fc.assert(
      fc.property(fc.array(pos, { minLength: 3, maxLength: 12 }), (pts) => {
        const ring = [...pts, pts[0]!];
        const r = importBoundary(JSON.stringify({ type: 'Polygon', coordinates: [ring] }));
        if (r.ok)
          expect(parseProject({ schemaVersion: 1, id: 'p', name: 'p', boundary: r.boundary }).ok).toBe(true);
        else expect(r.errors[0]!.message.length).toBeGreaterThan(5);
      }),
      { seed: 7, numRuns: Number(process.env.YARDWIRE_PROPERTY_RUNS ?? 300) },
    );
  });
});
