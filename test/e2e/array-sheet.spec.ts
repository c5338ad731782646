// A four-square in the app, quickly: the demo planned for 40 m with the visible "Arrays" option;
// the shortlist names its four directions and which serves each region; its detail draws each
// direction's pattern; its build sheet has the relays for each direction, the control cable, the
// parts in the box and, toward every region, each direction's elevation and azimuth cut with the
// serving one marked. Screenshots at 1280 × 720 land in test-results/screenshots/.
import { expect, openApp, shot, startPlan, test } from './fixtures.ts';

test('a four-square on the demo: directions in the shortlist, the detail and the build sheet', async ({
  page,
  host,
}) => {
  test.setTimeout(60_000);
  await page.setViewportSize({ width: 1280, height: 720 });
  await openApp(page, host);
  const arrays = page.getByTestId('run-bar').getByRole('checkbox', { name: 'Arrays' });
  if (!(await arrays.isChecked())) await arrays.check();
  await startPlan(page, '40 m');
  await expect(page.getByTestId('run-status')).toContainText(/\d+ candidates · /, { timeout: 50_000 });

  const row = page.getByTestId('candidate-row').filter({ hasText: 'Four-square' }).first();
  await expect(row.getByTestId('candidate-states')).toHaveText(/4 directions: \d+°, \d+°, \d+°, \d+°/);
  const marks = await row.getByTestId('serving-state').allTextContents();
  expect(marks.length).toBeGreaterThan(0);
  for (const m of marks) expect(['1', '2', '3', '4']).toContain(m);

  await row.click();
  const detail = page.getByTestId('candidate-detail');
  const legend = detail.getByTestId('state-legend');
  for (const n of [1, 2, 3, 4]) await expect(legend).toContainText(`direction ${n}`);
  await legend.scrollIntoViewIfNeeded();
  await shot(page, 'array-sheet-four-square-detail');

  await detail.getByRole('button', { name: 'Build sheet…' }).click();
  const dialog = page.getByRole('dialog', { name: /Print view/ });
  await expect(dialog).toBeVisible();
  const wiring = dialog.getByRole('heading', { name: 'Which relays for which direction' });
  await expect(wiring).toBeVisible();
  await expect(dialog.getByRole('heading', { name: 'Control cable' })).toBeVisible();
  await expect(dialog.getByRole('cell', { name: '90° hybrid coupler, 50 Ω' })).toBeVisible();
  await wiring.scrollIntoViewIfNeeded();
  await shot(page, 'array-sheet-four-square-wiring');

  // Toward every region: one elevation and one azimuth plot, each with the four directions.
  const groups = dialog.locator('.dir-group');
  const regions = await groups.count();
  expect(regions).toBeGreaterThan(0);
  for (let i = 0; i < regions; i++) {
    const g = groups.nth(i);
    await expect(g.getByRole('heading')).toContainText(/served by direction [1-4] \(beam \d+°\)/);
    await expect(g.locator('svg path.trace')).toHaveCount(8);
    await expect(g.locator('svg path.trace.serving')).toHaveCount(2);
  }
  await groups.first().scrollIntoViewIfNeeded();
  await shot(page, 'array-sheet-four-square-patterns');
  await page.keyboard.press('Escape');
  await expect(dialog).toBeHidden();
});
