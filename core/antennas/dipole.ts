/**
 * Horizontal (or sloping) centre-fed half-wave dipole between two supports.
 *
 * Canonical frame: support A at (−s/2, 0), support B at (+s/2, 0), heights hA and hB; the top wire
 * runs along the straight line between the two attachment points. If the span s is at least the
 * wire length L, the wire is centred in the span and tied with ropes to both supports; if the span
 * is shorter, the top wire runs the whole span and each end hangs straight down by (L − s)/2
 * (so the lower end may fall below the end-height limit, which rejects the placement).
 * Trim dimension: the total wire length L.
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
  wireLength,
} from './common.ts';
import type { Builder, Design, WireModel } from './types.ts';

interface Shape {
  top: [XYZ, XYZ];
  drops: [XYZ, XYZ][];
  ropes: [XYZ, XYZ][];
  ends: XYZ[];
}

function shape(d: Design, L: number): Shape {
  const s = num(d, 'spanM');
  const hA = num(d, 'heightAM');
  const hB = num(d, 'heightBM');
  const A: XYZ = [-s / 2, 0, hA];
  const B: XYZ = [s / 2, 0, hB];
  const lineLen = Math.hypot(s, hB - hA);
  if (L >= lineLen) {
    const drop = (L - lineLen) / 2;
    return {
      top: [A, B],
      drops:
        drop > 1e-3
          ? [
              [A, [A[0], 0, hA - drop]],
              [B, [B[0], 0, hB - drop]],
            ]
          : [],
      ropes: [],
      ends:
        drop > 1e-3
          ? [
              [A[0], 0, hA - drop],
              [B[0], 0, hB - drop],
            ]
          : [A, B],
    };
  }
  const t0 = (1 - L / lineLen) / 2;
  const at = (t: number): XYZ => [A[0] + t * s, 0, hA + t * (hB - hA)];
  const P = at(t0);
  const Q = at(1 - t0);
  return {
    top: [P, Q],
    drops: [],
    ropes: [
      [A, P],
      [Q, B],
    ],
    ends: [P, Q],
  };
}

export const dipoleBuilder: Builder = {
  type: 'dipole',
  label: 'Dipole between two supports',
  propose({ site, band }) {
    const out = proposalList('dipole', band);
    const nominal = 0.48 * band.wavelengthM;
    for (const [a, b] of supportPairs(site.site.supports)) {
      const s = dist2(a.xy, b.xy);
      const where = `between ${a.name} and ${b.name}`;
      const ropeM = (s - nominal) / 2;
      if (ropeM > site.site.settings.maxRopeM) {
        out.rejectBy(
          (ropeM - site.site.settings.maxRopeM) / ropeM,
          [a.id, b.id],
          where,
          `span ${s.toFixed(1)} m needs ropes of ${ropeM.toFixed(1)} m, over the ${site.site.settings.maxRopeM} m rope limit${whereToChange('maxRopeM')}`,
        );
        continue;
      }
      // Longest wire whose hanging ends stay at or above the end height.
      const e = site.site.settings.minEndHeightM;
      const lineLen = Math.hypot(s, b.heightM - a.heightM);
      const maxM = Math.min(0.56 * band.wavelengthM, lineLen + 2 * (Math.min(a.heightM, b.heightM) - e));
      const minM = 0.4 * band.wavelengthM;
      if (maxM < 0.9 * nominal) {
        out.rejectBy(
          (0.9 * nominal - maxM) / (0.9 * nominal),
          [a.id, b.id],
          where,
          `span ${s.toFixed(1)} m is too short: a ${nominal.toFixed(1)} m wire's ends would hang below the ${e.toFixed(1)} m end height`,
        );
        continue;
      }
      out.proposals.push({
        design: out.design(
          { spanM: round(s, 3), heightAM: a.heightM, heightBM: b.heightM },
          { name: 'total wire length', nominalM: Math.min(nominal, maxM), minM: Math.min(minM, maxM), maxM },
        ),
        ...acrossSupports(a, b),
        supports: [a.id, b.id],
        groupKey: `dipole:${a.id}:${b.id}`,
        where,
      });
    }
    return out.result();
  },
  model(d, L): WireModel {
    const lambda = lambdaOf(d);
    const sh = shape(d, L);
    const wires = [wire(sh.top[0], sh.top[1], lambda, 'top wire', true)];
    sh.drops.forEach(([p, q], k) => wires.push(wire(p, q, lambda, k === 0 ? 'end A drop' : 'end B drop')));
    return { wires, feeds: [{ wire: 0, position: 0.5 }], radials: [] };
  },
  elements(d, L): Element[] {
    const sh = shape(d, L);
    const s = num(d, 'spanM');
    const els: Element[] = [
      { kind: 'wire', label: 'top wire', from: sh.top[0], to: sh.top[1] },
      ...sh.drops.map(([p, q], k): Element => ({
        kind: 'wire',
        label: `end ${k === 0 ? 'A' : 'B'} drop`,
        from: p,
        to: q,
      })),
      ...sh.ropes.map(([p, q], k): Element => ({
        kind: 'rope',
        label: `rope to support ${k === 0 ? 'A' : 'B'}`,
        from: p,
        to: q,
      })),
      ...sh.ends.map((p, k): Element => ({ kind: 'end', label: `wire end ${k === 0 ? 'A' : 'B'}`, at: p })),
      ...supportPairElements(s, num(d, 'heightAM'), num(d, 'heightBM')),
    ];
    return els;
  },
  heights(d, L) {
    const sh = shape(d, L);
    return [
      { label: 'feed point', heightM: (sh.top[0][2] + sh.top[1][2]) / 2 },
      { label: 'end A', heightM: sh.ends[0][2] },
      { label: 'end B', heightM: sh.ends[1][2] },
    ];
  },
  cutList(d, L) {
    const sh = shape(d, L);
    const items = [cut('dipole leg (centre insulator to end)', 2, L / 2)];
    if (sh.ropes.length)
      items.push({
        ...cut('rope to support', 2, wireLength({ from: sh.ropes[0][0], to: sh.ropes[0][1] }), 0, 'rope'),
      });
    return items;
  },
};
