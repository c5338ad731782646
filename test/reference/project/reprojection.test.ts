// Reprojection of projected aerial images onto the map (issue 18 point 1): the corners of a test
// image generated here, and a marker painted into it, must land within 0.5 m of the same points
// computed independently: proj4 called directly with the published parameters of each system,
// written out below (core/REFERENCES.md §11), and GeographicLib for the distance (§10).
import proj4 from 'proj4';
import Geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose.ts';
import { epsgProjectedKeys, tiledGeoTiffBytes, type GeoKeyValue } from '../../helpers/geotiffWriter.ts';
import { AerialSource, footprintOf } from '../../../renderer/src/lib/aerial.ts';
import type { LonLat } from '../../../core/project/schema.ts';

const TOL_M = 0.5; // the requirement
const US_FT_M = 1200 / 3937; // US survey foot, exact (NIST Handbook 44 App. C; NGS SPCS 83 manual)
const geod = Geodesic.Geodesic.WGS84;
const distM = (a: LonLat, b: LonLat): number => geod.Inverse(a[1], a[0], b[1], b[0]).s12 ?? NaN;

// UTM zone 15 north: transverse Mercator, central meridian −93° (6·15 − 183), scale 0.9996,
// false easting 500 000 m, false northing 0, WGS84 ellipsoid (§11: UTM definition).
const UTM15 = '+proj=tmerc +lat_0=0 +lon_0=-93 +k_0=0.9996 +x_0=500000 +y_0=0 +ellps=WGS84 +units=m +no_defs';
// NAD83 / New York Long Island (ftUS), EPSG:2263, SPCS 83 zone 3104: Lambert conformal conic,
// standard parallels 41°02′ N and 40°40′ N, origin 40°10′ N 74° W, false easting 300 000 m
// (984 250 ftUS), false northing 0, GRS80 (§11: NGS SPCS 83 zone table; values from memory).
const NY_LI =
  '+proj=lcc +lat_1=41.03333333333333 +lat_2=40.66666666666667 +lat_0=40.16666666666667 +lon_0=-74 +x_0=300000 +y_0=0 +ellps=GRS80 +units=m +no_defs';

interface Case {
  name: string;
  keys: GeoKeyValue[];
  /** Upper-left corner and pixel size in the file's units. */
  origin: [number, number];
  pixel: number;
  /** Independent: the file's units to metres, then the published definition. */
  unitM: number;
  published: string;
}

const W = 600;
const H = 400;
const MARK = { col: 412, row: 137, size: 4 };

function image(c: Case): ArrayBuffer {
  return tiledGeoTiffBytes({
    width: W,
    height: H,
    tile: 256,
    geo: { tiepoint: c.origin, pixelScale: [c.pixel, c.pixel], keys: c.keys },
    fill(tx, ty, rgb) {
      for (let y = 0; y < 256; y++)
        for (let x = 0; x < 256; x++) {
          const col = tx * 256 + x;
          const row = ty * 256 + y;
          const mark =
            col >= MARK.col && col < MARK.col + MARK.size && row >= MARK.row && row < MARK.row + MARK.size;
          rgb.set(mark ? [255, 0, 0] : [90, 120, 80], (y * 256 + x) * 3);
        }
    },
  });
}

function independent(c: Case, col: number, row: number): LonLat {
  const x = (c.origin[0] + col * c.pixel) * c.unitM;
  const y = (c.origin[1] - row * c.pixel) * c.unitM;
  const [lon, lat] = proj4(c.published, 'WGS84').forward([x, y]) as [number, number];
  return [lon, lat];
}

const CASES: Case[] = [
  {
    name: 'UTM zone 15N by EPSG code (32615), metres',
    keys: epsgProjectedKeys(32615),
    origin: [440_700, 4_972_200],
    pixel: 0.25,
    unitM: 1,
    published: UTM15,
  },
  {
    name: 'state plane NY Long Island by EPSG code (2263), US survey feet',
    keys: epsgProjectedKeys(2263),
    origin: [987_000, 195_000],
    pixel: 0.75,
    unitM: US_FT_M,
    published: NY_LI,
  },
  {
    name: 'user-defined transverse Mercator in US survey feet (GeoKeys, no EPSG code)',
    keys: [
      { key: 1024, value: 1 },
      { key: 1025, value: 1 },
      { key: 2048, value: 4326 },
      { key: 3072, value: 32767 },
      { key: 3074, value: 32767 },
      { key: 3075, value: 1 }, // CT_TransverseMercator
      { key: 3076, value: 9003 }, // ProjLinearUnits: US survey foot
      { key: 3080, value: -93, double: true },
      { key: 3081, value: 0, double: true },
      { key: 3082, value: 500_000 / US_FT_M, double: true },
      { key: 3083, value: 0, double: true },
      { key: 3092, value: 0.9996, double: true },
    ],
    origin: [440_700 / US_FT_M, 4_972_200 / US_FT_M],
    pixel: 0.8,
    unitM: US_FT_M,
    published: UTM15,
  },
];

describe('projected aerials land where the published systems put them', () => {
  for (const c of CASES) {
    it(`${c.name}: corners within ${TOL_M} m`, async () => {
      const source = await AerialSource.open(image(c));
      const corners = footprintOf(source.georef);
      const expected = [
        independent(c, 0, 0),
        independent(c, W, 0),
        independent(c, W, H),
        independent(c, 0, H),
      ];
      corners.forEach((p, i) =>
        expectClose(
          distM(p, expected[i]!),
          0,
          TOL_M,
          `corner ${i} vs proj4 with the published ${c.name} (§11)`,
        ),
      );
    });

    it(`${c.name}: a marker drawn on the map grid lands within ${TOL_M} m`, async () => {
      const source = await AerialSource.open(image(c));
      // Render a 60 m square around the marker at about 0.1 m per output pixel.
      const centre = independent(c, MARK.col + MARK.size / 2, MARK.row + MARK.size / 2);
      const dLat = 30 / 111_000;
      const dLon = dLat / Math.cos((centre[1] * Math.PI) / 180);
      const view: [[number, number], [number, number]] = [
        [centre[1] - dLat, centre[0] - dLon],
        [centre[1] + dLat, centre[0] + dLon],
      ];
      const N = 600;
      const out = await source.render(view, N, N);
      // Red pixels' centroid, in the output's web-mercator grid, back to [lon, lat].
      let sx = 0;
      let sy = 0;
      let n = 0;
      for (let y = 0; y < N; y++)
        for (let x = 0; x < N; x++) {
          const i = (y * N + x) * 4;
          if (out.rgba[i]! > 200 && out.rgba[i + 1]! < 50) {
            sx += x + 0.5;
            sy += y + 0.5;
            n++;
          }
        }
      expect(n, 'the marker is drawn').toBeGreaterThan(0);
      const merc = (lon: number, lat: number): [number, number] => [
        lon,
        (Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360)) * 180) / Math.PI,
      ];
      const [, m0] = merc(view[0][1], view[0][0]);
      const [, m1] = merc(view[1][1], view[1][0]);
      const lon = view[0][1] + ((view[1][1] - view[0][1]) * sx) / n / N;
      const m = m1 - ((m1 - m0) * sy) / n / N;
      const lat = (Math.atan(Math.sinh((m * Math.PI) / 180)) * 180) / Math.PI;
      expectClose(
        distM([lon, lat], centre),
        0,
        TOL_M,
        `marker centre vs proj4 with the published ${c.name} (§11)`,
      );
    });
  }
});
