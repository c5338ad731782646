/**
 * Half-square between two supports: a half-wave top wire and two quarter-wave drops, fed with
 * 50 Ω coax at a top corner (the corner nearer the station).
 *
 * Canonical frame: supports at (±s/2, 0); the top wire of length T (nominal half a wave) is
 * centred at height h = the lower of the two usable heights, tied by ropes to the supports when
 * the span is longer; the fed corner is at −x. Each drop hangs from its corner by d (the trim
 * dimension). When h − d would fall below the end height e, the drop goes down to e and its last
 * d − (h − e) metres bend inward, horizontally at e: the lower ends carry little current but high
 * voltage, so they must stay at or above e.
 */
import type { Element } from '../site/feasibility.ts';
import { whereToChange } from '../project/settingLimits.ts';
import type { XYZ } from '../site/geometry.ts';
import { dist2 } from '../site/geometry.ts';
import {
  acrossSupports,
  cut,
  lambdaOf,
  num,
  proposalList,
  round,
  supportPairElements,
  supportPairs,
  wire,
} from './common.ts';
import type { Builder, Design, ModelWire, WireModel } from './types.ts';

/** Top wire length as a fraction of the wavelength (common practice, no source). */
export const TOP_FRACTION = 0.5;

export interface Side {
  corner: XYZ;
  bottom: XYZ;
  end: XYZ;
  bent: boolean;
}

/** The top wire and both sides at drop length `dropM`, centred on the origin along x (also used by the half-square arrays). */
export function sides(d: Design, dropM: number): { top: [XYZ, XYZ]; A: Side; B: Side; s: number } {
  const s = num(d, 'spanM');
  const T = num(d, 'topM');
  const h = num(d, 'heightM');
  const e = num(d, 'endHeightM');
  const mk = (x: number, inward: number): Side => {
    const corner: XYZ = [x, 0, h];
    if (h - dropM >= e) return { corner, bottom: [x, 0, h - dropM], end: [x, 0, h - dropM], bent: false };
    const bend = dropM - (h - e);
    return { corner, bottom: [x, 0, e], end: [x + inward * bend, 0, e], bent: true };
  };
  return {
    top: [
      [-T / 2, 0, h],
      [T / 2, 0, h],
    ],
    A: mk(-T / 2, 1),
    B: mk(T / 2, -1),
    s,
  };
}

export const halfSquareBuilder: Builder = {
  type: 'half-square',
  label: 'Half-square between two supports',
  propose({ site, band }) {
    const out = proposalList('half-square', band);
    const e = site.site.settings.minEndHeightM;
    const T = TOP_FRACTION * band.wavelengthM;
    for (let [a, b] of supportPairs(site.site.supports)) {
      const s = dist2(a.xy, b.xy);
      const where = `between ${a.name} and ${b.name}`;
      const reasons: string[] = [];
      let short = 0; // Rejection.shortfall: the worst of the misses below
      if (s < T) short = (T - s) / T;
      else if ((s - T) / 2 > site.site.settings.maxRopeM)
        short = ((s - T) / 2 - site.site.settings.maxRopeM) / ((s - T) / 2);
      if (s < T) reasons.push(`span ${s.toFixed(1)} m is shorter than the ${T.toFixed(1)} m top wire`);
      else if ((s - T) / 2 > site.site.settings.maxRopeM) {
        reasons.push(
          `span ${s.toFixed(1)} m needs ropes of ${((s - T) / 2).toFixed(1)} m, over the ${site.site.settings.maxRopeM} m rope limit${whereToChange('maxRopeM')}`,
        );
      }
      const h = Math.min(a.heightM, b.heightM);
      if (h - e < 0.05 * band.wavelengthM) {
        short = Math.max(short, (0.05 * band.wavelengthM - (h - e)) / (0.05 * band.wavelengthM));
        reasons.push(
          `the lower support (${h.toFixed(1)} m) leaves too little height above the ${e.toFixed(1)} m end height`,
        );
      }
      if (reasons.length) {
        out.rejectBy(short, [a.id, b.id], where, ...reasons);
        continue;
      }
      // Feed at the corner nearer the station: make that support A (canonical −x).
      if (dist2(b.xy, site.site.station) < dist2(a.xy, site.site.station)) [a, b] = [b, a];
      out.proposals.push({
        design: out.design(
          {
            spanM: round(s, 3),
            topM: round(T, 3),
            heightM: h,
            endHeightM: e,
            supportAM: a.heightM,
            supportBM: b.heightM,
          },
          {
            name: 'length of each drop',
            nominalM: 0.245 * band.wavelengthM,
            minM: 0.15 * band.wavelengthM,
            // Bent ends may not reach past the middle of the top wire.
            maxM: Math.min(0.33 * band.wavelengthM, h - e + T / 2 - 1),
          },
        ),
        ...acrossSupports(a, b),
        supports: [a.id, b.id],
        groupKey: `half-square:${[a.id, b.id].sort().join(':')}`,
        where: `${where}, fed at the ${a.name} corner`,
      });
    }
    return out.result();
  },
  model(d, dropM): WireModel {
    const lambda = lambdaOf(d);
    const { top, A, B } = sides(d, dropM);
    const wires: ModelWire[] = [
      wire(A.corner, A.bottom, lambda, 'fed drop (A)'),
      wire(top[0], top[1], lambda, 'top wire'),
      wire(B.corner, B.bottom, lambda, 'far drop (B)'),
    ];
    if (A.bent) wires.push(wire(A.bottom, A.end, lambda, 'bent end A'));
    if (B.bent) wires.push(wire(B.bottom, B.end, lambda, 'bent end B'));
    return { wires, feeds: [{ wire: 0, position: 0 }], radials: [] };
  },
  elements(d, dropM): Element[] {
    const { top, A, B, s } = sides(d, dropM);
    const els: Element[] = [
      { kind: 'wire', label: 'top wire', role: 'top-wire', from: top[0], to: top[1] },
      { kind: 'wire', label: 'drop A', from: A.corner, to: A.bottom },
      { kind: 'wire', label: 'drop B', from: B.corner, to: B.bottom },
      { kind: 'end', label: 'lower end A', at: A.end },
      { kind: 'end', label: 'lower end B', at: B.end },
      { kind: 'rope', label: 'tie-down A', from: A.end, to: [A.end[0], 0, 0] },
      { kind: 'rope', label: 'tie-down B', from: B.end, to: [B.end[0], 0, 0] },
      ...supportPairElements(s, num(d, 'supportAM'), num(d, 'supportBM')),
    ];
    if (A.bent) els.push({ kind: 'wire', label: 'bent end A', from: A.bottom, to: A.end });
    if (B.bent) els.push({ kind: 'wire', label: 'bent end B', from: B.bottom, to: B.end });
    if (s > top[1][0] - top[0][0] + 1e-6) {
      els.push({ kind: 'rope', label: 'rope to support A', from: [-s / 2, 0, top[0][2]], to: top[0] });
      els.push({ kind: 'rope', label: 'rope to support B', from: top[1], to: [s / 2, 0, top[1][2]] });
    }
    return els;
  },
  heights(d, dropM) {
    const { A } = sides(d, dropM);
    return [
      { label: 'top wire and fed corner', heightM: A.corner[2] },
      { label: 'lower ends', heightM: A.end[2] },
    ];
  },
  cutList(d, dropM) {
    const T = num(d, 'topM');
    return [cut('top wire', 1, T), cut('drop (including any bent end)', 2, dropM)];
  },
};
