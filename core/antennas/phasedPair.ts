/**
 * Two driven quarter-wave verticals, phased: a quarter wave apart, fed from a relay box midway,
 * switchable between end-fire one way (the rear vertical leads by 90°), end-fire the other way,
 * and broadside (both in phase, beaming both ways across the array's axis).
 *
 * Feed arrangement (why this one): two coax lines of equal length ℓE run from the box to the two
 * verticals; in end-fire a delay line ℓD (coax coiled in the box) is switched by the relay into
 * the path of the front vertical, in broadside it is left out. The station's line meets the
 * node where the two paths join. This is the plainest arrangement a builder can switch with one
 * relay pair and cut from one roll of coax: two equal runs and one delay piece. The lengths are
 * designed here from first principles, not taken from any published network: with drive
 * impedances Z_B (rear) and Z_F (front) at the target currents I_B = 1, I_F = t (t = 1∠−90°), the
 * voltage at the input of a line of length ℓ ending in a load Z carrying current I is
 * V(ℓ) = I·(Z·cosh γℓ + Z0·sinh γℓ) (Pozar, Microwave Engineering, 4th ed., 2012, §2.3 and §2.7,
 * the lossy line's input voltage from its ABCD matrix), and the two paths joined at one node need
 * V_B(ℓE) = V_F(ℓE + ℓD): one complex equation for the two lengths (`phasingLines`, a grid search
 * then Newton's method). The drive impedances come from the mutual impedance of the two verticals
 * solved by the field solver (`pairImpedances`) over perfect ground, plus the loss resistance of
 * each radial field (`designGroundLossOhm`): the Wait–Pope integral of core/em/radials.ts for one
 * quarter-wave vertical with the user's radial count over the project's soil, computed when the
 * array is proposed and kept as the design parameter `groundLossOhm`, so the design stays a pure
 * function of its parameters (DESIGN_GROUND_LOSS_OHM only when the soil is not known). The
 * currents the network really achieves over the project's soil are then solved
 * with the wires (core/em/network.ts) and reported (core/antennas/arrayFeed.ts): the pattern the
 * plan scores is that of the achieved currents, not of the target.
 *
 * Broadside: with the delay out, both verticals hang on equal lines from one node, so by symmetry
 * their currents are equal and in phase whatever the coupling; the pattern is not a turn or a
 * mirror of the end-fire one, so it is solved as its own network (WireModel.stateNetworks, state
 * `variant` 1). End-fire the other way is end-fire turned by 180° (the pair is symmetric).
 *
 * The heights are a single vertical's nominal resonant height (not trimmed through the box, as
 * for the four-square: the box's reactance is the L-network's job, core/match); the station's
 * line sees the impedance at the box, which differs between end-fire and broadside (both are
 * reported). Radials: the user's count at each base, cut on the line midway and bonded there.
 *
 * Canonical frame: front vertical F at (0, +s/2), rear R at (0, −s/2); state 1 beams toward
 * canonical north (toward F). Values of the trade (common practice, no source): spacing λ/4 and
 * 90° phasing give the cardioid end-fire pattern; 75 Ω coax (PHASING_LINE_Z0_OHM), velocity
 * factor 0.66, the loss of core/antennas/verticalPair.ts's cable.
 */
import type { Element } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';
import { lineHyperbolics, type NetworkSpec } from '../em/network.ts';
import { evaluateAntenna } from '../em/evaluate.ts';
import { c, cAdd, cDiv, cMul, cSub, type Complex } from '../numeric/complex.ts';
import { complexPermittivity, soilSurfaceImpedanceOhm } from '../em/fresnel.ts';
import { ETA0 } from '../em/constants.ts';
import {
  BARE_CONTACT_RADIUS_M,
  NEAR_FIELD_WAVELENGTHS,
  groundLossResistance,
  sinusoidalMonopoleSurfaceField,
} from '../em/radials.ts';
import { soilGround } from '../em/soils.ts';
import type { Soil } from '../project/schema.ts';
import { coaxCut, num, proposalList, round, wire, WIRE_RADIUS_M } from './common.ts';
import { RADIAL_RADIUS_M } from './radials.ts';
import { VERTICAL_NOMINAL_FRACTION } from './vertical.ts';
import { COAX_LINE, COAX_VELOCITY_FACTOR, linesNetwork } from './verticalPair.ts';
import { groupCuts, groupHeights, proposeVerticalArray, verticalParts, verticalsModel } from './verticals.ts';
import type { Builder, Design, WireModel } from './types.ts';

export const PHASED_SPACING_WAVELENGTHS = 0.25;
/**
 * The phasing lines are 75 Ω coax: with 50 Ω no pair of lengths solves the equal-voltage condition
 * for λ/4 spacing and 90° (the nearest misses by some 4 V per ampere of drive, lossless, with the
 * drive impedances of two resonant verticals over perfect ground plus DESIGN_GROUND_LOSS_OHM);
 * with 75 Ω it has solutions.
 */
export const PHASING_LINE_Z0_OHM = 75;
/** The phasing lines (core/em/network.ts), less their length. */
export const PHASING_LINE = { ...COAX_LINE, z0Ohm: PHASING_LINE_Z0_OHM };
/** Target phase of the front vertical's current relative to the rear one's, degrees (end-fire). */
export const PHASED_TARGET_PHASE_DEG = -90;
/**
 * Fallback loss resistance at each vertical's base for the design of the lines, ohms, used only
 * when the soil's electrical values are not known (an unknown class id): a radial field of some
 * 16 to 32 quarter-wave radials over average soil (value from memory, common practice, no
 * source). The achieved currents are solved over the real soil and reported.
 */
export const DESIGN_GROUND_LOSS_OHM = 8;

/**
 * The loss resistance of one quarter-wave vertical's radial field, referred to its base current,
 * ohms: the Wait–Pope integral (core/em/radials.ts groundLossResistance) of the sinusoidal
 * monopole's surface field (sinusoidalMonopoleSurfaceField) over `count` radials of `radialM`,
 * between the radiator's radius and NEAR_FIELD_WAVELENGTHS λ (the limits the solver uses), with
 * the soil's surface impedance from the solver's own conversion (fresnel.ts
 * complexPermittivity, soilSurfaceImpedanceOhm). One vertical alone: the pair's fields are cut
 * and bonded midway, which the solver then models. DESIGN_GROUND_LOSS_OHM when the soil is
 * unknown.
 */
export function designGroundLossOhm(
  soil: Soil,
  freqHz: number,
  heightM: number,
  count: number,
  radialM: number,
): number {
  const g = soilGround(soil);
  if (!g || g.kind !== 'soil') return DESIGN_GROUND_LOSS_OHM;
  const zg = soilSurfaceImpedanceOhm(complexPermittivity(g, freqHz), ETA0);
  const lengthsM = Array<number>(Math.max(0, Math.round(count))).fill(radialM);
  return groundLossResistance({
    freqHz,
    screen: { lengthsM, radiusM: RADIAL_RADIUS_M },
    zg,
    hAbs2PerI0: sinusoidalMonopoleSurfaceField(freqHz, heightM),
    rhoMinM: lengthsM.length ? WIRE_RADIUS_M : Math.max(BARE_CONTACT_RADIUS_M, WIRE_RADIUS_M),
    rhoMaxM: (NEAR_FIELD_WAVELENGTHS * SPEED_OF_LIGHT_M_PER_S) / freqHz,
  });
}
/** Slack on each element line beyond the straight run from the box to the base, metres. */
export const PHASED_LINE_SLACK_M = 1;
export const PHASED_AXES_DEG = [0, 90];
export const PHASED_SPOT_COUNT = 2;

const NAMES = ['F', 'R'] as const;
const pairBases = (s: number): XY[] => [
  [0, s / 2],
  [0, -s / 2],
];

/** V(ℓ) = I·(Z cosh γℓ + Z0 sinh γℓ): input voltage of a line ending in Z carrying I (Pozar §2.7). */
export function lineInputVoltage(z: Complex, i: Complex, lengthM: number, freqHz: number): Complex {
  const { sh, ch } = lineHyperbolics(PHASING_LINE, lengthM, freqHz);
  return cMul(i, cAdd(cMul(z, ch), c(PHASING_LINE_Z0_OHM * sh.re, PHASING_LINE_Z0_OHM * sh.im)));
}

/**
 * The element lines ℓE (each, at least `minElementM`) and the delay ℓD (0 … one wavelength in the
 * line) for which the rear vertical (drive impedance zRear, current 1) and the front one (zFront,
 * current `ratio`) fed in parallel from one node get those currents: V_R(ℓE) = V_F(ℓE + ℓD).
 * Null when no pair of lengths solves it.
 */
export function phasingLines(
  zRear: Complex,
  zFront: Complex,
  ratio: Complex,
  freqHz: number,
  minElementM: number,
): { elementLineM: number; delayLineM: number; residualV: number } | null {
  const lamL = (COAX_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / freqHz;
  const f = (e: number, d: number): Complex =>
    cSub(lineInputVoltage(zRear, c(1), e, freqHz), lineInputVoltage(zFront, ratio, e + d, freqHz));
  const size = (v: Complex) => Math.hypot(v.re, v.im);
  // Grid over one half wave of ℓE (the equation repeats every half wave, up to the line loss) and
  // one wave of ℓD; then Newton's method on the two real unknowns from the best grid points.
  const N = 120;
  const starts: { e: number; d: number; r: number }[] = [];
  for (let i = 0; i < N; i++)
    for (let j = 0; j < 2 * N; j++) {
      const e = minElementM + (i * lamL) / 2 / N;
      const d = (j * lamL) / 2 / N;
      starts.push({ e, d, r: size(f(e, d)) });
    }
  starts.sort((p, q) => p.r - q.r);
  let best: { elementLineM: number; delayLineM: number; residualV: number } | null = null;
  for (const s of starts.slice(0, 12)) {
    let { e, d } = s;
    for (let k = 0; k < 40; k++) {
      const v = f(e, d);
      const h = 1e-4 * lamL;
      const de = cDiv(cSub(f(e + h, d), v), c(h));
      const dd = cDiv(cSub(f(e, d + h), v), c(h));
      // [de dd] [Δe Δd]ᵀ = −v, two real unknowns
      const det = de.re * dd.im - dd.re * de.im;
      if (Math.abs(det) < 1e-12) break;
      const stepE = (-v.re * dd.im + dd.re * v.im) / det;
      const stepD = (-de.re * v.im + v.re * de.im) / det;
      const lim = lamL / 20;
      e += Math.max(-lim, Math.min(lim, stepE));
      d += Math.max(-lim, Math.min(lim, stepD));
      if (Math.hypot(stepE, stepD) < 1e-6) break;
    }
    d = ((d % lamL) + lamL) % lamL;
    while (e < minElementM) e += lamL / 2;
    const r = size(f(e, d));
    if (r > 1e-6 * size(lineInputVoltage(zRear, c(1), e, freqHz))) continue;
    if (!best || e + d < best.elementLineM + best.delayLineM - 1e-6)
      best = { elementLineM: e, delayLineM: d, residualV: r };
  }
  return best;
}

/**
 * Self and mutual impedance of two verticals of height H, `s` apart, over perfect ground, at f:
 * the field solver with a current source of 1 A into one base and the other base open
 * (Z11 = V1, Z21 = V2). Cached per (f, H, s).
 */
const zCache = new Map<string, { z11: Complex; z12: Complex }>();
export function pairImpedances(freqHz: number, H: number, s: number): { z11: Complex; z12: Complex } {
  const key = `${freqHz}|${H.toFixed(4)}|${s.toFixed(4)}`;
  const hit = zCache.get(key);
  if (hit) return hit;
  const lambda = SPEED_OF_LIGHT_M_PER_S / freqHz;
  const wires = pairBases(s).map((b, i) => wire([b[0], b[1], 0], [b[0], b[1], H], lambda, `v${i}`));
  const r = evaluateAntenna(
    {
      wires: wires.map(({ from, to, radiusM, segments, material }) => ({
        from,
        to,
        radiusM,
        segments,
        material,
      })),
      feeds: [
        { wire: 0, position: 0 },
        { wire: 1, position: 0 },
      ],
      network: {
        portNodes: ['a', 'b'],
        elements: [],
        sources: [{ node: 'a', kind: 'current', value: [1, 0] }],
      },
      ground: { kind: 'perfect' },
    },
    { frequenciesHz: [freqHz], pattern: { elevationsDeg: [], azimuthsDeg: [] } },
  ).frequencies[0];
  const v = r.feeds.map((p) => c(p.voltageV[0], p.voltageV[1]));
  const out = { z11: v[0], z12: v[1] };
  zCache.set(key, out);
  return out;
}

/** The designed lengths of a pair of height H at f (spacing s): element lines and delay. */
export function designPhasing(
  freqHz: number,
  H: number,
  s: number,
  groundLossOhm = DESIGN_GROUND_LOSS_OHM,
): { elementLineM: number; delayLineM: number; zRear: Complex; zFront: Complex } | null {
  const { z11, z12 } = pairImpedances(freqHz, H, s);
  const self = cAdd(z11, c(groundLossOhm));
  const phi = (PHASED_TARGET_PHASE_DEG * Math.PI) / 180;
  const t = c(Math.cos(phi), Math.sin(phi));
  // drive impedances at the target currents: Z_R = Z11 + Z12·t, Z_F = Z11 + Z12/t
  const zRear = cAdd(self, cMul(z12, t));
  const zFront = cAdd(self, cDiv(z12, t));
  const lines = phasingLines(zRear, zFront, t, freqHz, s / 2 + PHASED_LINE_SLACK_M);
  return lines ? { ...lines, zRear, zFront } : null;
}

/** The network of end-fire toward F (state 1): R on ℓE, F on the delay and ℓE. */
export function phasedNetwork(d: Design): NetworkSpec {
  const e = num(d, 'elementLineM');
  return linesNetwork(['f', 'r'], 'box', PHASING_LINE, [
    ['box', 'r', e],
    ['box', 'delay', num(d, 'delayLineM')],
    ['delay', 'f', e],
  ]);
}

/** The network of broadside (state 3): both on ℓE from the box, the delay out. */
export function broadsideNetwork(d: Design): NetworkSpec {
  const e = num(d, 'elementLineM');
  return linesNetwork(['f', 'r'], 'box', PHASING_LINE, [
    ['box', 'r', e],
    ['box', 'f', e],
  ]);
}

function phasedModel(d: Design, H: number): WireModel {
  return {
    ...verticalsModel(d, H, pairBases(num(d, 'spacingM')), NAMES),
    network: phasedNetwork(d),
    stateNetworks: [broadsideNetwork(d)],
    radialsBonded: true,
    referenceFeed: 1,
  };
}

export const phasedPairBuilder: Builder = {
  type: 'phased-pair',
  label: 'Two phased quarter-wave verticals (end-fire or broadside)',
  array: true,
  elementCount: 2,
  propose(ctx) {
    const lambda = ctx.band.wavelengthM;
    const f = ctx.band.designFreqHz;
    const s = PHASED_SPACING_WAVELENGTHS * lambda;
    const H = VERTICAL_NOMINAL_FRACTION * lambda;
    // rounded first, so that the kept parameter is the value the lines were designed with
    const lossOhm = round(
      designGroundLossOhm(ctx.site.site.soil, f, H, ctx.site.site.settings.radialCount, 0.25 * lambda),
      2,
    );
    const lines = designPhasing(f, H, s, lossOhm);
    const spec = {
      groupWords: 'two quarter-wave verticals',
      where: 'phased pair at a free spot',
      bases: pairBases(s),
      names: NAMES,
      axesDeg: PHASED_AXES_DEG,
      count: PHASED_SPOT_COUNT,
      minApartM: 0.25 * lambda,
      trim: {
        name: "height of both verticals (a single vertical's resonant height)",
        nominalM: H,
        minM: H,
        maxM: H,
      },
      noSpotReason: `no free spot on the lot keeps two masts ${s.toFixed(1)} m apart clear of the setback and every keep-out`,
      params: {
        spacingM: round(s, 2),
        elementLineM: round(lines?.elementLineM ?? 0, 2),
        delayLineM: round(lines?.delayLineM ?? 0, 2),
        groundLossOhm: lossOhm,
      },
      states: [
        { name: 'end-fire toward F (R leads by 90°)', rotationDeg: 0 },
        { name: 'end-fire toward R (F leads by 90°)', rotationDeg: 180 },
        { name: 'broadside (in phase), both ways across the axis', rotationDeg: 0, variant: 1, beamDeg: 90 },
      ],
      describe: ({ xy, rotationDeg: rot }: { xy: XY; rotationDeg: number }) => ({
        where: `phased pair at (${xy[0].toFixed(0)} m E, ${xy[1].toFixed(0)} m N), axis ${rot}°–${rot + 180}°`,
        broadsideDeg: [rot, (rot + 180) % 360, (rot + 90) % 360, (rot + 270) % 360],
      }),
    };
    if (!lines) {
      const out = proposalList('phased-pair', ctx.band);
      out.reject([], spec.where, 'no pair of coax lengths gives the 90° phasing with these verticals');
      return out.result();
    }
    return proposeVerticalArray('phased-pair', ctx, spec);
  },
  model: phasedModel,
  elements(d, H): Element[] {
    const [F, R] = pairBases(num(d, 'spacingM')).map((b, i) => verticalParts(d, H, b, NAMES[i]));
    return [F.wire, R.wire, ...F.radials, ...R.radials, F.mast, R.mast];
  },
  heights: (_d, H) => groupHeights(H),
  cutList: (d, H) => [
    ...groupCuts(d, H, NAMES, 'vertical radiator (F and R)'),
    coaxCut('75 Ω coax, relay box to each vertical (equal lengths, VF 0.66)', 2, num(d, 'elementLineM')),
    coaxCut('75 Ω coax delay line in the relay box (end-fire phasing)', 1, num(d, 'delayLineM')),
  ],
};
