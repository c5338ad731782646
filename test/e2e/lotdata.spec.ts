// Real lot data in (issue 18): a new project at an invented spot, a projected aerial (UTM zone
// 15N, tiled, generated here) under the map, the lot boundary from a zipped shapefile of three
// invented parcels with a UTM .prj (chosen in the parcel chooser by its address), the parcel's
// address as the project name, four supports traced on it, and a 40 m plan.
import proj4 from 'proj4';
import { epsgProjectedKeys, tiledGeoTiffBytes } from '../helpers/geotiffWriter.ts';
import { clockwiseRect, parcelLayer, parcelRows, storedZip } from '../helpers/shapefileWriter.ts';
import { addSupports, expect, metresPerPixel, openNewLot, shot, test, waitSaved } from './fixtures.ts';

// An invented spot in farmland inside UTM zone 15; nothing here names a real station or lot.
const PLACE: [number, number] = [-94.2184, 45.3121];
const UTM15 = '+proj=utm +zone=15 +datum=WGS84 +units=m +no_defs';
const UTM15_PRJ =
  'PROJCS["WGS_1984_UTM_Zone_15N",GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Transverse_Mercator"],PARAMETER["False_Easting",500000.0],PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",-93.0],PARAMETER["Scale_Factor",0.9996],PARAMETER["Latitude_Of_Origin",0.0],UNIT["Meter",1.0]]';
const [E0, N0] = proj4(UTM15).forward(PLACE) as [number, number];

/** A tiled UTM aerial of 320 m × 240 m around the place, 0.5 m pixels: fields with a darker lot. */
function aerial(): Buffer {
  const px = 0.5;
  const [w, h] = [640, 480];
  const x0 = E0 - (w * px) / 2;
  const y0 = N0 + (h * px) / 2;
  const bytes = tiledGeoTiffBytes({
    width: w,
    height: h,
    tile: 256,
    geo: { tiepoint: [x0, y0], pixelScale: [px, px], keys: epsgProjectedKeys(32615) },
    fill(tx, ty, rgb) {
      for (let y = 0; y < 256; y++)
        for (let x = 0; x < 256; x++) {
          const e = x0 + (tx * 256 + x + 0.5) * px - E0;
          const n = y0 - (ty * 256 + y + 0.5) * px - N0;
          const inLot = Math.abs(e) < 50 && Math.abs(n) < 40;
          rgb.set(inLot ? [70, 110, 60] : [150, 160, 110], (y * 256 + x) * 3);
        }
    },
  });
  return Buffer.from(bytes);
}

/** Three parcels side by side, 100 m × 80 m each, in UTM metres; ours is in the middle. */
function parcelsZip(): Buffer {
  const rect = (e: number, n: number) => clockwiseRect(E0 + e - 50, N0 + n - 40, 100, 80);
  // 15-020-0100, 2100 Invented Prairie Rd; then 0101, 2102 and 0102, 2104.
  const rows = parcelRows(
    (i) => `15-020-010${i}`,
    (i) => `${2100 + 2 * i} Invented Prairie Rd`,
  );
  return Buffer.from(
    storedZip(parcelLayer('parcels/parcels', [rect(-100, 0), rect(0, 0), rect(100, 0)], rows, UTM15_PRJ)),
  );
}

test('imports a projected aerial and a shapefile parcel, traces supports on them, and plans', async ({
  page,
  host,
}) => {
  test.setTimeout(150_000);
  await openNewLot(page, host, 'Lot data test');
  const goTo = page.getByRole('textbox', { name: 'Go to a locator or coordinates' });
  await goTo.fill(`${PLACE[1]}, ${PLACE[0]}`);
  await goTo.press('Enter');

  // The UTM aerial: referenced, not embedded; drawn from the file for the view.
  await page.getByRole('tab', { name: 'Aerial' }).click();
  await page
    .getByTestId('aerial-file')
    .setInputFiles({ name: 'ortho-utm15.tif', mimeType: 'image/tiff', buffer: aerial() });
  await expect(page.getByTestId('aerial-crs')).toContainText('EPSG:32615 (metre), 640 × 480 px');
  await expect(page.locator('img.yw-aerial')).toHaveAttribute('src', /^blob:/);

  // The parcel layer: three parcels, chosen by address.
  await page
    .getByTestId('boundary-file')
    .setInputFiles({ name: 'parcels.zip', mimeType: 'application/zip', buffer: parcelsZip() });
  const chooser = page.getByTestId('parcel-chooser');
  await expect(chooser).toContainText('holds 3 parcels');
  await page.getByTestId('parcel-filter').fill('2102');
  await expect(page.getByTestId('parcel-use')).toHaveCount(1);
  await shot(page, 'lotdata-chooser');
  await page.getByTestId('parcel-use').click();
  const summary = page.getByTestId('imported-lot-summary');
  // 100 m × 80 m of UTM grid is 8000 m² divided by the square of the scale factor there (about
  // 0.9997, some 95 km from the central meridian: DMA TM 8358.2, from memory): about 8005 m².
  await expect(summary).toContainText(/Area 800[2-8] m²/);
  await expect(summary).toContainText('2102 Invented Prairie Rd');
  await page.getByTestId('use-parcel-name').click();
  await page.getByTestId('use-parcel-notes').click();
  await page.getByRole('button', { name: 'Close' }).click();
  await page.getByRole('tab', { name: 'Project' }).click();
  await expect(page.getByTestId('project-name')).toHaveValue('2102 Invented Prairie Rd');
  await page.getByRole('tab', { name: 'Lot' }).click();
  // The aerial's darker lot lies under the imported boundary: the image box holds the lot's.
  const img = (await page.locator('img.yw-aerial').boundingBox())!;
  const lot = (await page.locator('path.yw-boundary').boundingBox())!;
  expect(img.x).toBeLessThanOrEqual(lot.x);
  expect(img.y).toBeLessThanOrEqual(lot.y);

  // Four supports on the lot (the map is fitted to it, so its centre is the lot's).
  await page.getByRole('button', { name: 'Fold the planning panel' }).click();
  const mpp = await metresPerPixel(page);
  await addSupports(page, mpp, [
    ['West oak', -35, 15, '18'],
    ['Centre mast', 5, 15, '15'],
    ['East ash', 38, 18, '17'],
    ['South maple', 5, -22, '16'],
  ]);
  await waitSaved(page);
  await shot(page, 'lotdata-traced');

  // Plan 40 m on it.
  await page.getByRole('button', { name: 'Open the planning panel' }).click();
  const bar = page.getByTestId('run-bar');
  for (const b of ['160 m', '80 m']) {
    const box = bar.getByRole('checkbox', { name: b });
    if (await box.isChecked()) await box.uncheck();
  }
  await bar.getByRole('checkbox', { name: '40 m' }).check();
  await bar.getByRole('button', { name: /Run plan|Run again/ }).click();
  await expect(page.getByTestId('run-status')).toContainText(/\d+ candidates · /, { timeout: 100_000 });
  expect(await page.getByTestId('candidate-row').count()).toBeGreaterThan(0);
  await shot(page, 'lotdata-planned');

  // After a reload the project keeps the reference, not the image, and asks for the file.
  await page.reload();
  await page.getByRole('tab', { name: 'Aerial' }).click();
  await expect(page.getByTestId('aerial-needs-file')).toContainText('ortho-utm15.tif');
  await expect(page.locator('path.yw-aerial-outline')).toHaveCount(1);
  await page
    .getByTestId('aerial-reopen')
    .setInputFiles({ name: 'ortho-utm15.tif', mimeType: 'image/tiff', buffer: aerial() });
  await expect(page.locator('img.yw-aerial')).toHaveAttribute('src', /^blob:/);
  await expect(page.locator('path.yw-aerial-outline')).toHaveCount(0);

  // Asked to, the project keeps a copy too: after a reload it shows without the file.
  await page.getByTestId('aerial-embed-now').click();
  await expect(page.getByTestId('aerial-crs')).toContainText('a copy is kept in the project');
  await page.reload();
  await expect(page.locator('img.yw-aerial')).toHaveAttribute('src', /^data:image\/png;base64,/);
  await page.getByRole('tab', { name: 'Aerial' }).click();
  await expect(page.getByTestId('aerial-needs-file')).toHaveCount(0);
});
