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
 *
 * Span shorter than the half-wave top (issue 19): the top is shortened to the span (the longest
 * top the pair allows, tied at the supports) down to MIN_TOP_FRACTION of a wave, and the drops,
 * still the trim dimension, are lengthened by what the top lost (their nominal length; the trim
 * finds the resonant one), bending inward at the end height as above. The proposal says so in
 * `adaptations`. A pair closer than MIN_TOP_FRACTION λ, or too low for the lengthened drops, is
 * rejected with its shortfall.
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
import type { Builder, Design, HeightItem, ModelWire, WireModel } from './types.ts';

/** Top wire length as a fraction of the wavelength (common practice, no source). */
export const TOP_FRACTION = 0.5;
/**
 * Shortest top wire tried when the supports stand closer than half a wave, as a fraction of the
 * wavelength: below it the drops would carry most of the current and the antenna is no longer a
 * half-square but a pair of bent verticals (a modelling choice of this planner, no source).
 */
export const MIN_TOP_FRACTION = 0.3;
/** Nominal drop of the full-size half-square, as a fraction of the wavelength (common practice, no source). */
export const DROP_FRACTION = 0.245;

/**
 * Nominal drop of a half-square with top `topM`: the full-size drop plus half of what the top
 * lost, so that the wire keeps its length (a starting point only: the solver trims the drop).
 */
export function nominalDropM(topM: number, lambdaM: number): number {
  return DROP_FRACTION * lambdaM + Math.max(0, TOP_FRACTION * lambdaM - topM) / 2;
}

/** Longest drop the design allows: its bent end may not reach past 1 m short of the top's middle. */
export function longestDropM(topM: number, heightM: number, endHeightM: number, lambdaM: number): number {
  const lost = Math.max(0, TOP_FRACTION * lambdaM - topM) / 2;
  return Math.min(0.33 * lambdaM + lost, heightM - endHeightM + topM / 2 - 1);
}

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

/** Heights of a half-square at drop `dropM` (also of the arrays): its top with the fed corner, named `top`, and its lower ends. */
export function halfSquareHeights(d: Design, dropM: number, top: string): HeightItem[] {
  const { A } = sides(d, dropM);
  return [
    { label: top, heightM: A.corner[2] },
    { label: 'lower ends', heightM: A.end[2] },
  ];
}

export const halfSquareBuilder: Builder = {
  type: 'half-square',
  label: 'Half-square between two supports',
  propose({ site, band }) {
    const out = proposalList('half-square', band);
    const e = site.site.settings.minEndHeightM;
    const T = TOP_FRACTION * band.wavelengthM;
    const minTop = MIN_TOP_FRACTION * band.wavelengthM;
    for (let [a, b] of supportPairs(site.site.supports)) {
      const s = dist2(a.xy, b.xy);
      const where = `between ${a.name} and ${b.name}`;
      const h = Math.min(a.heightM, b.heightM);
      // The top: half a wave, or the span when the supports stand closer (shortened, drops longer).
      const top = Math.min(T, s);
      if (s < minTop) {
        const drop = nominalDropM(minTop, band.wavelengthM);
        out.rejectBy(
          (minTop - s) / minTop,
          [a.id, b.id],
          where,
          `the supports are ${s.toFixed(1)} m apart; a half-square needs at least ${minTop.toFixed(1)} m ` +
            `(its shortest top, ${MIN_TOP_FRACTION} λ) with drops of about ${drop.toFixed(1)} m`,
        );
        continue;
      }
      if ((s - T) / 2 > site.site.settings.maxRopeM) {
        // Shortfall: the rope it would need beyond the limit, over the rope it needs.
        out.rejectBy(
          ((s - T) / 2 - site.site.settings.maxRopeM) / ((s - T) / 2),
          [a.id, b.id],
          where,
          `span ${s.toFixed(1)} m needs ropes of ${((s - T) / 2).toFixed(1)} m, over the ${site.site.settings.maxRopeM} m rope limit${whereToChange('maxRopeM')}`,
        );
        continue;
      }
      if (h - e < 0.05 * band.wavelengthM) {
        out.rejectBy(
          (0.05 * band.wavelengthM - (h - e)) / (0.05 * band.wavelengthM),
          [a.id, b.id],
          where,
          `the lower support (${h.toFixed(1)} m) leaves ${(h - e).toFixed(1)} m above the ${e.toFixed(1)} m end height; ` +
            `a half-square needs at least ${(0.05 * band.wavelengthM).toFixed(1)} m`,
        );
        continue;
      }
      const nominalM = nominalDropM(top, band.wavelengthM);
      const maxM = longestDropM(top, h, e, band.wavelengthM);
      if (nominalM > maxM) {
        out.rejectBy(
          (nominalM - maxM) / nominalM,
          [a.id, b.id],
          where,
          `with the ${top.toFixed(1)} m top the drops need about ${nominalM.toFixed(1)} m each, but the lower support ` +
            `(${h.toFixed(1)} m) leaves room for ${maxM.toFixed(1)} m with the lower end bent inward at ${e.toFixed(1)} m`,
        );
        continue;
      }
      const adaptations =
        top < T - 1e-6
          ? [
              `top shortened to ${top.toFixed(1)} m (${(top / band.wavelengthM).toFixed(2)} λ, the span) from the ` +
                `${T.toFixed(1)} m half wave; drops lengthened (nominal ${nominalM.toFixed(1)} m each, trimmed), ` +
                `bending inward at the ${e.toFixed(1)} m end height when they reach it`,
            ]
          : undefined;
      // Feed at the corner nearer the station: make that support A (canonical −x).
      if (dist2(b.xy, site.site.station) < dist2(a.xy, site.site.station)) [a, b] = [b, a];
      out.proposals.push({
        design: out.design(
          {
            spanM: round(s, 3),
            topM: round(top, 3),
            heightM: h,
            endHeightM: e,
            supportAM: a.heightM,
            supportBM: b.heightM,
          },
          {
            name: 'length of each drop',
            nominalM,
            minM: 0.15 * band.wavelengthM,
            // Bent ends may not reach past the middle of the top wire.
            maxM,
          },
        ),
        ...acrossSupports(a, b),
        supports: [a.id, b.id],
        groupKey: `half-square:${[a.id, b.id].sort().join(':')}`,
        where: `${where}, fed at the ${a.name} corner`,
        ...(adaptations ? { adaptations } : {}),
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
  heights: (d, dropM) => halfSquareHeights(d, dropM, 'top wire and fed corner'),
  cutList(d, dropM) {
    const T = num(d, 'topM');
    return [cut('top wire', 1, T), cut('drop (including any bent end)', 2, dropM)];
  },
};
