// Issue 15 point 6: start-up problems of browser mode are one line saying what to change, exit
// code 2, no stack trace. The entry runs as a child process (Node with the tsx loader).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { HandlerTable } from '../../../electron/api/handlers.ts';
import {
  HEADERS_TIMEOUT_MS,
  REQUEST_TIMEOUT_MS,
  startBrowserServer,
} from '../../../electron/server/server.ts';
import { portFromEnv } from '../../../electron/server/startup.ts';

const dir = mkdtempSync(join(tmpdir(), 'yw-start-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function serve(env: Record<string, string>): { code: number | null; err: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'electron/server/serve.ts'], {
    env: { ...process.env, ...env },
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { code: r.status, err: r.stderr };
}

function expectOneLine(r: { code: number | null; err: string }, what: RegExp): void {
  expect(r.code).toBe(2);
  const lines = r.err.trim().split('\n');
  expect(lines).toHaveLength(1);
  expect(lines[0]).toMatch(what);
  expect(r.err).not.toMatch(/\n\s+at /);
}

describe('browser-mode start-up errors', () => {
  it('YARDWIRE_PORT=abc and 70000 are refused by the rule', () => {
    expect(portFromEnv('abc')).toMatch(/YARDWIRE_PORT must be a whole number from 0 to 65535/);
    expect(portFromEnv('70000')).toMatch(/it is "70000"/);
    expect(portFromEnv('-1')).toMatch(/whole number/);
    expect(portFromEnv(undefined)).toBe(5719);
    expect(portFromEnv('0')).toBe(0);
    expectOneLine(serve({ YARDWIRE_PORT: 'abc', YARDWIRE_DATA_DIR: dir }), /YARDWIRE_PORT must be/);
  }, 60_000);

  it('a data folder that is a file', () => {
    const f = join(dir, 'a-file');
    writeFileSync(f, 'x');
    expectOneLine(
      serve({ YARDWIRE_PORT: '0', YARDWIRE_DATA_DIR: f }),
      /is a file, not a folder: point YARDWIRE_DATA_DIR/,
    );
  }, 60_000);

  it('a port in use', async () => {
    const blocker = createServer();
    await new Promise<void>((ok) => blocker.listen(0, '127.0.0.1', ok));
    const port = (blocker.address() as { port: number }).port;
    try {
      expectOneLine(
        serve({ YARDWIRE_PORT: String(port), YARDWIRE_DATA_DIR: join(dir, 'data') }),
        new RegExp(`port ${port} is already in use.*set YARDWIRE_PORT`),
      );
    } finally {
      blocker.close();
    }
  }, 60_000);

  it('slow requests are bounded like idle ones (not the default 300 s)', async () => {
    const srv = await startBrowserServer({
      handlers: {} as HandlerTable,
      staticDir: dir,
      port: 0,
    });
    try {
      expect(srv.server.headersTimeout).toBe(HEADERS_TIMEOUT_MS);
      expect(srv.server.requestTimeout).toBe(REQUEST_TIMEOUT_MS);
      expect(REQUEST_TIMEOUT_MS).toBeLessThanOrEqual(30_000);
    } finally {
      await srv.close();
    }
  });
});
