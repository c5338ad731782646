// A plan belongs to its project and is kept (issue 14 point 1): plan the demo, reload and find
// the shortlist (with the selected and compared candidates) without running again; open another
// project and find no trace of the demo's plan in the table, on the lot map, on the bearing map
// or in the print view; open the demo again, restart the host, and find it once more; edit the
// lot and read what changed since the plan.
import { expect, type Host, newProject, openAndPlan, openApp, openSupport, shot, test } from './fixtures.ts';
import type { Page } from '@playwright/test';

test.describe.configure({ mode: 'serial' });

/** The demo's plan is on screen as it was kept: its rows, the selected candidate drawn, the compared one too. */
async function expectDemoPlan(page: Page, rows: number, firstRow: string): Promise<void> {
  const dock = page.getByTestId('plan-dock');
  await dock.getByRole('tab', { name: /Shortlist/ }).click();
  await expect(page.getByTestId('candidate-row')).toHaveCount(rows);
  await expect(page.getByTestId('candidate-row').first()).toHaveText(firstRow);
  await expect(page.getByTestId('run-status')).toContainText(/\d+ candidates · kept from /);
  await expect(page.getByTestId('candidate-detail')).toBeVisible();
  await expect(page.locator('.leaflet-overlay-pane path.yw-cand-selected.yw-cand-wire')).not.toHaveCount(0);
  await expect(page.locator('.leaflet-overlay-pane path.yw-cand-compared.yw-cand-wire')).not.toHaveCount(0);
  // Nothing ran: no progress bar appeared and the run button offers a new run.
  await expect(page.getByRole('progressbar', { name: 'Plan progress' })).toHaveCount(0);
}

async function reopen(page: Page, host: Host): Promise<void> {
  await page.goto('about:blank');
  await openApp(page, host);
}

test('keeps the plan with its project through a reload, a switch and a host restart', async ({
  page,
  host,
}) => {
  test.setTimeout(420_000);
  await openAndPlan(page, host, '80 m');
  const detail = page.getByTestId('candidate-detail');
  // Compare the first with the second: the map draws both.
  await detail.getByRole('combobox').filter({ hasText: '—' }).selectOption({ index: 1 });
  await expect(page.locator('.leaflet-overlay-pane path.yw-cand-compared')).not.toHaveCount(0);
  await page
    .getByTestId('plan-dock')
    .getByRole('tab', { name: /Shortlist/ })
    .click();
  const rows = await page.getByTestId('candidate-row').count();
  expect(rows).toBeGreaterThan(3);
  const firstRow = (await page.getByTestId('candidate-row').first().textContent())!;

  // Reload: the plan is back without running again, with the selection and the comparison.
  await page.reload();
  await openApp(page, host);
  await expectDemoPlan(page, rows, firstRow);
  await shot(page, 'keep-after-reload');

  // Another project: no trace of the demo's plan anywhere.
  await newProject(page, 'Empty lot');
  const dock = page.getByTestId('plan-dock');
  await dock.getByRole('tab', { name: /Shortlist/ }).click();
  await expect(page.getByTestId('candidate-row')).toHaveCount(0);
  await expect(page.getByTestId('candidate-detail')).toHaveCount(0);
  await expect(page.locator('.yw-cand')).toHaveCount(0);
  await expect(page.locator('.leaflet-tooltip', { hasText: /°$/ })).toHaveCount(0);
  await expect(page.getByTestId('run-status')).not.toContainText(/candidates/);
  await dock.getByRole('tab', { name: /Targets/ }).click();
  await expect(page.getByTestId('bearing-overlay')).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Build sheet…' })).toHaveCount(0);
  await expect(page.getByRole('dialog', { name: /Print view/ })).toHaveCount(0);
  await shot(page, 'keep-other-project');

  // Back to the demo: its plan again.
  await page.getByRole('tab', { name: 'Project' }).click();
  await page
    .getByTestId('project-list')
    .getByRole('button', { name: /demo lot/ })
    .click();
  await expectDemoPlan(page, rows, firstRow);

  // A print view open on the demo closes when another project opens.
  await page.getByTestId('candidate-detail').getByRole('button', { name: 'Build sheet…' }).click();
  await expect(page.getByRole('dialog', { name: /Print view/ })).toBeVisible();
  await page.keyboard.press('Escape');
  await expect(page.getByRole('dialog', { name: /Print view/ })).toHaveCount(0);

  // Restart the host on the same data: still there.
  await host.restart();
  await reopen(page, host);
  await expectDemoPlan(page, rows, firstRow);

  // An edit the plan reads: the plan stays, marked out of date with what changed.
  await page.getByRole('tab', { name: 'Lot' }).click();
  await openSupport(page, /^West oak/);
  await page.getByRole('button', { name: 'Delete support' }).click();
  await expect(page.getByTestId('plan-stale')).toContainText(
    'Out of date: the supports changed since this plan',
  );
  await expect(page.locator('.yw-stale-label')).toContainText('Out of date');
  await shot(page, 'keep-stale');
});
