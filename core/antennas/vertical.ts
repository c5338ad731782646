/**
 * Ground-mounted quarter-wave vertical with buried radials: either a wire hung from a support
 * (a rope from the attachment point holds its top) or a self-supporting vertical at a free spot.
 * Radials: the user's radial count at equal bearings, each a quarter wave long unless the lot
 * boundary (minus the setback) or a keep-out clips it; the solver's radial model gives the
 * ground loss over the site's soil.
 *
 * Canonical frame: base at the origin, wire straight up; radial k at canonical bearing k·360°/N.
 * Trim dimension: the height of the vertical wire.
 */
import { clipRadial } from '../site/feasibility.ts';
import { whereToChange } from '../project/settingLimits.ts';
import type { Element } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { arr, cut, lambdaOf, num, proposalList, wire } from './common.ts';
import { baseFedModel, clippedRadials, radialCuts, radialElements } from './radials.ts';
import { SPOT_SCORE_RADIALS, freeSpots, pickSpots } from './verticals.ts';
import type { Builder, Design, Proposal, WireModel } from './types.ts';

/** Nominal resonant height as a fraction of the wavelength (common practice, no source). */
export const VERTICAL_NOMINAL_FRACTION = 0.245;
/** How many free spots are proposed for a self-supporting vertical. */
export const SPOT_COUNT = 2;

function verticalModel(d: Design, H: number): WireModel {
  return baseFedModel(
    [wire([0, 0, 0], [0, 0, H], lambdaOf(d), 'vertical radiator')],
    arr(d, 'radialLengthsM'),
  );
}

export const verticalBuilder: Builder = {
  type: 'vertical',
  label: 'Ground-mounted quarter-wave vertical with radials',
  propose({ site, band }) {
    const out = proposalList('vertical', band);
    const st = site.site.settings;
    const lambda = band.wavelengthM;
    const nominal = VERTICAL_NOMINAL_FRACTION * lambda;
    const radialM = 0.25 * lambda;
    const trim = {
      name: 'height of the vertical wire',
      nominalM: nominal,
      minM: 0.2 * lambda,
      maxM: 0.3 * lambda,
    };
    const radialsAt = (xy: XY, count: number): number[] =>
      clippedRadials((b, n) => clipRadial(site, xy, b, n), 0, count, radialM);
    const propose = (
      xy: XY,
      supportHeightM: number,
      maxM: number,
      rest: Omit<Proposal, 'design' | 'placement'>,
    ) =>
      out.proposals.push({
        design: out.design(
          {
            radialLengthsM: radialsAt(xy, st.radialCount),
            supportHeightM,
            selfSupporting: supportHeightM ? 0 : 1,
          },
          { ...trim, maxM: Math.min(trim.maxM, maxM) },
        ),
        placement: { originXY: xy, rotationDeg: 0 },
        ...rest,
      });
    for (const s of site.site.supports) {
      if (s.heightM < nominal) {
        out.rejectBy(
          (nominal - s.heightM) / nominal,
          [s.id],
          `hung from ${s.name}`,
          `${s.name} at ${s.heightM.toFixed(1)} m is shorter than a quarter-wave vertical (about ${nominal.toFixed(1)} m)`,
        );
        continue;
      }
      propose(s.xy, s.heightM, s.heightM, {
        supports: [s.id],
        groupKey: `vertical:${s.id}`,
        where: `wire hung from ${s.name}`,
        broadsideDeg: [],
      });
    }
    const free = 'self-supporting at a free spot';
    if (nominal > st.maxVerticalHeightM) {
      out.rejectBy(
        (nominal - st.maxVerticalHeightM) / nominal,
        [],
        free,
        `a quarter-wave vertical (about ${nominal.toFixed(1)} m) is taller than your ${st.maxVerticalHeightM.toFixed(1)} m self-supporting limit${whereToChange('maxVerticalHeightM')}`,
      );
      return out.result();
    }
    // Free spots: grid points where a mast of the nominal height fits; best radial field first.
    const spots = freeSpots(site, [[0, 0]], [0], trim.maxM, ([xy]) =>
      radialsAt(xy, SPOT_SCORE_RADIALS).reduce((p, q) => p + q, 0),
    );
    const chosen = pickSpots(spots, SPOT_COUNT, 0.25 * lambda);
    if (chosen.length === 0)
      out.reject([], free, 'no free spot on the lot keeps a mast clear of the setback and every keep-out');
    chosen.forEach(({ xy }, k) =>
      propose(xy, 0, st.maxVerticalHeightM, {
        supports: [],
        groupKey: `vertical:free:${k}`,
        where: `self-supporting at (${xy[0].toFixed(0)} m E, ${xy[1].toFixed(0)} m N)`,
        broadsideDeg: [],
      }),
    );
    return out.result();
  },
  model: verticalModel,
  elements(d, H): Element[] {
    const self = num(d, 'selfSupporting') === 1;
    const els: Element[] = [
      { kind: 'wire', label: 'vertical radiator', from: [0, 0, 0], to: [0, 0, H] },
      ...radialElements(arr(d, 'radialLengthsM')),
    ];
    if (self) els.push({ kind: 'mast', label: 'self-supporting vertical', at: [0, 0], heightM: H });
    else {
      els.push({
        kind: 'support',
        label: 'support',
        supportId: 'S',
        at: [0, 0],
        heightM: num(d, 'supportHeightM'),
      });
      els.push({
        kind: 'rope',
        label: 'rope to support',
        from: [0, 0, H],
        to: [0, 0, num(d, 'supportHeightM')],
      });
    }
    return els;
  },
  heights(_d, H) {
    return [
      { label: 'feed point (base)', heightM: 0 },
      { label: 'top of vertical', heightM: H },
    ];
  },
  cutList(d, H) {
    return [cut('vertical radiator', 1, H), ...radialCuts(arr(d, 'radialLengthsM'))];
  },
};
