// Cost of the store's start-up integrity check (PRAGMA quick_check) on a large store: fills a
// temporary database with N demo-sized projects (default 4000, about 50 MB), then times opening it.
// Run: npx tsx test/bench/store-check.ts [N]
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildDemoProject } from '../../data/demo/demoProject.ts';
import { ProjectStore } from '../../data/store.ts';

const n = Number(process.argv[2] ?? 4000);
const dir = mkdtempSync(join(tmpdir(), 'yw-bench-'));
const file = join(dir, 'db.sqlite');
const s = new ProjectStore(file);
const demo = buildDemoProject();
for (let i = 0; i < n; i++)
  s.saveProject({ ...demo, id: `p${i}`, name: `Project ${i}`, notes: 'x'.repeat(4000) });
s.close();
const times: number[] = [];
for (let k = 0; k < 3; k++) {
  const t = new ProjectStore(file);
  times.push(t.integrityCheckMs);
  t.close();
}
times.sort((a, b) => a - b);
const mb = (statSync(file).size + (statSync(`${file}-wal`, { throwIfNoEntry: false })?.size ?? 0)) / 1e6;
console.log(
  `${n} projects, ${mb.toFixed(1)} MB: quick_check median ${times[1].toFixed(0)} ms (runs ${times.map((t) => t.toFixed(0)).join(', ')})`,
);
rmSync(dir, { recursive: true, force: true });
