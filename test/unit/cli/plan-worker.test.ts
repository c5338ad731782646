import { mkdtempSync, readFileSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { workerBundle } from '../../../core/cli/plan.ts';

describe('plan worker bundle', () => {
  const dir = mkdtempSync(join(tmpdir(), 'plan-worker-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('bundles the worker with its inputs listed, reuses it while they are unchanged, rebuilds when one changes', () => {
    const out = workerBundle(dir);
    expect(out).toBe(join(dir, 'plan-worker.mjs'));
    const manifest = JSON.parse(readFileSync(join(dir, 'plan-worker.manifest.json'), 'utf8')) as {
      inputs: Record<string, [number, number]>;
    };
    const inputs = Object.keys(manifest.inputs);
    expect(inputs.some((p) => p.endsWith(join('core', 'cli', 'plan-worker.ts')))).toBe(true);
    expect(inputs.some((p) => p.endsWith(join('core', 'rank', 'evaluate.ts')))).toBe(true);
    const built = statSync(out as string).mtimeMs;
    expect(workerBundle(dir)).toBe(out);
    expect(statSync(out as string).mtimeMs).toBe(built);
    // An input that looks changed (other modification time in the manifest) forces a rebuild.
    const stale = join(dir, 'plan-worker.manifest.json');
    const m = { inputs: { ...manifest.inputs, [inputs[0]]: [manifest.inputs[inputs[0]][0], 1] } };
    writeFileSync(stale, JSON.stringify(m));
    utimesSync(out as string, new Date(0), new Date(0));
    expect(workerBundle(dir)).toBe(out);
    expect(statSync(out as string).mtimeMs).toBeGreaterThan(built - 1);
  });
});
