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
/** How many far supports (nearest usable first) an inverted-L tries from each base support: the top part is short, so its direction changes the pattern little. */
export const INVERTED_L_FAR_SUPPORTS = 1;

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
      if (a.heightM >= INVERTED_L_MAX_VERTICAL_FRACTION * lambda) continue;
      if (a.heightM < 0.08 * lambda) {
        out.reject(
          [a.id],
          `up ${a.name}`,
          `${a.name} at ${a.heightM.toFixed(1)} m is too short for the vertical part (at least ${(0.08 * lambda).toFixed(1)} m)`,
        );
        continue;
      }
      let tried = 0;
      const byDistance = sup.filter((b) => b !== a).sort((p, q) => dist2(a.xy, p.xy) - dist2(a.xy, q.xy));
      for (const b of byDistance) {
        const s = dist2(a.xy, b.xy);
        const run = Math.hypot(s, b.heightM - a.heightM);
        const horiz = nominal - a.heightM;
        const where = `up ${a.name} toward ${b.name}`;
        if (run < horiz * 1.1 || run - horiz > site.site.settings.maxRopeM) {
          out.reject(
            [a.id, b.id],
            where,
            run < horiz * 1.1
              ? `${b.name} is ${s.toFixed(1)} m away, too close for a ${horiz.toFixed(1)} m top wire`
              : `${b.name} is ${s.toFixed(1)} m away: the rope would be ${(run - horiz).toFixed(1)} m, over the ${site.site.settings.maxRopeM} m rope limit${whereToChange('maxRopeM')}`,
          );
          continue;
        }
        if (tried >= INVERTED_L_FAR_SUPPORTS) {
          out.reject(
            [a.id, b.id],
            where,
            `only the ${INVERTED_L_FAR_SUPPORTS} nearest usable far supports are tried for an inverted-L up ${a.name}`,
          );
          continue;
        }
        tried++;
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
