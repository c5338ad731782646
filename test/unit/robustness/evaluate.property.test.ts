// Property and bad-input tests of the solver's input edge (`evaluate`): random and hostile antenna
// descriptions never crash the command, never hang, never print NaN or Infinity, and every refusal
// names the field. Seeded; `npm test` runs a modest number of cases, `npm run test:property` 10 000
// of the cheap parsing cases (the solving property scales with YARDWIRE_PROPERTY_RUNS / 50).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { runEvaluate } from '../../../core/cli/evaluate.ts';

const RUNS = Number(process.env.YARDWIRE_PROPERTY_RUNS ?? 300);

/**
 * No NaN or Infinity outside JSON strings (a key or message may quote the word; a number may not),
 * and on success every number in the parsed output is finite.
 */
function expectNoNonFinite(out: string, code: number): void {
  expect(out.replace(/"(?:[^"\\]|\\.)*"/g, '""')).not.toMatch(/NaN|Infinity/);
  if (code !== 0) return;
  const walk = (v: unknown): void => {
    if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
    else if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') Object.values(v).forEach(walk);
  };
  walk(JSON.parse(out));
}

async function evaluateDoc(doc: unknown): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await runEvaluate(['in.json'], {
    stdout: (s) => (out += s),
    stderr: (s) => (err += s),
    readFile: async () => (typeof doc === 'string' ? doc : JSON.stringify(doc)),
  });
  return { code, out, err };
}

const dipole = (over: Record<string, unknown> = {}) => ({
  frequenciesMHz: [7.05],
  ground: 'free-space',
  wires: [{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001, segments: 11 }],
  feeds: [{ wire: 0, position: 0.5 }],
  ...over,
});

describe('evaluate: bad solver inputs get a clear error naming the field', () => {
  const cases: [string, unknown, RegExp][] = [
    [
      'zero-length wire',
      dipole({ wires: [{ from: [0, 0, 10], to: [0, 0, 10], radiusM: 0.001 }] }),
      /wires\[0\]/,
    ],
    [
      'radius larger than the segment',
      dipole({ wires: [{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 3, segments: 11 }] }),
      /wires\[0\]/,
    ],
    [
      'wire below ground',
      dipole({ ground: 'average', wires: [{ from: [-10, 0, -1], to: [10, 0, 5], radiusM: 0.001 }] }),
      /wires\[0\]/,
    ],
    [
      'coincident wires',
      dipole({
        wires: [
          { from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001 },
          { from: [-10, 0, 10], to: [10, 0, 10], radiusM: 0.001 },
        ],
      }),
      /wires\[1\]|wires\[0\]/,
    ],
    ['feed on a missing wire', dipole({ feeds: [{ wire: 3, position: 0.5 }] }), /feeds\[0\]/],
    [
      'feed position outside the wire',
      dipole({ feeds: [{ wire: 0, position: 1.5 }] }),
      /feeds\[0\]\.position/,
    ],
    ['negative frequency', dipole({ frequenciesMHz: [-3] }), /frequenciesMHz\[0\]/],
    ['no frequencies', dipole({ frequenciesMHz: [] }), /frequenciesMHz/],
    ['unknown soil', dipole({ ground: 'swamp-of-doom' }), /ground/],
    [
      'text radius',
      dipole({ wires: [{ from: [-10, 0, 10], to: [10, 0, 10], radiusM: 'thin' }] }),
      /wires\[0\]\.radiusM/,
    ],
    [
      'NaN coordinate (as null)',
      dipole({ wires: [{ from: [null, 0, 10], to: [10, 0, 10], radiusM: 0.001 }] }),
      /wires\[0\]\.from/,
    ],
    ['no feeds', dipole({ feeds: [] }), /feeds/],
    ['not JSON', '{"wires": [', /JSON/],
  ];
  it.each(cases)('%s', async (_label, doc, field) => {
    const r = await evaluateDoc(doc);
    expect(r.code).toBe(1);
    expect(r.out + r.err).toMatch(field);
    expect(r.out).not.toMatch(/NaN|Infinity/);
  });
});

describe('evaluate under random input (property)', () => {
  it('random JSON documents are refused or evaluated, never crash, never print NaN', async () => {
    await fc.assert(
      fc.asyncProperty(fc.json({ maxDepth: 4 }), async (text) => {
        const r = await evaluateDoc(text);
        expect([0, 1]).toContain(r.code);
        expectNoNonFinite(r.out, r.code);
      }),
      { seed: 31, numRuns: RUNS },
    );
  });

  it('random small wire antennas evaluate to finite numbers or a named refusal', async () => {
    const coord = fc.double({ min: -30, max: 30, noNaN: true });
    const height = fc.double({ min: -2, max: 30, noNaN: true });
    const wire = fc.record({
      from: fc.tuple(coord, coord, height),
      to: fc.tuple(coord, coord, height),
      radiusM: fc.double({ min: 1e-5, max: 0.5, noNaN: true }),
      segments: fc.integer({ min: 1, max: 9 }),
    });
    const doc = fc.record({
      frequenciesMHz: fc.array(fc.double({ min: 1, max: 8, noNaN: true }), { minLength: 1, maxLength: 2 }),
      ground: fc.constantFrom('free-space', 'perfect', 'average', 'very-poor', 'salt-water'),
      wires: fc.array(wire, { minLength: 1, maxLength: 3 }),
      feeds: fc.array(
        fc.record({
          wire: fc.integer({ min: 0, max: 3 }),
          position: fc.double({ min: 0, max: 1, noNaN: true }),
        }),
        { minLength: 1, maxLength: 2 },
      ),
      pattern: fc.constant({ elevationsDeg: [10, 45], azimuthsDeg: [0, 90] }),
    });
    await fc.assert(
      fc.asyncProperty(doc, async (d) => {
        const r = await evaluateDoc(d);
        expect([0, 1]).toContain(r.code);
        expectNoNonFinite(r.out, r.code);
        if (r.code === 1) expect(JSON.parse(r.out).error.message.length).toBeGreaterThan(3);
      }),
      { seed: 32, numRuns: Math.max(20, Math.round(RUNS / 5)) },
    );
  }, 120_000);
});
