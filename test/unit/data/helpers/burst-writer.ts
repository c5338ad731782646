// Child process for the crash test: saves the demo project over and over with a counter in its
// notes, and prints "saved N" on stdout after each save has returned.
import { ProjectStore } from '../../../../data/store.ts';
import { buildDemoProject } from '../../../../data/demo/demoProject.ts';

const file = process.argv[2];
if (!file) throw new Error('usage: burst-writer FILE');
const store = new ProjectStore(file);
const demo = buildDemoProject();
for (let n = 1; n < 1_000_000; n++) {
  store.saveProject({
    ...demo,
    notes: `edit ${n}`,
    supports: demo.supports.map((s, i) => (i === 0 ? { ...s, usableHeightM: 10 + (n % 10) } : s)),
  });
  process.stdout.write(`saved ${n}\n`);
}
