import { describe, expect, it } from 'vitest';
import { runCli } from '../../../core/cli/main.ts';
import { cliIo } from '../../helpers/cliIo.ts';

const io = () => cliIo();

describe('cli report: arguments', () => {
  it('needs --out', async () => {
    const t = io();
    expect(await runCli(['report', '--demo'], t.io)).toBe(2);
    expect(t.err.join('')).toMatch(/--out FILE\.html is required/);
    expect(Object.keys(t.written)).toEqual([]);
  });
  it('rejects an unknown coax type, mode and an on-time outside 0…1', async () => {
    for (const bad of [
      ['--coax', 'RG-999'],
      ['--mode', 'am'],
      ['--on-time', '1.5'],
      ['--units', 'cubits'],
    ]) {
      const t = io();
      expect(await runCli(['report', '--demo', '--out', 'r.html', ...bad], t.io)).toBe(2);
      expect(t.err.join('')).toContain(bad[0]);
    }
  });
  it('rejects a candidate id without a band prefix before planning', async () => {
    const t = io();
    expect(await runCli(['report', '--demo', '--candidate', 'nope', '--out', 'r.html'], t.io)).toBe(1);
    expect(t.err.join('')).toMatch(/no candidate "nope"/);
  });
  it('reports an unreadable project file', async () => {
    const t = io();
    expect(await runCli(['report', 'missing.json', '--out', 'r.html'], t.io)).toBe(1);
    expect(t.err.join('')).toMatch(/missing\.json/);
  });
});
