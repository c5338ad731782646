// `npm start`: opens the desktop window when the Electron binary is installed, or when it can be
// fetched now (once, with the package's own installer: electron-fetch.mjs); otherwise serves the
// same app on a loopback address (browser mode), says why, and prints the URL to open.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { ROOT as root, chooseShell } from './electron-fetch.mjs';

function run(cmd, args, opts = {}) {
  return new Promise((ok) => {
    const child = spawn(cmd, args, { stdio: 'inherit', cwd: root, ...opts });
    child.on('exit', (code) => ok(code ?? 1));
  });
}

const buildCode = await run(process.execPath, [join(root, 'electron/build/build.mjs'), '--quiet']);
if (buildCode !== 0) process.exit(buildCode);

const shell = await chooseShell();
if (shell.shell === 'electron') {
  if (shell.fetched) console.log('The Electron binary was fetched; opening the desktop window.');
  const { ensureElectronSqlite } = await import('./electron-sqlite.mjs');
  const binding = ensureElectronSqlite();
  process.exit(
    await run(shell.bin, [join(root, 'dist/electron/main.cjs')], {
      env: { ...process.env, YARDWIRE_SQLITE_BINDING: binding },
    }),
  );
}
console.log(
  `Yardwire runs in browser mode because ${shell.reason}.\n` +
    'It is the same app, served on this computer only. Open the address below in Chromium, Chrome, Firefox or Edge.',
);
process.exit(await run(process.execPath, [join(root, 'dist/server/serve.mjs')]));
