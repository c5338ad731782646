/**
 * Fixtures for the end-to-end tests: a fresh browser-mode host per test (its own free port and
 * its own temporary data folder), a page that may reach only the loopback host, and helpers to
 * restart the host on the same data and to save screenshots as artefacts.
 */
import { test as base, expect, type APIRequestContext, type Page } from '@playwright/test';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const SERVER_ENTRY = 'dist/server/serve.mjs';
const READY_LINE = /^Yardwire is running at (http:\/\/127\.0\.0\.1:\d+\/#token=[A-Za-z0-9_-]+)$/m;
const START_TIMEOUT_MS = 15_000;

export interface Host {
  /** The address printed by the host, token included. */
  url: string;
  dataDir: string;
  /** Stop the host and start it again on the same data folder (a new port and token). */
  restart(): Promise<void>;
  /** Stop the host (a later restart() starts it again). */
  stop(): Promise<void>;
  /** True once the test has stopped the host at least once (refused connections are then expected). */
  wasStopped: boolean;
}

function startHost(dataDir: string): Promise<{ child: ChildProcess; url: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [SERVER_ENTRY], {
      env: { ...process.env, YARDWIRE_PORT: '0', YARDWIRE_DATA_DIR: dataDir },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    let err = '';
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`host did not print its address within ${START_TIMEOUT_MS} ms\n${out}${err}`));
    }, START_TIMEOUT_MS);
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const m = READY_LINE.exec(out);
      if (m?.[1]) {
        clearTimeout(timer);
        resolve({ child, url: m[1] });
      }
    });
    child.stderr!.on('data', (d: Buffer) => (err += d.toString()));
    child.on('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`host exited (${code}) before it was ready\n${out}${err}`));
    });
  });
}

function stopHost(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null) return resolve();
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
  });
}

const isLoopback = (url: string): boolean => {
  if (url.startsWith('data:') || url.startsWith('blob:')) return true;
  try {
    return new URL(url).hostname === '127.0.0.1';
  } catch {
    return false;
  }
};

export const test = base.extend<{ host: Host; blocked: string[] }>({
  host: async ({}, use) => {
    const dataDir = mkdtempSync(join(tmpdir(), 'yardwire-e2e-'));
    let running = await startHost(dataDir);
    const host: Host = {
      url: running.url,
      dataDir,
      restart: async () => {
        // The window may ask while the server is down (a refused connection is expected then).
        host.wasStopped = true;
        await stopHost(running.child);
        running = await startHost(dataDir);
        host.url = running.url;
      },
      stop: () => {
        host.wasStopped = true;
        return stopHost(running.child);
      },
      wasStopped: false,
    };
    await use(host);
    await stopHost(running.child);
    rmSync(dataDir, { recursive: true, force: true });
  },
  blocked: async ({ context }, use) => {
    const blocked: string[] = [];
    await context.route('**/*', (route) => {
      const url = route.request().url();
      if (isLoopback(url)) return route.continue();
      blocked.push(url);
      return route.abort('blockedbyclient');
    });
    await use(blocked);
  },
  page: async ({ page, blocked, host }, use) => {
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(String(e)));
    page.on('console', (m) => {
      if (m.type() !== 'error') return;
      const text = m.text();
      // The browser logs each aborted request; `blocked` already lists (and fails on) those.
      if (text.startsWith('Failed to load resource: net::ERR_BLOCKED_BY_CLIENT')) return;
      if (host.wasStopped && text.startsWith('Failed to load resource: net::ERR_CONNECTION_REFUSED')) return;
      errors.push(text);
    });
    await use(page);
    expect(blocked, 'the app must not reach beyond the loopback host').toEqual([]);
    expect(errors, 'no script errors in the page').toEqual([]);
  },
});

export { expect };

/** Call the host's API as the page would (token header), expecting success; returns the value. */
export async function apiCall(
  req: APIRequestContext,
  host: Host,
  name: string,
  body: unknown,
): Promise<unknown> {
  const base = host.url.replace(/#.*$/, '');
  const token = /#token=([A-Za-z0-9_-]+)/.exec(host.url)![1]!;
  const res = await req.post(`${base}api/${name}`, {
    headers: { 'content-type': 'application/json', 'x-yardwire-token': token },
    data: body,
  });
  const out = (await res.json()) as { ok: boolean; value?: unknown; error?: unknown };
  expect(out.ok, JSON.stringify(out.error)).toBe(true);
  return out.value;
}

/** Open the app at the host's address and wait until the project is on screen. */
export async function openApp(page: Page, host: Host): Promise<void> {
  await page.goto(host.url);
  await expect(page.getByRole('tab', { name: 'Lot' })).toBeVisible();
  await expect(page.locator('.leaflet-container')).toBeVisible();
  await expect(page.getByText('Opening the project…')).toHaveCount(0);
}

/** Open the app, plan one band and select the plan's first candidate. */
export async function openAndPlan(page: Page, host: Host, band: '160 m' | '80 m' | '40 m'): Promise<void> {
  await openApp(page, host);
  await planAndSelectFirst(page, band);
}

/** Create a new project of this name from the Project tab (it opens at once). */
export async function newProject(page: Page, name: string): Promise<void> {
  await page.getByRole('tab', { name: 'Project' }).click();
  await page.getByRole('button', { name: 'New…' }).click();
  await page.getByLabel('Name of the new project').fill(name);
  await page.getByRole('button', { name: 'Create' }).click();
  await expect(page.getByTestId('project-name')).toHaveValue(name);
}

/** Open the app, create a new project of this name and show its (empty) lot. */
export async function openNewLot(page: Page, host: Host, name: string): Promise<void> {
  await openApp(page, host);
  await newProject(page, name);
  await page.getByRole('tab', { name: 'Lot' }).click();
}

/** Open the support whose list entry matches `name` (e.g. /^West oak/) in the inspector. */
export async function openSupport(page: Page, name: RegExp): Promise<void> {
  await page.getByTestId('support-list').getByRole('button', { name }).click();
}

/** Metres per screen pixel, read from the map's scale bar (its label and drawn width). */
export async function metresPerPixel(page: Page): Promise<number> {
  const line = page.locator('.leaflet-control-scale-line').first();
  const label = (await line.textContent())!.trim();
  const m = /^([\d.]+)\s*(m|km)$/.exec(label);
  expect(m, `scale bar label "${label}"`).not.toBeNull();
  return (Number(m![1]) * (m![2] === 'km' ? 1000 : 1)) / (await line.boundingBox())!.width;
}

/** Click the map at an offset in metres (east, north) from the map's centre. */
export async function clickAt(page: Page, mpp: number, east: number, north: number): Promise<void> {
  const box = (await page.getByTestId('map').boundingBox())!;
  await page.mouse.click(box.x + box.width / 2 + east / mpp, box.y + box.height / 2 - north / mpp);
}

/**
 * Add supports with the keyboard (S, click, height, name), each [name, east m, north m, height as
 * typed] from the map's centre, on a lot that had none; the list then counts just these.
 */
export async function addSupports(
  page: Page,
  mpp: number,
  supports: [string, number, number, string][],
): Promise<void> {
  for (const [name, e, n, h] of supports) {
    await page.keyboard.press('s');
    await clickAt(page, mpp, e, n);
    await expect(page.getByTestId('support-height')).toBeFocused();
    await page.keyboard.type(h);
    await page.keyboard.press('Enter');
    await page.getByTestId('support-name').fill(name);
    await page.getByTestId('support-name').press('Enter');
    await page.getByRole('button', { name: 'Back to list' }).click();
  }
  await expect(page.getByRole('heading', { name: `Supports (${supports.length})` })).toBeVisible();
}

/** Tick only this band in the run bar (the others off) and start the plan. */
export async function startPlan(page: Page, band: '160 m' | '80 m' | '40 m'): Promise<void> {
  const bar = page.getByTestId('run-bar');
  // The band asked for first: the last ticked band cannot be unticked.
  const box = bar.getByRole('checkbox', { name: band });
  if (!(await box.isChecked())) await box.check();
  for (const b of ['160 m', '80 m', '40 m'].filter((x) => x !== band)) {
    const other = bar.getByRole('checkbox', { name: b });
    if (await other.isChecked()) await other.uncheck();
  }
  await bar.getByRole('button', { name: /Run plan|Run again/ }).click();
}

/** Plan one band, wait for the shortlist and select its first candidate. */
export async function planAndSelectFirst(page: Page, band: '160 m' | '80 m' | '40 m'): Promise<void> {
  await startPlan(page, band);
  await expect(page.getByTestId('run-status')).toContainText(/\d+ candidates · /, { timeout: 200_000 });
  // A plan of several bands is grouped by band: take the first row of the band asked for.
  const group = page
    .locator('tbody')
    .filter({ has: page.getByTestId('band-group').filter({ hasText: band }) });
  const rows = (await group.count()) ? group.getByTestId('candidate-row') : page.getByTestId('candidate-row');
  await rows.first().click();
}

/** Wait until the last edit has reached the store. */
export async function waitSaved(page: Page): Promise<void> {
  await expect(page.getByTestId('save-status')).toHaveText('Saved');
}

/** Click the map at a fraction of its width and height (0..1 from the top-left corner). */
export async function clickMap(page: Page, fx: number, fy: number): Promise<void> {
  const box = (await page.getByTestId('map').boundingBox())!;
  await page.mouse.click(box.x + box.width * fx, box.y + box.height * fy);
}

/**
 * The "You went to" mark of a Go sits in the middle of the part of the map that the empty-lot
 * card (when shown) leaves in view, with nothing of the app's own over it.
 */
export async function expectGoMarkInView(page: Page): Promise<void> {
  const mark = (await page.locator('path.yw-goto').boundingBox())!;
  const map = (await page.getByTestId('map').boundingBox())!;
  const card = page.getByTestId('empty-lot');
  const cardBox = (await card.isVisible()) ? await card.boundingBox() : null;
  const left = cardBox ? cardBox.x + cardBox.width : map.x;
  const x = mark.x + mark.width / 2;
  const y = mark.y + mark.height / 2;
  expect(Math.abs(x - (left + map.x + map.width) / 2)).toBeLessThan(3);
  expect(Math.abs(y - (map.y + map.height / 2))).toBeLessThan(3);
  const onTop = await page.evaluate(
    ([px, py]) =>
      document.elementFromPoint(px!, py!)?.closest('.leaflet-container, [data-testid]')?.className,
    [x, mark.y + 1],
  );
  expect(onTop, 'what lies over the mark').toContain('leaflet-container');
}

/** Save a screenshot as a test artefact under test-results/screenshots/. */
export async function shot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: join('test-results', 'screenshots', `${name}.png`) });
}

/** A pattern for a phrase that matches whatever whitespace (line breaks included) sits between its words. */
export function phrase(text: string): RegExp {
  const escaped = text
    .trim()
    .split(/\s+/)
    .map((w) => w.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'));
  return new RegExp(escaped.join('\\s+'));
}
