// Import of georeferenced aerials, against TIFFs written by the demo generator's encoder.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import {
  EXTENT,
  GEOKEYS_4326,
  LAYOUT,
  OUTPUT,
  demoAerialTiff,
  encodeRgbTiff,
  geoKeysProjected,
  lonLatOf,
} from '../../demo/generate-aerial.mjs';
import { AerialImportError, decodeGeoTiff, webMercatorToLonLat } from './aerial.ts';

const DEG_TOL = 1e-9; // bounds are read back from doubles written by our own encoder

const buf = (u8: Uint8Array): ArrayBuffer =>
  u8.buffer.slice(u8.byteOffset, u8.byteOffset + u8.byteLength) as ArrayBuffer;
const plain = (w: number, h: number) => new Uint8Array(w * h * 3).fill(128);

describe('demo aerial', () => {
  it('decodes with the bounds of the painted extent', async () => {
    const a = await decodeGeoTiff(buf(demoAerialTiff()));
    const [west, south] = lonLatOf(EXTENT.west, EXTENT.south);
    const [east, north] = lonLatOf(EXTENT.east, EXTENT.north);
    expect(a.crs).toMatch(/^EPSG:4326 /);
    expect(a.width).toBe(460);
    expect(Math.abs(a.bounds[0][0] - south)).toBeLessThan(DEG_TOL);
    expect(Math.abs(a.bounds[0][1] - west)).toBeLessThan(DEG_TOL);
    expect(Math.abs(a.bounds[1][0] - north)).toBeLessThan(DEG_TOL);
    expect(Math.abs(a.bounds[1][1] - east)).toBeLessThan(DEG_TOL);
  });

  it('paints a dark tree crown at each demo tree and an opaque alpha', async () => {
    const a = await decodeGeoTiff(buf(demoAerialTiff()));
    for (const s of LAYOUT.supports.filter((s) => s.kind === 'tree')) {
      const x = Math.floor((s.e - EXTENT.west) / EXTENT.mPerPx);
      const y = Math.floor((EXTENT.north - s.n) / EXTENT.mPerPx);
      const i = (y * a.width + x) * 4;
      expect(a.rgba[i + 1]!, s.id).toBeGreaterThan(a.rgba[i]!); // green dominates
      expect(a.rgba[i + 1]!, s.id).toBeLessThan(130); // darker than the meadow
      expect(a.rgba[i + 3]).toBe(255);
    }
  });

  it('uses the same layout as the demo project', () => {
    const demo = buildDemoProject();
    expect(LAYOUT.supports.map((s) => s.id)).toEqual(demo.supports.map((s) => s.id));
    for (const s of LAYOUT.supports) {
      const d = demo.supports.find((x) => x.id === s.id)!;
      const [lon, lat] = lonLatOf(s.e, s.n);
      expect(Math.abs(lon - d.position[0]), s.id).toBeLessThan(1e-6);
      expect(Math.abs(lat - d.position[1]), s.id).toBeLessThan(1e-6);
      expect(s.h, s.id).toBe(d.usableHeightM);
    }
  });

  it('is committed exactly as the generator writes it', () => {
    expect(Buffer.compare(readFileSync(OUTPUT), Buffer.from(demoAerialTiff()))).toBe(0);
  });
});

describe('decodeGeoTiff errors and projections', () => {
  it('refuses a TIFF without georeference', async () => {
    await expect(decodeGeoTiff(buf(encodeRgbTiff(4, 4, plain(4, 4), null)))).rejects.toThrow(
      /no georeference/,
    );
  });

  it('refuses a truncated file', async () => {
    const whole = encodeRgbTiff(64, 64, plain(64, 64), {
      tiepoint: [10, 50],
      pixelScale: [1e-5, 1e-5],
      geoKeys: GEOKEYS_4326,
    });
    await expect(decodeGeoTiff(buf(whole.slice(0, whole.length - 1000)))).rejects.toThrow(/truncated/);
    await expect(decodeGeoTiff(buf(whole.slice(0, 100)))).rejects.toBeInstanceOf(AerialImportError);
  });

  it('refuses a file that is not a TIFF', async () => {
    await expect(decodeGeoTiff(buf(new TextEncoder().encode('not an image at all')))).rejects.toThrow(
      /not a TIFF/,
    );
  });

  it('converts web-mercator metres to degrees', async () => {
    const x0 = 1_113_194.9079; // 10° east
    const y0 = 6_446_275.841; // 50° north
    const tiff = encodeRgbTiff(100, 100, plain(100, 100), {
      tiepoint: [x0, y0],
      pixelScale: [1, 1],
      geoKeys: geoKeysProjected(3857),
    });
    const a = await decodeGeoTiff(buf(tiff));
    expect(a.crs).toMatch(/^EPSG:3857 /);
    expect(a.bounds[1][0]).toBeCloseTo(50, 6);
    expect(a.bounds[0][1]).toBeCloseTo(10, 6);
    // 100 m of mercator at 50° N is 100·cos 50° ≈ 64.3 m on the ground: 100 m / R in longitude.
    expect(a.bounds[1][1] - a.bounds[0][1]).toBeCloseTo((100 / 6_378_137) * (180 / Math.PI), 9);
    expect(webMercatorToLonLat(0, 0)).toEqual([0, 0]);
  });

  it('reads a UTM image (its placement is checked in test/reference/project/reprojection.test.ts)', async () => {
    const tiff = encodeRgbTiff(4, 4, plain(4, 4), {
      tiepoint: [500_000, 4_970_000],
      pixelScale: [1, 1],
      geoKeys: geoKeysProjected(32615),
    });
    expect((await decodeGeoTiff(buf(tiff))).crs).toBe('EPSG:32615 (metre)');
  });

  it('names the GeoKey holding a system it does not know', async () => {
    const tiff = encodeRgbTiff(4, 4, plain(4, 4), {
      tiepoint: [500_000, 4_970_000],
      pixelScale: [1, 1],
      geoKeys: geoKeysProjected(30000),
    });
    await expect(decodeGeoTiff(buf(tiff))).rejects.toThrow(/ProjectedCSTypeGeoKey.*30000/);
  });

  it('refuses metres that pose as degrees', async () => {
    const tiff = encodeRgbTiff(4, 4, plain(4, 4), {
      tiepoint: [500_000, 4_970_000],
      pixelScale: [1, 1],
      geoKeys: GEOKEYS_4326,
    });
    await expect(decodeGeoTiff(buf(tiff))).rejects.toThrow(/outside/);
  });

  it('limits the longer side when asked', async () => {
    const tiff = encodeRgbTiff(200, 100, plain(200, 100), {
      tiepoint: [10, 50],
      pixelScale: [1e-5, 1e-5],
      geoKeys: GEOKEYS_4326,
    });
    const a = await decodeGeoTiff(buf(tiff), 50);
    // On the map's web-mercator grid, 1e-3° of latitude at 50° N spans 1/cos 50° ≈ 1.556 times the
    // same longitude: 25 · 1.556 ≈ 39 px (spherical mercator, EPSG guidance note 7-2).
    expect([a.width, a.height]).toEqual([50, Math.round(25 / Math.cos((50 * Math.PI) / 180))]);
    expect(a.rgba.length).toBe(a.width * a.height * 4);
  });
});
