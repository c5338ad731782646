// Which shell `npm start` opens, and fetching the Electron binary when it is missing.
//
// The Electron package's install script is disabled in package.json (so that `npm install` works
// where its binary cannot be downloaded). `npm start` therefore tries, once, the package's own
// installer when the binary is missing: with a short timeout and a progress line. When that
// works it opens the desktop window; otherwise it falls back to browser mode and says why. A
// failed fetch is remembered for a day (in .cache/), so a computer without the network does not
// wait on every start; `YARDWIRE_FETCH_ELECTRON=1 npm start` tries again at once.
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
/** How long the installer may take, seconds, unless YARDWIRE_ELECTRON_FETCH_TIMEOUT_S says otherwise. */
export const DEFAULT_FETCH_TIMEOUT_S = 120;
/** How long a failed fetch is not tried again, ms. */
export const RETRY_AFTER_MS = 24 * 3600 * 1000;
export const MARKER_FILE = join(ROOT, '.cache', 'electron-fetch.json');

const require = createRequire(import.meta.url);

/** The installed Electron binary's path, or null when it was never fetched. */
export function findElectronBinary() {
  try {
    // The package reads its path file when it is loaded: load it afresh after a fetch.
    const id = require.resolve('electron');
    delete require.cache[id];
    const path = require(id);
    return typeof path === 'string' && existsSync(path) ? path : null;
  } catch {
    return null;
  }
}

/**
 * Run the Electron package's own installer in a child process, with a progress line every second
 * and a time limit. Resolves to { ok: true } or { ok: false, reason } (never rejects).
 */
export function fetchElectronBinary({
  timeoutMs = DEFAULT_FETCH_TIMEOUT_S * 1000,
  log = (line) => process.stdout.write(line),
  spawnFn = spawn,
} = {}) {
  return new Promise((resolve) => {
    let installer;
    try {
      installer = require.resolve('electron/install.js');
    } catch {
      return resolve({ ok: false, reason: 'the Electron package is not installed (run npm install)' });
    }
    const started = Date.now();
    let out = '';
    const child = spawnFn(process.execPath, [installer], {
      cwd: dirname(installer),
      stdio: ['ignore', 'pipe', 'pipe'],
      env: { ...process.env, ELECTRON_SKIP_BINARY_DOWNLOAD: '' },
    });
    const keep = (d) => (out = (out + d.toString()).slice(-2000));
    child.stdout?.on('data', keep);
    child.stderr?.on('data', keep);
    const limit = Math.round(timeoutMs / 1000);
    const tick = setInterval(() => {
      log(
        `\rFetching the Electron binary… ${Math.round((Date.now() - started) / 1000)} s (at most ${limit} s)`,
      );
    }, 1000);
    let settled = false;
    const done = (r) => {
      if (settled) return;
      settled = true;
      clearInterval(tick);
      clearTimeout(timer);
      log('\n');
      resolve(r);
    };
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      done({ ok: false, reason: `the download took longer than ${limit} s` });
    }, timeoutMs);
    child.on('error', (e) => done({ ok: false, reason: `the installer could not run (${e.message})` }));
    child.on('exit', (code) => {
      if (code === 0) return done({ ok: true });
      const last = out.trim().split('\n').pop()?.trim();
      done({
        ok: false,
        reason: `the installer failed${last ? `: ${last.slice(0, 300)}` : ` (exit ${code})`}`,
      });
    });
  });
}

function readMarker(file) {
  try {
    return JSON.parse(readFileSync(file, 'utf8'));
  } catch {
    return null;
  }
}

/**
 * Decide the shell: the desktop window when the binary is there or can be fetched now, browser
 * mode otherwise, with the reason in words. Every effect comes in through `deps`, so both paths
 * can be tested without the network.
 */
export async function chooseShell({
  env = process.env,
  findBinary = findElectronBinary,
  fetchBinary = fetchElectronBinary,
  markerFile = MARKER_FILE,
  now = () => Date.now(),
  log = (line) => process.stdout.write(line),
} = {}) {
  if (env.YARDWIRE_BROWSER_MODE) return { shell: 'browser', reason: 'YARDWIRE_BROWSER_MODE is set' };
  const bin = findBinary();
  if (bin) return { shell: 'electron', bin, fetched: false };
  const marker = readMarker(markerFile);
  const retry = env.YARDWIRE_FETCH_ELECTRON === '1';
  if (!retry && marker && typeof marker.failedAt === 'number' && now() - marker.failedAt < RETRY_AFTER_MS) {
    return {
      shell: 'browser',
      reason: `the Electron binary is not installed; fetching it failed ${new Date(marker.failedAt).toISOString()} (${marker.reason}); YARDWIRE_FETCH_ELECTRON=1 npm start tries again`,
    };
  }
  const s = Number(env.YARDWIRE_ELECTRON_FETCH_TIMEOUT_S);
  const timeoutMs = (Number.isFinite(s) && s > 0 ? s : DEFAULT_FETCH_TIMEOUT_S) * 1000;
  log('The Electron binary is not installed: fetching it once with the Electron package’s own installer.\n');
  const r = await fetchBinary({ timeoutMs, log });
  const after = r.ok ? findBinary() : null;
  if (after) {
    return { shell: 'electron', bin: after, fetched: true };
  }
  const reason = r.ok ? 'the installer finished but the binary is still missing' : r.reason;
  try {
    mkdirSync(dirname(markerFile), { recursive: true });
    writeFileSync(markerFile, JSON.stringify({ failedAt: now(), reason }));
  } catch {
    // Not remembering the failure only means trying again next time.
  }
  return { shell: 'browser', reason: `the Electron binary could not be fetched: ${reason}` };
}
