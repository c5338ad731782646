/**
 * Inverted-L: a vertical wire up support A, the rest running toward support B at the top, fed at
 * the base against buried radials. Proposed where A is too short for a quarter-wave vertical.
 *
 * Canonical frame: base at the origin, A's attachment at height hA; B at (s, 0) with attachment
 * height hB. The upper wire runs from A's top along the straight line toward B's attachment for
 * L − hA metres and is tied to B by a rope for the rest. Trim dimension: the total wire length L.
 */
import { clipRadial } from '../site/feasibility.ts';
import { whereToChange } from '../project/settingLimits.ts';
import type { Element } from '../site/feasibility.ts';
import type { XYZ } from '../site/geometry.ts';
import { bearingOf, dist2 } from '../site/geometry.ts';
import { arr, cut, lambdaOf, num, proposalList, round, wire } from './common.ts';
import { baseFedModel, clippedRadials, radialCuts, radialElements } from './radials.ts';
import type { Builder, Design, WireModel } from './types.ts';

/** Nominal total length as a fraction of the wavelength (common practice, no source). */
export const INVERTED_L_NOMINAL_FRACTION = 0.26;
/** Tallest vertical part for which an inverted-L is proposed, as a fraction of the wavelength. */
export const INVERTED_L_MAX_VERTICAL_FRACTION = 0.2;
/**
 * Time budget of the far-support search: every usable far support in reach of a base support (the
 * top part's length plus the rope limit, not too close) is tried, up to this many per base, the
 * tallest first (then the nearest). Each try costs one radial-field clip and one site check, so a
 * band costs at most PLAN_BOUNDS.supports × INVERTED_L_MAX_FAR_SUPPORTS = 40 × 8 = 320 tries
 * (core/rank/plan.ts). The nearest far support alone was often the wrong one: its rope may cross
 * a keep-out or its direction leave the base's radials a smaller field.
 */
export const INVERTED_L_MAX_FAR_SUPPORTS = 8;

function shape(d: Design, L: number): { top: XYZ; end: XYZ; far: XYZ } {
  const hA = num(d, 'heightAM');
  const hB = num(d, 'heightBM');
  const s = num(d, 'spanM');
  const top: XYZ = [0, 0, hA];
  const far: XYZ = [s, 0, hB];
  const run = Math.hypot(s, hB - hA);
  const t = Math.max(0, L - hA) / run;
  return { top, end: [t * s, 0, hA + t * (hB - hA)], far };
}

export const invertedLBuilder: Builder = {
  type: 'inverted-l',
  label: 'Inverted-L up one support toward another',
  propose({ site, band }) {
    const out = proposalList('inverted-l', band);
    const st = site.site.settings;
    const lambda = band.wavelengthM;
    const nominal = INVERTED_L_NOMINAL_FRACTION * lambda;
    const sup = site.site.supports;
    for (const a of sup) {
      // Tall enough for a plain vertical (or nearly: the top part would be a stub).
      if (a.heightM >= INVERTED_L_MAX_VERTICAL_FRACTION * lambda) {
        out.reject(
          [a.id],
          `up ${a.name}`,
          `${a.name} at ${a.heightM.toFixed(1)} m is tall enough for a vertical: an inverted-L is proposed up supports under ${(INVERTED_L_MAX_VERTICAL_FRACTION * lambda).toFixed(1)} m`,
        );
        continue;
      }
      if (a.heightM < 0.08 * lambda) {
        out.rejectBy(
          (0.08 * lambda - a.heightM) / (0.08 * lambda),
          [a.id],
          `up ${a.name}`,
          `${a.name} at ${a.heightM.toFixed(1)} m is too short for the vertical part (at least ${(0.08 * lambda).toFixed(1)} m)`,
        );
        continue;
      }
      const inReach: { b: (typeof sup)[number]; s: number; run: number }[] = [];
      for (const b of sup) {
        if (b === a) continue;
        const s = dist2(a.xy, b.xy);
        const run = Math.hypot(s, b.heightM - a.heightM);
        const horiz = nominal - a.heightM;
        const where = `up ${a.name} toward ${b.name}`;
        if (run < horiz * 1.1) {
          out.rejectBy(
            (horiz * 1.1 - run) / (horiz * 1.1),
            [a.id, b.id],
            where,
            `${b.name} is ${s.toFixed(1)} m away, too close for a ${horiz.toFixed(1)} m top wire`,
          );
        } else if (run - horiz > st.maxRopeM) {
          out.rejectBy(
            (run - horiz - st.maxRopeM) / (run - horiz),
            [a.id, b.id],
            where,
            `${b.name} is ${s.toFixed(1)} m away: the rope would be ${(run - horiz).toFixed(1)} m, over the ${st.maxRopeM} m rope limit${whereToChange('maxRopeM')}`,
          );
        } else inReach.push({ b, s, run });
      }
      // Tallest first (the top part sags least toward it), then nearest, within the budget.
      inReach.sort((p, q) => q.b.heightM - p.b.heightM || p.s - q.s);
      for (const [k, { b, s, run }] of inReach.entries()) {
        const where = `up ${a.name} toward ${b.name}`;
        if (k >= INVERTED_L_MAX_FAR_SUPPORTS) {
          out.reject(
            [a.id, b.id],
            where,
            `only the ${INVERTED_L_MAX_FAR_SUPPORTS} tallest far supports in reach are tried for an inverted-L up ${a.name}`,
          );
          continue;
        }
        // Radials are listed from canonical north; the placement rotates by bearing − 90, so re-clip in that frame.
        const rot = bearingOf(a.xy, b.xy) - 90;
        const lengths = clippedRadials(
          (bb, n) => clipRadial(site, a.xy, bb, n),
          rot,
          st.radialCount,
          0.25 * lambda,
        );
        out.proposals.push({
          design: out.design(
            { heightAM: a.heightM, heightBM: b.heightM, spanM: round(s, 3), radialLengthsM: lengths },
            {
              name: 'total wire length',
              nominalM: nominal,
              minM: a.heightM + 1,
              maxM: Math.min(0.4 * lambda, a.heightM + run),
            },
          ),
          placement: { originXY: a.xy, rotationDeg: rot },
          supports: [a.id, b.id],
          groupKey: `inverted-l:${a.id}:${b.id}`,
          where,
          broadsideDeg: [],
        });
      }
    }
    return out.result();
  },
  model(d, L): WireModel {
    const lambda = lambdaOf(d);
    const { top, end } = shape(d, L);
    return baseFedModel(
      [wire([0, 0, 0], top, lambda, 'vertical part'), wire(top, end, lambda, 'top part')],
      arr(d, 'radialLengthsM'),
    );
  },
  elements(d, L): Element[] {
    const { top, end, far } = shape(d, L);
    return [
      { kind: 'wire', label: 'vertical part', from: [0, 0, 0], to: top },
      { kind: 'wire', label: 'top part', role: 'top-wire', from: top, to: end },
      { kind: 'rope', label: 'rope to the far support', from: end, to: far },
      { kind: 'end', label: 'far end', at: end },
      { kind: 'support', label: 'support A', supportId: 'A', at: [0, 0], heightM: num(d, 'heightAM') },
      { kind: 'support', label: 'support B', supportId: 'B', at: [far[0], 0], heightM: num(d, 'heightBM') },
      ...radialElements(arr(d, 'radialLengthsM')),
    ];
  },
  heights(d, L) {
    const { top, end } = shape(d, L);
    return [
      { label: 'feed point (base)', heightM: 0 },
      { label: 'top of the vertical part', heightM: top[2] },
      { label: 'far end', heightM: end[2] },
    ];
  },
  cutList(d, L) {
    return [cut('radiator (vertical and top in one piece)', 1, L), ...radialCuts(arr(d, 'radialLengthsM'))];
  },
};
