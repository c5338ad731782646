/**
 * Four-square: four self-supporting quarter-wave verticals on the corners of a square of side
 * λ/4, fed for end-fire along a diagonal, with four directions switched by relays.
 *
 * Feed arrangement (why this one): the hybrid-coupler feed, the one commonly built (common
 * practice, no source). Each element is joined to the control box by an electrical quarter wave
 * of 75 Ω foam-dielectric coax (VF 0.82, FORCING_LINE_VELOCITY_FACTOR), or three where one does
 * not reach (`oddQuarterWaveM`): a quarter-wave line forces the element's current to −jV/Z0 of the box voltage
 * whatever the element's drive impedance (Pozar §2.5: Zin = Z0²/ZL), so the box sets the current
 * phases even though mutual coupling makes the four drive impedances differ. In the box a 90°
 * hybrid splits the station's power: its through port feeds the back element, its coupled port
 * (90° later) the two side elements in parallel, and an inverting 1:1 transformer on the through
 * port feeds the front element 180° after the back one; the hybrid's isolated port goes to a 50 Ω
 * dump resistor that takes the power reflected by the unequal loads (reported as network loss).
 * Relays in the box rotate which element is the back one (four states, the array being
 * symmetric: one solve serves all four). All of it is in the model (core/em/network.ts): lines
 * with loss, the hybrid, the transformer, the dump resistor; the relay contacts are ideal.
 *
 * Canonical frame: front element F at (0, +a), right R at (+a, 0), back B at (0, −a), left L at
 * (−a, 0), a = (λ/4)/√2; state 1 beams toward canonical north. Radials: the user's count at each
 * base, cut on the lines midway to the other elements and bonded there. The four are cut to the
 * nominal resonant height of one quarter-wave vertical (0.245 λ, common practice, no source) and
 * not trimmed through the box (see `propose`); trimming each alone over the project's soil is
 * left to do.
 */
import type { Element } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';
import type { NetworkSpec } from '../em/network.ts';
import { coaxCut, num, round } from './common.ts';
import { VERTICAL_NOMINAL_FRACTION } from './vertical.ts';
import { COAX_LOSS_DB_PER_100M, COAX_LOSS_REFERENCE_MHZ } from './verticalPair.ts';
import { groupCuts, groupHeights, proposeVerticalArray, verticalParts, verticalsModel } from './verticals.ts';
import { COAX_RUN_SLACK_M } from './halfSquareArrays.ts';
import type { Builder, CutItem, Design, WireModel } from './types.ts';

/** Characteristic impedance of the current-forcing lines (75 Ω coax; common practice, no source). */
export const FORCING_LINE_Z0_OHM = 75;
export const HYBRID_Z0_OHM = 50;
export const DUMP_RESISTOR_OHM = 50;
/** Square orientations tried at each spot. */
export const FOUR_SQUARE_AXES_DEG = [0, 45];
export const FOUR_SQUARE_SPOT_COUNT = 1;

const NAMES = ['F', 'R', 'B', 'L'] as const;
/** The four verticals' names in the canonical frame's clockwise order (F, R, B, L). */
export const FOUR_SQUARE_NAMES = NAMES;

/** Element positions in the canonical frame (F, R, B, L) for side `side`. */
export function fourSquareCorners(side: number): XY[] {
  const a = side / Math.SQRT2;
  return [
    [0, a],
    [a, 0],
    [0, -a],
    [-a, 0],
  ];
}

/**
 * Velocity factor of the forcing lines: foam-dielectric 75 Ω coax (about 0.82; value from memory,
 * common practice, no source). With solid-dielectric coax (0.66) one electrical quarter wave is
 * 0.165 λ, shorter than the 0.177 λ from the box at the centre of a λ/4 square to a corner, so the
 * line would not reach; with foam it is 0.205 λ and does.
 */
export const FORCING_LINE_VELOCITY_FACTOR = 0.82;

/** Physical length of an electrical quarter wave of the forcing-line coax at f. */
export function quarterWaveCoaxM(freqHz: number): number {
  return (0.25 * FORCING_LINE_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / freqHz;
}

/**
 * The forcing lines: the smallest odd number of electrical quarter waves of the coax that reaches
 * runM (box to the farthest base) with COAX_RUN_SLACK_M to spare. An odd number of quarter waves
 * forces the current as one does (Zin = Z0²/ZL repeats every half wave; Pozar §2.5), at more
 * loss: one is used wherever it reaches (it does from the centre of a λ/4 square).
 */
export function oddQuarterWaveM(runM: number, freqHz: number): number {
  const q = quarterWaveCoaxM(freqHz);
  let n = 1;
  while (n * q < runM + COAX_RUN_SLACK_M) n += 2;
  return n * q;
}

/** The cut-list row of the four forcing lines. */
export function forcingLineCut(d: Design): CutItem {
  const n = Math.round(num(d, 'lineLengthM') / quarterWaveCoaxM(d.designFreqHz));
  return coaxCut(
    `75 Ω coax, control box to each vertical (${n} electrical quarter wave${n > 1 ? 's' : ''}, VF ${FORCING_LINE_VELOCITY_FACTOR}, foam)`,
    4,
    num(d, 'lineLengthM'),
  );
}

/**
 * The hybrid-coupler network. `turn` k (0…3) is the relay state that makes the vertical k places
 * clockwise of F the front one (its feed is joined to the front output): the same box, the lines
 * routed round by k.
 */
export function fourSquareNetwork(d: Design, turn = 0): NetworkSpec {
  const line = num(d, 'lineLengthM');
  const coax = {
    z0Ohm: FORCING_LINE_Z0_OHM,
    velocityFactor: FORCING_LINE_VELOCITY_FACTOR,
    lossDbPer100m: COAX_LOSS_DB_PER_100M,
    lossReferenceMHz: COAX_LOSS_REFERENCE_MHZ,
  };
  return {
    portNodes: NAMES.map((_, i) => `e${NAMES[(i - turn + 4) % 4]}`),
    elements: [
      { kind: 'hybrid', ports: ['in', 'through', 'coupled', 'isolated'], z0Ohm: HYBRID_Z0_OHM },
      { kind: 'impedance', a: 'isolated', b: 'common', rOhm: DUMP_RESISTOR_OHM, xOhm: 0 },
      // front: inverted through-port voltage
      { kind: 'transformer', primary: ['through', 'common'], secondary: ['common', 'xF'], turnsRatio: 1 },
      { kind: 'line', a: 'xF', b: 'eF', lengthM: line, ...coax },
      { kind: 'line', a: 'coupled', b: 'eR', lengthM: line, ...coax },
      { kind: 'line', a: 'through', b: 'eB', lengthM: line, ...coax },
      { kind: 'line', a: 'coupled', b: 'eL', lengthM: line, ...coax },
    ],
    sources: [{ node: 'in', kind: 'voltage', value: [1, 0] }],
  };
}

function fourSquareModel(d: Design, H: number): WireModel {
  return {
    ...verticalsModel(d, H, fourSquareCorners(num(d, 'sideM')), NAMES),
    network: fourSquareNetwork(d),
    radialsBonded: true,
    referenceFeed: 2,
  };
}

export const fourSquareBuilder: Builder = {
  type: 'four-square',
  label: 'Four-square of quarter-wave verticals (hybrid-coupler feed)',
  array: true,
  elementCount: 4,
  propose(ctx) {
    const lambda = ctx.band.wavelengthM;
    const nominal = VERTICAL_NOMINAL_FRACTION * lambda;
    const side = 0.25 * lambda;
    return proposeVerticalArray('four-square', ctx, {
      groupWords: 'four quarter-wave verticals',
      where: 'self-supporting four-square at a free spot',
      bases: fourSquareCorners(side),
      names: NAMES,
      axesDeg: FOUR_SQUARE_AXES_DEG,
      count: FOUR_SQUARE_SPOT_COUNT,
      minApartM: 0,
      // The four are cut to a single vertical's resonant height and not trimmed through the box:
      // the hybrid hides the elements' reactance, so trimming for the station line's reactance
      // shortens them until the dump resistor takes a large share (measured: 42 % against 9 % at
      // the resonant height, 80 m over very good ground; test/unit/antennas/fourSquare.test.ts).
      trim: {
        name: "height of the four verticals (a single vertical's resonant height)",
        nominalM: nominal,
        minM: nominal,
        maxM: nominal,
      },
      noSpotReason: `no free spot on the lot holds a ${side.toFixed(1)} m square of masts clear of the setback and every keep-out`,
      // The box at the centre, side/√2 from each base: one foam quarter wave reaches.
      params: {
        sideM: round(side, 2),
        lineLengthM: round(oddQuarterWaveM(side / Math.SQRT2, ctx.band.designFreqHz), 2),
      },
      states: NAMES.map((n, i) => ({ name: `beam toward vertical ${n}`, rotationDeg: 90 * i })),
      describe: ({ xy, rotationDeg: rot }) => ({
        where: `self-supporting four-square centred at (${xy[0].toFixed(0)} m E, ${xy[1].toFixed(0)} m N)`,
        broadsideDeg: [0, 90, 180, 270].map((r) => (rot + r) % 360),
      }),
    });
  },
  model: fourSquareModel,
  elements(d, H): Element[] {
    return fourSquareCorners(num(d, 'sideM')).flatMap((c, i): Element[] => {
      const v = verticalParts(d, H, c, NAMES[i]);
      return [v.wire, v.mast, ...v.radials];
    });
  },
  heights: (_d, H) => groupHeights(H),
  cutList: (d, H) => [...groupCuts(d, H, NAMES, 'vertical radiator (four)'), forcingLineCut(d)],
};
