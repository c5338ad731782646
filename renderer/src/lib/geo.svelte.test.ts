// Geometry helpers of the lot editor.
import geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { lotMeasures } from '../../../core/project/lotMeasures.ts';
import { expectRelClose } from '../../../test/helpers/expectClose.ts';
import { buildDemoProject, demoLonLat } from '../../../data/demo/demoProject.ts';
import {
  fallReachWarnings,
  closeRing,
  formatArea,
  maidenhead,
  parsePlace,
  perimeterM,
  pointWarnings,
  supportInDanger,
  supportWarnings,
  polygonAreaM2,
  ringSides,
} from './geo.ts';

describe('lot measures', () => {
  const demo = buildDemoProject();
  it('measures the demo lot sides as laid out in metres', () => {
    const sides = ringSides(demo.boundary!.coordinates[0]!).map((s) => s.lengthM);
    // Layout corners (0,0) (165,0) (172,104) (4,98): side lengths by Pythagoras.
    const expected = [165, Math.hypot(7, 104), Math.hypot(168, 6), Math.hypot(4, 98)];
    sides.forEach((s, i) => expect(Math.abs(s - expected[i]!) / expected[i]!).toBeLessThan(0.005));
    expect(perimeterM(demo.boundary!)).toBeCloseTo(
      expected.reduce((a, b) => a + b),
      -1,
    );
  });

  it('gives the demo lot 1.68 ha (shoelace of the layout corners)', () => {
    const shoelace =
      0.5 * Math.abs(0 * 0 - 165 * 0 + (165 * 104 - 172 * 0) + (172 * 98 - 4 * 104) + (4 * 0 - 0 * 98));
    expect(Math.abs(polygonAreaM2(demo.boundary!) - shoelace) / shoelace).toBeLessThan(0.01);
    expect(formatArea(shoelace, 'metric')).toBe('1.68 ha');
    expect(formatArea(shoelace, 'imperial')).toBe('4.15 acres');
    expect(formatArea(500, 'metric')).toBe('500 m²');
    expect(formatArea(500, 'imperial')).toBe('5382 ft²');
  });

  it('reads a 45 × 30 m lot as 1350 m², the area every view shows (one geodesic area)', () => {
    // Corners laid out by GeographicLib's direct problem (independent of the code under test's
    // area), 45 m east and 30 m north of 45.12° N, 93.40° W; over 50 m the ellipsoid is flat to
    // well under 1e-5, so the plane rectangle's area is the reference (Euclid, width × depth).
    const g = geodesic.Geodesic.WGS84;
    const at = (lat: number, lon: number, azi: number, s: number): [number, number] => {
      const d = g.Direct(lat, lon, azi, s);
      return [d.lon2!, d.lat2!];
    };
    const c0: [number, number] = [-93.4, 45.12];
    const c1 = at(c0[1], c0[0], 90, 45);
    const c2 = at(c1[1], c1[0], 0, 30);
    const c3 = at(c0[1], c0[0], 0, 30);
    const lot = { type: 'Polygon' as const, coordinates: [[c0, c1, c2, c3, c0]] };
    expectRelClose(polygonAreaM2(lot), 45 * 30, 1e-5, 'plane rectangle, width × depth');
    expectRelClose(perimeterM(lot), 150, 1e-5, 'plane rectangle, 2 (width + depth)');
    expect(polygonAreaM2(lot)).toBe(lotMeasures(lot).areaM2);
    expect(formatArea(polygonAreaM2(lot), 'metric')).toBe('1350 m²');
  });

  it('knows which way each side faces, whichever way the ring runs', () => {
    const ring = demo.boundary!.coordinates[0]!;
    expect(ringSides(ring).map((s) => s.facing)).toEqual(['S', 'E', 'N', 'W']);
    expect(ringSides([...ring].reverse()).map((s) => s.facing)).toEqual(['W', 'N', 'E', 'S']);
    const south = ringSides(ring)[0]!;
    expect(south.outward[1]).toBeCloseTo(-1, 6);
  });

  it('closes a ring once', () => {
    expect(
      closeRing([
        [0, 0],
        [1, 0],
        [1, 1],
      ]),
    ).toHaveLength(4);
    expect(
      closeRing([
        [0, 0],
        [1, 0],
        [1, 1],
        [0, 0],
      ]),
    ).toHaveLength(4);
    expect(closeRing([])).toEqual([]);
  });
});

describe('Maidenhead locator', () => {
  it('computes field, square and subsquare', () => {
    expect(maidenhead([0, 0])).toBe('JJ00aa');
    expect(maidenhead([-0.0001, -0.0001])).toBe('II99xx');
    // -93.75, 44.90: x = 86.25 → E, 3, d; y = 134.90 → N, 4, v.
    expect(maidenhead([-93.75, 44.9])).toBe('EN34dv');
    expect(maidenhead([180, 90])).toBe('RR99xx');
    expect(maidenhead([-93.75 + 360, 44.9])).toBe('EN34dv'); // a map panned across the seam
  });

  it('parses a locator or "lat, lon" back to a point', () => {
    const p = parsePlace('EN34dv')!;
    expect(maidenhead(p)).toBe('EN34dv');
    expect(parsePlace('44.9, -93.75')).toEqual([-93.75, 44.9]);
    expect(parsePlace('jj00')).toEqual([1, 0.5]);
    expect(parsePlace('95, 10')).toBeNull();
    expect(parsePlace('somewhere')).toBeNull();
  });
});

describe('fallReachWarnings', () => {
  const demo = buildDemoProject();
  it('flags a support nearer to a power line than its height, and only then', () => {
    // The demo line runs east-west 7 m south of the lot's south edge.
    const near = { ...demo.supports[0]!, position: demoLonLat(80, 5), usableHeightM: 15 };
    const w = fallReachWarnings(near, demo, 'metric');
    expect(w).toHaveLength(1);
    expect(w[0]!.level).toBe('danger');
    expect(w[0]!.text).toMatch(
      /^“Distribution line along the road” is 12\.0 m away, less than this support's 15\.0 m/,
    );
    expect(fallReachWarnings({ ...near, usableHeightM: 11 }, demo, 'metric')).toEqual([]);
    expect(demo.supports.flatMap((s) => fallReachWarnings(s, demo, 'metric'))).toEqual([]);
  });
});

describe('pointWarnings', () => {
  const demo = buildDemoProject();
  it('warns inside the power-line band and outside the lot', () => {
    const nearLine = demoLonLat(80, 5);
    expect(pointWarnings(nearLine, demo)).toEqual([
      {
        level: 'danger',
        text: 'Inside the clearance of “Distribution line along the road”: anything attached here could reach the line if it falls.',
      },
    ]);
    expect(pointWarnings(demoLonLat(100, 60), demo)).toEqual([]);
    expect(pointWarnings(demoLonLat(100, 140), demo)).toEqual([
      { level: 'notice', text: 'Outside the lot boundary: is it yours to use?' },
    ]);
    expect(pointWarnings(demoLonLat(25, 20), demo)[0]).toEqual({ level: 'notice', text: 'Inside “House”.' });
  });

  it('puts dangers first and tells a support in danger from one merely outside the lot', () => {
    const outside = { ...demo.supports[0]!, position: demoLonLat(100, 140) };
    expect(supportInDanger(outside, demo, 'metric')).toBe(false);
    const byRoad = { ...demo.supports[0]!, position: demoLonLat(200, -2), usableHeightM: 12 };
    const w = supportWarnings(byRoad, demo, 'metric');
    expect(w.map((x) => x.level)).toEqual(['danger', 'danger', 'notice']);
    expect(supportInDanger(byRoad, demo, 'metric')).toBe(true);
  });
});
