// One entry of the command line bundled into a plain ES module with esbuild at first use, and
// rebuilt when any of its inputs changes (size or modification time), so that the command line
// and its worker threads start without a TypeScript loader. Plain JavaScript: the launcher
// (launch.mjs) runs it before any loader is there. Bundles live in the git-ignored .cache folder.
import { existsSync, mkdirSync, readFileSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, resolve as resolvePath } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The repository's root (this file is core/cli/bundle.mjs, or inlined in a bundle two levels down). */
export const ROOT = fileURLToPath(new URL('../../', import.meta.url));

function stamp(path) {
  try {
    const st = statSync(path);
    return [st.size, st.mtimeMs];
  } catch {
    return null;
  }
}

function isFresh(dir, name) {
  try {
    const m = JSON.parse(readFileSync(join(dir, `${name}.manifest.json`), 'utf8'));
    if (!existsSync(join(dir, `${name}.mjs`))) return false;
    for (const [path, want] of Object.entries(m.inputs)) {
      const got = stamp(path);
      if (!got || got[0] !== want[0] || got[1] !== want[1]) return false;
    }
    return Object.keys(m.inputs).length > 0;
  } catch {
    return false;
  }
}

/**
 * The bundle of `entry` (a path from the root) as `dir/name.mjs`, built when missing or stale;
 * null when esbuild is not available (the caller then runs the source through a loader).
 */
export function freshBundle(entry, dir, name) {
  const out = join(dir, `${name}.mjs`);
  if (isFresh(dir, name)) return out;
  try {
    const esbuild = createRequire(join(ROOT, 'package.json'))('esbuild');
    mkdirSync(dir, { recursive: true });
    // Build next to the final file, then rename: concurrent runs never read a partial bundle.
    const tmp = join(dir, `${name}.${process.pid}.${Date.now()}.mjs`);
    const res = esbuild.buildSync({
      entryPoints: [join(ROOT, entry)],
      bundle: true,
      platform: 'node',
      format: 'esm',
      target: 'node20',
      outfile: tmp,
      metafile: true,
      absWorkingDir: ROOT,
      logLevel: 'silent',
      // Packages that load with require() inside an ES module bundle need one.
      banner: {
        js: "import { createRequire as __cr } from 'node:module'; const require = __cr(import.meta.url);",
      },
    });
    const inputs = {};
    for (const rel of Object.keys(res.metafile?.inputs ?? {})) {
      const abs = resolvePath(ROOT, rel);
      const st = stamp(abs);
      if (st) inputs[abs] = st;
    }
    renameSync(tmp, out);
    const mtmp = join(dir, `${name}.manifest.${process.pid}.json`);
    writeFileSync(mtmp, JSON.stringify({ inputs }));
    renameSync(mtmp, join(dir, `${name}.manifest.json`));
    return out;
  } catch {
    return null;
  }
}
