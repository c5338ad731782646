// Arrays in the app: the invented example lot with four supports near a rectangle (and a fifth
// making an L) is planned for 80 m with the visible "Arrays" option; the shortlist names each
// switched array's directions and which one serves each region; the detail draws each direction's
// pattern; the map draws every element, the array's coax and its relay box; the build sheet has
// the relay box and control wiring and the array's parts in the bill of materials. Screenshots
// at 1280 × 720 land in test-results/screenshots/.
import { readFileSync } from 'node:fs';
import { apiCall, expect, openApp, shot, startPlan, test } from './fixtures.ts';

const EXAMPLE = 'data/examples/four-supports-near-a-rectangle.json';

test('plans the half-square arrays on a lot with four supports near a rectangle', async ({ page, host }) => {
  test.setTimeout(300_000);
  await page.setViewportSize({ width: 1280, height: 720 });
  const lot = JSON.parse(readFileSync(EXAMPLE, 'utf8')) as { id: string };
  await apiCall(page.request, host, 'saveProject', { project: lot });
  await apiCall(page.request, host, 'openProject', { id: lot.id });
  await openApp(page, host);

  // The option is visible in the run bar, on for this project (its settings say so).
  const arrays = page.getByTestId('run-bar').getByRole('checkbox', { name: 'Arrays' });
  await expect(arrays).toBeVisible();
  await expect(arrays).toBeChecked();
  await startPlan(page, '80 m');
  await expect(page.getByTestId('run-status')).toContainText(/\d+ candidates · /, { timeout: 280_000 });

  // The switched pair: its two directions, and a direction number beside each region's gain.
  const rows = page.getByTestId('candidate-row');
  const pair = rows.filter({ hasText: 'Switched half-square pair' });
  await expect(pair).toHaveCount(1);
  await expect(pair.getByTestId('candidate-states')).toHaveText(/2 directions: \d+°, \d+°/);
  const marks = await pair.getByTestId('serving-state').allTextContents();
  expect(marks.length).toBe(3);
  expect(new Set(marks)).toEqual(new Set(['1', '2']));
  await expect(page.getByTestId('score-explained')).toContainText('which direction');

  // Its detail: each direction's pattern; on the map both half-squares, the coax and the box.
  await pair.click();
  const detail = page.getByTestId('candidate-detail');
  await expect(detail.getByTestId('state-legend')).toContainText('direction 1');
  await expect(detail.getByTestId('state-legend')).toContainText('direction 2');
  // What the feed network achieves: both elements' drive impedances and currents.
  await expect(detail.getByTestId('array-feed').getByRole('row')).toHaveCount(3);
  await expect(detail.getByTestId('array-note')).toContainText('South America');
  await detail.getByTestId('state-legend').scrollIntoViewIfNeeded();
  await shot(page, 'arrays-switched-pair-patterns');
  await detail.getByTestId('array-note').scrollIntoViewIfNeeded();
  await shot(page, 'arrays-switched-pair-detail');
  await expect(page.locator('path.yw-cand-coax')).toHaveCount(2);
  await expect(page.locator('path.yw-cand-box')).toHaveCount(1); // both lines meet at the one box
  await expect(page.locator('path.yw-cand-feed')).toHaveCount(2);
  expect(await page.locator('path.yw-cand-wire').count()).toBeGreaterThanOrEqual(6);
  await shot(page, 'arrays-switched-pair-map');

  // The build sheet: relay box, relays and control wiring, and the array's parts in the bill.
  await detail.getByRole('button', { name: 'Build sheet…' }).click();
  const dialog = page.getByRole('dialog', { name: /Print view/ });
  await expect(dialog).toBeVisible();
  await expect(dialog.getByRole('heading', { name: 'Array: relay box and control wiring' })).toBeVisible();
  await expect(dialog.getByText(/K1, double-pole double-throw/).first()).toBeVisible();
  await expect(dialog.getByRole('cell', { name: 'Relays, 12 V DC coil' })).toBeVisible();
  await expect(
    dialog.getByRole('cell', { name: 'Coaxial cable for the array’s lines and stubs' }),
  ).toBeVisible();
  await dialog.getByRole('heading', { name: 'Array: relay box and control wiring' }).scrollIntoViewIfNeeded();
  await shot(page, 'arrays-switched-pair-sheet-wiring');
  await dialog.getByRole('heading', { name: 'Bill of materials', exact: true }).scrollIntoViewIfNeeded();
  await shot(page, 'arrays-switched-pair-sheet-bom');
  await page.keyboard.press('Escape');
  await expect(dialog).toBeHidden();

  // The L and the fixed reflector are drawn too.
  for (const [name, file] of [
    ['Half-square L (switched)', 'arrays-l-map'],
    ['Half-square + reflector', 'arrays-reflector-map'],
  ] as const) {
    // The best placement of each (the L may stand on more than one set of three supports).
    const row = rows.filter({ hasText: name }).first();
    await expect(row).toBeVisible();
    await row.click();
    await expect(page.locator('path.yw-cand-feed')).toHaveCount(2);
    await shot(page, file);
  }

  // Turning the option off marks the plan out of date (it changes what is planned).
  await arrays.uncheck();
  await expect(page.getByTestId('plan-stale')).toBeVisible();
});
