// The evaluate document schema (core/em/input.ts) and the CLI command (core/cli/evaluate.ts).
import { describe, it, expect } from 'vitest';
import { readFile } from 'node:fs/promises';
import { parseAntennaInput, antennaInputSchema } from '../../../core/em/input.ts';
import { runEvaluate } from '../../../core/cli/evaluate.ts';
import { cliIo } from '../../helpers/cliIo.ts';

const io = (files: Record<string, string> = {}) => cliIo(files, { disk: true });

const good = {
  frequenciesMHz: [7.1],
  ground: 'average',
  wires: [{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001 }],
  feeds: [{ wire: 0, position: 0.5 }],
};

describe('input schema', () => {
  it('accepts the example documents', async () => {
    for (const f of ['data/examples/evaluate-dipole.json', 'data/examples/half-square-average.json'])
      expect(antennaInputSchema.safeParse(JSON.parse(await readFile(f, 'utf8'))).success).toBe(true);
  });
  it('names the field of each error as a JSON path', () => {
    const r = parseAntennaInput({
      ...good,
      wires: [{ ...good.wires[0], radiusM: 0 }],
      feeds: [{ wire: 2, position: 1.5 }],
    });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const fields = r.errors.map((e) => e.field);
    expect(fields).toContain('wires[0].radiusM');
    expect(fields).toContain('feeds[0].position');
  });
  it('resolves soil classes and user grounds; radials with one length', () => {
    const r = parseAntennaInput({
      ...good,
      ground: { permittivity: 15, conductivitySPerM: 0.002 },
      wires: [{ from: [0, 0, 0], to: [0, 0, 10], radiusM: 0.01 }],
      feeds: [{ wire: 0, position: 0 }],
      radials: [{ wire: 0, count: 4, lengthM: 10, radiusM: 0.001 }],
    });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.model.ground).toEqual({ kind: 'soil', permittivity: 15, conductivitySPerM: 0.002 });
    expect(r.model.radials?.[0].lengthsM).toEqual([10, 10, 10, 10]);
    const s = parseAntennaInput(good);
    expect(s.ok && s.model.ground).toEqual({
      kind: 'soil',
      permittivity: 13,
      conductivitySPerM: 0.005,
      label: 'average',
    });
  });
  it('rejects unknown soil ids and unknown keys', () => {
    expect(parseAntennaInput({ ...good, ground: 'clay' }).ok).toBe(false);
    expect(parseAntennaInput({ ...good, wire: [] }).ok).toBe(false);
  });
});

describe('evaluate command', () => {
  it('prints only JSON for the example, with finite numbers and the requested pattern rows', async () => {
    const t = io();
    const code = await runEvaluate(['data/examples/evaluate-dipole.json'], t.io);
    expect(code).toBe(0);
    const doc = JSON.parse(t.out.join(''));
    expect(doc.frequencies).toHaveLength(3);
    const f = doc.frequencies[1];
    expect(f.feeds[0].impedanceOhm).toHaveLength(2);
    expect(f.pattern).toHaveLength(6 * 3);
    expect(Object.keys(f.pattern[0]).sort()).toEqual([
      'azimuthDeg',
      'elevationDeg',
      'gainDbi',
      'horizontalDbi',
      'verticalDbi',
    ]);
    expect(t.out.join('')).not.toMatch(/NaN|Infinity/);
  });
  it('fails with the field path and exit code 1 on bad input', async () => {
    const t = io({
      'bad.json': JSON.stringify({ ...good, wires: [{ from: [0, 0, 1], to: [0, 0, -3], radiusM: 0.001 }] }),
    });
    expect(await runEvaluate(['bad.json'], t.io)).toBe(1);
    expect(JSON.parse(t.out.join('')).error.field).toBe('wires[0].to[2]');
    const u = io({ 'bad.json': '{ not json' });
    expect(await runEvaluate(['bad.json'], u.io)).toBe(1);
    const v = io({ 'bad.json': JSON.stringify({ ...good, feeds: [{ wire: 0, position: 1 }] }) });
    expect(await runEvaluate(['bad.json'], v.io)).toBe(1);
    expect(JSON.parse(v.out.join('')).error.field).toBe('feeds[0].position');
    expect(await runEvaluate([], io().io)).toBe(2);
  });
});
