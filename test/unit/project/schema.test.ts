import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { emptyProject, parseProject, PROJECT_SCHEMA_VERSION } from '../../../core/project/schema.ts';

const demo = buildDemoProject();

function withChange(mutate: (d: Record<string, unknown>) => void): unknown {
  const d = structuredClone(demo) as unknown as Record<string, unknown>;
  mutate(d);
  return d;
}

function errorsOf(doc: unknown): { path: string; message: string }[] {
  const r = parseProject(doc);
  if (r.ok) throw new Error('expected the document to be rejected');
  return r.errors;
}

describe('project schema', () => {
  it('accepts the demo project and an empty project', () => {
    expect(parseProject(demo).ok).toBe(true);
    const p = emptyProject('p1', 'Empty');
    expect(p.schemaVersion).toBe(PROJECT_SCHEMA_VERSION);
    expect(p.settings.setbackM).toBe(1);
    expect(p.settings.minEndHeightM).toBe(2.5);
    expect(parseProject(JSON.parse(JSON.stringify(p))).ok).toBe(true);
  });

  it('the demo lot matches its brief: 1–2 ha, six to ten supports of 10–25 m, a house and a power line', () => {
    expect(demo.supports.length).toBeGreaterThanOrEqual(6);
    expect(demo.supports.length).toBeLessThanOrEqual(10);
    for (const s of demo.supports) {
      expect(s.usableHeightM).toBeGreaterThanOrEqual(10);
      expect(s.usableHeightM).toBeLessThanOrEqual(25);
    }
    expect(demo.keepOuts.some((k) => k.kind === 'building')).toBe(true);
    expect(demo.keepOuts.some((k) => k.kind === 'power-line')).toBe(true);
  });

  const cases: [string, (d: Record<string, unknown>) => void, string, RegExp][] = [
    ['not an object', () => undefined, '(document)', /./],
    ['missing name', (d) => delete d.name, 'name', /required/],
    ['empty name', (d) => (d.name = '   '), 'name', /empty/],
    ['bad id', (d) => (d.id = 'a b/c'), 'id', /letters, digits/],
    [
      'negative height',
      (d) => ((d.supports as { usableHeightM: number }[])[1]!.usableHeightM = -4),
      'supports[1].usableHeightM',
      /greater than 0/,
    ],
    [
      'zero height',
      (d) => ((d.supports as { usableHeightM: number }[])[0]!.usableHeightM = 0),
      'supports[0].usableHeightM',
      /greater than 0/,
    ],
    [
      'absurd height',
      (d) => ((d.supports as { usableHeightM: number }[])[0]!.usableHeightM = 5000),
      'supports[0].usableHeightM',
      /at most 200/,
    ],
    [
      'text height',
      (d) => ((d.supports as { usableHeightM: unknown }[])[0]!.usableHeightM = '12'),
      'supports[0].usableHeightM',
      /must be a number/,
    ],
    [
      'NaN-like height',
      (d) => ((d.supports as { usableHeightM: unknown }[])[0]!.usableHeightM = null),
      'supports[0].usableHeightM',
      /number/,
    ],
    [
      'unknown kind',
      (d) => ((d.supports as { kind: string }[])[2]!.kind = 'pole'),
      'supports[2].kind',
      /tree, mast, tower, building/,
    ],
    [
      'longitude out of range',
      (d) => ((d.supports as { position: number[] }[])[0]!.position = [181, 10]),
      'supports[0].position[0]',
      /longitude/,
    ],
    [
      'latitude out of range',
      (d) => ((d.supports as { position: number[] }[])[0]!.position = [10, -91]),
      'supports[0].position[1]',
      /latitude/,
    ],
    [
      'position with three numbers',
      (d) => ((d.supports as { position: number[] }[])[0]!.position = [1, 2, 3]),
      'supports[0].position',
      /./,
    ],
    [
      'unclosed boundary',
      (d) => (d.boundary as { coordinates: number[][][] }).coordinates[0]!.pop(),
      'boundary.coordinates[0]',
      /closed/,
    ],
    [
      'boundary with two corners',
      (d) =>
        ((d.boundary as { coordinates: number[][][] }).coordinates = [
          [
            [0, 0],
            [1, 1],
            [0, 0],
          ],
        ]),
      'boundary.coordinates[0]',
      /at least 4/,
    ],
    [
      'boundary with a hole',
      (d) => {
        const b = d.boundary as { coordinates: number[][][] };
        b.coordinates.push(b.coordinates[0]!);
      },
      'boundary.coordinates',
      /holes/,
    ],
    [
      'boundary as a point',
      (d) => (d.boundary = { type: 'Point', coordinates: [0, 0] }),
      'boundary.type',
      /./,
    ],
    [
      'building drawn as a line',
      (d) => ((d.keepOuts as { kind: string }[])[1]!.kind = 'building'),
      'keepOuts[1].geometry',
      /polygon/,
    ],
    [
      'negative clearance',
      (d) => ((d.keepOuts as { clearanceM: number }[])[1]!.clearanceM = -1),
      'keepOuts[1].clearanceM',
      /between 0 and 500/,
    ],
    ['unknown soil', (d) => (d.soil = { classId: 'mud' }), 'soil', /./],
    [
      'soil permittivity below 1',
      (d) => (d.soil = { permittivity: 0.5, conductivitySPerM: 0.005 }),
      'soil',
      /./,
    ],
    ['band outside the list', (d) => (d.bands = ['20m']), 'bands[0]', /160m, 80m, 40m/],
    [
      'negative setback',
      (d) => ((d.settings as { setbackM: number }).setbackM = -2),
      'settings.setbackM',
      /between 0 and 50/,
    ],
    [
      'fractional radial count',
      (d) => ((d.settings as { radialCount: number }).radialCount = 3.5),
      'settings.radialCount',
      /whole number/,
    ],
    [
      'tile URL with script',
      (d) => ((d.settings as { tileUrlTemplate: string }).tileUrlTemplate = 'javascript:alert(1)'),
      'settings.tileUrlTemplate',
      /http/,
    ],
    ['newer schema version', (d) => (d.schemaVersion = 99), 'schemaVersion', /newer Yardwire/],
    [
      'duplicate support id',
      (d) => ((d.supports as { id: string }[])[1]!.id = (d.supports as { id: string }[])[0]!.id),
      'supports[1].id',
      /duplicate/,
    ],
    [
      'weight out of range',
      (d) => ((d.targets as { weight: number }[])[0]!.weight = 1000),
      'targets[0]',
      /./,
    ],
  ];

  it.each(cases)('rejects %s, naming the field and the problem', (_label, mutate, path, message) => {
    const doc = _label === 'not an object' ? 42 : withChange(mutate);
    const errors = errorsOf(doc);
    const hit = errors.find((e) => e.path === path || e.path.startsWith(path));
    expect(hit, `errors were ${JSON.stringify(errors)}`).toBeDefined();
    expect(hit!.message).toMatch(message);
    expect(hit!.message).not.toMatch(/NaN/);
  });

  it('migrates a document without a schema version forward to the current one', () => {
    const d = withChange((x) => delete x.schemaVersion);
    const r = parseProject(d);
    expect(r.ok).toBe(true);
  });

  it('fills defaults for optional parts', () => {
    const r = parseProject({ schemaVersion: 1, id: 'min', name: 'Minimal' });
    expect(r.ok && r.value.supports).toEqual([]);
    expect(r.ok && r.value.soil).toEqual({ classId: 'average' });
    expect(r.ok && r.value.bands).toEqual(['80m']);
  });
});
