// First start: the demo lot opens with its supports, keep-outs and measures.
import { expect, openApp, phrase, shot, test } from './fixtures.ts';

const DEMO_SUPPORTS = [
  'West oak',
  'North oak',
  'Ridge pine',
  'North-east spruce',
  'Yard maple',
  'East ash',
  'Field mast',
  'North-west tower',
];

test('shows the demo lot with its supports, keep-outs and lot size', async ({ page, host }) => {
  await openApp(page, host);
  const list = page.getByTestId('support-list');
  for (const name of DEMO_SUPPORTS) await expect(list.getByRole('button', { name })).toBeVisible();
  await expect(list.getByRole('button', { name: /West oak\s*20\.0 m/ })).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Supports (8)' })).toBeVisible();
  // Labels on the map: name and height of each support, side lengths of the lot.
  await expect(page.locator('.yw-support')).toHaveCount(8);
  await expect(page.locator('.leaflet-tooltip', { hasText: 'North oak · 22.0 m' })).toBeVisible();
  await expect(page.locator('.yw-side-label')).toHaveCount(4);
  await expect(page.getByTestId('lot-summary')).toContainText('Lot 1.69 ha');
  await expect(
    page.locator('.leaflet-tooltip', { hasText: /Distribution line.*keep 25\.0 m clear/ }),
  ).toBeVisible();
  await shot(page, 'demo-lot');
});

test('a power line shows its caution when selected', async ({ page, host }) => {
  await openApp(page, host);
  await page.getByRole('button', { name: /Distribution line along the road/ }).click();
  await expect(page.getByText(phrase('farther from a power line than it could fall'))).toBeVisible();
  await expect(page.getByText(phrase('Defer to local codes'))).toBeVisible();
  await expect(page.getByTestId('keepout-clearance')).toHaveValue('25');
  await shot(page, 'power-line-selected');
});
