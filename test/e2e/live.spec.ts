// Live re-ranking (issue 17 point 1): with the demo's plan shown, drag a support; while the mouse
// is still down the shortlist is the provisional one of the drag position (marked so in the run
// bar and above the table); when the drag ends the exact plan of the new position replaces it,
// is kept, and undo marks it out of date.
import { expect, openApp, planAndSelectFirst, shot, test, waitSaved } from './fixtures.ts';

test('the shortlist follows a dragged support and settles to the exact plan when it is dropped', async ({
  page,
  host,
}) => {
  test.setTimeout(420_000);
  await openApp(page, host);
  await planAndSelectFirst(page, '80 m');
  const status = page.getByTestId('run-status');
  await expect(status).toContainText(/\d+ candidates · \d/);
  const live = page.getByTestId('plan-live');
  const banner = page.getByTestId('shortlist-provisional');
  await expect(live).toHaveCount(0);

  const marker = page.locator('.yw-support[title^="West oak"]');
  const at = (await marker.boundingBox())!;
  const x = at.x + at.width / 2;
  const y = at.y + at.height / 2;
  await page.mouse.move(x, y);
  await page.mouse.down();
  await page.mouse.move(x + 6, y + 4, { steps: 3 });
  // Still dragging: the provisional ranking of this position is shown, and marked.
  await expect(live).toBeVisible({ timeout: 60_000 });
  await expect(live).toHaveAttribute('data-live', /provisional|following/);
  await expect(banner).toBeVisible();
  await expect(page.getByTestId('shortlist')).toHaveClass(/provisional/);
  await expect(page.getByTestId('candidate-row').first()).toBeVisible();
  await expect(page.getByTestId('plan-stale')).toHaveCount(0);
  await shot(page, 'live-dragging');
  // Further along: still provisional, now for the newer position (no queue of old positions).
  await page.mouse.move(x + 14, y + 9, { steps: 4 });
  await expect(live).toHaveAttribute('data-live', 'provisional', { timeout: 60_000 });
  await expect(banner).toContainText('Provisional ranking');

  await page.mouse.up();
  await waitSaved(page);
  await expect(page.getByTestId('status-action')).toHaveText('move West oak');
  // Settled: the exact plan of the new position, with no provisional mark and nothing out of date.
  await expect(live).toHaveCount(0, { timeout: 200_000 });
  await expect(banner).toHaveCount(0);
  await expect(status).toContainText(/\d+ candidates · \d/);
  await expect(page.getByTestId('plan-stale')).toHaveCount(0);
  await expect(page.getByTestId('shortlist')).not.toHaveClass(/provisional/);
  await shot(page, 'live-settled');

  // Undo puts the oak back: the kept plan (of the moved oak) is out of date.
  await page.keyboard.press('Control+z');
  await expect(page.getByTestId('plan-stale')).toContainText('supports');
});
