/** `site --demo --json` prints the demo project; `site FILE.json` validates a project file. */
import { buildDemoProject } from '../demo/demoProject.ts';
import { parseProject } from '../project/schema.ts';
import type { CliIo } from './main.ts';
import { readJsonFile } from './projectFile.ts';

export async function runSite(argv: string[], io: CliIo): Promise<number> {
  const json = argv.includes('--json');
  const demo = argv.includes('--demo');
  const files = argv.filter((a) => !a.startsWith('--'));
  const unknown = argv.filter((a) => a.startsWith('--') && a !== '--json' && a !== '--demo');
  if (unknown.length > 0 || (demo ? files.length > 0 : files.length !== 1)) {
    io.stderr('usage: site --demo [--json] | site FILE.json [--json]\n');
    return 2;
  }
  let doc: unknown;
  let label: string;
  if (demo) {
    doc = buildDemoProject();
    label = 'demo project';
  } else {
    label = files[0] as string;
    const read = await readJsonFile(label, io);
    if (!read) return 1;
    doc = read.doc;
  }
  const parsed = parseProject(doc);
  if (!parsed.ok) {
    if (json) io.stdout(JSON.stringify({ ok: false, errors: parsed.errors }, null, 2) + '\n');
    for (const e of parsed.errors) io.stderr(`${label}: ${e.path}: ${e.message}\n`);
    return 1;
  }
  const p = parsed.value;
  if (json) {
    io.stdout(JSON.stringify(p, null, 2) + '\n');
  } else {
    io.stdout(
      `${p.name}: valid project (schema ${p.schemaVersion}), ${p.supports.length} supports, ` +
        `${p.keepOuts.length} keep-outs, bands ${p.bands.join(', ')}\n`,
    );
  }
  return 0;
}
