/**
 * The registry of antenna types. Adding a type means writing one builder module
 * (core/antennas/<type>.ts implementing Builder) and listing it here.
 */
import { dipoleBuilder } from './dipole.ts';
import { halfSquareBuilder } from './halfSquare.ts';
import { invertedLBuilder } from './invertedL.ts';
import { invertedVBuilder } from './invertedV.ts';
import type { AntennaTypeId, Builder } from './types.ts';
import { verticalBuilder } from './vertical.ts';
import { loadedVerticalBuilder, tTopVerticalBuilder, topHatVerticalBuilder } from './shortVerticals.ts';
import { sloperBuilder, slopingVerticalBuilder } from './slopers.ts';
import { directorPairBuilder, verticalPairBuilder } from './verticalPair.ts';
import { switchedPairBuilder } from './switchedPair.ts';
import { fourSquareBuilder } from './fourSquare.ts';
import { fourSquareHungBuilder } from './fourSquareHung.ts';
import {
  halfSquareLBuilder,
  halfSquareReflectorBuilder,
  halfSquareSwitchedBuilder,
} from './halfSquareArrays.ts';
import { phasedPairBuilder } from './phasedPair.ts';
import { loopArrayBuilder } from './loopArray.ts';

export const BUILDERS: readonly Builder[] = [
  dipoleBuilder,
  invertedVBuilder,
  halfSquareBuilder,
  verticalBuilder,
  invertedLBuilder,
  topHatVerticalBuilder,
  tTopVerticalBuilder,
  loadedVerticalBuilder,
  sloperBuilder,
  slopingVerticalBuilder,
  verticalPairBuilder,
  fourSquareBuilder,
  fourSquareHungBuilder,
  halfSquareReflectorBuilder,
  halfSquareSwitchedBuilder,
  halfSquareLBuilder,
  phasedPairBuilder,
  directorPairBuilder,
  loopArrayBuilder,
];

/**
 * Types the planner forms from other candidates rather than from the lot (a switched pair of two
 * shortlisted antennas, core/rank/pairs.ts): not proposed by enumeration, but rebuilt like any
 * other design.
 */
export const DERIVED_BUILDERS: readonly Builder[] = [switchedPairBuilder(builderFor)];

export function builderFor(type: AntennaTypeId): Builder {
  const b = BUILDERS.find((x) => x.type === type) ?? DERIVED_BUILDERS.find((x) => x.type === type);
  if (!b) throw new Error(`no builder for antenna type "${type}"`);
  return b;
}
