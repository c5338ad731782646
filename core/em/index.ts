/**
 * The field solver's public API. The planning core and the app import from here.
 *
 *   evaluateAntenna(model, { frequenciesHz, pattern? }) → EvaluationResult   (throws ModelError)
 *   tryEvaluateAntenna(model, options) → { ok: true, value } | { ok: false, error }
 *   sweepImpedance / swrBandwidth / trimDimension                           (sweep.ts)
 *   antennaInputSchema / parseAntennaInput                                  (the JSON document)
 *
 * Method, accuracy and the document format: core/em/README.md.
 */
import { evaluateAntenna, type EvaluateOptions, type EvaluationResult } from './evaluate.ts';
import { ModelError } from './errors.ts';
import type { AntennaModel } from './types.ts';

export { evaluateAntenna, swrOf, toDbi, DEFAULT_PATTERN, GAIN_FLOOR_DBI, SWR_CAP } from './evaluate.ts';
export type {
  EvaluateOptions,
  EvaluationResult,
  FrequencyResult,
  FeedOutput,
  GroundSystemOutput,
  PatternGrid,
  PatternPoint,
} from './evaluate.ts';
export { sweepImpedance, swrBandwidth, trimDimension } from './sweep.ts';
export type {
  SweepOptions,
  SweepPoint,
  SweepResult,
  BandwidthOptions,
  BandwidthResult,
  TrimOptions,
  TrimResult,
} from './sweep.ts';
export { antennaInputSchema, parseAntennaInput, groundFromInput, jsonPath } from './input.ts';
export type { AntennaInput, InputError, ParsedInput } from './input.ts';
export { ModelError } from './errors.ts';
export type { Diagnostic } from './errors.ts';
export type {
  AntennaModel,
  WireSpec,
  FeedSpec,
  LoadSpec,
  RadialSpec,
  GroundSpec,
  Vec3,
  ComplexPair,
} from './types.ts';
export { createGroundModel } from './ground.ts';
export type { GroundModel, GroundAtFrequency, GroundZone } from './ground.ts';
export { fresnelCoefficients, complexPermittivity, soilSurfaceImpedanceOhm } from './fresnel.ts';
export { MATERIALS, internalImpedancePerM, skinDepthM, surfaceResistanceOhm } from './conductor.ts';
export type { ConductorMaterial, MaterialName } from './conductor.ts';
export { SOIL_CLASSES, SOIL_CLASS_IDS, soilById } from './soils.ts';
export type { SoilClass } from './soils.ts';
export { DEFAULT_SEGMENTS_PER_WAVELENGTH } from './mesh.ts';

export type EvaluateOutcome =
  { ok: true; value: EvaluationResult } | { ok: false; error: { field: string; message: string } };

/** evaluateAntenna with the project's result convention: a model that cannot be built is an error value. */
export function tryEvaluateAntenna(model: AntennaModel, options: EvaluateOptions): EvaluateOutcome {
  try {
    return { ok: true, value: evaluateAntenna(model, options) };
  } catch (e) {
    if (e instanceof ModelError) {
      const prefix = `${e.field}: `;
      return {
        ok: false,
        error: {
          field: e.field,
          message: e.message.startsWith(prefix) ? e.message.slice(prefix.length) : e.message,
        },
      };
    }
    throw e;
  }
}
