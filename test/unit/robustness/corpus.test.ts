// The bad-input corpus of issue 15: one case per class of problem the probe found, through the
// command line as a user meets it. Each case checks the exit code, that the refusal names the
// field (a JSON path), that it comes within a time bound, and that no stack trace or NaN leaks.
// Cases are invented inputs; the limits they hit are documented in core/em/limits.ts and
// core/project/validity.ts.
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../core/cli/main.ts';
import { decodeUtf8 } from '../../../core/cli/text.ts';
import { buildDemoProject } from '../../../core/demo/demoProject.ts';

/** Every refusal must come within this (ms): the limits are checked before any solving. */
const REFUSAL_MS = 5000;

async function cli(argv: string[], text: string | Uint8Array) {
  let out = '';
  let err = '';
  const t0 = performance.now();
  const code = await runCli(argv, {
    stdout: (s) => (out += s),
    stderr: (s) => (err += s),
    readFile: async () => (typeof text === 'string' ? text : decodeUtf8(text)),
  });
  return { code, out, err, ms: performance.now() - t0 };
}

function expectCleanRefusal(r: { code: number; out: string; err: string; ms: number }, field: RegExp): void {
  expect(r.code).toBe(1);
  expect(r.out + r.err).toMatch(field);
  expect(r.ms).toBeLessThan(REFUSAL_MS);
  expect(r.out + r.err).not.toMatch(/\n\s+at .+:\d+:\d+|NaN|Infinity/); // no stack frame, no NaN
}

const wire = (over: Record<string, unknown> = {}) => ({
  from: [-10, 0, 10],
  to: [10, 0, 10],
  radiusM: 0.001,
  ...over,
});
const antenna = (over: Record<string, unknown> = {}) =>
  JSON.stringify({
    frequenciesMHz: [7.05],
    ground: 'free-space',
    wires: [wire()],
    feeds: [{ wire: 0, position: 0.5 }],
    ...over,
  });

describe('corpus: evaluate refuses what it cannot do in bounded time, naming the field', () => {
  const cases: [string, string, RegExp][] = [
    ['radius 1e-300 m', antenna({ wires: [wire({ radiusM: 1e-300 })] }), /wires\[0\]\.radiusM/],
    ['radius 1e-120 m', antenna({ wires: [wire({ radiusM: 1e-120 })] }), /wires\[0\]\.radiusM/],
    ['radius 5 m on 40 m', antenna({ wires: [wire({ radiusM: 5 })] }), /wires\[0\]\.radiusM.*thin-wire/],
    [
      'lossless soil of permittivity 1e8',
      antenna({ ground: { permittivity: 1e8, conductivitySPerM: 0 } }),
      /ground\.permittivity/,
    ],
    ['frequency 1e6 MHz', antenna({ frequenciesMHz: [1e6] }), /frequenciesMHz\[0\]/],
    ['frequency 1e12 MHz', antenna({ frequenciesMHz: [1e12] }), /frequenciesMHz\[0\]/],
    [
      '2 000 frequencies',
      antenna({ frequenciesMHz: Array.from({ length: 2000 }, (_, i) => 7 + i * 1e-4) }),
      /frequenciesMHz.*at most/,
    ],
    [
      '500 wires',
      antenna({ wires: Array.from({ length: 500 }, (_, i) => wire({ from: [i, 0, 10], to: [i, 0, 30] })) }),
      /"field": "wires"/,
    ],
    [
      'a 20 000 × 20 000 pattern grid',
      antenna({
        pattern: {
          elevationsDeg: Array.from({ length: 20000 }, (_, i) => -90 + i * 0.009),
          azimuthsDeg: Array.from({ length: 20000 }, (_, i) => i * 0.018),
        },
      }),
      /"field": "pattern"/,
    ],
    [
      'a 1 000 km wire',
      antenna({ wires: [wire({ from: [-500000, 0, 10], to: [500000, 0, 10] })] }),
      /wires\[0\]\.from\[0\]/,
    ],
    [
      'negative load resistance',
      antenna({ loads: [{ kind: 'impedance', wire: 0, position: 0.5, rOhm: -30, xOhm: 0 }] }),
      /loads\[0\]\.rOhm.*negative/,
    ],
    [
      'a wire lying on the soil',
      antenna({ ground: 'average', wires: [wire({ from: [-10, 0, 0], to: [10, 0, 0] })] }),
      /wires\[0\].*lies on the ground/,
    ],
    [
      'a wire 1.5 mm above lossy soil',
      antenna({ ground: 'average', wires: [wire({ from: [-10, 0, 0.0015], to: [10, 0, 0.0015] })] }),
      /wires\[0\]\.from\[2\]/,
    ],
    [
      'ground-power check of a wire 5 cm up',
      antenna({
        frequenciesMHz: [3.6],
        ground: 'average',
        groundPowerCheck: true,
        wires: [wire({ from: [-20, 0, 0.05], to: [20, 0, 0.05] })],
      }),
      /groundPowerCheck/,
    ],
    ['coincident wires', antenna({ wires: [wire(), wire()] }), /wires\[1\]/],
  ];
  it.each(cases)('%s', async (_label, doc, field) => {
    expectCleanRefusal(await cli(['evaluate', 'in.json'], doc), field);
  });

  it('a wire 2 m over lossy soil with the ground-power check runs and reports the balance', async () => {
    const r = await cli(
      ['evaluate', 'in.json'],
      antenna({
        frequenciesMHz: [7.05],
        ground: 'average',
        groundPowerCheck: true,
        wires: [wire({ from: [-10, 0, 2], to: [10, 0, 2] })],
      }),
    );
    expect(r.code).toBe(0);
    const out = JSON.parse(r.out) as { frequencies: { groundAbsorbedW?: number; efficiency: number }[] };
    expect(out.frequencies[0].groundAbsorbedW).toBeGreaterThan(0);
    expect(out.frequencies[0].efficiency).toBeLessThan(1);
  }, 60_000);
});

describe('corpus: input files are UTF-8 or refused with the reason', () => {
  const dipole = antenna({ pattern: { elevationsDeg: [], azimuthsDeg: [] } });
  it('accepts and drops a UTF-8 byte-order mark', async () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode(dipole)]);
    expect((await cli(['evaluate', 'in.json'], bytes)).code).toBe(0);
  }, 30_000);
  const refuse: [string, number[], RegExp][] = [
    ['UTF-16 with its mark', [0xff, 0xfe, 0x7b, 0, 0x7d, 0], /UTF-16 \(little-endian byte-order mark\)/],
    ['UTF-16 without a mark', [0x7b, 0, 0x22, 0, 0x61, 0, 0x22, 0], /looks like UTF-16/],
    ['UTF-16 big-endian without a mark', [0, 0x7b, 0, 0x22, 0, 0x61], /looks like UTF-16 \(big-endian/],
    [
      'Latin-1 bytes',
      [...new TextEncoder().encode('{"a":"caf'), 0xe9, 0x22, 0x7d],
      /not valid UTF-8 \(first bad byte at offset 9\)/,
    ],
    ['a lone continuation byte', [0x7b, 0x80, 0x7d], /offset 1/],
    ['an encoded surrogate', [0x7b, 0xed, 0xa0, 0x80, 0x7d], /offset 1/],
  ];
  it.each(refuse)('refuses %s', (_label, bytes, reason) => {
    expect(() => decodeUtf8(new Uint8Array(bytes))).toThrow(reason);
  });
});

describe('corpus: projects that are valid in form but wrong are refused by field', () => {
  const demo = () => JSON.parse(JSON.stringify(buildDemoProject())) as Record<string, unknown>;
  const ring = (pts: number[][]) => ({ type: 'Polygon', coordinates: [[...pts, pts[0]]] });
  const cases: [string, (d: Record<string, unknown>) => void, RegExp][] = [
    ['a station 10 000 km away', (d) => (d.station = [20, 20]), /station: .*outside the lot.*within 1 km/],
    [
      'a support far from the lot',
      (d) => ((d.supports as { position: number[] }[])[0].position = [0, 0]),
      /supports\[0\]\.position: /,
    ],
    [
      'a bow-tie boundary',
      (d) =>
        (d.boundary = ring([
          [0, 0],
          [0.001, 0.001],
          [0.001, 0],
          [0, 0.001],
        ])),
      /boundary\.coordinates\[0\]: the boundary crosses itself/,
    ],
    [
      'a zero-area boundary',
      (d) =>
        (d.boundary = ring([
          [0, 0],
          [0.001, 0],
          [0.002, 0],
        ])),
      /boundary\.coordinates\[0\]: the boundary encloses no area/,
    ],
    [
      'an unknown target region',
      (d) => (d.targets = [{ regionId: 'atlantis' }]),
      /targets\[0\]\.regionId: there is no/,
    ],
    [
      'duplicate own target ids',
      (d) =>
        (d.targets = [
          { id: 't', name: 'A', area: { center: [0, 0], radiusKm: 100 } },
          { id: 't', name: 'B', area: { center: [1, 1], radiusKm: 100 } },
        ]),
      /targets\[1\]\.id: duplicate target id/,
    ],
    ['a repeated band', (d) => (d.bands = ['80m', '80m', '80m']), /bands: lists a band twice/],
    ['no band', (d) => (d.bands = []), /bands: give at least one band/],
    [
      'a soil out of range',
      (d) => (d.soil = { permittivity: 500, conductivitySPerM: 0.01 }),
      /soil\.permittivity: /,
    ],
    ['an unknown soil class', (d) => (d.soil = { classId: 'mud' }), /soil\.classId: must be one of/],
    [
      'a target area of the wrong shape',
      (d) => (d.targets = [{ id: 't', name: 'A', area: { center: [0, 0], radiusKm: 'far' } }]),
      /targets\[0\]\.area\.radiusKm: must be a number/,
    ],
  ];
  it.each(cases)('%s', async (_label, change, reason) => {
    const d = demo();
    change(d);
    const r = await cli(['site', 'p.json'], JSON.stringify(d));
    expectCleanRefusal(r, reason);
  });

  it('1e309 is "must be a finite number", not "must be a number, not number"', async () => {
    const text = JSON.stringify(demo()).replace(/"usableHeightM":[0-9.]+/, '"usableHeightM":1e309');
    const r = await cli(['site', 'p.json'], text);
    expectCleanRefusal(r, /supports\[0\]\.usableHeightM: must be a finite number/);
  });

  it('plan refuses an empty band list instead of planning nothing and exiting 0', async () => {
    const d = demo();
    d.bands = [];
    const r = await cli(['plan', 'p.json'], JSON.stringify(d));
    expectCleanRefusal(r, /bands: give at least one band/);
  });
});
