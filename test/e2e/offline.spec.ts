// Offline by default, and honest about saving: imagery is fetched only from a tile server the
// user sets, and an edit that cannot reach the store says so.
import { clickMap, expect, openApp, test, waitSaved } from './fixtures.ts';

test('asks for map tiles only once a tile server is set', async ({ page, host, blocked }) => {
  await openApp(page, host);
  await page.mouse.wheel(0, -300);
  await expect(page.locator('.leaflet-tile')).toHaveCount(0);
  expect(blocked).toEqual([]);
  await page.getByRole('tab', { name: 'Settings' }).click();
  await page.getByLabel('Tile URL template').fill('https://tiles.example.invalid/{z}/{x}/{y}.png');
  await page.getByLabel('Tile URL template').press('Enter');
  await page.getByLabel('Attribution shown on the map').fill('Imagery: my own server');
  await page.getByLabel('Attribution shown on the map').press('Enter');
  await waitSaved(page);
  await expect(page.locator('.leaflet-control-attribution')).toContainText('Imagery: my own server');
  await expect.poll(() => blocked.some((u) => u.startsWith('https://tiles.example.invalid/'))).toBe(true);
  blocked.length = 0; // those were the requests the user asked for; the fixture checks the rest
  await page.getByLabel('Tile URL template').fill('');
  await page.getByLabel('Tile URL template').press('Enter');
  await waitSaved(page);
  await expect(page.locator('.leaflet-tile')).toHaveCount(0);
  blocked.length = 0;
});

test('says so when an edit cannot be saved; the store keeps the last saved state', async ({ page, host }) => {
  await openApp(page, host);
  await host.stop();
  await page.keyboard.press('s');
  await clickMap(page, 0.6, 0.3);
  await expect(page.getByTestId('save-status')).toContainText('Not saved: cannot reach the Yardwire host');
  await expect(page.getByRole('button', { name: 'Retry saving' })).toBeVisible();
  await host.restart();
  await page.goto(host.url);
  await expect(page.getByRole('heading', { name: 'Supports (8)' })).toBeVisible();
});
