// A first-time user's whole path on a fresh lot (not the demo): new project, go to an invented
// rural spot, trace a lot about 100 m × 80 m, add four supports with heights, a building
// keep-out, two weighted target regions, plan for 40 m, read the shortlist, select and compare
// candidates, export the CSV, reload and find everything kept. Also: every button on the main
// screen has an accessible name.
import type { Page } from '@playwright/test';
import {
  addSupports,
  clickAt,
  expect,
  metresPerPixel,
  openNewLot,
  shot,
  test,
  waitSaved,
} from './fixtures.ts';

// An invented spot on open prairie; nothing here names a real station or lot.
const PLACE = '47.2184, -101.6372';

/** Every visible button has a non-empty accessible name. */
async function expectNamedButtons(page: Page): Promise<number> {
  const buttons = await page.getByRole('button').all();
  let seen = 0;
  for (const b of buttons) {
    if (!(await b.isVisible())) continue;
    await expect(b).toHaveAccessibleName(/\S/);
    seen++;
  }
  return seen;
}

test('plans a fresh lot end to end, exports the shortlist, and keeps it all over a reload', async ({
  page,
  host,
}) => {
  // About 20 s on an idle machine; the margin is for a machine busy with other work.
  test.setTimeout(120_000);

  // A new project, then an invented rural place.
  await openNewLot(page, host, 'Prairie quarter, test lot');
  await expect(page.getByTestId('empty-lot')).toBeVisible();
  await shot(page, 'fresh-empty');
  const goTo = page.getByRole('textbox', { name: 'Go to a locator or coordinates' });
  await goTo.fill('somewhere nice');
  await goTo.press('Enter');
  await expect(page.getByRole('alert').filter({ hasText: /locator such as/ })).toBeVisible();
  await goTo.fill(PLACE);
  await goTo.press('Enter');
  await expect(page.getByRole('alert').filter({ hasText: /locator such as/ })).toHaveCount(0);

  // Fold the planning panel while tracing, so the whole lot fits on the map, and zoom out if needed.
  await page.getByRole('button', { name: 'Fold the planning panel' }).click();
  let mpp = await metresPerPixel(page);
  const mapBox = (await page.getByTestId('map').boundingBox())!;
  while (100 / mpp > mapBox.height * 0.7) {
    await page.getByRole('button', { name: 'Zoom out' }).click();
    await expect.poll(() => metresPerPixel(page)).toBeGreaterThan(mpp * 1.5);
    mpp = await metresPerPixel(page);
  }

  // The lot: 100 m east–west by 80 m north–south, centred on the view.
  await page.keyboard.press('b');
  await clickAt(page, mpp, -50, 40);
  await clickAt(page, mpp, 50, 40);
  await clickAt(page, mpp, 50, -40);
  await clickAt(page, mpp, -50, -40);
  await page.keyboard.press('Enter');
  const summary = page.getByTestId('lot-summary');
  // 8000 m² give or take the scale bar's rounding.
  await expect(summary).toContainText(/Lot (7[6-9]\d\d|8[0-3]\d\d) m²/);
  await expect(page.locator('.yw-side-label')).toHaveCount(4);
  await page.keyboard.press('Escape');

  // Four supports, 35–45 m apart, with heights.
  const supports: [string, number, number, string][] = [
    ['West cottonwood', -35, 20, '18'],
    ['Centre mast', 5, 20, '15'],
    ['East elm', 40, 22, '17.5'],
    ['South box elder', 5, -20, '16'],
  ];
  await addSupports(page, mpp, supports);
  // (A replaced layer's tooltip fades out for a moment: wait for the one that stays.)
  const elmTip = page.locator('.leaflet-tooltip', { hasText: 'East elm · 17.5 m' });
  await expect(elmTip).toHaveCount(1);
  await expect(elmTip).toBeVisible();

  // A building keep-out in the north-west corner, clear of the supports.
  await page.keyboard.press('k');
  await clickAt(page, mpp, -45, 38);
  await clickAt(page, mpp, -45, 28);
  await clickAt(page, mpp, -25, 28);
  await clickAt(page, mpp, -25, 38);
  await page.keyboard.press('Enter');
  await expect(page.getByRole('heading', { name: 'Building' })).toBeVisible();
  await page.getByTestId('keepout-name').fill('House');
  await page.getByTestId('keepout-name').press('Enter');
  await page.getByRole('button', { name: 'Back to list' }).click();
  await expect(page.getByRole('heading', { name: 'Keep-outs (1)' })).toBeVisible();
  await waitSaved(page);
  await shot(page, 'fresh-lot');

  // The accessibility check on the main screen with a lot, supports and a keep-out drawn.
  expect(await expectNamedButtons(page)).toBeGreaterThan(15);

  // Targets: two regions, weighted.
  const dock = page.getByTestId('plan-dock');
  await page.getByRole('button', { name: 'Open the planning panel' }).click();
  await dock.getByRole('tab', { name: /Targets/ }).click();
  await expect(page.getByTestId('station-locator')).toHaveValue(/^DN[0-9]{2}[a-x]{2}$/);
  await expect(page.getByTestId('bearing-map')).toBeVisible();
  const list = page.getByTestId('region-list');
  await list.getByRole('checkbox', { name: 'Europe' }).check();
  await list.getByRole('checkbox', { name: 'Japan' }).check();
  await page.getByRole('spinbutton', { name: 'Weight of Europe' }).fill('3');
  await page.getByRole('spinbutton', { name: 'Weight of Europe' }).press('Tab');
  await page.getByRole('spinbutton', { name: 'Weight of Japan' }).fill('1.5');
  await page.getByRole('spinbutton', { name: 'Weight of Japan' }).press('Tab');
  await expect(dock.getByRole('tab', { name: 'Targets (2)' })).toBeVisible();
  await expect(list.getByTestId('path-figures')).toHaveCount(2);
  await shot(page, 'fresh-targets');

  // 40 m only, then run.
  const bar = page.getByTestId('run-bar');
  await bar.getByRole('checkbox', { name: '40 m' }).check();
  await bar.getByRole('checkbox', { name: '80 m' }).uncheck();
  for (const b of ['160 m', '80 m']) await expect(bar.getByRole('checkbox', { name: b })).not.toBeChecked();
  await waitSaved(page);
  await bar.getByRole('button', { name: 'Run plan' }).click();
  await expect(page.getByTestId('run-status')).toContainText(/\d+ candidates · /, { timeout: 50_000 });
  await dock.getByRole('tab', { name: /Shortlist/ }).click();
  const rows = page.getByTestId('candidate-row');
  expect(await rows.count()).toBeGreaterThan(1);
  await shot(page, 'fresh-shortlist');

  // Select the first: its plots and its overlay on the lot.
  const pathsBefore = await page.locator('.leaflet-overlay-pane path').count();
  await rows.first().click();
  const detail = page.getByTestId('candidate-detail');
  await expect(detail).toBeVisible();
  await expect.poll(() => page.locator('.leaflet-overlay-pane path').count()).toBeGreaterThan(pathsBefore);
  await expect(detail.getByTestId('elevation-plot').locator('svg path')).not.toHaveCount(0);
  await expect(detail.getByTestId('azimuth-plot').locator('svg path')).not.toHaveCount(0);
  await expect(detail.getByTestId('swr-plot').locator('svg path')).not.toHaveCount(0, { timeout: 40_000 });
  for (const id of ['elevation-plot', 'azimuth-plot', 'swr-plot'])
    await expect(detail.getByTestId(id).getByRole('img')).toHaveAccessibleName(/\S/);
  // A half-square or dipole is a line from above: its footprint reads as a length, not "0 m²".
  await expect(detail).not.toContainText(/\b0 m² of the lot/);
  await expect(detail).toContainText(/Footprint\s*(a line [\d.]+ m long|\d+ m² of the lot)/);
  // The run status is cut short in the bar; its whole text is in the tooltip.
  await expect(page.getByTestId('run-status')).toHaveAttribute(
    'title',
    /^\d+ candidates · [\d.]+ s \(\d+ designs solved, \d+ reused\)/,
  );
  expect(await expectNamedButtons(page)).toBeGreaterThan(30);
  await shot(page, 'fresh-selected');
  await detail.getByTestId('swr-plot').scrollIntoViewIfNeeded();
  await shot(page, 'fresh-plots');

  // Compare with the second.
  await detail.getByRole('combobox').filter({ hasText: '—' }).selectOption({ index: 1 });
  await expect(page.getByTestId('azimuth-wins')).toContainText(/stronger over \d+°\s+of\s+azimuth/);
  expect(await expectNamedButtons(page)).toBeGreaterThan(20);
  await shot(page, 'fresh-compare');

  // The shortlist as CSV (from the Shortlist tab): a header and one row per candidate, all for 40 m.
  await page.getByRole('tab', { name: /^Shortlist/ }).click();
  const download = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Shortlist CSV' }).click();
  const file = await download;
  expect(file.suggestedFilename()).toBe('prairie-quarter-test-lot-shortlist.csv');
  const body = Buffer.concat(await (await file.createReadStream()).toArray()).toString('utf8');
  const lines = body.split('\r\n').filter((l) => l !== '');
  expect(lines[0]).toMatch(/^band,rank,type/);
  expect(lines.length).toBeGreaterThan(2);
  expect(lines.slice(1).every((l) => l.startsWith('40m,'))).toBe(true);

  // Everything kept over a reload.
  await page.reload();
  await expect(page.getByTestId('support-list')).toBeVisible();
  await page.getByRole('tab', { name: 'Project' }).click();
  await expect(page.getByTestId('project-name')).toHaveValue('Prairie quarter, test lot');
  await page.getByRole('tab', { name: 'Lot' }).click();
  await expect(summary).toContainText(/Lot (7[6-9]\d\d|8[0-3]\d\d) m²/);
  const supportList = page.getByTestId('support-list');
  for (const [name, , , h] of supports)
    await expect(
      supportList.getByRole('button', { name: new RegExp(`${name}\\s*${Number(h).toFixed(1)} m`) }),
    ).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Keep-outs (1)' })).toBeVisible();
  await expect(page.getByRole('button', { name: /House/ })).toBeVisible();
  await expect(bar.getByRole('checkbox', { name: '40 m' })).toBeChecked();
  await expect(bar.getByRole('checkbox', { name: '80 m' })).not.toBeChecked();
  await dock.getByRole('tab', { name: /Targets/ }).click();
  await expect(page.getByRole('spinbutton', { name: 'Weight of Europe' })).toHaveValue('3');
  await expect(page.getByRole('spinbutton', { name: 'Weight of Japan' })).toHaveValue('1.5');
  await shot(page, 'fresh-reloaded');
});
