// Editing on the map: add a support and set its height, draw a lot boundary, undo and redo.
import { clickMap, expect, openApp, openSupport, phrase, shot, test, waitSaved } from './fixtures.ts';

test('adds a support by clicking the map; its height survives a reload and a restart', async ({
  page,
  host,
}) => {
  await openApp(page, host);
  await page.keyboard.press('s');
  await expect(page.getByRole('status').filter({ hasText: 'Add support' })).toBeVisible();
  await clickMap(page, 0.62, 0.3);
  await expect(page.getByTestId('support-name')).toHaveValue('Support 1');
  // The height field has the focus: type the height straight away.
  await expect(page.getByTestId('support-height')).toBeFocused();
  await page.keyboard.type('17.5');
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('support-height')).not.toBeFocused();
  await page.getByTestId('support-name').fill('Back-fence walnut');
  await page.getByTestId('support-name').press('Enter');
  await waitSaved(page);
  await expect(page.locator('.leaflet-tooltip', { hasText: 'Back-fence walnut · 17.5 m' })).toBeVisible();
  await shot(page, 'support-added');

  await page.reload();
  await expect(
    page.getByTestId('support-list').getByRole('button', { name: /Back-fence walnut\s*17\.5 m/ }),
  ).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Supports (9)' })).toBeVisible();

  await host.restart();
  await page.goto(host.url);
  await expect(
    page.getByTestId('support-list').getByRole('button', { name: /Back-fence walnut\s*17\.5 m/ }),
  ).toBeVisible();
});

test('refuses an impossible height and says why', async ({ page, host }) => {
  await openApp(page, host);
  await openSupport(page, /^West oak/);
  await page.getByTestId('support-height').fill('-4');
  await page.getByTestId('support-height').press('Enter');
  await expect(
    page.getByRole('alert').filter({ hasText: 'Enter a length more than 0.0 m up to 200.0 m' }),
  ).toBeVisible();
  await page.getByRole('button', { name: 'Back to list' }).click();
  await expect(
    page.getByTestId('support-list').getByRole('button', { name: /West oak\s*20\.0 m/ }),
  ).toBeVisible();
});

test('deletes the selected support with the Delete key, and undo brings it back', async ({ page, host }) => {
  await openApp(page, host);
  await openSupport(page, /^East ash/);
  await page.getByTestId('support-name').blur();
  await page.keyboard.press('Delete');
  await expect(page.getByRole('heading', { name: 'Supports (7)' })).toBeVisible();
  await expect(page.locator('.leaflet-tooltip', { hasText: 'East ash' })).toHaveCount(0);
  await page.keyboard.press('Control+z');
  await expect(page.getByRole('heading', { name: 'Supports (8)' })).toBeVisible();
  await expect(page.locator('.leaflet-tooltip', { hasText: 'East ash · 12.0 m' })).toBeVisible();
});

test('draws a new lot boundary; undo and redo walk over it', async ({ page, host }) => {
  await openApp(page, host);
  const summary = page.getByTestId('lot-summary');
  await expect(summary).toContainText('1.69 ha');
  await page.keyboard.press('b');
  await clickMap(page, 0.3, 0.3);
  await clickMap(page, 0.7, 0.3);
  await clickMap(page, 0.7, 0.6);
  await clickMap(page, 0.3, 0.6);
  await page.keyboard.press('Enter');
  await expect(summary).not.toContainText('1.69 ha');
  const drawn = (await summary.textContent())!;
  await expect(page.locator('.yw-side-label')).toHaveCount(4);
  await expect(page.getByRole('heading', { name: 'Lot boundary' })).toBeVisible();
  await waitSaved(page);
  await shot(page, 'boundary-drawn');

  await page.keyboard.press('Control+z');
  await expect(summary).toContainText('1.69 ha');
  await page.keyboard.press('Control+Shift+Z');
  await expect(summary).toHaveText(drawn);
  await page.keyboard.press('Control+z');
  await page.keyboard.press('Control+y');
  await expect(summary).toHaveText(drawn);
  // The toolbar buttons do the same.
  await page.getByRole('button', { name: 'Undo' }).click();
  await expect(summary).toContainText('1.69 ha');
  await page.getByRole('button', { name: 'Redo' }).click();
  await expect(summary).toHaveText(drawn);
  await waitSaved(page);
  await page.reload();
  await expect(summary).toHaveText(drawn);
});

test('draws a power line and shows its clearance band and caution', async ({ page, host }) => {
  await openApp(page, host);
  await page.keyboard.press('p');
  await clickMap(page, 0.2, 0.27);
  await clickMap(page, 0.8, 0.27);
  await page.keyboard.press('Enter');
  await expect(page.getByRole('heading', { name: 'Power line' })).toBeVisible();
  await expect(page.getByText(phrase('farther from a power line than it could fall'))).toBeVisible();
  await expect(
    page.locator('.leaflet-tooltip', { hasText: 'Power line 1 · keep 15.0 m clear' }),
  ).toBeVisible();
  await page.getByTestId('keepout-clearance').fill('20');
  await page.getByTestId('keepout-clearance').press('Enter');
  await expect(
    page.locator('.leaflet-tooltip', { hasText: 'Power line 1 · keep 20.0 m clear' }),
  ).toBeVisible();
  // A support now standing in the band is flagged.
  await page.getByRole('button', { name: 'Back to list' }).click();
  await openSupport(page, /^North oak/);
  await expect(
    page.getByRole('alert').filter({ hasText: /Inside the clearance of “Power line 1”/ }),
  ).toBeVisible();
  await expect(page.locator('.yw-support.is-hazard[title^="North oak"]')).toBeVisible();
  await shot(page, 'power-line-drawn');
});

test('places the station and shows its locator', async ({ page, host }) => {
  await openApp(page, host);
  await page.keyboard.press('t');
  await clickMap(page, 0.5, 0.5);
  await expect(page.getByRole('heading', { name: 'Station' })).toBeVisible();
  await expect(page.getByLabel('Inspector').getByTestId('station-locator')).toHaveText(/^EN34[a-x]{2}$/);
  await expect(page.getByText(phrase('check the RF exposure limits'))).toBeVisible();
});

test('drags a support to a new place; undo puts it back', async ({ page, host }) => {
  await openApp(page, host);
  const marker = page.locator('.yw-support[title^="Field mast"]');
  const before = (await marker.boundingBox())!;
  await page.mouse.move(before.x + before.width / 2, before.y + before.height / 2);
  await page.mouse.down();
  await page.mouse.move(before.x + 80, before.y + 60, { steps: 8 });
  await page.mouse.up();
  await waitSaved(page);
  const after = (await marker.boundingBox())!;
  expect(Math.round(after.x - before.x)).toBeGreaterThan(60);
  await expect(page.getByTestId('status-action')).toHaveText('move Field mast');
  await page.keyboard.press('Control+z');
  const back = (await marker.boundingBox())!;
  expect(Math.abs(back.x - before.x)).toBeLessThan(2);
  expect(Math.abs(back.y - before.y)).toBeLessThan(2);
});

test('moves a lot corner by dragging it', async ({ page, host }) => {
  await openApp(page, host);
  const summary = page.getByTestId('lot-summary');
  const lot = page.locator('path.yw-boundary');
  const box = (await lot.boundingBox())!;
  await lot.click({ position: { x: box.width * 0.55, y: box.height * 0.8 } });
  await expect(page.getByRole('heading', { name: 'Lot boundary' })).toBeVisible();
  // The north-east corner: the top-right vertex handle.
  const handles = page.locator('.marker-icon:not(.marker-icon-middle)');
  await expect(handles).toHaveCount(4);
  const boxes = await Promise.all((await handles.all()).map((h) => h.boundingBox()));
  const ne = boxes.reduce((a, b) => (b!.x - b!.y > a!.x - a!.y ? b : a))!;
  await page.mouse.move(ne.x + ne.width / 2, ne.y + ne.height / 2);
  await page.mouse.down();
  await page.mouse.move(ne.x + 60, ne.y - 40, { steps: 8 });
  await page.mouse.up();
  await expect(summary).not.toContainText('1.69 ha');
  await expect(page.getByTestId('status-action')).toHaveText('move lot corner');
  await page.keyboard.press('Control+z');
  await expect(summary).toContainText('1.69 ha');
});

// Keep-outs drawn with their key: the corners or points clicked (fractions of the map), then the
// inspector's heading, the default name and the measure it shows.
for (const k of [
  {
    what: 'a building keep-out',
    key: 'k',
    at: [
      [0.55, 0.62],
      [0.62, 0.62],
      [0.62, 0.68],
      [0.55, 0.68],
    ],
    heading: 'Building',
    name: 'Building 1',
    measure: /^Area \d+ m²/,
  },
  {
    what: 'a path where people walk, which blocks nothing by default',
    key: 'w',
    at: [
      [0.45, 0.5],
      [0.52, 0.56],
      [0.6, 0.58],
    ],
    heading: 'Path or play area',
    name: 'Path 1',
    measure: /^Length \d+/,
  },
]) {
  test(`draws ${k.what}`, async ({ page, host }) => {
    await openApp(page, host);
    await page.keyboard.press(k.key);
    for (const [fx, fy] of k.at) await clickMap(page, fx!, fy!);
    await page.keyboard.press('Enter');
    await expect(page.getByRole('heading', { name: k.heading })).toBeVisible();
    await expect(page.getByTestId('keepout-name')).toHaveValue(k.name);
    await expect(page.getByText(k.measure)).toBeVisible();
    await page.getByRole('button', { name: 'Back to list' }).click();
    await expect(page.getByRole('heading', { name: 'Keep-outs (4)' })).toBeVisible();
  });
}

test('Esc cancels a drawing half way and leaves the lot as it was', async ({ page, host }) => {
  await openApp(page, host);
  await page.getByRole('button', { name: 'Draw lot boundary' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'replaces the current one' })).toBeVisible();
  await clickMap(page, 0.3, 0.3);
  await clickMap(page, 0.7, 0.3);
  await page.keyboard.press('Escape');
  await expect(page.getByRole('status').filter({ hasText: 'Draw lot boundary' })).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Undo' })).toBeDisabled();
  await expect(page.getByTestId('lot-summary')).toContainText('1.69 ha');
  await expect(page.locator('.yw-side-label')).toHaveCount(4);
});
