/**
 * The station report: the demo build sheet generated through the command (`report --demo`) into
 * a temporary file, opened in Chromium from file://, offline (every request that is not the
 * report file itself or a data:/blob: URL is aborted and fails the test), every section heading
 * on the page, and a screenshot as an artefact.
 */
import { test, expect } from '@playwright/test';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { runReport } from '../../core/cli/report.ts';
import { REPORT_SECTIONS } from '../../core/report/html.ts';
import { openAndPlan, openApp, planAndSelectFirst, shot, test as appTest } from './fixtures.ts';

test('the demo build sheet opens standalone with every section', async ({ page, context }) => {
  test.setTimeout(180_000);
  const dir = mkdtempSync(join(tmpdir(), 'yardwire-report-'));
  try {
    const out = join(dir, 'report.html');
    const err: string[] = [];
    const code = await runReport(
      ['--demo', '--out', out, '--power', '400', '--mode', 'cw', '--workers', '2'],
      {
        stdout: () => {},
        stderr: (s) => err.push(s),
        readFile: () => Promise.reject(new Error('no files in this test')),
      },
    );
    expect(code, err.join('')).toBe(0);

    const fileUrl = pathToFileURL(out).href;
    const blocked: string[] = [];
    await context.route('**/*', (route) => {
      const url = route.request().url();
      if (url === fileUrl || url.startsWith('data:') || url.startsWith('blob:')) return route.continue();
      blocked.push(url);
      return route.abort('blockedbyclient');
    });
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(String(e)));
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });

    await page.goto(fileUrl);
    await expect(page.getByRole('heading', { level: 1 })).toContainText('Build sheet');
    for (const h of REPORT_SECTIONS)
      await expect(page.getByRole('heading', { level: 2, name: h, exact: true })).toBeVisible();
    await expect(page.getByRole('img', { name: /^Lot plan of / })).toBeVisible();
    const detail = page.getByRole('img', { name: /^Antenna detail of / });
    await expect(detail).toBeVisible();
    await expect(detail.locator('.wire').first()).toBeVisible();
    await expect(detail.locator('.feed')).toHaveCount(1);
    await expect(page.getByText(/reactive near field reaches about/)).toBeVisible();
    await expect(page.getByText(/kHz per cm/)).toBeVisible();
    await page.setViewportSize({ width: 900, height: 860 });
    await page.screenshot({ path: join('test-results', 'screenshots', 'report.png'), fullPage: true });
    // Print layout renders without errors too.
    await page.emulateMedia({ media: 'print' });
    await expect(page.getByRole('heading', { level: 2, name: 'Cautions' })).toBeVisible();

    expect(blocked, 'the report must load nothing from elsewhere').toEqual([]);
    expect(errors, 'no errors in the page').toEqual([]);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
});

test.describe('build sheet from the app', () => {
  appTest(
    'the candidate detail opens the build sheet, which saves as a standalone HTML file',
    async ({ page, host }) => {
      appTest.setTimeout(240_000);
      await openAndPlan(page, host, '40 m');
      const detail = page.getByTestId('candidate-detail');
      await detail.getByRole('button', { name: 'Build sheet…' }).click();
      const view = page.getByTestId('report-view');
      await expect(view).toBeVisible();
      const download = page.waitForEvent('download');
      await view.getByRole('button', { name: 'Save HTML' }).click();
      const file = await download;
      expect(file.suggestedFilename()).toMatch(/^build-sheet-40m-.*\.html$/);
      const html = Buffer.concat(await (await file.createReadStream()).toArray()).toString('utf8');
      for (const h of REPORT_SECTIONS) expect(html).toContain(`<h2>${h}</h2>`);
      expect(html).toContain('Larkspur Ridge');
      // The sheet carries the station settings of the project and the zones on the lot.
      expect(html).toContain('Where the zones reach on the lot');
      expect(html).toContain('100 W PEP, ssb');
      await shot(page, 'report-button');
    },
  );
});

test.describe('imperial build sheet', () => {
  appTest('with feet chosen, the build sheet from the app holds no metre lengths', async ({ page, host }) => {
    appTest.setTimeout(240_000);
    await page.setViewportSize({ width: 1280, height: 720 });
    await openApp(page, host);
    await page.getByRole('button', { name: 'Imperial units (feet)' }).click();
    await planAndSelectFirst(page, '40 m');
    const detail = page.getByTestId('candidate-detail');
    await detail.getByRole('button', { name: 'Build sheet…' }).click();
    const view = page.getByTestId('report-view');
    await expect(view).toBeVisible();
    await shot(page, 'report-imperial-1280');
    const download = page.waitForEvent('download');
    await view.getByRole('button', { name: 'Save HTML' }).click();
    const html = Buffer.concat(await (await (await download).createReadStream()).toArray()).toString('utf8');
    const text = html
      .replace(/<style>[\s\S]*?<\/style>/, '')
      .replace(/<title>[\s\S]*?<\/title>/g, ' ')
      .replace(/<[^>]+>/g, ' ');
    // A metric length: a number then m, cm, mm or metres; band names ("40 m band") aside.
    const metric = text.match(/.{0,40}\d\s?(?:m|cm|mm|metres?)\b(?!\s*band).{0,10}/);
    expect(metric?.[0] ?? null, 'a metric length on the imperial sheet').toBeNull();
    expect(text).toMatch(/\d+ ft \d+(?:¼|½|¾)? in/);
    expect(text).toMatch(/dB\/100 ft/);
    // The whole sheet as it prints, at 1280 wide, for a person to look at.
    const sheet = await page.context().newPage();
    await sheet.route('**/*', (r) => (r.request().url().startsWith('data:') ? r.continue() : r.abort()));
    await sheet.setViewportSize({ width: 1280, height: 720 });
    await sheet.setContent(html);
    await sheet.screenshot({
      path: join('test-results', 'screenshots', 'report-imperial-full.png'),
      fullPage: true,
    });
    await sheet.close();
  });
});
