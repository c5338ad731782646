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
 * ratio). Coax: 50 Ω, velocity factor 0.66, 1.9 dB per 100 m at 3.6 MHz scaled as √f (an
 * RG-213-class cable, value from memory).
 */
import type { Element } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';
import type { NetworkSpec } from '../em/network.ts';
import { cut, num, round } from './common.ts';
import { VERTICAL_NOMINAL_FRACTION } from './vertical.ts';
import { groupCuts, groupHeights, proposeVerticalArray, verticalParts, verticalsModel } from './verticals.ts';
import type { Builder, Design, WireModel } from './types.ts';

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

/** The array's feed network in state 1 (A driven, B reflecting). */
export function pairNetwork(d: Design): NetworkSpec {
  const line = num(d, 'lineLengthM');
  return {
    portNodes: ['a', 'b'],
    elements: [
      { kind: 'line', a: 'box-a', b: 'a', lengthM: line, ...COAX_LINE },
      { kind: 'line', a: 'box-b', b: 'b', lengthM: line, ...COAX_LINE },
      { kind: 'line', a: 'box-b', b: 'common', lengthM: num(d, 'stubLengthM'), ...COAX_LINE },
    ],
    sources: [{ node: 'box-a', kind: 'voltage', value: [1, 0] }],
  };
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
    network: pairNetwork(d),
    radialsBonded: true,
  };
}

export const verticalPairBuilder: Builder = {
  type: 'vertical-pair',
  label: 'Two switched quarter-wave verticals (driven + reflector)',
  array: true,
  elementCount: 2,
  propose(ctx) {
    const lambda = ctx.band.wavelengthM;
    const f = ctx.band.designFreqHz;
    const s = PAIR_SPACING_WAVELENGTHS * lambda;
    return proposeVerticalArray('vertical-pair', ctx, {
      groupWords: 'two quarter-wave verticals',
      where: 'self-supporting pair at a free spot',
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
        stubLengthM: round(stubLengthM(REFLECTOR_REACTANCE_OHM, f), 2),
      },
      states: [
        { name: 'A driven, B reflects', rotationDeg: 0 },
        { name: 'B driven, A reflects', rotationDeg: 180 },
      ],
      describe: ({ xy, rotationDeg: rot }) => ({
        where: `self-supporting pair at (${xy[0].toFixed(0)} m E, ${xy[1].toFixed(0)} m N), axis ${rot}°–${rot + 180}°`,
        broadsideDeg: [rot, (rot + 180) % 360],
      }),
    });
  },
  model: pairModel,
  elements(d, H): Element[] {
    const [A, B] = pairBases(num(d, 'spacingM')).map((c, i) => verticalParts(d, H, c, NAMES[i]));
    return [A.wire, B.wire, ...A.radials, ...B.radials, A.mast, B.mast];
  },
  heights: (_d, H) => groupHeights(H),
  cutList(d, H) {
    const items = groupCuts(d, H, NAMES, 'vertical radiator (A and B)');
    items.push(
      cut(
        'coax, relay box to each vertical (electrical half wave, VF 0.66)',
        2,
        num(d, 'lineLengthM'),
        2,
        'coax',
      ),
    );
    items.push(
      cut('coax loading stub at the relay box, far end shorted', 1, num(d, 'stubLengthM'), 2, 'coax'),
    );
    return items;
  },
};
