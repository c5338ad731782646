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
import { clipRadial, requiredClearance, boundaryDistance, keepOutDistance } from '../site/feasibility.ts';
import { whereToChange } from '../project/settingLimits.ts';
import type { Element } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { RADIAL_RADIUS_M, arr, clippedRadials, cut, lambdaOf, num, radialElements, wire } from './common.ts';
import type { Builder, Design, Proposal, Rejection, WireModel } from './types.ts';

/** Nominal resonant height as a fraction of the wavelength (common practice, no source). */
export const VERTICAL_NOMINAL_FRACTION = 0.245;
/** Grid step of the free-spot search, metres. */
export const SPOT_GRID_M = 4;
/** How many free spots are proposed for a self-supporting vertical. */
export const SPOT_COUNT = 2;

function verticalModel(d: Design, H: number): WireModel {
  const lambda = lambdaOf(d);
  const w = wire([0, 0, 0], [0, 0, H], lambda, 'vertical radiator');
  const lengths = arr(d, 'radialLengthsM');
  return {
    wires: [w],
    feeds: [{ wire: 0, position: 0 }],
    radials: lengths.length
      ? [{ wire: 0, count: lengths.length, lengthsM: lengths, radiusM: RADIAL_RADIUS_M }]
      : [],
  };
}

export const verticalBuilder: Builder = {
  type: 'vertical',
  label: 'Ground-mounted quarter-wave vertical with radials',
  propose({ site, band }) {
    const proposals: Proposal[] = [];
    const rejections: Rejection[] = [];
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
    const radialsAt = (xy: XY): number[] =>
      clippedRadials((b, n) => clipRadial(site, xy, b, n), 0, st.radialCount, radialM);
    for (const s of site.site.supports) {
      if (s.heightM < nominal) {
        rejections.push({
          type: 'vertical',
          band: band.band,
          supports: [s.id],
          where: `hung from ${s.name}`,
          reasons: [
            `${s.name} at ${s.heightM.toFixed(1)} m is shorter than a quarter-wave vertical (about ${nominal.toFixed(1)} m)`,
          ],
        });
        continue;
      }
      proposals.push({
        design: {
          type: 'vertical',
          band: band.band,
          designFreqHz: band.designFreqHz,
          params: { radialLengthsM: radialsAt(s.xy), supportHeightM: s.heightM, selfSupporting: 0 },
          trim: { ...trim, maxM: Math.min(trim.maxM, s.heightM) },
        },
        placement: { originXY: s.xy, rotationDeg: 0 },
        supports: [s.id],
        groupKey: `vertical:${s.id}`,
        where: `wire hung from ${s.name}`,
        broadsideDeg: [],
      });
    }
    if (nominal > st.maxVerticalHeightM) {
      rejections.push({
        type: 'vertical',
        band: band.band,
        supports: [],
        where: 'self-supporting at a free spot',
        reasons: [
          `a quarter-wave vertical (about ${nominal.toFixed(1)} m) is taller than your ${st.maxVerticalHeightM.toFixed(1)} m self-supporting limit${whereToChange('maxVerticalHeightM')}`,
        ],
      });
      return { proposals, rejections };
    }
    // Free spots: grid points where a mast of the nominal height fits; best radial field first.
    const b = site.site.boundary;
    const xs = b.map((p) => p[0]);
    const ys = b.map((p) => p[1]);
    const spots: { xy: XY; total: number }[] = [];
    for (let x = Math.min(...xs); x <= Math.max(...xs); x += SPOT_GRID_M) {
      for (let y = Math.min(...ys); y <= Math.max(...ys); y += SPOT_GRID_M) {
        const xy: XY = [x, y];
        if (boundaryDistance(site, xy) < st.setbackM) continue;
        const blocked = site.site.keepOuts.some(
          (k, i) => keepOutDistance(site, i, xy) < requiredClearance(k, trim.maxM),
        );
        if (blocked) continue;
        const total = clippedRadials((bb, n) => clipRadial(site, xy, bb, n), 0, 8, radialM).reduce(
          (p, q) => p + q,
          0,
        );
        spots.push({ xy, total });
      }
    }
    spots.sort((p, q) => q.total - p.total);
    const chosen: XY[] = [];
    for (const sp of spots) {
      if (chosen.length >= SPOT_COUNT) break;
      if (chosen.some((c) => Math.hypot(c[0] - sp.xy[0], c[1] - sp.xy[1]) < 0.25 * lambda)) continue;
      chosen.push(sp.xy);
    }
    if (chosen.length === 0) {
      rejections.push({
        type: 'vertical',
        band: band.band,
        supports: [],
        where: 'self-supporting at a free spot',
        reasons: ['no free spot on the lot keeps a mast clear of the setback and every keep-out'],
      });
    }
    chosen.forEach((xy, k) => {
      proposals.push({
        design: {
          type: 'vertical',
          band: band.band,
          designFreqHz: band.designFreqHz,
          params: { radialLengthsM: radialsAt(xy), supportHeightM: 0, selfSupporting: 1 },
          trim: { ...trim, maxM: Math.min(trim.maxM, st.maxVerticalHeightM) },
        },
        placement: { originXY: xy, rotationDeg: 0 },
        supports: [],
        groupKey: `vertical:free:${k}`,
        where: `self-supporting at (${xy[0].toFixed(0)} m E, ${xy[1].toFixed(0)} m N)`,
        broadsideDeg: [],
      });
    });
    return { proposals, rejections };
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
    const lengths = arr(d, 'radialLengthsM');
    const items = [cut('vertical radiator', 1, H)];
    const byLen = new Map<number, number>();
    for (const l of lengths) byLen.set(l, (byLen.get(l) ?? 0) + 1);
    [...byLen.entries()]
      .sort((p, q) => q[0] - p[0])
      .forEach(([l, n]) => items.push(cut('buried radial', n, l, 1, 'radial')));
    return items;
  },
};
