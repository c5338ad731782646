// Shapefile parcels (issue 18 point 3): one parcel, many with attributes for a chooser, a .prj in
// US survey feet, and damaged files refused with the place named. The files are written here by
// test/helpers/shapefileWriter.ts.
import { deflateRawSync } from 'node:zlib';
import proj4 from 'proj4';
import Geodesic from 'geographiclib-geodesic';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { importShapefile, parcelLabels, type InputFile } from '../../../core/project/importShapefile.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import {
  clockwiseRect,
  PARCEL_FIELDS,
  parcelLayer,
  parcelRows,
  polygonShp,
  storedZip,
  textDbf,
  type Ring,
} from '../../helpers/shapefileWriter.ts';

const WGS84_PRJ =
  'GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]]';
// ESRI-style WKT of NAD83 / New York Long Island (ftUS) as county GIS exports write it (from memory).
const NY_LI_FTUS_PRJ =
  'PROJCS["NAD_1983_StatePlane_New_York_Long_Island_FIPS_3104_Feet",GEOGCS["GCS_North_American_1983",DATUM["D_North_American_1983",SPHEROID["GRS_1980",6378137.0,298.257222101]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Lambert_Conformal_Conic"],PARAMETER["False_Easting",984250.0],PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",-74.0],PARAMETER["Standard_Parallel_1",40.66666666666666],PARAMETER["Standard_Parallel_2",41.03333333333333],PARAMETER["Latitude_Of_Origin",40.16666666666666],UNIT["Foot_US",0.3048006096012192]]';
// Published parameters of the same zone (core/REFERENCES.md §11), in metres.
const NY_LI_M =
  '+proj=lcc +lat_1=41.03333333333333 +lat_2=40.66666666666667 +lat_0=40.16666666666667 +lon_0=-74 +x_0=300000 +y_0=0 +ellps=GRS80 +units=m +no_defs';
const US_FT_M = 1200 / 3937;

const enc = (s: string): Uint8Array => new TextEncoder().encode(s);
// 27-118-0001, 100 Invented Lane; 27-118-0002, 102 Invented Lane; 27-118-0003, 104 Invented Lane.
const ROWS = parcelRows(
  (i) => `27-118-000${i + 1}`,
  (i) => `${100 + 2 * i} Invented Lane`,
);
const LOT0 = clockwiseRect(-93.7512, 44.9021, 0.0021, 0.0009);
const lots = [
  LOT0,
  clockwiseRect(-93.749, 44.9021, 0.002, 0.0009),
  clockwiseRect(-93.7469, 44.9021, 0.0018, 0.0009),
];

const file = (name: string, bytes: Uint8Array): InputFile => ({ name, bytes });
/** One parcel as loose files `stem`.shp, .dbf (the first row) and .prj. */
const oneParcel = (stem: string, ring: Ring, prj: string): InputFile[] =>
  parcelLayer(stem, [ring], [ROWS[0]!], prj).map((f) => file(f.name, f.data));

describe('importShapefile', () => {
  it('imports one parcel from loose files, with its attributes', async () => {
    const r = await importShapefile(oneParcel('lot', LOT0, WGS84_PRJ));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.parcels).toHaveLength(1);
    expect(r.fields).toEqual(['PIN', 'SITEADDR']);
    expect(r.parcels[0]!.attributes).toEqual({ PIN: '27-118-0001', SITEADDR: '100 Invented Lane' });
    const ring = r.parcels[0]!.boundary.coordinates[0]!;
    expect(ring).toHaveLength(5);
    for (const p of LOT0)
      expect(ring.some((q) => Math.abs(q[0] - p[0]) < 1e-12 && Math.abs(q[1] - p[1]) < 1e-12)).toBe(true);
    expect(parcelLabels(r.parcels[0]!.attributes)).toEqual({
      address: '100 Invented Lane',
      parcelId: '27-118-0001',
    });
  });

  it('lists every parcel of a zipped layer, for the chooser', async () => {
    const zip = storedZip([
      ...parcelLayer('county/parcels', lots, ROWS, WGS84_PRJ),
      { name: '__MACOSX/county/._parcels.shp', data: enc('junk') },
    ]);
    const r = await importShapefile([file('parcels.zip', zip)]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.layer).toBe('parcels');
    expect(r.parcels.map((p) => p.record)).toEqual([1, 2, 3]);
    expect(r.parcels.map((p) => p.attributes['SITEADDR'])).toEqual(ROWS.map((x) => x[1]));
  });

  it('unpacks a deflated zip, as most archivers write it', async () => {
    const zip = storedZip(
      parcelLayer('parcels', lots, ROWS, WGS84_PRJ),
      (d) => new Uint8Array(deflateRawSync(d)),
    );
    const r = await importShapefile([file('parcels.zip', zip)]);
    expect(r.ok && r.parcels.length).toBe(3);
    const damaged = zip.slice();
    damaged.fill(0x55, 60, 90); // inside the first entry's compressed data
    const d = await importShapefile([file('parcels.zip', damaged)]);
    expect(d.ok).toBe(false);
    if (!d.ok) expect(d.errors[0]!.path).toBe('parcels.zip');
  });

  it('honours a .prj in US survey feet (corners within 0.5 m of proj4 with the published zone)', async () => {
    const ftRing = clockwiseRect(987_000, 195_000, 300, 150);
    const r = await importShapefile(oneParcel('ny', ftRing, NY_LI_FTUS_PRJ));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const got = r.parcels[0]!.boundary.coordinates[0]!;
    const exact = proj4(NY_LI_M, 'WGS84');
    for (const [x, y] of ftRing) {
      const [lon, lat] = exact.forward([x * US_FT_M, y * US_FT_M]) as [number, number];
      const nearest = Math.min(
        ...got.map((q) => Geodesic.Geodesic.WGS84.Inverse(lat, lon, q[1], q[0]).s12 ?? NaN),
      );
      expectClose(nearest, 0, 0.5, 'proj4 with SPCS 83 zone 3104 published parameters (REFERENCES §11)');
    }
  });

  it('refuses a cut-off .dbf, naming the record and byte', async () => {
    const dbf = textDbf(PARCEL_FIELDS, ROWS);
    const r = await importShapefile([
      file('parcels.shp', polygonShp(lots)),
      file('parcels.dbf', dbf.slice(0, dbf.length - 20)),
      file('parcels.prj', enc(WGS84_PRJ)),
    ]);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]!.path).toMatch(/^parcels\.dbf, record 3 \(byte \d+\)$/);
    expect(r.errors[0]!.message).toMatch(/cut off/);
  });

  it('refuses a .dbf that does not belong to the .shp', async () => {
    const r = await importShapefile([
      file('parcels.shp', polygonShp(lots)),
      file('parcels.dbf', textDbf(PARCEL_FIELDS, ROWS.slice(0, 2))),
    ]);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]!.message).toMatch(/holds 2 records but parcels\.shp holds 3/);
  });

  it('refuses a cut-off .shp, naming the record', async () => {
    const shp = polygonShp(lots);
    // Keep the declared length honest so the record walk finds the damage.
    const cut = shp.slice(0, shp.length - 40);
    new DataView(cut.buffer).setInt32(24, cut.length / 2, false);
    const r = await importShapefile([file('parcels.shp', cut)]);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]!.path).toMatch(/^parcels\.shp, record 3 \(byte \d+\)$/);
  });

  it('refuses projected coordinates without a .prj, and an unreadable .prj', async () => {
    const ft = [clockwiseRect(987_000, 195_000, 300, 150)];
    const none = await importShapefile([file('ny.shp', polygonShp(ft))]);
    expect(none.ok).toBe(false);
    if (!none.ok) expect(none.errors[0]!.message).toMatch(/no \.prj/);
    const bad = await importShapefile([
      file('ny.shp', polygonShp(ft)),
      file('ny.prj', enc('PROJCS[nonsense')),
    ]);
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors[0]!.path).toBe('ny.prj');
  });

  it('refuses a zip whose entries claim more than the limit, before unpacking', async () => {
    const zip = storedZip([{ name: 'p.shp', data: polygonShp(lots) }]);
    const v = new DataView(zip.buffer);
    const central = zip.length - 22 - (46 + 'p.shp'.length);
    v.setUint32(central + 24, 2_000_000_000, true);
    const r = await importShapefile([file('p.zip', zip)]);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]!.message).toMatch(/would unpack to 2000\.0 MB/);
  });

  it('lists self-crossing parcels as skipped and keeps the good ones', async () => {
    const bowtie: Ring = [
      [-93.74, 44.9],
      [-93.739, 44.901],
      [-93.739, 44.9],
      [-93.74, 44.901],
      [-93.74, 44.9],
    ];
    const r = await importShapefile([
      file('p.shp', polygonShp([LOT0, bowtie])),
      file('p.prj', enc(WGS84_PRJ)),
    ]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.parcels.map((p) => p.record)).toEqual([1]);
    expect(r.skippedCount).toBe(1);
    expect(r.skipped[0]!.path).toMatch(/^p\.shp, record 2/);
  });

  it('never throws on damaged files: random bytes spliced into a good layer (property test, seeded)', async () => {
    const shp = polygonShp(lots);
    const dbf = textDbf(PARCEL_FIELDS, ROWS);
    const zip = storedZip([
      { name: 'p.shp', data: shp },
      { name: 'p.dbf', data: dbf },
    ]);
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom('shp', 'dbf', 'zip'),
        fc.nat(),
        fc.uint8Array({ minLength: 1, maxLength: 64 }),
        fc.boolean(),
        async (which, at, junk, cut) => {
          const good = which === 'shp' ? shp : which === 'dbf' ? dbf : zip;
          const bad = good.slice();
          const from = at % bad.length;
          bad.set(junk.subarray(0, bad.length - from), from);
          const bytes = cut ? bad.subarray(0, from + 1) : bad;
          const files =
            which === 'zip'
              ? [file('p.zip', bytes)]
              : [file('p.shp', which === 'shp' ? bytes : shp), file('p.dbf', which === 'dbf' ? bytes : dbf)];
          const t0 = performance.now();
          const r = await importShapefile(files);
          expect(performance.now() - t0).toBeLessThan(2000);
          if (!r.ok) for (const e of r.errors) expect(e.path.length * e.message.length).toBeGreaterThan(0);
        },
      ),
      { seed: 20261205, numRuns: Number(process.env.YARDWIRE_PROPERTY_RUNS ?? 200) },
    );
  });
});
