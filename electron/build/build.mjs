// Builds everything the shells run: the renderer (Vite) into dist/renderer, and the host
// bundles (esbuild): the browser-mode server, the Electron main process and its preload.
import { build as viteBuild } from 'vite';
import { build as esbuild } from 'esbuild';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const quiet = process.argv.includes('--quiet') || process.env.YARDWIRE_BUILD_QUIET === '1';

await viteBuild({ configFile: join(root, 'vite.config.ts'), logLevel: quiet ? 'warn' : 'info' });

const common = {
  bundle: true,
  platform: 'node',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  external: ['better-sqlite3', 'electron'],
  absWorkingDir: root,
};
await esbuild({
  ...common,
  entryPoints: ['electron/server/serve.ts'],
  outfile: 'dist/server/serve.mjs',
  format: 'esm',
  banner: {
    js: "import { createRequire as __cr } from 'node:module'; const require = __cr(import.meta.url);",
  },
});
await esbuild({
  ...common,
  entryPoints: ['electron/main.ts'],
  outfile: 'dist/electron/main.cjs',
  format: 'cjs',
});
await esbuild({
  ...common,
  entryPoints: ['electron/preload.ts'],
  outfile: 'dist/electron/preload.cjs',
  format: 'cjs',
  platform: 'browser',
});
if (!quiet) console.log('built dist/renderer, dist/server/serve.mjs, dist/electron/{main,preload}.cjs');
