// The planning workflow end to end: open the demo, pick targets, run a plan for 80 m in the
// workers, watch the progress, read the ranked shortlist, select the first candidate, see it on
// the lot and its plots, compare two, browse the rejected placements.
import { expect, openApp, shot, test } from './fixtures.ts';

// Both tests run the field solver in every core the page is given: one after the other, not side by side.
test.describe.configure({ mode: 'serial' });

test('plans the demo lot for 80 m and shows the first candidate drawn with its plots', async ({
  page,
  host,
}) => {
  test.setTimeout(180_000);
  await openApp(page, host);
  const dock = page.getByTestId('plan-dock');
  await dock.getByRole('tab', { name: /Targets/ }).click();

  // The station's locator is shown; the bearing map is drawn around it.
  await expect(page.getByTestId('station-locator')).toHaveValue(/^[A-R]{2}\d\d[a-x]{2}$/);
  await expect(page.getByTestId('bearing-map')).toBeVisible();

  // Pick two regions from the list and give one more weight.
  const list = page.getByTestId('region-list');
  for (const name of ['Europe', 'Japan']) {
    const box = list.getByRole('checkbox', { name });
    if (!(await box.isChecked())) await box.check();
  }
  await page.getByRole('spinbutton', { name: 'Weight of Europe' }).fill('2');
  await page.getByRole('spinbutton', { name: 'Weight of Europe' }).press('Tab');
  await expect(list.getByTestId('path-figures').first()).toContainText(/km/);
  await shot(page, 'plan-targets');

  // 80 m only, then run.
  const bar = page.getByTestId('run-bar');
  for (const b of ['160 m', '40 m']) {
    const box = bar.getByRole('checkbox', { name: b });
    if (await box.isChecked()) await box.uncheck();
  }
  const b80 = bar.getByRole('checkbox', { name: '80 m' });
  if (!(await b80.isChecked())) await b80.check();
  await bar.getByRole('button', { name: /Run plan|Run again/ }).click();
  await expect(page.getByRole('progressbar', { name: 'Plan progress' })).toBeVisible();
  await expect(page.getByTestId('run-status')).toContainText(/Solving \d+ of \d+ designs|Placing|Ranking/);
  await shot(page, 'plan-progress');

  // The window keeps answering while the workers solve: the Targets tab opens at once.
  await dock.getByRole('tab', { name: /Targets/ }).click();
  await expect(page.getByTestId('bearing-map')).toBeVisible({ timeout: 2_000 });
  await dock.getByRole('tab', { name: /Shortlist/ }).click();

  await expect(page.getByTestId('run-status')).toContainText(/\d+ candidates · /, { timeout: 150_000 });
  const rows = page.getByTestId('candidate-row');
  expect(await rows.count()).toBeGreaterThan(3);
  await expect(
    page
      .getByTestId('shortlist')
      .getByText(/^best /)
      .first(),
  ).toBeVisible();

  // Select the first: drawn on the lot, its figures, plots and cautions.
  await rows.first().click();
  const detail = page.getByTestId('candidate-detail');
  await expect(detail).toBeVisible();
  await expect(page.locator('.leaflet-overlay-pane path')).not.toHaveCount(0);
  await expect(page.locator('.leaflet-tooltip', { hasText: /Europe \d+°/ })).toBeVisible();
  await expect(detail.getByTestId('feed-impedance')).toContainText(/Ω/);
  await expect(detail.getByTestId('elevation-plot').locator('svg path')).not.toHaveCount(0);
  await expect(detail.getByTestId('azimuth-plot').locator('svg')).toBeVisible();
  await expect(detail.getByTestId('swr-plot').locator('svg')).toBeVisible({ timeout: 30_000 });
  await expect(detail.getByTestId('cut-list')).toBeVisible();
  await expect(detail.getByTestId('cautions')).toContainText('Lightning');
  await expect(detail.getByTestId('cautions')).toContainText('Power lines');
  await shot(page, 'plan-shortlist-selected');
  await detail.getByTestId('swr-plot').scrollIntoViewIfNeeded();
  await shot(page, 'plan-detail-plots');

  // Compare with the second candidate.
  await detail.getByRole('combobox').filter({ hasText: '—' }).selectOption({ index: 1 });
  await expect(page.getByTestId('azimuth-wins')).toContainText(/stronger over \d+°\s+of\s+azimuth/);
  await shot(page, 'plan-compare');

  // Rejected placements with their reasons.
  await dock.getByRole('tab', { name: /Rejected/ }).click();
  await expect(page.getByTestId('rejected').locator('li').first()).toBeVisible();
  // Every single-antenna type has a placement on the demo lot at 80 m: no "Why not?" block.
  await expect(page.getByTestId('why-not')).toHaveCount(0);
  await shot(page, 'plan-rejected');

  // The selected candidate's pattern over the bearing map.
  await dock.getByRole('tab', { name: /Targets/ }).click();
  await expect(page.getByTestId('bearing-overlay')).toBeVisible();
  await shot(page, 'plan-bearing-overlay');

  // A small edit (a weight) re-runs from the evaluation cache kept in the worker: no solver work.
  await page.getByRole('spinbutton', { name: 'Weight of Japan' }).fill('3');
  await page.getByRole('spinbutton', { name: 'Weight of Japan' }).press('Tab');
  await expect(page.getByTestId('run-status')).toContainText(/changed since this plan/);
  await bar.getByRole('button', { name: 'Run again' }).click();
  // The status says how long; its tooltip says how much was solved and reused.
  await expect(page.getByTestId('run-status')).toHaveAttribute('title', /\(0 designs solved, \d+ reused\)/, {
    timeout: 20_000,
  });

  // Adding 40 m starts new solver work, which can be cancelled at once.
  await bar.getByRole('checkbox', { name: '40 m' }).check();
  await bar.getByRole('button', { name: 'Run again' }).click();
  await bar.getByRole('button', { name: 'Cancel' }).click();
  await expect(page.getByTestId('run-status')).toContainText(/Cancelled after \d+ of \d+/);
  await expect(bar.getByRole('button', { name: 'Run again' })).toBeEnabled();
});

test('imports a lot boundary from GeoJSON and exports the lot and the shortlist', async ({ page, host }) => {
  test.setTimeout(120_000);
  await openApp(page, host);
  // A bad file names what is wrong, and changes nothing.
  await page.getByTestId('boundary-file').setInputFiles({
    name: 'parcel.geojson',
    mimeType: 'application/geo+json',
    buffer: Buffer.from('{"type":"Point","coordinates":[1,2]}'),
  });
  await expect(page.getByRole('alert').filter({ hasText: /Polygon/ })).toBeVisible();
  await expect(page.getByTestId('lot-summary')).toContainText('Lot 1.69 ha');

  // A good one replaces the boundary (a 100 m × 100 m square near the demo lot).
  const [lon, lat] = [-93.7505, 44.9025];
  const dLon = 100 / (111_320 * Math.cos((lat * Math.PI) / 180));
  const dLat = 100 / 110_950;
  const ring = [
    [lon, lat],
    [lon + dLon, lat],
    [lon + dLon, lat + dLat],
    [lon, lat + dLat],
    [lon, lat],
  ];
  await page.getByTestId('boundary-file').setInputFiles({
    name: 'parcel.geojson',
    mimeType: 'application/geo+json',
    buffer: Buffer.from(
      JSON.stringify({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } }),
    ),
  });
  await expect(
    page.getByText(/Lot boundary imported from parcel\.geojson \(GeoJSON, 4 corners\)/),
  ).toBeVisible();
  await expect(page.getByTestId('lot-summary')).toContainText(/Lot 1\.0\d ha|Lot 0\.99 ha/);

  const lot = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Lot GeoJSON' }).click();
  const file = await lot;
  expect(file.suggestedFilename()).toMatch(/-lot\.geojson$/);
  const text = await (await file.createReadStream()).toArray();
  const fc = JSON.parse(Buffer.concat(text).toString('utf8'));
  expect(fc.features[0].geometry.coordinates[0]).toEqual(ring);

  // Run the plan on the new lot and export the shortlist.
  await page
    .getByTestId('run-bar')
    .getByRole('button', { name: /Run plan/ })
    .click();
  await expect(page.getByTestId('run-status')).toContainText(/\d+ candidates · /, { timeout: 100_000 });
  const csv = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Shortlist CSV' }).click();
  const c = await csv;
  expect(c.suggestedFilename()).toMatch(/-shortlist\.csv$/);
  const body = Buffer.concat(await (await c.createReadStream()).toArray()).toString('utf8');
  expect(body.split('\r\n')[0]).toMatch(/^band,rank,type/);
  expect(body.split('\r\n').filter((l) => l.startsWith('80m,')).length).toBeGreaterThan(0);
});
