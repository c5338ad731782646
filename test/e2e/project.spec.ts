// The project panel: rename, new, recent list, open, duplicate, delete (with confirm), reset demo.
import { expect, newProject, openApp, openSupport, shot, test, waitSaved } from './fixtures.ts';

test('renames, creates, reopens, duplicates and deletes projects', async ({ page, host }) => {
  await openApp(page, host);
  await page.getByRole('tab', { name: 'Project' }).click();
  await page.getByTestId('project-name').fill('Demo, my edits');
  await page.getByTestId('project-name').press('Enter');
  await waitSaved(page);
  const list = page.getByTestId('project-list');
  await expect(list.getByRole('button', { name: /Demo, my edits/ })).toBeVisible();

  await newProject(page, 'Hilltop rental');
  await page.getByRole('tab', { name: 'Lot' }).click();
  await expect(page.getByTestId('empty-lot')).toContainText(
    'No lot boundary yet — press B and click the corners, or type it below.',
  );
  await expect(page.getByText('No supports yet')).toBeVisible();
  await shot(page, 'new-project');

  await page.getByRole('tab', { name: 'Project' }).click();
  await list.getByRole('button', { name: /Demo, my edits/ }).click();
  await expect(page.getByTestId('project-name')).toHaveValue('Demo, my edits');
  await page.getByRole('button', { name: 'Duplicate' }).click();
  await expect(page.getByTestId('project-name')).toHaveValue(/Demo, my edits/);
  await expect(list.getByRole('button')).toHaveCount(3);

  // Delete asks first; Cancel keeps it.
  const current = await page.getByTestId('project-name').inputValue();
  await page.getByRole('button', { name: 'Delete', exact: true }).click();
  await page.getByRole('button', { name: 'Cancel' }).click();
  await expect(list.getByRole('button')).toHaveCount(3);
  await page.getByRole('button', { name: 'Delete', exact: true }).click();
  await expect(page.getByRole('alertdialog')).toContainText(`Delete “${current}” for good?`);
  await page.getByRole('button', { name: 'Yes, delete' }).click();
  await expect(list.getByRole('button')).toHaveCount(2);
  await expect(page.getByTestId('project-name')).not.toHaveValue(current);
});

test('resets the demo after a confirm', async ({ page, host }) => {
  await openApp(page, host);
  await openSupport(page, /^West oak/);
  await page.getByRole('button', { name: 'Delete support' }).click();
  await expect(page.getByRole('heading', { name: 'Supports (7)' })).toBeVisible();
  await waitSaved(page);
  await page.getByRole('tab', { name: 'Project' }).click();
  await page.getByRole('button', { name: 'Reset demo project' }).click();
  await page.getByRole('button', { name: 'Yes, reset demo project' }).click();
  await page.getByRole('tab', { name: 'Lot' }).click();
  await expect(page.getByRole('heading', { name: 'Supports (8)' })).toBeVisible();
  await expect(
    page.getByTestId('support-list').getByRole('button', { name: /West oak\s*20\.0 m/ }),
  ).toBeVisible();
});
