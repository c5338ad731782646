/**
 * The print view of the build sheet: plan the demo lot for 40 m, open the first candidate's build
 * sheet in the view, every section inside the view's shadow root with the report's own styles
 * (and none of them in the app), the toolbar (Print…, Save as PDF… explained in browser mode,
 * Save HTML, Close), print media showing only the report and flowing over several pages, a PDF
 * from the print layout, Escape closing it with focus back on the Build sheet button.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { REPORT_SECTIONS } from '../../core/report/html.ts';
import { expect, openAndPlan, shot, test } from './fixtures.ts';

const REPORT_BLUE = 'rgb(47, 93, 124)'; // the report's heading colour (core/report/html.ts)

test('the build sheet opens in the print view and prints only the report', async ({ page, host }) => {
  test.setTimeout(240_000);
  await openAndPlan(page, host, '40 m');
  const detail = page.getByTestId('candidate-detail');
  const sheetButton = detail.getByRole('button', { name: 'Build sheet…' });

  // The button opens the view through showBuildSheet, which remembers it for focus on close.
  const dialog = page.getByRole('dialog', { name: /Print view/ });
  await sheetButton.click();
  await expect(dialog).toBeVisible();
  await expect(dialog).toHaveAttribute('aria-modal', 'true');
  const toolbar = dialog.getByRole('toolbar', { name: 'Print view' });
  await expect(toolbar.getByRole('button', { name: 'Print…' })).toBeFocused();

  // Every section, inside the shadow root, in the report's own styles.
  const reportHost = page.getByTestId('report-host');
  await expect(dialog.getByRole('heading', { level: 1 })).toContainText('Build sheet');
  for (const h of REPORT_SECTIONS)
    await expect(dialog.getByRole('heading', { level: 2, name: h, exact: true })).toBeVisible();
  const inShadow = await reportHost.evaluate((el) => ({
    h2: [...(el.shadowRoot?.querySelectorAll('h2') ?? [])].map((h) => h.textContent),
    h2Colour: getComputedStyle(el.shadowRoot!.querySelector('h2')!).color,
    scripts: el.shadowRoot!.querySelectorAll('script').length,
    inLightDom: el.querySelectorAll('*').length,
  }));
  expect(inShadow).toEqual({ h2: [...REPORT_SECTIONS], h2Colour: REPORT_BLUE, scripts: 0, inLightDom: 0 });
  // The lot drawing is shown with the antenna's wires in it (a wire seen from above may be a
  // horizontal line, whose box has no height, so the drawing is what must be visible).
  await expect(dialog.locator('svg.lot').first()).toBeVisible();
  expect(await dialog.locator('svg.lot .wire').count()).toBeGreaterThan(0);
  // Nothing leaks out: the app's own headings keep their colour, no report rule reaches the page.
  expect(await detail.locator('h2').evaluate((h) => getComputedStyle(h).color)).not.toBe(REPORT_BLUE);
  expect(
    await page.evaluate(() =>
      [...document.querySelectorAll('style')].some((s) => s.textContent?.includes('#2f5d7c')),
    ),
  ).toBe(false);

  // Toolbar: print, PDF explained in browser mode, save HTML; Tab stays inside the dialog.
  await page.evaluate(() => {
    (window as unknown as { printed: number }).printed = 0;
    window.print = () => void (window as unknown as { printed: number }).printed++;
  });
  await toolbar.getByRole('button', { name: 'Print…' }).click();
  expect(await page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1);
  const pdfButton = toolbar.getByRole('button', { name: 'Save as PDF…' });
  await expect(pdfButton).toHaveAttribute('aria-disabled', 'true');
  await expect(pdfButton).toHaveAttribute('title', /desktop app/);
  // aria-disabled (so its tooltip still shows): Playwright will not click it; a keyboard user can press it.
  await pdfButton.focus();
  await page.keyboard.press('Enter');
  await expect(dialog.getByRole('status')).toContainText('saved by the desktop app');
  const saved = page.waitForEvent('download');
  await toolbar.getByRole('button', { name: 'Save HTML' }).click();
  expect((await saved).suggestedFilename()).toMatch(/^build-sheet-40m-.*\.html$/);
  for (let i = 0; i < 7; i++) {
    await page.keyboard.press(i % 3 === 2 ? 'Shift+Tab' : 'Tab');
    expect(await dialog.evaluate((d) => d.contains(document.activeElement))).toBe(true);
  }
  await page.setViewportSize({ width: 1200, height: 860 });
  await toolbar.getByRole('button', { name: 'Print…' }).focus();
  await shot(page, 'printview');

  // Print media: the app is gone, the report is all there is, and it flows over several pages.
  await page.emulateMedia({ media: 'print' });
  await expect(toolbar).toBeHidden();
  for (const id of ['plan-dock', 'map', 'candidate-detail']) await expect(page.getByTestId(id)).toBeHidden();
  await expect(page.getByRole('tab', { name: 'Lot' })).toBeHidden();
  for (const h of REPORT_SECTIONS)
    await expect(page.getByRole('heading', { level: 2, name: h, exact: true })).toBeVisible();
  const layout = await reportHost.evaluate((el) => ({
    position: getComputedStyle(el.closest('[role="dialog"]')!).position,
    bodyMargin: getComputedStyle(el.shadowRoot!.querySelector('.report-body')!).marginTop,
    height: el.getBoundingClientRect().height,
  }));
  expect(layout.position).toBe('static');
  expect(layout.bodyMargin).toBe('0px'); // the report's own print rule, inside the shadow root
  await page.screenshot({ path: join('test-results', 'screenshots', 'printview-print.png'), fullPage: true });
  const pdf = await page.pdf({ format: 'A4', printBackground: true });
  writeFileSync(join('test-results', 'printview.pdf'), pdf);
  const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page(?!s)/g) ?? []).length;
  expect(pages, 'the report flows over several pages').toBeGreaterThanOrEqual(3);
  await page.emulateMedia({ media: 'screen' });

  // Escape closes; focus is back on the Build sheet button.
  await page.keyboard.press('Escape');
  await expect(dialog).toHaveCount(0);
  await expect(sheetButton).toBeFocused();
  await expect(page.getByTestId('plan-dock')).toBeVisible();
});
