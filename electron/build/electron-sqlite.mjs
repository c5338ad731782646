// better-sqlite3 exists in one ABI build at a time. Node's build stays where npm put it (for
// `npm test` and browser mode); the Electron build is made once into a separate cache folder,
// .cache/electron-sqlite/, and the main process picks it with better-sqlite3's `nativeBinding`
// option, so switching between `npm test` and `npm start` costs nothing.
//
// npm's configuration on some machines sets `nodedir`, which would make the rebuild compile
// against Node's headers (wrong ABI) without a word: it is removed from the environment here.
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const ELECTRON_SQLITE_DIR = join(root, '.cache', 'electron-sqlite');
export const ELECTRON_SQLITE_BINDING = join(
  ELECTRON_SQLITE_DIR,
  'better-sqlite3',
  'build',
  'Release',
  'better_sqlite3.node',
);

export function ensureElectronSqlite() {
  if (existsSync(ELECTRON_SQLITE_BINDING)) return ELECTRON_SQLITE_BINDING;
  const require = createRequire(import.meta.url);
  const electronVersion = require('electron/package.json').version;
  const work = join(ELECTRON_SQLITE_DIR, 'better-sqlite3');
  rmSync(work, { recursive: true, force: true });
  mkdirSync(ELECTRON_SQLITE_DIR, { recursive: true });
  cpSync(join(root, 'node_modules', 'better-sqlite3'), work, { recursive: true });
  const env = { ...process.env };
  for (const k of Object.keys(env)) if (k.toLowerCase() === 'npm_config_nodedir') delete env[k];
  console.log(`Building better-sqlite3 for Electron ${electronVersion} (once) …`);
  const r = spawnSync(
    process.execPath,
    [
      join(root, 'node_modules', '@electron', 'rebuild', 'lib', 'cli.js'),
      '--version',
      electronVersion,
      '--module-dir',
      work,
      '--only',
      'better-sqlite3',
      '--force',
    ],
    { stdio: 'inherit', env, cwd: root },
  );
  if (r.status !== 0 || !existsSync(ELECTRON_SQLITE_BINDING)) {
    rmSync(work, { recursive: true, force: true });
    throw new Error('could not build better-sqlite3 for Electron; the Node build was left untouched');
  }
  return ELECTRON_SQLITE_BINDING;
}
