// Under load: a generated lot of 40 supports (780 support pairs, several hundred designs to
// solve) is planned in the workers with progress, cancelled at two points, kept responsive, and
// survives injected worker failures (a throw, a worker that closes itself) with the project
// intact. The whole plan is never waited for: the test cancels instead.
import type { Page } from '@playwright/test';
import { apiCall, expect, openApp, test, waitSaved } from './fixtures.ts';

test.describe.configure({ mode: 'serial' });

/** A small seeded generator (mulberry32), so the lot is the same on every run. */
function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** An invented 300 m × 300 m lot with 40 supports on a jittered 8 × 5 grid, 10–25 m high. */
function fortySupportLot(): Record<string, unknown> & { supports: { id: string; usableHeightM: number }[] } {
  const origin = [-97.2841, 41.6203];
  const mPerDegLat = 111_132.954;
  const ll = (e: number, n: number): [number, number] => {
    const mPerDegLon = mPerDegLat * Math.cos((origin[1]! * Math.PI) / 180);
    return [
      Math.round((origin[0]! + e / mPerDegLon) * 1e7) / 1e7,
      Math.round((origin[1]! + n / mPerDegLat) * 1e7) / 1e7,
    ];
  };
  const r = seeded(40);
  const supports = Array.from({ length: 40 }, (_, i) => {
    const col = i % 8;
    const row = Math.floor(i / 8);
    const e = 25 + col * 35 + (r() - 0.5) * 16;
    const n = 30 + row * 60 + (r() - 0.5) * 20;
    return {
      id: `s${String(i + 1).padStart(2, '0')}`,
      name: `Support ${i + 1}`,
      kind: i % 5 === 0 ? 'mast' : 'tree',
      position: ll(e, n),
      usableHeightM: Math.round((10 + r() * 15) * 10) / 10,
      notes: '',
    };
  });
  return {
    schemaVersion: 1,
    id: 'load-forty',
    name: 'Forty supports (load test)',
    notes: '',
    boundary: { type: 'Polygon', coordinates: [[ll(0, 0), ll(300, 0), ll(300, 300), ll(0, 300), ll(0, 0)]] },
    supports,
    keepOuts: [],
    station: ll(150, 150),
    soil: { classId: 'average' },
    targets: [{ regionId: 'europe', weight: 1 }],
    bands: ['80m'],
  };
}

/** The page's JS heap in use, MB (Chromium, through the DevTools protocol). */
async function heapMB(page: Page): Promise<number> {
  const cdp = await page.context().newCDPSession(page);
  try {
    const h = (await cdp.send('Runtime.getHeapUsage')) as { usedSize: number };
    return h.usedSize / 2 ** 20;
  } finally {
    await cdp.detach();
  }
}

/** Designs solved so far, from the run bar's words ("Solving N of M designs …"). */
async function solved(page: Page): Promise<{ done: number; total: number } | null> {
  const t = (await page.getByTestId('run-status').textContent()) ?? '';
  const m = /Solving (\d+) of (\d+) designs/.exec(t);
  return m ? { done: Number(m[1]), total: Number(m[2]) } : null;
}

async function waitSolved(
  page: Page,
  atLeast: number,
  timeout = 30_000,
): Promise<{ done: number; total: number }> {
  let last: { done: number; total: number } | null = null;
  await expect
    .poll(async () => (last = await solved(page))?.done ?? -1, { timeout, intervals: [100] })
    .toBeGreaterThanOrEqual(atLeast);
  return last!;
}

test('a 40-support lot plans with progress, cancels, stays responsive and survives worker failures', async ({
  page,
  host,
}) => {
  test.setTimeout(90_000);
  const lot = fortySupportLot();
  await apiCall(page.request, host, 'saveProject', { project: lot });
  await apiCall(page.request, host, 'openProject', { id: lot.id });
  await openApp(page, host);
  await expect(page.getByRole('heading', { name: 'Supports (40)' })).toBeVisible();
  const heap: number[] = [await heapMB(page)];

  const bar = page.getByTestId('run-bar');
  const status = page.getByTestId('run-status');
  const runButton = bar.getByRole('button', { name: /Run plan|Run again/ });
  const progress = page.getByRole('progressbar', { name: 'Plan progress' });

  // Run 1: progress moves; the window answers; cancelled mid-evaluation.
  await runButton.click();
  await expect(progress).toBeVisible();
  const a = await waitSolved(page, 3);
  expect(a.total).toBeGreaterThan(300);
  const t0 = Date.now();
  await page.locator('.yw-support[title^="Support 12"]').click();
  await expect(page.getByTestId('support-name')).toHaveValue('Support 12', { timeout: 1_000 });
  const openMs = Date.now() - t0;
  const b = await waitSolved(page, a.done + 10);
  expect(b.done).toBeGreaterThan(a.done);
  expect(Number(await progress.getAttribute('aria-valuenow'))).toBeGreaterThan(0);
  heap.push(await heapMB(page));
  await bar.getByRole('button', { name: 'Cancel' }).click();
  await expect(status).toContainText(/Cancelled after \d+ of \d+/);
  await expect(progress).toHaveCount(0);
  const firstCancel = Number(/Cancelled after (\d+)/.exec((await status.textContent()) ?? '')![1]);
  expect(firstCancel).toBeGreaterThanOrEqual(b.done);

  // Run 2: starts from the designs kept; cancelled at once, while candidates are placed.
  await expect(runButton).toBeEnabled();
  await runButton.click();
  await bar.getByRole('button', { name: 'Cancel' }).click();
  await expect(status).toContainText(/Cancelled after 0 of/);
  await expect(runButton).toBeEnabled();

  // Run 3: reuses the kept designs; a worker throws after 2 evaluations of its own.
  await page.evaluate(() => {
    (window as unknown as Record<string, unknown>)['__yardwireTestFault__'] = {
      kind: 'throw',
      afterEvaluations: 2,
    };
  });
  await runButton.click();
  await expect(status).toContainText(
    /a planning worker failed: .*test fault: thrown after 2 evaluations; the project is unchanged; run again/,
    { timeout: 30_000 },
  );
  await expect(status).toHaveClass(/error/);
  await expect(progress).toHaveCount(0);
  await expect(runButton).toBeEnabled();
  heap.push(await heapMB(page));

  // Edits still save after the failure.
  await page.locator('.yw-support[title^="Support 7"]').click();
  await page.getByTestId('support-name').fill('Support 7 (after the crash)');
  await page.getByTestId('support-name').press('Enter');
  await waitSaved(page);

  // Run 4: a worker closes itself after one evaluation; the runner stops waiting after 4 s.
  await page.evaluate(() => {
    (window as unknown as Record<string, unknown>)['__yardwireTestFault__'] = {
      kind: 'close',
      afterEvaluations: 1,
      stallMs: 4_000,
    };
  });
  await runButton.click();
  await expect(status).toContainText(
    /a planning worker failed: no answer for 4 s; the project is unchanged/,
    {
      timeout: 30_000,
    },
  );
  await expect(runButton).toBeEnabled();

  // Run 5: healthy again on a fresh pool; progress moves, then it is cancelled.
  await runButton.click();
  const c = await waitSolved(page, 5);
  await waitSolved(page, c.done + 5);
  heap.push(await heapMB(page));
  await bar.getByRole('button', { name: 'Cancel' }).click();
  await expect(status).toContainText(/Cancelled after \d+ of \d+/);

  // The project is intact after a reload: 40 supports, the same heights, the one edit kept.
  await page.reload();
  await expect(page.getByRole('heading', { name: 'Supports (40)' })).toBeVisible();
  const stored = (await apiCall(page.request, host, 'openProject', { id: lot.id })) as {
    supports: { id: string; name: string; usableHeightM: number }[];
  };
  expect(stored.supports.map((s) => [s.id, s.usableHeightM])).toEqual(
    lot.supports.map((s) => [s.id, s.usableHeightM]),
  );
  expect(stored.supports.find((s) => s.id === 's07')!.name).toBe('Support 7 (after the crash)');
  heap.push(await heapMB(page));

  const peak = Math.max(...heap);
  test.info().annotations.push({
    type: 'load',
    description: `designs ${a.total}; editor opened in ${openMs} ms during the run; first cancel after ${firstCancel}; page heap MB ${heap.map((h) => h.toFixed(1)).join(' → ')} (peak ${peak.toFixed(1)})`,
  });
  console.log(test.info().annotations.at(-1)!.description);
  expect(peak).toBeLessThan(150);
  expect(heap.at(-2)! - heap[0]!).toBeLessThan(60);
});
