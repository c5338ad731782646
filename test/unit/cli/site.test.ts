import { describe, expect, it } from 'vitest';
import { runCli } from '../../../core/cli/main.ts';
import { parseProject } from '../../../core/project/schema.ts';
import { cliIo } from '../../helpers/cliIo.ts';

const io = (files: Record<string, string> = {}) => cliIo(files);

describe('cli site', () => {
  it('prints the demo project as JSON in the project schema', async () => {
    const t = io();
    expect(await runCli(['site', '--demo', '--json'], t.io)).toBe(0);
    const doc = JSON.parse(t.out.join(''));
    expect(parseProject(doc).ok).toBe(true);
  });

  it('validates a file and prints each error with its JSON path, exiting non-zero', async () => {
    const t = io({
      'lot.json': JSON.stringify({
        schemaVersion: 1,
        id: 'x',
        name: 'Lot',
        supports: [{ id: 's', name: 'S', kind: 'tree', position: [0, 0], usableHeightM: 'tall' }],
      }),
    });
    expect(await runCli(['site', 'lot.json'], t.io)).toBe(1);
    expect(t.err.join('')).toMatch(/lot\.json: supports\[0\]\.usableHeightM: must be a number/);
  });

  it('reports unreadable and non-JSON files plainly', async () => {
    const t = io({ 'a.json': '{nope' });
    expect(await runCli(['site', 'a.json'], t.io)).toBe(1);
    expect(t.err.join('')).toMatch(/not valid JSON/);
    const u = io();
    expect(await runCli(['site', 'missing.json'], u.io)).toBe(1);
    expect(u.err.join('')).toMatch(/cannot read/);
  });

  it('rejects unknown commands and usage errors', async () => {
    const t = io();
    expect(await runCli(['frobnicate'], t.io)).toBe(2);
    expect(await runCli(['site'], t.io)).toBe(2);
  });
});
