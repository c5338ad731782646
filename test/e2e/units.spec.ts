// Metric and imperial: every length shown and typed in the chosen unit, stored in metres.
import { expect, openApp, shot, test, waitSaved } from './fixtures.ts';

test('switches to imperial and back; heights typed in feet are kept', async ({ page, host }) => {
  await openApp(page, host);
  const list = page.getByTestId('support-list');
  await page.getByRole('button', { name: 'Imperial units (feet)' }).click();
  await expect(list.getByRole('button', { name: /West oak\s*65\.6 ft/ })).toBeVisible();
  await expect(page.locator('.leaflet-tooltip', { hasText: 'North oak · 72.2 ft' })).toBeVisible();
  await expect(page.locator('.yw-side-label').first()).toContainText('ft');
  await expect(page.getByTestId('lot-summary')).toContainText('4.17 acres');
  await expect(page.locator('.leaflet-control-scale-line')).toContainText('ft');

  await list.getByRole('button', { name: /^Yard maple/ }).click();
  await expect(page.getByTestId('support-height')).toHaveValue('45.93');
  await page.getByTestId('support-height').fill('50');
  await page.getByTestId('support-height').press('Enter');
  await waitSaved(page);
  await shot(page, 'imperial');

  await page.reload();
  await expect(page.getByRole('button', { name: 'Imperial units (feet)' })).toHaveAttribute(
    'aria-pressed',
    'true',
  );
  await page.getByRole('button', { name: 'Metric units (metres)' }).click();
  await expect(list.getByRole('button', { name: /Yard maple\s*15\.2 m/ })).toBeVisible();
  await expect(page.getByTestId('lot-summary')).toContainText('1.69 ha');
});

test('settings take lengths in the chosen unit', async ({ page, host }) => {
  await openApp(page, host);
  await page.getByRole('button', { name: 'Imperial units (feet)' }).click();
  await page.getByRole('tab', { name: 'Settings' }).click();
  const lowest = page.getByLabel('Lowest wire end above ground');
  await expect(lowest).toHaveValue('8.2');
  await lowest.fill('10');
  await lowest.press('Enter');
  await waitSaved(page);
  await page.getByRole('radio', { name: 'Metric (m)' }).check();
  await expect(lowest).toHaveValue('3.05');
  await page.getByTestId('soil').selectOption('poor');
  await expect(page.getByText('Sandy or stony soil, drier ground.')).toBeVisible();
  await expect(page.getByText(/Source: common practice/)).toBeVisible();
  await expect(page.getByText(/keep them above anyone's reach/)).toBeVisible();
  await shot(page, 'settings');
});
