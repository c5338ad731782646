/**
 * Sloping wires from one support (issue 19 point 2).
 *
 * Half-wave sloper ('sloper'): a centre-fed half-wave wire from the support's attachment (a short
 * rope, MIN_ROPE_M) sloping down to an insulated lower end, whose rope runs on in the same line
 * to a ground anchor. It is fed at its centre (a sloping dipole, about 50–70 Ω, coax straight
 * from the feed point); feeding it at the top would put a high impedance up the support and need
 * a matching unit there. The slope is the steepest that keeps the lower end SLOPER_END_MARGIN_M
 * above the end-height limit at the longest trim, at most SLOPER_MAX_SLOPE_DEG; below
 * SLOPER_MIN_SLOPE_DEG the support is too short and the placement is rejected with the height it
 * would need. SLOPER_DIRECTIONS bearings are proposed per support (one design, so one
 * evaluation); the planner keeps the best that fits. Trim: the wire's total length.
 *
 * Sloping quarter-wave ('sloping-vertical'): a quarter-wave wire from the ground at its foot, fed
 * there against buried radials, up toward the support's attachment, tied to it by a rope. Proposed
 * on supports too short for a plain quarter-wave vertical; the foot stands where the line from it
 * to the attachment is the longest trim plus MIN_ROPE_M long, so the slope is fixed by the support
 * height; below SLOPING_MIN_SLOPE_DEG it is rejected with the height it would need. Of
 * SLOPER_DIRECTIONS bearings of the foot around the support, the SLOPING_KEPT that fit with the
 * most room for radials are proposed. Trim: the wire's length.
 *
 * Canonical frames: sloper, the support at the origin and the wire sloping down toward canonical
 * north (+y); sloping quarter-wave, the foot at the origin and the support at (0, s), canonical
 * north pointing from the foot to the support.
 */
import { checkPlacement, clipRadial, type Element } from '../site/feasibility.ts';
import { whereToChange } from '../project/settingLimits.ts';
import { placeXY, type XYZ } from '../site/geometry.ts';
import { arr, cut, lambdaOf, num, placeElements, proposalList, round, wire } from './common.ts';
import { baseFedModel, clippedRadials, radialCuts, radialElements } from './radials.ts';
import { MIN_ROPE_M } from './shortVerticals.ts';
import type { Builder, Design, WireModel } from './types.ts';
import { VERTICAL_NOMINAL_FRACTION } from './vertical.ts';

/** Nominal length of a half-wave sloper as a fraction of the wavelength (common practice, no source). */
export const SLOPER_NOMINAL_FRACTION = 0.475;
/** Trim limits of the sloper, fractions of the wavelength. */
export const SLOPER_TRIM_FRACTIONS = { min: 0.43, max: 0.52 } as const;
/** Bearings tried per support for a sloper (and for the foot of a sloping quarter-wave). */
export const SLOPER_DIRECTIONS = 12;
/** Shallowest slope below horizontal accepted for either type, degrees (a chosen bound: shallower, the wire is a low horizontal one). */
export const SLOPER_MIN_SLOPE_DEG = 25;
/** Steepest slope of a sloper, degrees (a chosen bound: steeper, the wire hangs along the support). */
export const SLOPER_MAX_SLOPE_DEG = 60;
/** Height kept above the end-height limit at the sloper's longest trim, metres. */
export const SLOPER_END_MARGIN_M = 0.5;
/** Shallowest slope of a sloping quarter-wave, degrees (a chosen bound: below it the wire radiates more like a low horizontal wire than a vertical). */
export const SLOPING_MIN_SLOPE_DEG = 30;
/** Bearings of the foot proposed per support for a sloping quarter-wave (the most radial room first). */
export const SLOPING_KEPT = 2;

const D2R = Math.PI / 180;

// ───────────────────────────── half-wave sloper ─────────────────────────────

function sloperShape(d: Design, L: number): { attach: XYZ; upper: XYZ; lower: XYZ; anchor: XYZ } {
  const h = num(d, 'heightM');
  const a = num(d, 'slopeDeg') * D2R;
  const u: XYZ = [0, Math.cos(a), -Math.sin(a)];
  const at = (t: number): XYZ => [0, t * u[1], h + t * u[2]];
  return { attach: [0, 0, h], upper: at(MIN_ROPE_M), lower: at(MIN_ROPE_M + L), anchor: at(h / Math.sin(a)) };
}

export const sloperBuilder: Builder = {
  type: 'sloper',
  label: 'Half-wave sloper, centre-fed, from one support to a ground anchor',
  propose({ site, band }) {
    const out = proposalList('sloper', band);
    const lambda = band.wavelengthM;
    const minEnd = site.site.settings.minEndHeightM;
    const maxM = SLOPER_TRIM_FRACTIONS.max * lambda;
    for (const s of site.site.supports) {
      const where = `sloping from ${s.name}`;
      const drop = s.heightM - minEnd - SLOPER_END_MARGIN_M;
      const sinA = drop / (MIN_ROPE_M + maxM);
      const needM = minEnd + SLOPER_END_MARGIN_M + (MIN_ROPE_M + maxM) * Math.sin(SLOPER_MIN_SLOPE_DEG * D2R);
      if (sinA < Math.sin(SLOPER_MIN_SLOPE_DEG * D2R)) {
        out.rejectBy(
          1 - s.heightM / needM,
          [s.id],
          where,
          `${s.name} at ${s.heightM.toFixed(1)} m is too short for a half-wave sloper on this band: sloping at least ${SLOPER_MIN_SLOPE_DEG}° with its lower end above the ${minEnd.toFixed(1)} m end-height limit, it needs a support of about ${needM.toFixed(1)} m${whereToChange('minEndHeightM')}`,
        );
        continue;
      }
      const slopeDeg = round(Math.min(SLOPER_MAX_SLOPE_DEG, Math.asin(Math.min(1, sinA)) / D2R), 2);
      const design = out.design(
        { heightM: s.heightM, slopeDeg },
        {
          name: 'total wire length',
          nominalM: SLOPER_NOMINAL_FRACTION * lambda,
          minM: SLOPER_TRIM_FRACTIONS.min * lambda,
          maxM,
        },
      );
      for (let k = 0; k < SLOPER_DIRECTIONS; k++) {
        const bearing = (k * 360) / SLOPER_DIRECTIONS;
        out.proposals.push({
          design,
          placement: { originXY: s.xy, rotationDeg: bearing },
          supports: [s.id],
          groupKey: `sloper:${s.id}`,
          where: `${where} toward ${bearing.toFixed(0)}°, sloping ${slopeDeg.toFixed(0)}°`,
          broadsideDeg: [],
        });
      }
    }
    return out.result();
  },
  model(d, L): WireModel {
    const { upper, lower } = sloperShape(d, L);
    return {
      wires: [wire(upper, lower, lambdaOf(d), 'sloper', true)],
      feeds: [{ wire: 0, position: 0.5 }],
      radials: [],
    };
  },
  elements(d, L): Element[] {
    const { attach, upper, lower, anchor } = sloperShape(d, L);
    return [
      { kind: 'support', label: 'support', supportId: 'S', at: [0, 0], heightM: num(d, 'heightM') },
      { kind: 'rope', label: 'rope to the support', from: attach, to: upper },
      { kind: 'wire', label: 'sloper', from: upper, to: lower },
      { kind: 'end', label: 'upper end', at: upper },
      { kind: 'end', label: 'lower end', at: lower },
      { kind: 'rope', label: 'rope to the anchor', from: lower, to: anchor },
      { kind: 'anchor', label: 'ground anchor', at: anchor },
    ];
  },
  heights(d, L) {
    const { upper, lower } = sloperShape(d, L);
    return [
      { label: 'upper end', heightM: upper[2] },
      { label: 'feed point (centre)', heightM: (upper[2] + lower[2]) / 2 },
      { label: 'lower end', heightM: lower[2] },
    ];
  },
  cutList(_d, L) {
    return [cut('sloper, each half', 2, L / 2)];
  },
};

// ───────────────────────────── sloping quarter-wave ─────────────────────────────

function slopingShape(d: Design, L: number): { top: XYZ; attach: XYZ } {
  const s = num(d, 'spanM');
  const h = num(d, 'heightM');
  const run = Math.hypot(s, h);
  return { top: [0, (L * s) / run, (L * h) / run], attach: [0, s, h] };
}

export const slopingVerticalBuilder: Builder = {
  type: 'sloping-vertical',
  label: 'Sloping quarter-wave from a support, fed at its foot against radials',
  propose({ site, band, check = checkPlacement }) {
    const out = proposalList('sloping-vertical', band);
    const lambda = band.wavelengthM;
    const trim = {
      name: 'length of the sloping wire',
      nominalM: VERTICAL_NOMINAL_FRACTION * lambda,
      minM: 0.2 * lambda,
      maxM: 0.28 * lambda,
    };
    const reach = trim.maxM + MIN_ROPE_M;
    for (const s of site.site.supports) {
      if (s.heightM >= trim.nominalM) continue; // the plain vertical is proposed there
      const where = `sloping quarter-wave from ${s.name}`;
      const slope = Math.asin(s.heightM / reach) / D2R;
      if (slope < SLOPING_MIN_SLOPE_DEG) {
        const need = reach * Math.sin(SLOPING_MIN_SLOPE_DEG * D2R);
        out.rejectBy(
          1 - s.heightM / need,
          [s.id],
          where,
          `from ${s.name} at ${s.heightM.toFixed(1)} m a ${reach.toFixed(1)} m line to the ground slopes only ${slope.toFixed(1)}°; at least ${SLOPING_MIN_SLOPE_DEG}° needs a support of about ${need.toFixed(1)} m`,
        );
        continue;
      }
      const span = round(Math.sqrt(reach * reach - s.heightM * s.heightM), 3);
      const fits: { design: Design; rot: number; xy: [number, number]; room: number }[] = [];
      for (let k = 0; k < SLOPER_DIRECTIONS; k++) {
        const away = (k * 360) / SLOPER_DIRECTIONS; // bearing from the support to the foot
        const rot = (away + 180) % 360;
        const xy = placeXY([0, -span], rot, s.xy);
        const radials = clippedRadials(
          (b, n) => clipRadial(site, xy, b, n),
          rot,
          site.site.settings.radialCount,
          0.25 * lambda,
        );
        const design = out.design({ heightM: s.heightM, spanM: span, radialLengthsM: radials }, trim);
        const placed = placeElements(slopingVerticalBuilder.elements(design, trim.maxM), {
          originXY: xy,
          rotationDeg: rot,
        });
        if (!check(site, placed).ok) continue;
        fits.push({ design, rot, xy, room: radials.reduce((p, q) => p + q, 0) });
      }
      if (fits.length === 0) {
        out.reject(
          [s.id],
          where,
          `no bearing of the foot (${span.toFixed(1)} m from ${s.name}, every ${360 / SLOPER_DIRECTIONS}°) keeps the wire and rope on the lot and clear of every keep-out`,
        );
        continue;
      }
      fits.sort((p, q) => q.room - p.room);
      for (const f of fits.slice(0, SLOPING_KEPT))
        out.proposals.push({
          design: f.design,
          placement: { originXY: f.xy, rotationDeg: f.rot },
          supports: [s.id],
          groupKey: `sloping-vertical:${s.id}`,
          where: `${where}, foot toward ${((f.rot + 180) % 360).toFixed(0)}°, sloping ${slope.toFixed(0)}°`,
          broadsideDeg: [],
        });
    }
    return out.result();
  },
  model(d, L): WireModel {
    const { top } = slopingShape(d, L);
    return baseFedModel([wire([0, 0, 0], top, lambdaOf(d), 'sloping wire')], arr(d, 'radialLengthsM'));
  },
  elements(d, L): Element[] {
    const { top, attach } = slopingShape(d, L);
    return [
      { kind: 'wire', label: 'sloping wire', from: [0, 0, 0], to: top },
      { kind: 'end', label: 'top end', at: top },
      { kind: 'rope', label: 'rope to the support', from: top, to: attach },
      { kind: 'support', label: 'support', supportId: 'S', at: [0, attach[1]], heightM: attach[2] },
      ...radialElements(arr(d, 'radialLengthsM')),
    ];
  },
  heights(d, L) {
    const { top } = slopingShape(d, L);
    return [
      { label: 'feed point (foot)', heightM: 0 },
      { label: 'top end', heightM: top[2] },
    ];
  },
  cutList(d, L) {
    return [cut('sloping wire', 1, L), ...radialCuts(arr(d, 'radialLengthsM'))];
  },
};
