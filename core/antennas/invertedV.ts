/**
 * Inverted-V from one support: fed at the apex, two legs sloping down to anchors at the lowest
 * allowed end height.
 *
 * Canonical frame: the support at the origin, apex height h. A short horizontal feed wire of
 * APEX_WIRE_M is centred on the apex along x (the feed sits at its middle); the legs run from its
 * ends. In plan the legs point at bearings ±φ/2 from canonical north... for φ = 180° they point east
 * and west (a straight inverted-V), for smaller plan angles φ the legs bend toward north (a V in plan
 * too, to fit a lot). Each leg drops from h to the end height e = minEndHeight; its plan reach is
 * √(ℓ² − (h − e)²). When the legs are too short to reach the end height at an included angle of at
 * least 90°, the ends stay higher at that angle. Trim dimension: the total wire length L.
 */
import type { Element } from '../site/feasibility.ts';
import type { XYZ } from '../site/geometry.ts';
import { cut, lambdaOf, num, proposalList, wire } from './common.ts';
import type { Builder, Design, WireModel } from './types.ts';

/** Length of the horizontal feed wire at the apex, metres (a modelling detail, common practice, no source). */
export const APEX_WIRE_M = 1;
/** Plan angles between the legs that are tried, degrees. */
export const PLAN_ANGLES_DEG = [180, 140, 100] as const;
/** Orientation step, degrees. */
export const ORIENTATION_STEP_DEG = 5;
/** Smallest included angle between the legs in their own plane, degrees (common practice, no source). */
export const MIN_INCLUDED_ANGLE_DEG = 90;

interface Shape {
  apexL: XYZ;
  apexR: XYZ;
  endL: XYZ;
  endR: XYZ;
}

function shape(d: Design, L: number): Shape {
  const h = num(d, 'heightM');
  const e = num(d, 'endHeightM');
  const phi = (num(d, 'planAngleDeg') * Math.PI) / 180;
  const leg = Math.max(0, L / 2 - APEX_WIRE_M / 2);
  let drop = h - e;
  const minHalf = ((MIN_INCLUDED_ANGLE_DEG / 2) * Math.PI) / 180;
  // Legs at least minHalf from vertical: drop ≤ leg·cos(minHalf).
  if (drop > leg * Math.cos(minHalf)) drop = leg * Math.cos(minHalf);
  const reach = Math.sqrt(Math.max(0, leg * leg - drop * drop));
  // Leg plan directions: bearings 90° − ... expressed as unit vectors at ±φ/2 from north.
  const uL: [number, number] = [-Math.sin(phi / 2), Math.cos(phi / 2)];
  const uR: [number, number] = [Math.sin(phi / 2), Math.cos(phi / 2)];
  const a = APEX_WIRE_M / 2;
  const apexL: XYZ = [-a, 0, h];
  const apexR: XYZ = [a, 0, h];
  return {
    apexL,
    apexR,
    endL: [apexL[0] + uL[0] * reach, uL[1] * reach, h - drop],
    endR: [apexR[0] + uR[0] * reach, uR[1] * reach, h - drop],
  };
}

export const invertedVBuilder: Builder = {
  type: 'inverted-v',
  label: 'Inverted-V from one support',
  propose({ site, band }) {
    const out = proposalList('inverted-v', band);
    const e = site.site.settings.minEndHeightM;
    for (const s of site.site.supports) {
      if (s.heightM <= e + 1) {
        out.rejectBy(
          (e + 1 - s.heightM) / (e + 1),
          [s.id],
          `from ${s.name}`,
          `${s.name} at ${s.heightM.toFixed(1)} m is not above the ${e.toFixed(1)} m end height`,
        );
        continue;
      }
      for (const phiDeg of PLAN_ANGLES_DEG) {
        const full = phiDeg === 180 ? 180 : 360;
        for (let beta = 0; beta < full; beta += ORIENTATION_STEP_DEG) {
          // Canonical legs bend toward north; rotation by beta turns canonical north to bearing beta.
          out.proposals.push({
            design: out.design(
              { heightM: s.heightM, endHeightM: e, planAngleDeg: phiDeg },
              {
                name: 'total wire length',
                nominalM: 0.47 * band.wavelengthM,
                minM: 0.38 * band.wavelengthM,
                maxM: 0.56 * band.wavelengthM,
              },
            ),
            placement: { originXY: s.xy, rotationDeg: beta },
            supports: [s.id],
            groupKey: `inverted-v:${s.id}:${phiDeg}`,
            where:
              phiDeg === 180
                ? `from ${s.name}, wire along ${((beta + 90) % 180).toFixed(0)}°`
                : `from ${s.name}, legs ${phiDeg}° apart in plan, opening toward ${beta.toFixed(0)}°`,
            broadsideDeg: [beta % 360, (beta + 180) % 360],
          });
        }
      }
    }
    return out.result();
  },
  model(d, L): WireModel {
    const lambda = lambdaOf(d);
    const sh = shape(d, L);
    return {
      wires: [
        wire(sh.apexL, sh.apexR, lambda, 'feed wire at the apex', true),
        wire(sh.apexL, sh.endL, lambda, 'leg L'),
        wire(sh.apexR, sh.endR, lambda, 'leg R'),
      ],
      feeds: [{ wire: 0, position: 0.5 }],
      radials: [],
    };
  },
  elements(d, L): Element[] {
    const sh = shape(d, L);
    return [
      { kind: 'wire', label: 'apex', from: sh.apexL, to: sh.apexR },
      { kind: 'wire', label: 'leg L', from: sh.apexL, to: sh.endL },
      { kind: 'wire', label: 'leg R', from: sh.apexR, to: sh.endR },
      { kind: 'end', label: 'end of leg L', at: sh.endL },
      { kind: 'end', label: 'end of leg R', at: sh.endR },
      { kind: 'rope', label: 'anchor rope L', from: sh.endL, to: [sh.endL[0], sh.endL[1], 0] },
      { kind: 'rope', label: 'anchor rope R', from: sh.endR, to: [sh.endR[0], sh.endR[1], 0] },
      { kind: 'anchor', label: 'anchor L', at: [sh.endL[0], sh.endL[1], 0] },
      { kind: 'anchor', label: 'anchor R', at: [sh.endR[0], sh.endR[1], 0] },
      { kind: 'support', label: 'support', supportId: 'S', at: [0, 0], heightM: num(d, 'heightM') },
    ];
  },
  heights(d, L) {
    const sh = shape(d, L);
    return [
      { label: 'apex (feed point)', heightM: sh.apexL[2] },
      { label: 'leg ends', heightM: sh.endL[2] },
    ];
  },
  cutList(_d, L) {
    return [cut('inverted-V leg (apex insulator to end)', 2, L / 2)];
  },
};
