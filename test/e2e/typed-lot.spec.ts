// Setting up a lot without imagery (issue 14 point 6): the empty state says how to add imagery;
// Go visibly moves the map and marks the place; the boundary is typed as width × depth at a
// bearing, and then as sides from a corner, with errors next to their fields.
import geodesic from 'geographiclib-geodesic';
import { clickMap, expect, expectGoMarkInView, newProject, openApp, shot, test } from './fixtures.ts';

test('types a 45 × 30 m lot after going to its place, without imagery', async ({ page, host }) => {
  await openApp(page, host);
  await newProject(page, 'Typed lot');

  const card = page.getByTestId('empty-lot');
  await expect(card.getByTestId('imagery-help')).toContainText('GeoTIFF');
  await expect(card.getByTestId('imagery-help')).toContainText('your own tile address in Settings');
  await expect(card.getByTestId('imagery-help')).toContainText('or choose a public service');

  // Go: the map moves there and the place is marked, in the middle of the map beside the card.
  const goTo = page.getByRole('textbox', { name: 'Go to a locator or coordinates' });
  await goTo.fill('45.12, -93.40');
  await goTo.press('Enter');
  await expect(page.locator('.yw-goto-label')).toContainText('You went to 45.12000, -93.40000');
  await expectGoMarkInView(page);

  // A missing width is refused next to the field.
  const typed = page.getByTestId('typed-boundary');
  await typed.getByRole('spinbutton', { name: 'Depth, m' }).fill('30');
  await typed.getByRole('button', { name: 'Set boundary' }).click();
  await expect(typed.getByTestId('typed-lot-error')).toContainText('width must be a length');

  await typed.getByRole('spinbutton', { name: 'Width, m' }).fill('45');
  await typed.getByRole('spinbutton', { name: 'Bearing of the front side, degrees' }).fill('0');
  await typed.getByRole('button', { name: 'Set boundary' }).click();
  const sides = page.locator('.yw-side-label span');
  await expect(sides).toHaveCount(4);
  // The Go mark goes once the lot is drawn, so that it never covers the lot.
  await expect(page.locator('path.yw-goto')).toHaveCount(0);
  expect((await sides.allTextContents()).sort()).toEqual(['30.0 m', '30.0 m', '45.0 m', '45.0 m']);
  // One geodesic area everywhere: the chip reads the lot measures' WGS84 area.
  await expect(page.getByTestId('lot-summary')).toContainText('Lot 1350 m² · perimeter 150.0 m');
  await shot(page, 'typed-lot-rectangle');

  // A support placed 10 m from the first corner at a bearing of 90°: where the geodesic puts it
  // (GeographicLib's direct problem on WGS84, core/REFERENCES.md §10), to the six decimals shown.
  await page.keyboard.press('s');
  await clickMap(page, 0.5, 0.6);
  const offset = page.getByTestId('support-offset');
  await page.getByText('Place by distance and bearing').click();
  // The first place to start from is shown chosen, and each corner says where it lies.
  await expect(offset.getByRole('combobox', { name: 'Offset from' }).locator('option:checked')).toHaveText(
    'lot corner 1 (SW)',
  );
  await offset.getByRole('combobox', { name: 'Offset from' }).selectOption({ label: 'lot corner 3 (NE)' });
  await offset.getByRole('combobox', { name: 'Offset from' }).selectOption({ label: 'lot corner 1 (SW)' });
  await offset.getByRole('spinbutton', { name: 'Distance, m' }).fill('10');
  await offset.getByRole('spinbutton', { name: 'Bearing, degrees' }).fill('90');
  await offset.getByRole('button', { name: 'Place here' }).click();
  const d = geodesic.Geodesic.WGS84.Direct(45.12, -93.4, 90, 10);
  await expect(page.getByText(`${d.lat2!.toFixed(6)}, ${d.lon2!.toFixed(6)}`)).toBeVisible();
});
