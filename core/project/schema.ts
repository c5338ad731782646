/**
 * The one project schema. A project is one lot scenario: the lot boundary, the supports with
 * their usable heights, keep-out zones, the station point, the soil, the target regions, the
 * bands and the user's settings. The same schema describes a project file, what the store keeps,
 * what the command line reads and what the API carries. Positions are WGS84 [lon, lat] in degrees
 * (GeoJSON order, RFC 7946 §3.1.1); heights and distances are metres.
 *
 * Versioned: `schemaVersion` is the document version; `migrateProjectDocument` brings older
 * documents forward before validation.
 */
import { z } from 'zod';
import { isOnTimeFraction, isPowerW, MAX_POWER_W, STATION_DEFAULTS } from './station.ts';
import { SOIL_CLASS_IDS } from '../em/soils.ts';
import { flattenIssues, projectValidity } from './validity.ts';
import { BAND_INFO } from '../bands.ts';

export const PROJECT_SCHEMA_VERSION = 2;

/** Plain-words messages for the commonest problems, in place of the validator's defaults. */
function plainMessage(issue: { code: string; input?: unknown; expected?: unknown }): string | undefined {
  if (issue.code === 'invalid_type') {
    if (issue.input === undefined) return 'is required';
    if (typeof issue.input === 'number' && issue.expected === 'number') return 'must be a finite number'; // 1e309, NaN
    const got = issue.input === null ? 'null' : Array.isArray(issue.input) ? 'a list' : typeof issue.input;
    return `must be ${article(String(issue.expected))}, not ${got === 'object' ? 'an object' : got}`;
  }
  if (issue.code === 'unrecognized_keys') return undefined;
  return undefined;
}
function article(t: string): string {
  if (t === 'array' || t === 'tuple') return 'a list';
  return /^[aeiou]/.test(t) ? `an ${t}` : `a ${t}`;
}
z.config({ customError: plainMessage });

const finite = z.number().refine(Number.isFinite, 'must be a finite number');

/** [lon, lat] in degrees, WGS84. */
export const LonLatSchema = z.tuple([
  finite.refine((v) => v >= -180 && v <= 180, 'longitude must be between -180 and 180 degrees'),
  finite.refine((v) => v >= -90 && v <= 90, 'latitude must be between -90 and 90 degrees'),
]);
export type LonLat = z.infer<typeof LonLatSchema>;

const idSchema = z
  .string()
  .min(1, 'must not be empty')
  .max(64, 'must be at most 64 characters')
  .regex(/^[A-Za-z0-9_-]+$/, 'may contain only letters, digits, "-" and "_"');

const nameSchema = z.string().trim().min(1, 'must not be empty').max(200, 'must be at most 200 characters');
const notesSchema = z.string().max(5000, 'must be at most 5000 characters').default('');

/** A closed ring of at least 4 positions whose first and last coincide (RFC 7946 §3.1.6). */
export const RingSchema = z
  .array(LonLatSchema)
  .min(4, 'a ring needs at least 4 positions (3 corners and the closing point)')
  .max(10_000, 'a ring may have at most 10000 positions')
  .refine((ring) => {
    const a = ring[0];
    const b = ring[ring.length - 1];
    return a !== undefined && b !== undefined && a[0] === b[0] && a[1] === b[1];
  }, 'a ring must be closed: its last position must equal its first');

export const PolygonSchema = z.object({
  type: z.literal('Polygon'),
  coordinates: z
    .array(RingSchema)
    .min(1, 'a polygon needs an outer ring')
    .max(1, 'holes are not supported in a lot boundary or keep-out'),
});
export type Polygon = z.infer<typeof PolygonSchema>;

export const LineStringSchema = z.object({
  type: z.literal('LineString'),
  coordinates: z.array(LonLatSchema).min(2, 'a line needs at least 2 positions').max(10_000),
});
export type LineString = z.infer<typeof LineStringSchema>;

export const SUPPORT_KINDS = ['tree', 'mast', 'tower', 'building'] as const;
export type SupportKind = (typeof SUPPORT_KINDS)[number];

/** Highest usable attachment height we accept, in metres (a very tall tower). */
export const MAX_SUPPORT_HEIGHT_M = 200;

/**
 * What a tower or mast is made of. Steel and aluminium conduct and go into the antenna model as
 * a vertical conductor (core/antennas/conductors.ts); fibreglass does not. Trees and buildings
 * take no material: they are never modelled as conductors.
 */
export const SUPPORT_MATERIALS = ['steel', 'aluminium', 'fibreglass'] as const;
export type SupportMaterial = (typeof SUPPORT_MATERIALS)[number];

/** Limits of the metal-support dimensions we accept, metres. */
export const FACE_WIDTH_LIMITS_M = { min: 0.05, max: 3 } as const;
export const DIAMETER_LIMITS_M = { min: 0.01, max: 1 } as const;

export const SupportSchema = z
  .object({
    id: idSchema,
    name: nameSchema,
    kind: z.enum(SUPPORT_KINDS, { message: `must be one of ${SUPPORT_KINDS.join(', ')}` }),
    position: LonLatSchema,
    usableHeightM: finite
      .refine((v) => v > 0, 'must be greater than 0 m')
      .refine((v) => v <= MAX_SUPPORT_HEIGHT_M, `must be at most ${MAX_SUPPORT_HEIGHT_M} m`),
    notes: notesSchema,
    /**
     * Towers and masts only. Unset: a tower is taken as steel (it conducts); a mast is unknown
     * (the planner leaves it out of the model and says so).
     */
    material: z
      .enum(SUPPORT_MATERIALS, { message: `must be one of ${SUPPORT_MATERIALS.join(', ')}` })
      .optional(),
    /** Height of the metal structure, metres (unset: the usable height). */
    structureHeightM: finite
      .refine((v) => v > 0, 'must be greater than 0 m')
      .refine((v) => v <= MAX_SUPPORT_HEIGHT_M, `must be at most ${MAX_SUPPORT_HEIGHT_M} m`)
      .optional(),
    /** Face width of a lattice tower, metres. */
    faceWidthM: finite
      .refine(
        (v) => v >= FACE_WIDTH_LIMITS_M.min && v <= FACE_WIDTH_LIMITS_M.max,
        `must be between ${FACE_WIDTH_LIMITS_M.min} and ${FACE_WIDTH_LIMITS_M.max} m`,
      )
      .optional(),
    /** Outside diameter of a tubular mast, metres. */
    diameterM: finite
      .refine(
        (v) => v >= DIAMETER_LIMITS_M.min && v <= DIAMETER_LIMITS_M.max,
        `must be between ${DIAMETER_LIMITS_M.min} and ${DIAMETER_LIMITS_M.max} m`,
      )
      .optional(),
    /** Whether the metal structure is connected to ground at its base (unset: yes). */
    grounded: z.boolean().optional(),
  })
  .superRefine((s, ctx) => {
    if (s.kind === 'tree' || s.kind === 'building') {
      for (const f of ['material', 'structureHeightM', 'faceWidthM', 'diameterM', 'grounded'] as const) {
        if (s[f] !== undefined)
          ctx.addIssue({
            code: 'custom',
            path: [f],
            message: `a ${s.kind} is never modelled as a conductor: leave ${f} unset`,
          });
      }
    }
    if (s.structureHeightM !== undefined && s.structureHeightM < s.usableHeightM)
      ctx.addIssue({
        code: 'custom',
        path: ['structureHeightM'],
        message: `must be at least the usable height (${s.usableHeightM} m): the attachment is on the structure`,
      });
  });
export type Support = z.infer<typeof SupportSchema>;

/**
 * Whether a support conducts: a tower unless it is fibreglass, a mast only when its material is
 * set to a metal (null: a mast whose material is not set, which the user is asked for), never a
 * tree or a building.
 */
export function supportConducts(s: Pick<Support, 'kind' | 'material'>): boolean | null {
  if (s.kind === 'tower') return s.material !== 'fibreglass';
  if (s.kind === 'mast') return s.material === undefined ? null : s.material !== 'fibreglass';
  return false;
}

/**
 * Keep-out kinds. A `path` is a walkway, drive or play area where people walk and linger: wires
 * may pass over it (the end-height rule still holds), and the RF-exposure zones are checked
 * against it. A `buried` zone is a buried cable or pipe (a line, or an area such as a drain
 * field): wires pass over it freely; buried radials, anchors and masts keep settings.buriedClearanceM
 * (or the zone's own clearance, if larger) from it (core/site/feasibility.ts).
 */
export const KEEP_OUT_KINDS = ['building', 'power-line', 'path', 'buried', 'other'] as const;
export type KeepOutKind = (typeof KEEP_OUT_KINDS)[number];

export const KeepOutSchema = z
  .object({
    id: idSchema,
    name: nameSchema,
    kind: z.enum(KEEP_OUT_KINDS, { message: `must be one of ${KEEP_OUT_KINDS.join(', ')}` }),
    geometry: z.discriminatedUnion('type', [PolygonSchema, LineStringSchema], {
      message: 'must be a Polygon or a LineString',
    }),
    /** Horizontal clearance kept around the zone, metres. For a power line: the fall distance plus a margin. */
    clearanceM: finite.refine((v) => v >= 0 && v <= 500, 'must be between 0 and 500 m').default(0),
    /** Height of the object (building ridge, power-line conductors), metres, if known. */
    heightM: finite.refine((v) => v >= 0 && v <= 300, 'must be between 0 and 300 m').optional(),
    notes: notesSchema,
  })
  .refine((k) => k.geometry.type === 'Polygon' || k.kind !== 'building', {
    message: 'a building must be drawn as a polygon',
    path: ['geometry'],
  });
export type KeepOut = z.infer<typeof KeepOutSchema>;

export const SoilSchema = z.union(
  [
    z.object({
      classId: z.enum(SOIL_CLASS_IDS as [string, ...string[]], {
        message: `must be one of the soil classes: ${SOIL_CLASS_IDS.join(', ')}`,
      }),
    }),
    z.object({
      permittivity: finite.refine(
        (v) => v >= 1 && v <= 100,
        'relative permittivity must be between 1 and 100',
      ),
      conductivitySPerM: finite.refine((v) => v >= 0 && v <= 10, 'conductivity must be between 0 and 10 S/m'),
    }),
  ],
  { message: 'must be { "classId": … } or { "permittivity": …, "conductivitySPerM": … }' },
);
export type Soil = z.infer<typeof SoilSchema>;

export const BANDS = ['160m', '80m', '40m'] as const;
export type Band = (typeof BANDS)[number];

/**
 * A region's own take-off window [lowest, highest] in degrees above the horizon, in place of the
 * computed distribution (core/paths/takeoff.ts); optional.
 */
export const TakeoffWindowSchema = z
  .unknown()
  // Checked by hand so that every refusal names this field (a type error inside the union of
  // target kinds would otherwise be reported against the whole target).
  .superRefine((v, ctx) => {
    if (!Array.isArray(v) || v.length !== 2) {
      ctx.addIssue({ code: 'custom', message: 'must be a list of two angles in degrees: [lowest, highest]' });
      return;
    }
    v.forEach((a: unknown, i) => {
      if (typeof a !== 'number' || !Number.isFinite(a) || a < 1 || a > 89)
        ctx.addIssue({
          code: 'custom',
          path: [i],
          message: `the ${i === 0 ? 'lowest' : 'highest'} angle must be a number between 1 and 89 degrees`,
        });
    });
    if (typeof v[0] === 'number' && typeof v[1] === 'number' && v[0] > v[1])
      ctx.addIssue({ code: 'custom', message: 'the lowest angle must not be above the highest' });
  })
  .transform((v) => v as [number, number]);

export const TargetSchema = z.union(
  [
    z.object({
      regionId: idSchema,
      weight: finite.refine((v) => v >= 0 && v <= 100, 'weight must be between 0 and 100').default(1),
      takeoffWindowDeg: TakeoffWindowSchema.optional(),
    }),
    z.object({
      id: idSchema,
      name: nameSchema,
      weight: finite.refine((v) => v >= 0 && v <= 100, 'weight must be between 0 and 100').default(1),
      takeoffWindowDeg: TakeoffWindowSchema.optional(),
      area: z.union(
        [
          z.object({
            center: LonLatSchema,
            radiusKm: finite.refine((v) => v > 0 && v <= 5000, 'radius must be between 0 and 5000 km'),
          }),
          PolygonSchema,
        ],
        { message: 'must be { "center": [lon, lat], "radiusKm": … } or a Polygon' },
      ),
    }),
  ],
  { message: 'must be { "regionId": … } or an own area { "id", "name", "area" }' },
);
export type Target = z.infer<typeof TargetSchema>;

const bandChoice = (band: Band) =>
  z
    .union([
      z.object({ part: z.enum(['cw', 'phone']) }),
      z.object({ part: z.literal('custom'), lowMHz: finite, highMHz: finite }),
    ])
    .superRefine((c, ctx) => {
      if (c.part !== 'custom') return;
      const [lo, hi] = BAND_INFO[band].edgesMHz;
      for (const k of ['lowMHz', 'highMHz'] as const)
        if (!(c[k] >= lo && c[k] <= hi))
          ctx.addIssue({
            code: 'custom',
            path: [k],
            message: `must be inside the ${band} band, ${lo}–${hi} MHz`,
          });
      if (c.lowMHz > c.highMHz)
        ctx.addIssue({ code: 'custom', path: ['highMHz'], message: 'must not be below lowMHz' });
    });

/** Per band, the part the user operates in (core/bands.ts). */
export const OperatingSchema = z.object({
  '160m': bandChoice('160m').optional(),
  '80m': bandChoice('80m').optional(),
  '40m': bandChoice('40m').optional(),
});

/** Emission modes for the exposure estimate (duty factors in core/report/exposure.ts). */
export const STATION_MODES = ['ssb', 'cw', 'ft8'] as const;
/** Coaxial cable types of the feed-line loss table (core/report/buildSheet.ts). */
export const COAX_TYPES = ['RG-58', 'RG-8X', 'RG-213', 'low-loss 10 mm foam'] as const;

/** The station's transmitter and feed line, for the build sheet and the RF-exposure estimate. */
export const StationSettingsSchema = z.object({
  /** Peak envelope power at the transmitter, watts. */
  powerW: finite.refine(isPowerW, `must be between 0 and ${MAX_POWER_W} W`).default(STATION_DEFAULTS.powerW),
  mode: z
    .enum(STATION_MODES, { message: `must be one of ${STATION_MODES.join(', ')}` })
    .default(STATION_DEFAULTS.mode),
  /** Fraction of the averaging time spent transmitting, 0…1. */
  onTimeFraction: finite
    .refine(isOnTimeFraction, 'must be between 0 and 1')
    .default(STATION_DEFAULTS.onTimeFraction),
  coax: z
    .enum(COAX_TYPES, { message: `must be one of ${COAX_TYPES.join(', ')}` })
    .default(STATION_DEFAULTS.coax),
});
export type StationSettings = z.infer<typeof StationSettingsSchema>;

/** Most soil classes a user's soil range may list (each costs one more solve per design). */
export const MAX_SOIL_RANGE = 4;

export const SettingsSchema = z.object({
  units: z.enum(['metric', 'imperial']).default('metric'),
  /** Setback kept from the lot boundary, metres. */
  setbackM: finite.refine((v) => v >= 0 && v <= 50, 'must be between 0 and 50 m').default(1),
  /** Lowest wire end above ground where people walk, metres. */
  minEndHeightM: finite.refine((v) => v >= 0 && v <= 30, 'must be between 0 and 30 m').default(2.5),
  /** Tallest self-supporting vertical the user would put up, metres. */
  maxVerticalHeightM: finite.refine((v) => v >= 0 && v <= 60, 'must be between 0 and 60 m').default(12),
  /** Longest rope from a wire end to its support or anchor, metres (was a fixed 40 m). */
  maxRopeM: finite.refine((v) => v >= 1 && v <= 200, 'must be between 1 and 200 m').default(40),
  /**
   * Distance buried radials keep from a power line's poles and from buried cables and pipes
   * (`buried` keep-outs), metres. Default 3 m: clear of a pole's ground rod and down conductor
   * and of where a buried line may really run, which is seldom exactly where it is drawn (common
   * practice, no source). The overhead line's fall clearance does not apply to buried radials.
   */
  buriedClearanceM: finite.refine((v) => v >= 0 && v <= 20, 'must be between 0 and 20 m').default(3),
  /**
   * The part of each band the user operates in (core/bands.ts): 'cw', 'phone', or their own
   * frequency or span; the planner designs and trims for its centre. Unset: the CW end.
   */
  operating: OperatingSchema.optional(),
  /**
   * Also plan the array types (several elements, relay-switched directions; core/antennas
   * registry entries marked `array`). Slower. Unset: single antennas only.
   */
  planArrays: z.boolean().optional(),
  /**
   * With arrays planned, a switched pair of two antennas (core/rank/pairs.ts) is listed only when
   * its score beats the band's best single antenna by at least this many dB. Default 1 dB: a second
   * antenna, its relays and coax are worth building only for a clear gain (a chosen default).
   */
  pairMarginDb: finite.refine((v) => v >= 0 && v <= 10, 'must be between 0 and 10 dB').default(1),
  /** Number of radials the user would lay. */
  radialCount: z
    .number()
    .int('must be a whole number')
    .min(0, 'must be at least 0')
    .max(240, 'must be at most 240')
    .default(32),
  /** The user's own imagery tile URL template ({z}/{x}/{y}); empty means no imagery (offline). */
  tileUrlTemplate: z
    .string()
    .max(500)
    .refine((s) => s === '' || /^https?:\/\/[^\s"'<>]+$/.test(s), 'must be an http(s) URL template or empty')
    .default(''),
  tileAttribution: z.string().max(300).default(''),
  station: StationSettingsSchema.default(StationSettingsSchema.parse({})),
  /**
   * Soil classes over which each candidate is also scored, to show how far its score moves when
   * the soil is not what the project says (unset: the classes next to the project's, one drier
   * and one wetter; core/em/soils.ts neighbourSoils).
   */
  soilRange: z
    .array(
      z.enum(SOIL_CLASS_IDS as [string, ...string[]], {
        message: `must be one of the soil classes: ${SOIL_CLASS_IDS.join(', ')}`,
      }),
    )
    .min(1, 'give at least one soil class, or leave the range unset')
    .max(MAX_SOIL_RANGE, `at most ${MAX_SOIL_RANGE} soil classes`)
    .refine((ids) => new Set(ids).size === ids.length, 'lists a soil class twice')
    .optional(),
});
export type Settings = z.infer<typeof SettingsSchema>;

export const ProjectSchema = z.object({
  schemaVersion: z.literal(PROJECT_SCHEMA_VERSION, {
    message: `must be ${PROJECT_SCHEMA_VERSION} (this version of Yardwire reads project schema ${PROJECT_SCHEMA_VERSION})`,
  }),
  id: idSchema,
  name: nameSchema,
  notes: notesSchema,
  boundary: PolygonSchema.nullable().default(null),
  supports: z.array(SupportSchema).max(500, 'at most 500 supports').default([]),
  keepOuts: z.array(KeepOutSchema).max(500, 'at most 500 keep-out zones').default([]),
  station: LonLatSchema.nullable().default(null),
  soil: SoilSchema.default({ classId: 'average' }),
  targets: z.array(TargetSchema).max(100).default([]),
  bands: z
    .array(z.enum(BANDS, { message: `must be one of ${BANDS.join(', ')}` }))
    .min(1, 'give at least one band')
    .max(3, 'at most 3 bands')
    .refine((b) => new Set(b).size === b.length, 'lists a band twice')
    .default(['80m']),
  settings: SettingsSchema.default(SettingsSchema.parse({})),
  /**
   * The user's feed-line routes: by shortlisted candidate id, the bend points [lon, lat] between
   * the station point and the candidate's feed point (none: a straight run).
   */
  feedRoutes: z
    .record(idSchema, z.array(LonLatSchema).max(100, 'a route may have at most 100 bend points'))
    .refine((r) => Object.keys(r).length <= 500, 'at most 500 routes')
    .default({}),
});
export type Project = z.infer<typeof ProjectSchema>;
export type ProjectInput = z.input<typeof ProjectSchema>;

/** One validation problem: where (a JSON path like `supports[2].usableHeightM`) and what is wrong. */
export interface FieldError {
  path: string;
  message: string;
}

export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`;
    else out += out === '' ? String(p) : `.${String(p)}`;
  }
  return out === '' ? '(document)' : out;
}

export type ParseResult<T> = { ok: true; value: T } | { ok: false; errors: FieldError[] };

/**
 * Brings older documents forward, one step per version:
 * - none → 1: the version field was added;
 * - 1 → 2: station settings (power, mode, on-time, coax), feed-line routes and the `path`
 *   keep-out kind were added; all have defaults, so the step only sets the version.
 */
export function migrateProjectDocument(doc: unknown): unknown {
  if (doc === null || typeof doc !== 'object' || Array.isArray(doc)) return doc;
  let d = doc as Record<string, unknown>;
  if (d.schemaVersion === undefined) d = { ...d, schemaVersion: 1 };
  if (d.schemaVersion === 1) d = { ...d, schemaVersion: 2 };
  return d;
}

/** Validate an unknown document (after migration) as a project, collecting every error. */
export function parseProject(doc: unknown): ParseResult<Project> {
  const version = (doc as { schemaVersion?: unknown } | null)?.schemaVersion;
  if (typeof version === 'number' && version > PROJECT_SCHEMA_VERSION) {
    return {
      ok: false,
      errors: [
        {
          path: 'schemaVersion',
          message: `this file was written by a newer Yardwire (schema ${version}); this version reads up to ${PROJECT_SCHEMA_VERSION}`,
        },
      ],
    };
  }
  const migrated = migrateProjectDocument(doc);
  const result = ProjectSchema.safeParse(migrated);
  if (result.success) {
    const dup = [...duplicateIds(result.data), ...projectValidity(result.data)];
    if (dup.length > 0) return { ok: false, errors: dup };
    return { ok: true, value: result.data };
  }
  return {
    ok: false,
    errors: flattenIssues(result.error.issues, migrated).map((i) => ({
      path: formatPath(i.path),
      message: i.message,
    })),
  };
}

function duplicateIds(p: Project): FieldError[] {
  const errors: FieldError[] = [];
  const seen = new Set<string>();
  p.supports.forEach((s, i) => {
    if (seen.has(s.id)) errors.push({ path: `supports[${i}].id`, message: `duplicate id "${s.id}"` });
    seen.add(s.id);
  });
  p.keepOuts.forEach((k, i) => {
    if (seen.has(k.id)) errors.push({ path: `keepOuts[${i}].id`, message: `duplicate id "${k.id}"` });
    seen.add(k.id);
  });
  return errors;
}

/** A new, empty project. */
export function emptyProject(id: string, name: string): Project {
  return ProjectSchema.parse({ schemaVersion: PROJECT_SCHEMA_VERSION, id, name });
}
