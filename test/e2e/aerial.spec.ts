// Aerial imagery: the demo's invented GeoTIFF through the same import path as a user's file.
import { GEOKEYS_4326, encodeRgbTiff } from '../../renderer/demo/generate-aerial.mjs';
import { expect, openApp, shot, test } from './fixtures.ts';

test('loads the demo aerial under the drawing; opacity sticks; it survives a reload', async ({
  page,
  host,
}) => {
  await openApp(page, host);
  await page.getByRole('tab', { name: 'Aerial' }).click();
  await expect(page.getByText('No aerial image for this project.')).toBeVisible();
  await page.getByRole('button', { name: 'Load demo aerial' }).click();
  await expect(page.getByTestId('aerial-name')).toHaveText('Demo aerial (invented)');
  const image = page.locator('img.yw-aerial');
  await expect(image).toBeVisible();
  await expect(image).toHaveAttribute('src', /^data:image\/png;base64,/);
  // The image lies under the lot: its box contains the box of the drawn boundary.
  const img = (await image.boundingBox())!;
  const lot = (await page.locator('path.yw-boundary').boundingBox())!;
  expect(img.x).toBeLessThan(lot.x);
  expect(img.y).toBeLessThan(lot.y);
  expect(img.x + img.width).toBeGreaterThan(lot.x + lot.width);
  expect(img.y + img.height).toBeGreaterThan(lot.y + lot.height);

  await page.getByTestId('aerial-opacity').fill('0.5');
  await expect(image).toHaveCSS('opacity', '0.5');
  await shot(page, 'demo-aerial');

  await page.reload();
  await expect(page.locator('img.yw-aerial')).toBeVisible();
  await expect(page.locator('img.yw-aerial')).toHaveCSS('opacity', '0.5');
});

test('explains a TIFF without georeference and a truncated one', async ({ page, host }) => {
  await openApp(page, host);
  await page.getByRole('tab', { name: 'Aerial' }).click();
  const plain = encodeRgbTiff(8, 8, new Uint8Array(8 * 8 * 3).fill(90), null);
  await page
    .getByTestId('aerial-file')
    .setInputFiles({ name: 'scan.tif', mimeType: 'image/tiff', buffer: Buffer.from(plain) });
  await expect(page.getByTestId('aerial-error')).toContainText('no georeference');
  const geo = encodeRgbTiff(64, 64, new Uint8Array(64 * 64 * 3).fill(90), {
    tiepoint: [10, 50],
    pixelScale: [1e-5, 1e-5],
    geoKeys: GEOKEYS_4326,
  });
  const cut = Buffer.from(geo.subarray(0, geo.length - 2000));
  await page
    .getByTestId('aerial-file')
    .setInputFiles({ name: 'cut.tif', mimeType: 'image/tiff', buffer: cut });
  await expect(page.getByTestId('aerial-error')).toContainText('truncated');
  await expect(page.locator('img.yw-aerial')).toHaveCount(0);
  await shot(page, 'aerial-error');
});
