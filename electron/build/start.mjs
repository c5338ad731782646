// `npm start`: opens the desktop window when the Electron binary is installed; otherwise serves
// the same app on a loopback address (browser mode) and prints the URL to open.
import { spawn } from 'node:child_process';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const require = createRequire(import.meta.url);

function electronBinary() {
  try {
    const path = require('electron'); // the package exports the binary's path, or throws if it was not fetched
    return typeof path === 'string' ? path : null;
  } catch {
    return null;
  }
}

function run(cmd, args, opts = {}) {
  return new Promise((ok) => {
    const child = spawn(cmd, args, { stdio: 'inherit', cwd: root, ...opts });
    child.on('exit', (code) => ok(code ?? 1));
  });
}

const buildCode = await run(process.execPath, [join(root, 'electron/build/build.mjs'), '--quiet']);
if (buildCode !== 0) process.exit(buildCode);

const bin = electronBinary();
if (bin && !process.env.YARDWIRE_BROWSER_MODE) {
  const { ensureElectronSqlite } = await import('./electron-sqlite.mjs');
  const binding = ensureElectronSqlite();
  process.exit(
    await run(bin, [join(root, 'dist/electron/main.cjs')], {
      env: { ...process.env, YARDWIRE_SQLITE_BINDING: binding },
    }),
  );
}
console.log(
  'The Electron binary is not installed (it could not be downloaded), so Yardwire runs in browser mode:\n' +
    'the same app, served on this computer only. Open the address below in Chromium, Chrome, Firefox or Edge.',
);
process.exit(await run(process.execPath, [join(root, 'dist/server/serve.mjs')]));
