// Imagery a user opts into (issue 14 point 6): the empty state offers public imagery and map
// services, each with its terms and credit shown; nothing is fetched before the user picks one,
// reads its terms and loads it; then tiles come from that service's host (answered here with a
// local tile: nothing reaches the network), its credit is on the map, and the choice is kept as
// the project's tile address. Also: the station locator's Go on the Targets tab moves the map.
import type { Page, Request } from '@playwright/test';
import { deflateSync, crc32 } from 'node:zlib';
import { expect, expectGoMarkInView, openNewLot, shot, test, waitSaved } from './fixtures.ts';

/** A 256 × 256 PNG tile (a plain grid), made here so that no tile comes from elsewhere. */
function localTile(): Buffer {
  const size = 256;
  const rows: Buffer[] = [];
  for (let y = 0; y < size; y++) {
    const row = Buffer.alloc(1 + size * 3);
    for (let x = 0; x < size; x++) {
      const line = x % 32 === 0 || y % 32 === 0;
      row.set(line ? [150, 160, 140] : [196, 206, 184], 1 + x * 3);
    }
    rows.push(row);
  }
  const chunk = (type: string, data: Buffer): Buffer => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
    const out = Buffer.alloc(12 + data.length);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc32(body), 8 + data.length);
    return out;
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(size, 0);
  header.writeUInt32BE(size, 4);
  header.set([8, 2, 0, 0, 0], 8); // 8 bits, RGB
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(Buffer.concat(rows))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

const OSM_HOST = 'tile.openstreetmap.org';
const USGS_HOST = 'basemap.nationalmap.gov';

/** Answer every request to these hosts with the local tile, and list them; the rest go on to the fixture (which blocks and reports them). */
async function serveTiles(page: Page, hosts: string[]): Promise<Request[]> {
  const seen: Request[] = [];
  const tile = localTile();
  await page.route(
    (url) => hosts.includes(url.hostname),
    (route) => {
      seen.push(route.request());
      return route.fulfill({ status: 200, contentType: 'image/png', body: tile });
    },
  );
  return seen;
}

test('loads a public map service only after the user reads its terms and chooses it', async ({
  page,
  host,
}) => {
  const tiles = await serveTiles(page, [OSM_HOST, USGS_HOST, 'server.arcgisonline.com']);
  await openNewLot(page, host, 'Imagery lot');

  // Going somewhere and zooming fetches nothing.
  const card = page.getByTestId('empty-lot');
  const goTo = card.getByRole('textbox', { name: 'Go to a locator or coordinates' });
  await goTo.fill('45.12, -93.40');
  await goTo.press('Enter');
  await expect(page.locator('.yw-goto-label')).toBeVisible();
  await page.mouse.wheel(0, -200);

  // The chooser lists the services with their hosts; picking one shows its terms and credit.
  await card.getByText('Public imagery and map services…').click();
  const presets = card.getByTestId('imagery-presets');
  await expect(presets).toContainText('Nothing is fetched until you choose a service');
  await expect(presets).toContainText(`from ${USGS_HOST}`);
  await presets.getByRole('radio', { name: /OpenStreetMap standard map/ }).check();
  const terms = presets.getByTestId('imagery-terms');
  await expect(terms).toContainText('no bulk downloading');
  await expect(terms).toContainText('© OpenStreetMap contributors');
  await expect(terms.getByRole('link')).toHaveAttribute(
    'href',
    'https://operations.osmfoundation.org/policies/tiles/',
  );
  const load = terms.getByRole('button', { name: 'Load OpenStreetMap standard map' });
  await expect(load).toBeDisabled();
  await shot(page, 'imagery-presets');
  await page.waitForTimeout(300); // time for any tile a map might ask for on its own
  expect(
    tiles.map((r) => r.url()),
    'no tile before the user chooses',
  ).toEqual([]);
  await expect(page.locator('.leaflet-tile')).toHaveCount(0);

  // Accepting and loading: tiles from that host only, and its credit on the map.
  await terms.getByRole('checkbox', { name: /I have read these terms/ }).check();
  await load.click();
  await waitSaved(page);
  await expect.poll(() => tiles.length).toBeGreaterThan(0);
  expect(new Set(tiles.map((r) => new URL(r.url()).hostname))).toEqual(new Set([OSM_HOST]));
  expect(tiles[0]!.url()).toMatch(/^https:\/\/tile\.openstreetmap\.org\/\d+\/\d+\/\d+\.png$/);
  await expect(page.locator('img.leaflet-tile-loaded').first()).toBeVisible();
  await expect(page.locator('.leaflet-control-attribution')).toContainText(
    '© OpenStreetMap contributors (ODbL)',
  );
  await expect(presets.getByTestId('imagery-in-use')).toContainText('OpenStreetMap standard map');
  // The place the user went to stays marked: choosing imagery is no change to the lot.
  await expect(page.locator('path.yw-goto')).toHaveCount(1);

  // Kept like the user's own tile address: in Settings, and over a reload.
  await page.getByRole('tab', { name: 'Settings' }).click();
  await expect(page.getByLabel('Tile URL template')).toHaveValue(
    'https://tile.openstreetmap.org/{z}/{x}/{y}.png',
  );
  await expect(page.getByLabel('Attribution shown on the map')).toHaveValue(
    '© OpenStreetMap contributors (ODbL)',
  );
  tiles.length = 0;
  await page.reload();
  await expect(page).toHaveTitle('Imagery lot — Yardwire');
  await expect.poll(() => tiles.length).toBeGreaterThan(0);
  expect(new Set(tiles.map((r) => new URL(r.url()).hostname))).toEqual(new Set([OSM_HOST]));

  // Stopping: the tiles go and no more are asked for.
  await page.getByRole('tab', { name: 'Settings' }).click();
  await page.getByRole('button', { name: 'Stop loading imagery' }).click();
  await waitSaved(page);
  await expect(page.locator('.leaflet-tile')).toHaveCount(0);
  tiles.length = 0;
  await page.mouse.wheel(0, 300);
  await page.waitForTimeout(300);
  expect(tiles.map((r) => r.url())).toEqual([]);
});

test("the station locator's Go on the Targets tab moves the map to the station", async ({ page, host }) => {
  await openNewLot(page, host, 'Locator lot');
  const dock = page.getByTestId('plan-dock');
  const open = page.getByRole('button', { name: 'Open the planning panel' });
  if (await open.isVisible()) await open.click();
  await dock.getByRole('tab', { name: /Targets/ }).click();
  await expect(page.locator('path.yw-goto')).toHaveCount(0);

  // EN34 worked by hand from the Maidenhead locator system (fields of 20° × 10° lettered from
  // 180° W and 90° S, squares of 2° × 1° numbered within; IARU Region 1, 1980, from memory):
  // field E N starts at (100° W, 40° N), square 3 4 spans 94…92° W and 44…45° N, centre
  // (44.5° N, 93° W).
  await dock.getByTestId('station-locator').fill('EN34');
  await dock.getByRole('button', { name: 'Go to the station locator on the map' }).click();
  await expect(page.locator('.yw-goto-label')).toContainText('You went to 44.50000, -93.00000');
  await expectGoMarkInView(page);
  await expect(dock.getByTestId('station-locator')).toHaveValue(/^EN34/);
  await shot(page, 'targets-go');

  // Enter in the field is the same Go: another square, and the map follows.
  await dock.getByTestId('station-locator').fill('EN35');
  await dock.getByTestId('station-locator').press('Enter');
  await expect(page.locator('.yw-goto-label', { hasText: 'You went to 45.50000, -93.00000' })).toBeVisible();
  await expect(page.locator('.yw-goto-label', { hasText: '44.50000' })).toHaveCount(0);
  // A locator that is not one is refused next to the field, and the map stays.
  await dock.getByTestId('station-locator').fill('ZZ99');
  await dock.getByRole('button', { name: 'Go to the station locator on the map' }).click();
  await expect(dock.getByRole('alert')).toContainText('is not a Maidenhead locator');
  await expect(page.locator('.yw-goto-label')).toHaveText('You went to 45.50000, -93.00000');
});
