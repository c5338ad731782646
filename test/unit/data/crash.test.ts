// A process killed (SIGKILL) in the middle of a burst of edits loses no edit whose save had
// returned: each save is one committed transaction in WAL mode with synchronous = FULL.
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ProjectStore } from '../../../data/store.ts';
import { DEMO_PROJECT_ID } from '../../../data/demo/demoProject.ts';

const writer = join(import.meta.dirname, 'helpers', 'burst-writer.ts');

function runAndKill(file: string, afterSaves: number): Promise<number> {
  return new Promise((ok, bad) => {
    const child = spawn(process.execPath, ['--import', 'tsx', writer, file], {
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let last = 0;
    let buf = '';
    let err = '';
    child.stderr.on('data', (c: Buffer) => (err += c.toString()));
    child.stdout.on('data', (c: Buffer) => {
      buf += c.toString();
      const lines = buf.split('\n');
      buf = lines.pop() ?? '';
      for (const l of lines) {
        const m = /^saved (\d+)$/.exec(l);
        if (m) last = Number(m[1]);
      }
      if (last >= afterSaves) child.kill('SIGKILL');
    });
    child.on('exit', (_code, signal) =>
      signal === 'SIGKILL' ? ok(last) : bad(new Error(`writer exited without being killed: ${err}`)),
    );
  });
}

describe('store under SIGKILL', () => {
  it.each([50, 400])('keeps every acknowledged edit when killed after %i saves', async (n) => {
    const dir = mkdtempSync(join(tmpdir(), 'yw-crash-'));
    try {
      const file = join(dir, 'db.sqlite');
      const acknowledged = await runAndKill(file, n);
      expect(acknowledged).toBeGreaterThanOrEqual(n);
      const store = new ProjectStore(file);
      const notes = store.getProject(DEMO_PROJECT_ID).notes;
      const stored = Number(/^edit (\d+)$/.exec(notes)?.[1]);
      // The stored edit is the last acknowledged one, or one more whose acknowledgement was in flight.
      expect(stored).toBeGreaterThanOrEqual(acknowledged);
      expect(stored).toBeLessThanOrEqual(acknowledged + 1);
      store.close();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
