// Property tests over the project schema (seeded): random documents and random mutations of the
// demo never crash the validator, never pass with a NaN inside, and every error names a field.
// `npm test` runs a few hundred cases; `npm run test:property` runs 10 000.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseProject } from '../../../core/project/schema.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';

const RUNS = Number(process.env.YARDWIRE_PROPERTY_RUNS ?? 300);

function hasNaN(v: unknown): boolean {
  if (typeof v === 'number') return !Number.isFinite(v);
  if (Array.isArray(v)) return v.some(hasNaN);
  if (v && typeof v === 'object') return Object.values(v).some(hasNaN);
  return false;
}

/** Set the value at a random path of a JSON document. */
function mutate(doc: unknown, path: number[], value: unknown): unknown {
  if (path.length === 0 || doc === null || typeof doc !== 'object') return value;
  const keys = Object.keys(doc as object);
  if (keys.length === 0) return value;
  const k = keys[(path[0] as number) % keys.length] as string;
  const copy = (Array.isArray(doc) ? [...doc] : { ...(doc as object) }) as Record<string, unknown>;
  copy[k] = mutate(copy[k], path.slice(1), value);
  return copy;
}

const weird = fc.oneof(
  fc.constant(null),
  fc.constant(Number.NaN),
  fc.constant(Infinity),
  fc.constant(-1),
  fc.constant(0),
  fc.constant(1e308),
  fc.constant(''),
  fc.constant('<img src=x onerror=alert(1)>'),
  fc.string({ maxLength: 20 }),
  fc.double(),
  fc.integer(),
  fc.boolean(),
  fc.array(fc.double(), { maxLength: 4 }),
  fc.json({ maxDepth: 3 }).map((s) => JSON.parse(s) as unknown),
);

describe('project schema under random input (property)', () => {
  it('random JSON never crashes the validator and errors always name a path', () => {
    fc.assert(
      fc.property(fc.json({ maxDepth: 5 }), (text) => {
        const r = parseProject(JSON.parse(text));
        if (!r.ok) for (const e of r.errors) expect(e.path.length).toBeGreaterThan(0);
      }),
      { seed: 11, numRuns: RUNS },
    );
  });

  it('random mutations of the demo: accepted documents hold no NaN or Infinity; rejected ones say where', () => {
    const demo = buildDemoProject();
    fc.assert(
      fc.property(fc.array(fc.nat({ max: 50 }), { minLength: 1, maxLength: 6 }), weird, (path, value) => {
        const doc = mutate(structuredClone(demo), path, value);
        const r = parseProject(doc);
        if (r.ok) expect(hasNaN(r.value)).toBe(false);
        else {
          expect(r.errors.length).toBeGreaterThan(0);
          for (const e of r.errors) {
            expect(e.path).not.toBe('');
            expect(e.message).toMatch(/\w/);
          }
        }
      }),
      { seed: 12, numRuns: RUNS },
    );
  });
});
