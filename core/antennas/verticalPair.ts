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
import { clipRadial, requiredClearance, boundaryDistance, keepOutDistance } from '../site/feasibility.ts';
import type { Element } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';
import type { NetworkSpec } from '../em/network.ts';
import {
  RADIAL_RADIUS_M,
  arr,
  cut,
  lambdaOf,
  num,
  radialElements,
  round,
  wire,
  MIN_RADIAL_M,
} from './common.ts';
import { SPOT_GRID_M, VERTICAL_NOMINAL_FRACTION } from './vertical.ts';
import type { Builder, Design, Proposal, Rejection, WireModel } from './types.ts';

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

const coax = {
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
      { kind: 'line', a: 'box-a', b: 'a', lengthM: line, ...coax },
      { kind: 'line', a: 'box-b', b: 'b', lengthM: line, ...coax },
      { kind: 'line', a: 'box-b', b: 'common', lengthM: num(d, 'stubLengthM'), ...coax },
    ],
    sources: [{ node: 'box-a', kind: 'voltage', value: [1, 0] }],
  };
}

function pairModel(d: Design, H: number): WireModel {
  const lambda = lambdaOf(d);
  const s = num(d, 'spacingM');
  const ra = arr(d, 'radialLengthsAM');
  const rb = arr(d, 'radialLengthsBM');
  const wires = [
    wire([0, s / 2, 0], [0, s / 2, H], lambda, 'vertical A'),
    wire([0, -s / 2, 0], [0, -s / 2, H], lambda, 'vertical B'),
  ];
  const radials = [];
  if (ra.length) radials.push({ wire: 0, count: ra.length, lengthsM: ra, radiusM: RADIAL_RADIUS_M });
  if (rb.length) radials.push({ wire: 1, count: rb.length, lengthsM: rb, radiusM: RADIAL_RADIUS_M });
  return {
    wires,
    feeds: [
      { wire: 0, position: 0 },
      { wire: 1, position: 0 },
    ],
    radials,
    network: pairNetwork(d),
    radialsBonded: true,
  };
}

export const verticalPairBuilder: Builder = {
  type: 'vertical-pair',
  label: 'Two switched quarter-wave verticals (driven + reflector)',
  array: true,
  elementCount: 2,
  propose({ site, band }) {
    const proposals: Proposal[] = [];
    const rejections: Rejection[] = [];
    const st = site.site.settings;
    const lambda = band.wavelengthM;
    const nominal = VERTICAL_NOMINAL_FRACTION * lambda;
    const s = PAIR_SPACING_WAVELENGTHS * lambda;
    const trim = {
      name: 'height of both verticals',
      nominalM: nominal,
      minM: 0.2 * lambda,
      maxM: 0.3 * lambda,
    };
    if (nominal > st.maxVerticalHeightM) {
      rejections.push({
        type: 'vertical-pair',
        band: band.band,
        supports: [],
        where: 'self-supporting pair at a free spot',
        reasons: [
          `two quarter-wave verticals (about ${nominal.toFixed(1)} m) are taller than your ${st.maxVerticalHeightM.toFixed(1)} m self-supporting limit`,
        ],
      });
      return { proposals, rejections };
    }
    const b = site.site.boundary;
    const xs = b.map((p) => p[0]);
    const ys = b.map((p) => p[1]);
    const place = (xy: XY, rot: number, dy: number): XY => {
      const r = (rot * Math.PI) / 180;
      return [xy[0] + dy * Math.sin(r), xy[1] + dy * Math.cos(r)];
    };
    const free = (p: XY): boolean =>
      boundaryDistance(site, p) >= st.setbackM &&
      !site.site.keepOuts.some((k, i) => keepOutDistance(site, i, p) < requiredClearance(k, trim.maxM));
    const spots: { xy: XY; rot: number; total: number }[] = [];
    for (let x = Math.min(...xs); x <= Math.max(...xs); x += SPOT_GRID_M)
      for (let y = Math.min(...ys); y <= Math.max(...ys); y += SPOT_GRID_M)
        for (const rot of PAIR_AXES_DEG) {
          const xy: XY = [x, y];
          const a = place(xy, rot, s / 2);
          const bb = place(xy, rot, -s / 2);
          if (!free(a) || !free(bb)) continue;
          let total = 0;
          for (let k = 0; k < 8; k++) {
            total += clipRadial(site, a, rot + k * 45, 0.25 * lambda);
            total += clipRadial(site, bb, rot + k * 45, 0.25 * lambda);
          }
          spots.push({ xy, rot, total });
        }
    spots.sort((p, q) => q.total - p.total);
    const chosen: { xy: XY; rot: number }[] = [];
    for (const sp of spots) {
      if (chosen.length >= PAIR_SPOT_COUNT) break;
      if (chosen.some((c) => Math.hypot(c.xy[0] - sp.xy[0], c.xy[1] - sp.xy[1]) < 0.25 * lambda)) continue;
      chosen.push(sp);
    }
    if (chosen.length === 0)
      rejections.push({
        type: 'vertical-pair',
        band: band.band,
        supports: [],
        where: 'self-supporting pair at a free spot',
        reasons: [
          `no free spot on the lot keeps two masts ${s.toFixed(1)} m apart clear of the setback and every keep-out`,
        ],
      });
    chosen.forEach(({ xy, rot }, k) => {
      const a = place(xy, rot, s / 2);
      const bb = place(xy, rot, -s / 2);
      const radialM = 0.25 * lambda;
      proposals.push({
        design: {
          type: 'vertical-pair',
          band: band.band,
          designFreqHz: band.designFreqHz,
          params: {
            spacingM: round(s, 2),
            lineLengthM: round(halfWaveCoaxM(band.designFreqHz), 2),
            stubLengthM: round(stubLengthM(REFLECTOR_REACTANCE_OHM, band.designFreqHz), 2),
            radialLengthsAM: radialsCutAtMidlines(
              (bg, n) => clipRadial(site, a, bg, n),
              rot,
              [0, s / 2],
              [[0, -s / 2]],
              st.radialCount,
              radialM,
            ),
            radialLengthsBM: radialsCutAtMidlines(
              (bg, n) => clipRadial(site, bb, bg, n),
              rot,
              [0, -s / 2],
              [[0, s / 2]],
              st.radialCount,
              radialM,
            ),
          },
          trim: { ...trim, maxM: Math.min(trim.maxM, st.maxVerticalHeightM) },
          states: [
            { name: 'A driven, B reflects', rotationDeg: 0 },
            { name: 'B driven, A reflects', rotationDeg: 180 },
          ],
        },
        placement: { originXY: xy, rotationDeg: rot },
        supports: [],
        groupKey: `vertical-pair:free:${k}`,
        where: `self-supporting pair at (${xy[0].toFixed(0)} m E, ${xy[1].toFixed(0)} m N), axis ${rot}°–${rot + 180}°`,
        broadsideDeg: [rot, (rot + 180) % 360],
      });
    });
    return { proposals, rejections };
  },
  model: pairModel,
  elements(d, H): Element[] {
    const s = num(d, 'spacingM');
    return [
      { kind: 'wire', label: 'vertical A', from: [0, s / 2, 0], to: [0, s / 2, H] },
      { kind: 'wire', label: 'vertical B', from: [0, -s / 2, 0], to: [0, -s / 2, H] },
      ...radialElements(arr(d, 'radialLengthsAM'), [0, s / 2, 0]).map((e) => ({
        ...e,
        label: `A ${e.label}`,
      })),
      ...radialElements(arr(d, 'radialLengthsBM'), [0, -s / 2, 0]).map((e) => ({
        ...e,
        label: `B ${e.label}`,
      })),
      { kind: 'mast', label: 'self-supporting vertical A', at: [0, s / 2], heightM: H },
      { kind: 'mast', label: 'self-supporting vertical B', at: [0, -s / 2], heightM: H },
    ];
  },
  heights(_d, H) {
    return [
      { label: 'feed points (bases)', heightM: 0 },
      { label: 'top of each vertical', heightM: H },
    ];
  },
  cutList(d, H) {
    const items = [cut('vertical radiator (A and B)', 2, H)];
    const byLen = new Map<number, number>();
    for (const l of [...arr(d, 'radialLengthsAM'), ...arr(d, 'radialLengthsBM')])
      byLen.set(l, (byLen.get(l) ?? 0) + 1);
    [...byLen.entries()]
      .sort((p, q) => q[0] - p[0])
      .forEach(([l, n]) => items.push(cut('buried radial', n, l, 1, 'radial')));
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

/**
 * Radial lengths at one base (canonical `base`), in canonical bearing order k·360°/N: a quarter
 * wave unless the lot clips it (`clip` takes the site bearing), and cut where it meets the line
 * midway to any other element (`others`, canonical), where the fields are bonded.
 */
export function radialsCutAtMidlines(
  clip: (bearingDeg: number, nominalM: number) => number,
  rotationDeg: number,
  base: XY,
  others: readonly XY[],
  count: number,
  nominalM: number,
): number[] {
  const out: number[] = [];
  for (let k = 0; k < count; k++) {
    const b = (2 * Math.PI * k) / count;
    const ux = Math.sin(b);
    const uy = Math.cos(b);
    let meet = Infinity;
    for (const o of others) {
      const dx = o[0] - base[0];
      const dy = o[1] - base[1];
      const along = ux * dx + uy * dy;
      if (along > 1e-9) meet = Math.min(meet, (dx * dx + dy * dy) / (2 * along));
    }
    const len = Math.min(clip(rotationDeg + (k * 360) / count, nominalM), meet);
    if (len >= MIN_RADIAL_M) out.push(round(len, 2));
  }
  return out;
}
