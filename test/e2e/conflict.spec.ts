// Two windows on one project must not silently undo each other's edits: the second window's save
// from an older base is refused, and the window says so.
import { expect, openApp, shot, test, waitSaved } from './fixtures.ts';

test('a save from a window that missed another window’s edit is refused and the user is told', async ({
  page,
  host,
}) => {
  await openApp(page, host);
  const other = await page.context().newPage();
  await openApp(other, host);

  await page.getByRole('tab', { name: 'Project' }).click();
  await page.getByTestId('project-name').fill('Edited in window A');
  await page.getByTestId('project-name').press('Enter');
  await waitSaved(page);

  await other.getByRole('tab', { name: 'Project' }).click();
  await other.getByTestId('project-name').fill('Edited in window B');
  await other.getByTestId('project-name').press('Enter');
  await expect(other.getByTestId('save-status')).toContainText(/Not saved: .*changed elsewhere/);
  await shot(other, 'save-conflict');

  // Window A's edit is what the store keeps: a fresh window opens it.
  const third = await page.context().newPage();
  await openApp(third, host);
  await third.getByRole('tab', { name: 'Project' }).click();
  await expect(third.getByTestId('project-name')).toHaveValue('Edited in window A');
});
