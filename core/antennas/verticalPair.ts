/**
 * Two-element vertical array: two identical self-supporting quarter-wave verticals, one driven
 * and one a parasitic reflector, with a relay box midway that swaps the roles (two directions).
 *
 * Feed arrangement (why this one): identical elements let one relay box reverse the beam, so the
 * array serves both ends of its axis; the box holds the relay and the reflector's loading stub.
 * Each element is joined to the box by an electrical half wave of coax, which repeats the
 * element's impedance at the box (common practice, no source): the station's feed line meets the
 * driven element's own impedance, and the stub at the box loads the other element as if it were
 * at its base. The relay (double-throw, one pole per element) connects one line to the station
 * feed and the other to the shorted stub. The stub (a shorted length of the same coax) is an
 * inductive reactance that makes the parasitic element electrically longer: a reflector.
 *
 * Modelled (core/em/network.ts): both half-wave lines and the stub with their loss; the relay
 * contacts are ideal; state 2 is state 1 turned by 180° (the array is symmetric), so one solve
 * serves both. Radials: the user's count at each base, a quarter wave unless the lot clips them;
 * where the two fields meet they are cut on the line midway and bonded (core/em/bondedRadials.ts).
 *
 * Canonical frame: element A at (0, +s/2), element B at (0, −s/2); state 1 drives A and beams
 * toward canonical north. Trim dimension: the height of both verticals.
 *
 * Values of the trade used here (common practice, no source): spacing 0.15 λ; reflector loading
 * about +j25 Ω at the base of a resonant quarter-wave element (checked against the solver in
 * test/unit/antennas/verticalPair.test.ts, which reports the forward gain and the front-to-back
 * ratio). The driven + director variant (`directorPairBuilder`, type 'vertical-pair-director') is
 * the same pair 0.1 λ apart with an open stub (capacitive) on the element in front; it gains less
 * than the reflector pair (solver, 40 m, average soil: +1.5 dB over one vertical against +2.2 dB,
 * the director's half-wave line running at a high SWR takes some 20 % of the power) but needs less
 * room. Coax: 50 Ω, velocity factor 0.66, 1.9 dB per 100 m at 3.6 MHz scaled as √f (an
 * RG-213-class cable, value from memory).
 */
import type { Element } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';
import type { NetworkSpec } from '../em/network.ts';
import { coaxCut, num, round } from './common.ts';
import { VERTICAL_NOMINAL_FRACTION } from './vertical.ts';
import { groupCuts, groupHeights, proposeVerticalArray, verticalParts, verticalsModel } from './verticals.ts';
import type { AntennaTypeId, Builder, BuildContext, CutItem, Design, WireModel } from './types.ts';

export const PAIR_SPACING_WAVELENGTHS = 0.15;
export const REFLECTOR_REACTANCE_OHM = 25;
export const COAX_Z0_OHM = 50;
export const COAX_VELOCITY_FACTOR = 0.66;
export const COAX_LOSS_DB_PER_100M = 1.9;
export const COAX_LOSS_REFERENCE_MHZ = 3.6;
/** Axis bearings tried at each spot (canonical north of the array on the site). */
export const PAIR_AXES_DEG = [0, 90];
/** Spots proposed per band. */
export const PAIR_SPOT_COUNT = 2;

/** The array's coax as a line of the feed network (core/em/network.ts), less its length. */
export const COAX_LINE = {
  z0Ohm: COAX_Z0_OHM,
  velocityFactor: COAX_VELOCITY_FACTOR,
  lossDbPer100m: COAX_LOSS_DB_PER_100M,
  lossReferenceMHz: COAX_LOSS_REFERENCE_MHZ,
};

/** Physical length of an electrical half wave of the coax at f. */
export function halfWaveCoaxM(freqHz: number): number {
  return (0.5 * COAX_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / freqHz;
}

/** Shorted stub length giving +jX with lossless Z0: ℓ = (λ_line/2π)·atan(X/Z0) (Pozar §2.3). */
export function stubLengthM(reactanceOhm: number, freqHz: number): number {
  const lambdaLine = (COAX_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / freqHz;
  return (lambdaLine / (2 * Math.PI)) * Math.atan(reactanceOhm / COAX_Z0_OHM);
}

/** Open stub length giving −jX (X > 0) with lossless Z0: ℓ = (λ_line/2π)·atan(Z0/X) (Pozar §2.3). */
export function openStubLengthM(reactanceOhm: number, freqHz: number): number {
  const lambdaLine = (COAX_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / freqHz;
  return (lambdaLine / (2 * Math.PI)) * Math.atan(COAX_Z0_OHM / reactanceOhm);
}

/** One line of a feed network: from node a to node b, lengthM long. */
export type LineRun = readonly [a: string, b: string, lengthM: number];

/**
 * A feed network of lines of one cable (`cable`: the line less its ends and length, such as
 * COAX_LINE), driven by 1 V at node `driven`, with the model's feeds at `portNodes`
 * (core/em/network.ts).
 */
export function linesNetwork(
  portNodes: readonly string[],
  driven: string,
  cable: typeof COAX_LINE,
  runs: readonly LineRun[],
): NetworkSpec {
  return {
    portNodes,
    elements: runs.map(([a, b, lengthM]) => ({ kind: 'line', a, b, lengthM, ...cable })),
    sources: [{ node: driven, kind: 'voltage', value: [1, 0] }],
  };
}

/**
 * The relay box of a switched pair: equal coax from box-a to A and from box-b to B, the stub on
 * the run from `stub[0]` to `stub[1]`, the box `driven` fed.
 */
function switchedPairNetwork(d: Design, driven: string, stub: readonly [string, string]): NetworkSpec {
  const line = num(d, 'lineLengthM');
  return linesNetwork(['a', 'b'], driven, COAX_LINE, [
    ['box-a', 'a', line],
    ['box-b', 'b', line],
    [...stub, num(d, 'stubLengthM')],
  ]);
}

/**
 * The director pair's network in state 1: B driven, A loaded by an open stub (a capacitive
 * reactance that makes it electrically shorter: a director), so state 1 beams toward A (north).
 */
export function directorPairNetwork(d: Design): NetworkSpec {
  return switchedPairNetwork(d, 'box-b', ['box-a', 'stub-open-end']);
}

/** The array's feed network in state 1 (A driven, B reflecting: a shorted stub on B's run). */
export function pairNetwork(d: Design): NetworkSpec {
  return switchedPairNetwork(d, 'box-a', ['box-b', 'common']);
}

/** Names and canonical bases of the two verticals for spacing s: A at (0, +s/2), B at (0, −s/2). */
const NAMES = ['A', 'B'] as const;
const pairBases = (s: number): XY[] => [
  [0, s / 2],
  [0, -s / 2],
];

function pairModel(d: Design, H: number): WireModel {
  return {
    ...verticalsModel(d, H, pairBases(num(d, 'spacingM')), NAMES),
    network: d.type === DIRECTOR_PAIR_TYPE ? directorPairNetwork(d) : pairNetwork(d),
    radialsBonded: true,
    ...(d.type === DIRECTOR_PAIR_TYPE ? { referenceFeed: 1 } : {}),
  };
}

/** The driven + director variant (directorPairBuilder). */
export const DIRECTOR_PAIR_TYPE = 'vertical-pair-director';
/** The parasitic element's stub at the relay box: a shorted one (reflector) or an open one (director). */
const REFLECTOR_STUB = (f: number): number => stubLengthM(REFLECTOR_REACTANCE_OHM, f);
const DIRECTOR_STUB = (f: number): number => openStubLengthM(-DIRECTOR_REACTANCE_OHM, f);

/** Proposals of a switched pair of self-supporting verticals `spacing` wavelengths apart. */
function proposePair(
  ctx: BuildContext,
  type: AntennaTypeId,
  spacingWavelengths: number,
  kind: string,
  stubM: (freqHz: number) => number,
  stateNames: [string, string],
): ReturnType<Builder['propose']> {
  const lambda = ctx.band.wavelengthM;
  const f = ctx.band.designFreqHz;
  const s = spacingWavelengths * lambda;
  return proposeVerticalArray(type, ctx, {
    groupWords: 'two quarter-wave verticals',
    where: `self-supporting pair${kind} at a free spot`,
    bases: pairBases(s),
    names: NAMES,
    axesDeg: PAIR_AXES_DEG,
    count: PAIR_SPOT_COUNT,
    minApartM: 0.25 * lambda,
    trim: {
      name: 'height of both verticals',
      nominalM: VERTICAL_NOMINAL_FRACTION * lambda,
      minM: 0.2 * lambda,
      maxM: 0.3 * lambda,
    },
    noSpotReason: `no free spot on the lot keeps two masts ${s.toFixed(1)} m apart clear of the setback and every keep-out`,
    params: {
      spacingM: round(s, 2),
      lineLengthM: round(halfWaveCoaxM(f), 2),
      stubLengthM: round(stubM(f), 2),
    },
    states: [
      { name: stateNames[0], rotationDeg: 0 },
      { name: stateNames[1], rotationDeg: 180 },
    ],
    describe: ({ xy, rotationDeg: rot }) => ({
      where: `self-supporting pair${kind} at (${xy[0].toFixed(0)} m E, ${xy[1].toFixed(0)} m N), axis ${rot}°–${rot + 180}°`,
      broadsideDeg: [rot, (rot + 180) % 360],
    }),
  });
}

/** Cut list of a switched pair: both verticals and their radials, the two half-wave lines, the stub. */
function pairCuts(d: Design, H: number, stubLabel: string): CutItem[] {
  return [
    ...groupCuts(d, H, NAMES, 'vertical radiator (A and B)'),
    coaxCut('coax, relay box to each vertical (electrical half wave, VF 0.66)', 2, num(d, 'lineLengthM')),
    coaxCut(stubLabel, 1, num(d, 'stubLengthM')),
  ];
}

/**
 * Spacing and director loading of the driven + director pair: near the most 15° forward gain over
 * average soil at 40 m in a sweep of the field solver (spacing 0.1 and 0.15 λ, the director's base
 * reactance 0 to −80 Ω: +2.0 dB over one vertical at 0.1 λ and −20 Ω, +1.8 dB at 0.15 λ and −30 Ω;
 * test/unit/antennas/verticalPair.test.ts checks the forward gain and the front-to-back ratio).
 */
export const DIRECTOR_SPACING_WAVELENGTHS = 0.1;
export const DIRECTOR_REACTANCE_OHM = -20;

export const verticalPairBuilder: Builder = {
  type: 'vertical-pair',
  label: 'Two switched quarter-wave verticals (driven + reflector)',
  array: true,
  elementCount: 2,
  propose: (ctx) =>
    proposePair(ctx, 'vertical-pair', PAIR_SPACING_WAVELENGTHS, '', REFLECTOR_STUB, [
      'A driven, B reflects',
      'B driven, A reflects',
    ]),
  model: pairModel,
  elements(d, H): Element[] {
    const [A, B] = pairBases(num(d, 'spacingM')).map((c, i) => verticalParts(d, H, c, NAMES[i]));
    return [A.wire, B.wire, ...A.radials, ...B.radials, A.mast, B.mast];
  },
  heights: (_d, H) => groupHeights(H),
  cutList: (d, H) => pairCuts(d, H, 'coax loading stub at the relay box, far end shorted'),
};

/**
 * Driven + director: the same two verticals and relay box, 0.1 λ apart; the relay puts an open
 * coax stub (a capacitive reactance, DIRECTOR_REACTANCE_OHM at the base through the half-wave
 * line) on the element in front, which makes it a director. State 1 drives B and beams toward A
 * (canonical north); state 2 is state 1 turned by 180°.
 */
export const directorPairBuilder: Builder = {
  ...verticalPairBuilder,
  type: DIRECTOR_PAIR_TYPE,
  label: 'Two switched quarter-wave verticals (driven + director)',
  propose: (ctx) =>
    proposePair(
      ctx,
      DIRECTOR_PAIR_TYPE,
      DIRECTOR_SPACING_WAVELENGTHS,
      ' (driven + director)',
      DIRECTOR_STUB,
      ['B driven, A directs', 'A driven, B directs'],
    ),
  cutList: (d, H) => pairCuts(d, H, 'coax director stub at the relay box, far end open'),
};
