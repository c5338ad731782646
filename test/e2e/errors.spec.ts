// Errors where the eye is (issue 14 point 10): the custom-target form shows its error under the
// field it is about, in view, with the focus there; a weight that is clamped says so.
import type { Locator } from '@playwright/test';
import { expect, openApp, shot, test } from './fixtures.ts';

/** The error sits just under the field (within 40 px) and inside the window. */
async function expectErrorUnder(field: Locator, error: Locator): Promise<void> {
  await expect(error).toBeInViewport();
  const f = (await field.boundingBox())!;
  const e = (await error.boundingBox())!;
  expect(e.y).toBeGreaterThanOrEqual(f.y + f.height - 1);
  expect(e.y - (f.y + f.height)).toBeLessThan(40);
}

test('the custom-target form shows its error next to the field; clamped weights say so', async ({
  page,
  host,
}) => {
  await openApp(page, host);
  const dock = page.getByTestId('plan-dock');
  await dock.getByRole('tab', { name: /Targets/ }).click();
  const form = page.getByTestId('custom-target-form');
  const place = form.getByRole('textbox', { name: /Centre/ });
  const radius = form.getByRole('spinbutton', { name: /Radius/ });
  const error = form.getByTestId('target-error');

  await place.fill('nowhere');
  await form.getByRole('button', { name: 'Add target' }).click();
  await expect(error).toContainText('"nowhere" is neither a locator');
  await expect(place).toBeFocused();
  await expect(place).toHaveAttribute('aria-invalid', 'true');
  await expectErrorUnder(place, error);
  await shot(page, 'target-error-place');

  await place.fill('PM95');
  await radius.fill('6000');
  await form.getByRole('button', { name: 'Add target' }).click();
  await expect(error).toContainText('the radius must be between 1 and 5000 km (6000 was given)');
  await expect(radius).toBeFocused();
  await expectErrorUnder(radius, error);

  // A weight that is clamped says so, and the field shows what was kept.
  const list = page.getByTestId('region-list');
  const europe = list.getByRole('checkbox', { name: 'Europe' });
  if (!(await europe.isChecked())) await europe.check();
  const w = page.getByRole('spinbutton', { name: 'Weight of Europe' });
  await w.fill('1e6');
  await w.press('Tab');
  await expect(w).toHaveValue('100');
  await expect(list.getByTestId('weight-note')).toHaveText(
    '1000000 is more than the largest weight: set to 100',
  );
  await w.fill('-2');
  await w.press('Tab');
  await expect(w).toHaveValue('0');
  await expect(list.getByTestId('weight-note')).toHaveText('a weight cannot be negative: -2 set to 0');
  await shot(page, 'target-weight-clamped');
});
