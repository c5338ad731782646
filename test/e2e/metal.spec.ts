// Metal supports and the soil range: the support inspector asks a mast's material and takes a
// tower's dimensions; the shortlist shows each score's range over the soils next to the
// project's and marks a rank that does not hold; the detail says both in words.
import { expect, openApp, planAndSelectFirst, shot, test, waitSaved } from './fixtures.ts';

test('a mast is asked for its material; the shortlist shows the soil range and the metal', async ({
  page,
  host,
}) => {
  test.setTimeout(240_000);
  await page.setViewportSize({ width: 1280, height: 720 });
  await openApp(page, host);
  const list = page.getByTestId('support-list');

  // The field mast: its material is not set, so the inspector asks.
  await list.getByRole('button', { name: /Field mast/ }).click();
  const metal = page.getByTestId('support-metal');
  await expect(page.getByTestId('support-metal-ask')).toContainText('aluminium or steel, or fibreglass');
  await shot(page, 'metal-mast-ask-1280');
  await page.getByTestId('support-material').selectOption('aluminium');
  await expect(page.getByTestId('support-diameter')).toBeVisible();
  await expect(metal.getByTestId('support-grounded')).toBeChecked();
  await waitSaved(page);

  // The tower: steel by default, with its face width.
  await page.getByRole('button', { name: 'Back to list' }).click();
  await list.getByRole('button', { name: /North-west tower/ }).click();
  await expect(page.getByTestId('support-material')).toHaveValue('');
  await expect(page.getByTestId('support-face-width')).toBeVisible();
  await page.setViewportSize({ width: 1440, height: 900 });
  await shot(page, 'metal-tower-1440');

  // Plan 80 m: the score cells carry the soil range, some rank a mark.
  await planAndSelectFirst(page, '80 m');
  const cells = page.getByTestId('score-cell');
  await expect(cells.first()).toContainText(/−?\d+\.\d to −?\d+\.\d/);
  await expect(page.getByTestId('rank-soil-mark').first()).toContainText(/↕\d+–\d+/);
  const detail = page.getByTestId('candidate-detail');
  await expect(detail.getByTestId('soil-range')).toContainText(/Over average soil it scores/);
  await shot(page, 'metal-shortlist-1440');

  // A candidate with the tower in its model says so.
  const withTower = page
    .getByTestId('candidate-row')
    .filter({ hasText: /North-west tower/ })
    .first();
  await withTower.click();
  await expect(detail.getByTestId('metal-supports')).toContainText(/North-west tower \(18\.0 m, grounded\)/);
  await page.setViewportSize({ width: 1280, height: 720 });
  await shot(page, 'metal-detail-1280');
});
