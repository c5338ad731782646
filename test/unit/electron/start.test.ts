// `npm start` on a machine without the Electron binary: it tries the package's own installer once
// (mocked here: no network), opens the desktop window when that works, and otherwise falls back to
// browser mode with the reason, remembering the failure for a day.
import { EventEmitter } from 'node:events';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import {
  chooseShell,
  fetchElectronBinary,
  RETRY_AFTER_MS,
  type FetchResult,
} from '../../../electron/build/electron-fetch.mjs';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'yw-start-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

function setup(result: FetchResult, installs = result.ok) {
  let installed = false;
  const fetchBinary = vi.fn(async (_o: { timeoutMs: number }) => {
    installed = installs;
    return result;
  });
  const logged: string[] = [];
  return {
    fetchBinary,
    logged,
    deps: {
      env: {},
      findBinary: () => (installed ? '/opt/electron/electron' : null),
      fetchBinary,
      markerFile: join(dir, 'electron-fetch.json'),
      now: () => 1_000_000_000_000,
      log: (l: string) => void logged.push(l),
    },
  };
}

describe('choosing the shell', () => {
  it('opens the desktop window at once when the binary is there (no fetch)', async () => {
    const fetchBinary = vi.fn();
    const r = await chooseShell({ env: {}, findBinary: () => '/opt/electron/electron', fetchBinary });
    expect(r).toEqual({ shell: 'electron', bin: '/opt/electron/electron', fetched: false });
    expect(fetchBinary).not.toHaveBeenCalled();
  });

  it('fetches a missing binary once and opens the desktop window when that works', async () => {
    const s = setup({ ok: true });
    const r = await chooseShell(s.deps);
    expect(r).toEqual({ shell: 'electron', bin: '/opt/electron/electron', fetched: true });
    expect(s.fetchBinary).toHaveBeenCalledTimes(1);
    expect(s.fetchBinary.mock.calls[0]![0]).toMatchObject({ timeoutMs: 120_000 });
    expect(s.logged.join('')).toContain('fetching it once');
  });

  it('falls back to browser mode with the reason, and does not try again for a day', async () => {
    const s = setup({ ok: false, reason: 'the download took longer than 120 s' });
    const r = await chooseShell(s.deps);
    expect(r).toEqual({
      shell: 'browser',
      reason: 'the Electron binary could not be fetched: the download took longer than 120 s',
    });
    expect(JSON.parse(readFileSync(s.deps.markerFile, 'utf8'))).toEqual({
      failedAt: 1_000_000_000_000,
      reason: 'the download took longer than 120 s',
    });
    const again = await chooseShell(s.deps);
    expect(s.fetchBinary).toHaveBeenCalledTimes(1);
    expect(again.shell === 'browser' && again.reason).toMatch(
      /fetching it failed .*took longer than 120 s.*YARDWIRE_FETCH_ELECTRON=1 npm start tries again/,
    );
    // Asked to, or a day later, it tries again.
    await chooseShell({ ...s.deps, env: { YARDWIRE_FETCH_ELECTRON: '1' } });
    expect(s.fetchBinary).toHaveBeenCalledTimes(2);
    await chooseShell({ ...s.deps, now: () => 1_000_000_000_000 + RETRY_AFTER_MS + 1 });
    expect(s.fetchBinary).toHaveBeenCalledTimes(3);
  });

  it('says so when the installer ends well but no binary appears', async () => {
    const s = setup({ ok: true }, false);
    const r = await chooseShell(s.deps);
    expect(r.shell === 'browser' && r.reason).toMatch(/finished but the binary is still missing/);
  });

  it('keeps browser mode when asked for it, without fetching', async () => {
    const s = setup({ ok: true });
    const r = await chooseShell({ ...s.deps, env: { YARDWIRE_BROWSER_MODE: '1' } });
    expect(r.shell).toBe('browser');
    expect(s.fetchBinary).not.toHaveBeenCalled();
  });
});

/** A stand-in for the installer's child process. */
function fakeChild() {
  const child = Object.assign(new EventEmitter(), {
    stdout: new EventEmitter(),
    stderr: new EventEmitter(),
    kill: vi.fn(),
  });
  return child;
}

describe('running the installer', () => {
  it('reports success, with a progress line while it runs', async () => {
    vi.useFakeTimers();
    try {
      const child = fakeChild();
      const spawnFn = vi.fn(() => child);
      const lines: string[] = [];
      const p = fetchElectronBinary({
        timeoutMs: 10_000,
        log: (l) => void lines.push(l),
        spawnFn: spawnFn as never,
      });
      await vi.advanceTimersByTimeAsync(2_100);
      child.emit('exit', 0);
      expect(await p).toEqual({ ok: true });
      expect(spawnFn).toHaveBeenCalledTimes(1);
      expect((spawnFn.mock.calls[0] as unknown as [string, string[]])[1][0]).toMatch(
        /electron[/\\]install\.js$/,
      );
      expect(
        lines.filter((l) => l.includes('Fetching the Electron binary… 2 s (at most 10 s)')),
      ).toHaveLength(1);
    } finally {
      vi.useRealTimers();
    }
  });

  it('gives up after the time limit, stops the installer and says why', async () => {
    vi.useFakeTimers();
    try {
      const child = fakeChild();
      const p = fetchElectronBinary({ timeoutMs: 5_000, log: () => {}, spawnFn: (() => child) as never });
      await vi.advanceTimersByTimeAsync(5_001);
      expect(await p).toEqual({ ok: false, reason: 'the download took longer than 5 s' });
      expect(child.kill).toHaveBeenCalledWith('SIGKILL');
    } finally {
      vi.useRealTimers();
    }
  });

  it('passes on the installer’s last words when it fails', async () => {
    const child = fakeChild();
    const p = fetchElectronBinary({ timeoutMs: 5_000, log: () => {}, spawnFn: (() => child) as never });
    child.stderr.emit('data', Buffer.from('HTTPError: getaddrinfo ENOTFOUND\n'));
    child.emit('exit', 1);
    expect(await p).toEqual({ ok: false, reason: 'the installer failed: HTTPError: getaddrinfo ENOTFOUND' });
  });
});
