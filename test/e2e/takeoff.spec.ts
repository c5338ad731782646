// Take-off angles as a weighted distribution: the target list shows each region's median and
// 10–90 % span; a region's own window is refused with the reason next to the field when it is
// upside down, then taken; a plan uses it (the candidate's figures say "own", the elevation plot
// shades exactly that window) while the other regions keep the computed distribution.
import { expect, openApp, phrase, planAndSelectFirst, shot, test, waitSaved } from './fixtures.ts';

test('a region gets its own take-off window, and the plan uses it', async ({ page, host }) => {
  test.setTimeout(240_000);
  await openApp(page, host);
  const dock = page.getByTestId('plan-dock');
  await dock.getByRole('tab', { name: /Targets/ }).click();
  const list = page.getByTestId('region-list');
  const europe = list.locator('li', { has: page.getByRole('checkbox', { name: 'Europe' }) });
  await expect(europe.getByRole('checkbox', { name: 'Europe' })).toBeChecked();

  // The computed distribution: median and 10–90 % span on the project's band.
  const figs = europe.getByTestId('takeoff-figures');
  await expect(figs).toContainText(phrase('take-off 80 m: median'));
  await expect(figs).toContainText(/10–90 % \d+–\d+°/);
  await shot(page, 'takeoff-targets-computed');

  // An upside-down window is refused, with the reason next to the field; nothing changes.
  await europe.getByRole('button', { name: 'Set your own take-off angles for Europe' }).click();
  const form = europe.getByTestId('takeoff-window-form');
  await form.getByRole('spinbutton', { name: /Lowest take-off angle for Europe/ }).fill('30');
  await form.getByRole('spinbutton', { name: /Highest take-off angle for Europe/ }).fill('10');
  await form.getByRole('button', { name: 'Use' }).click();
  await expect(form.getByTestId('takeoff-window-error')).toHaveText(
    'the lowest angle must not be above the highest',
  );
  await expect(figs).toContainText(phrase('take-off 80 m'));
  await shot(page, 'takeoff-window-refused');

  // A proper window is taken and saved: 25–35° in 1° steps, median 30°, 10–90 % 26–34°.
  await form.getByRole('spinbutton', { name: /Lowest take-off angle for Europe/ }).fill('25');
  await form.getByRole('spinbutton', { name: /Highest take-off angle for Europe/ }).fill('35');
  await form.getByRole('button', { name: 'Use' }).click();
  await expect(europe.getByTestId('takeoff-window-form')).toHaveCount(0);
  await expect(figs).toHaveText(phrase('your angles: median 30°, 10–90 % 26–34°'));
  await waitSaved(page);
  // Japan keeps the computed distribution.
  const japan = list.locator('li', { has: page.getByRole('checkbox', { name: 'Japan' }) });
  await expect(japan.getByTestId('takeoff-figures')).toContainText(phrase('take-off 80 m'));
  await shot(page, 'takeoff-window-set');

  // Plan: the candidate's figures and the elevation plot use the window.
  await planAndSelectFirst(page, '80 m');
  const detail = page.getByTestId('candidate-detail');
  const row = detail.getByTestId('region-gains').locator('tr', { hasText: 'Europe' });
  await expect(row).toContainText('30° (26–34°, own)');
  await expect(detail.getByTestId('region-gains').locator('tr', { hasText: 'Japan' })).not.toContainText(
    'own',
  );
  const shade = detail
    .getByTestId('elevation-plot')
    .locator('[data-testid="takeoff-shade"][data-name="Europe"] rect[data-elevation]');
  await expect(shade).toHaveCount(11);
  const els = await shade.evaluateAll((rs) => rs.map((r) => Number(r.getAttribute('data-elevation'))));
  expect(els).toEqual([25, 26, 27, 28, 29, 30, 31, 32, 33, 34, 35]);
  // Japan's computed distribution is shaded by weight: its bars do not all carry the same weight.
  const jw = await detail
    .getByTestId('elevation-plot')
    .locator('[data-testid="takeoff-shade"][data-name="Japan"] rect[data-weight]')
    .evaluateAll((rs) => rs.map((r) => Number(r.getAttribute('data-weight'))));
  expect(jw.length).toBeGreaterThan(3);
  expect(Math.max(...jw)).toBeGreaterThan(1.5 * Math.min(...jw));
  await detail.getByTestId('elevation-plot').scrollIntoViewIfNeeded();
  await shot(page, 'takeoff-plan-elevation');

  // Back to the computed angles.
  await dock.getByRole('tab', { name: /Targets/ }).click();
  await europe.getByRole('button', { name: 'Use the computed take-off angles for Europe' }).click();
  await expect(figs).toContainText(phrase('take-off 80 m'));
  await waitSaved(page);
});
