/**
 * The antenna description document read by `evaluate` (and, later, the app's API): one zod
 * schema, exported, and its conversion to the solver's SI model. Documented for users in
 * core/em/README.md. Frequencies in MHz and angles in degrees at this edge; all else SI.
 */
import { z } from 'zod';
import { mhzToHz } from '../units/index.ts';
import { SOIL_CLASS_IDS, soilGround } from './soils.ts';
import type { EvaluateOptions } from './evaluate.ts';
import type { AntennaModel, GroundSpec, LoadSpec } from './types.ts';

const finite = z.number().refine(Number.isFinite, 'must be a finite number');
const positive = finite.refine((v) => v > 0, 'must be positive');
const nonNegative = finite.refine((v) => v >= 0, 'must not be negative');
const point = z.tuple([finite, finite, finite]);
const index = z.number().int('must be a whole number').nonnegative('must not be negative');
const fraction = finite.refine((v) => v >= 0 && v <= 1, 'must lie between 0 and 1');

const materialSchema = z.union([
  z.enum(['perfect', 'copper', 'aluminium', 'steel', 'stainless-steel']),
  z.object({ conductivitySPerM: positive, relativePermeability: positive.optional() }).strict(),
]);

const wireSchema = z
  .object({
    from: point,
    to: point,
    radiusM: positive,
    segments: z.number().int('must be a whole number').min(1).max(2000).optional(),
    material: materialSchema.optional(),
  })
  .strict();

const feedSchema = z
  .object({ wire: index, position: fraction, voltage: z.tuple([finite, finite]).optional() })
  .strict();

const loadSchema = z.discriminatedUnion('kind', [
  z
    .object({ kind: z.literal('impedance'), wire: index, position: fraction, rOhm: finite, xOhm: finite })
    .strict(),
  z
    .object({
      kind: z.literal('series-rlc'),
      wire: index,
      position: fraction,
      rOhm: nonNegative.optional(),
      lH: positive.optional(),
      cF: positive.optional(),
    })
    .strict(),
  z
    .object({
      kind: z.literal('parallel-rlc'),
      wire: index,
      position: fraction,
      rOhm: positive.optional(),
      lH: positive.optional(),
      cF: positive.optional(),
    })
    .strict(),
]);

const radialSchema = z
  .object({
    wire: index,
    count: z.number().int('must be a whole number').min(1).max(1000),
    lengthM: positive.optional(),
    lengthsM: z.array(positive).optional(),
    radiusM: positive,
  })
  .strict();

const groundSchema = z.union(
  [
    z.enum(['free-space', 'perfect', ...(SOIL_CLASS_IDS as [string, ...string[]])]),
    z
      .object({
        permittivity: finite.refine((v) => v >= 1, 'must be at least 1'),
        conductivitySPerM: nonNegative,
      })
      .strict(),
  ],
  {
    message: `must be "free-space", "perfect", a soil-class id (${SOIL_CLASS_IDS.join(', ')}) or { "permittivity": …, "conductivitySPerM": … }`,
  },
);

const angleList = z.array(finite).max(20000);

export const antennaInputSchema = z
  .object({
    frequenciesMHz: z.array(positive).min(1, 'give at least one frequency').max(2000),
    ground: groundSchema,
    wires: z.array(wireSchema).min(1, 'the antenna has no wires').max(500),
    feeds: z.array(feedSchema).min(1, 'the antenna has no feed').max(64),
    loads: z.array(loadSchema).max(500).optional(),
    radials: z.array(radialSchema).max(64).optional(),
    pattern: z
      .object({
        elevationsDeg: angleList.refine(
          (a) => a.every((v) => v >= -90 && v <= 90),
          'elevations lie between −90 and 90',
        ),
        azimuthsDeg: angleList,
      })
      .strict()
      .optional(),
    referenceImpedanceOhm: positive.optional(),
    groundModel: z.enum(['exact', 'approximate']).optional(),
    groundPowerCheck: z.boolean().optional(),
    segmentsPerWavelength: finite
      .refine((v) => v >= 10 && v <= 400, 'must lie between 10 and 400')
      .optional(),
  })
  .strict()
  .superRefine((doc, ctx) => {
    const nW = doc.wires.length;
    const wireRef = (w: number, path: (string | number)[]) => {
      if (w >= nW)
        ctx.addIssue({ code: 'custom', path, message: `there is no wire ${w} (the antenna has ${nW})` });
    };
    doc.feeds.forEach((f, i) => wireRef(f.wire, ['feeds', i, 'wire']));
    (doc.loads ?? []).forEach((l, i) => wireRef(l.wire, ['loads', i, 'wire']));
    (doc.radials ?? []).forEach((r, i) => {
      wireRef(r.wire, ['radials', i, 'wire']);
      if ((r.lengthM === undefined) === (r.lengthsM === undefined))
        ctx.addIssue({ code: 'custom', path: ['radials', i], message: 'give either lengthM or lengthsM' });
      if (r.lengthsM && r.lengthsM.length !== r.count)
        ctx.addIssue({
          code: 'custom',
          path: ['radials', i, 'lengthsM'],
          message: `${r.lengthsM.length} lengths for ${r.count} radials`,
        });
    });
    if (doc.ground === 'free-space' && doc.radials?.length)
      ctx.addIssue({ code: 'custom', path: ['radials'], message: 'radials need a ground' });
  });

export type AntennaInput = z.infer<typeof antennaInputSchema>;

/** JSON path of a zod issue path: wires[2].radiusM. */
export function jsonPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const p of path) out += typeof p === 'number' ? `[${p}]` : out ? `.${String(p)}` : String(p);
  return out;
}

export interface InputError {
  field: string;
  message: string;
}

export type ParsedInput =
  { ok: true; model: AntennaModel; options: EvaluateOptions } | { ok: false; errors: InputError[] };

export function groundFromInput(g: AntennaInput['ground']): GroundSpec {
  if (g === 'free-space') return { kind: 'free-space' };
  if (g === 'perfect') return { kind: 'perfect' };
  // The schema admits only known class ids, so the conversion always answers here.
  return soilGround(g)!;
}

/** Validate an unknown document and convert it to the solver's model and options. */
export function parseAntennaInput(doc: unknown): ParsedInput {
  const r = antennaInputSchema.safeParse(doc);
  if (!r.success)
    return {
      ok: false,
      errors: r.error.issues.map((i) => ({ field: jsonPath(i.path), message: i.message })),
    };
  const d = r.data;
  const model: AntennaModel = {
    ground: groundFromInput(d.ground),
    wires: d.wires.map((w) => ({
      from: w.from,
      to: w.to,
      radiusM: w.radiusM,
      segments: w.segments,
      material:
        w.material === undefined || typeof w.material === 'string'
          ? w.material
          : {
              conductivitySPerM: w.material.conductivitySPerM,
              relativePermeability: w.material.relativePermeability ?? 1,
            },
    })),
    feeds: d.feeds.map((f) => ({ wire: f.wire, position: f.position, voltage: f.voltage })),
    loads: (d.loads ?? []).map((l): LoadSpec => l),
    radials: (d.radials ?? []).map((r) => ({
      wire: r.wire,
      count: r.count,
      lengthsM: r.lengthsM ?? new Array<number>(r.count).fill(r.lengthM ?? 0),
      radiusM: r.radiusM,
    })),
  };
  const options: EvaluateOptions = {
    frequenciesHz: d.frequenciesMHz.map(mhzToHz),
    pattern: d.pattern ?? { elevationsDeg: [], azimuthsDeg: [] },
    referenceImpedanceOhm: d.referenceImpedanceOhm,
    segmentsPerWavelength: d.segmentsPerWavelength,
    groundModel: d.groundModel ?? 'exact',
    groundPowerCheck: d.groundPowerCheck ?? false,
  };
  return { ok: true, model, options };
}
