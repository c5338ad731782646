/**
 * Horizontal (or sloping) centre-fed half-wave dipole between two supports.
 *
 * Canonical frame: support A at (−s/2, 0), support B at (+s/2, 0), heights hA and hB; the top wire
 * runs along the straight line between the two attachment points. If the span s is at least the
 * wire length L, the wire is centred in the span and tied with ropes to both supports; if the span
 * is shorter, the top wire runs the whole span and each end hangs straight down by (L − s)/2
 * (so the lower end may fall below the end-height limit, which rejects the placement).
 * Trim dimension: the total wire length L.
 *
 * Short spans and low supports (issue 19), tried in this order, the first that fits proposed:
 *  1. ends hanging down at the supports (above), when the nominal wire's ends stay above the end
 *     height with HANG_MARGIN to spare (a wire that cannot reach its nominal length seldom reaches
 *     resonance);
 *  2. ends folded back (`endForm` 1): the wire runs the whole span, turns FOLD_GAP_M down at each
 *     support and runs back toward the feed, at most FOLD_MAX_FRACTION of each half
 *     (core/antennas/loading.ts); L is the whole wire, folds included;
 *  3. loading coils (`endForm` 2): the wire runs the span, a coil of `coilH` henries (series loss
 *     ωL/Q at LOADING_COIL_Q) at COIL_POSITION_FRACTION of each half from the feed; the trim is
 *     still L, the wire beyond the coils (the coils stay fixed; a rope takes up what the wire does
 *     not reach). The coil is sized from the transmission-line estimate for a tip 80 % of the
 *     room beyond it, so that the trim can go both ways.
 * A span under MIN_LOADED_FRACTION λ is rejected with its shortfall.
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
import type { Builder, Design, ModelWire, WireModel } from './types.ts';
import {
  COIL_POSITION_FRACTION,
  coilLoad,
  FOLD_GAP_M,
  FOLD_MAX_FRACTION,
  FOLD_MIN_M,
  LOADING_COIL_Q,
  loadingReactanceOhm,
  microhenries,
} from './loading.ts';
import { WIRE_RADIUS_M } from './common.ts';

/** Shortest span (along the line between the attachments) a loaded dipole is proposed on, in wavelengths (a choice, no source). */
export const MIN_LOADED_FRACTION = 0.15;
/** The loaded dipole's coil is sized for a tip this share of the room beyond the coil (room for trimming both ways). */
export const COIL_TIP_SHARE = 0.8;

/**
 * Hanging ends are proposed when the wire can reach this much over its nominal length: a low
 * dipole over soil resonates a little longer than 0.48 λ (the solver's trims on 40–160 m).
 */
export const HANG_MARGIN = 1.03;
/** A folded dipole's nominal wire length over the straight one's (the solver's trims; starting point only). */
export const FOLDED_LENGTH_FACTOR = 1.15;

/** End forms of the param `endForm`. */
const PLAIN = 0;
const FOLDED = 1;
const LOADED = 2;

interface Shape {
  top: [XYZ, XYZ];
  drops: [XYZ, XYZ][];
  ropes: [XYZ, XYZ][];
  ends: XYZ[];
  /** Folded ends: for each end the link down at the support and the fold back toward the feed. */
  folds?: { link: [XYZ, XYZ]; back: [XYZ, XYZ] }[];
  /** Loaded: the coil positions (A side, B side) and the wire beyond each coil. */
  coils?: { at: [XYZ, XYZ]; tips: [XYZ, XYZ][] };
}

const endForm = (d: Design): number => (typeof d.params.endForm === 'number' ? d.params.endForm : PLAIN);

function shape(d: Design, L: number): Shape {
  const s = num(d, 'spanM');
  const hA = num(d, 'heightAM');
  const hB = num(d, 'heightBM');
  const A: XYZ = [-s / 2, 0, hA];
  const B: XYZ = [s / 2, 0, hB];
  const lineLen = Math.hypot(s, hB - hA);
  const at = (t: number): XYZ => [A[0] + t * s, 0, hA + t * (hB - hA)];
  const form = endForm(d);
  // Folded: the wire grows continuously with the trim; up to the turn it is the plain shape (ropes
  // below the span's length, then the turns down as short hanging ends), beyond it the folds.
  if (form === FOLDED && (L - lineLen) / 2 > FOLD_GAP_M + FOLD_MIN_M) {
    // Each fold runs back along the top, FOLD_GAP_M below it, from the support toward the feed.
    const fold = (L - lineLen - 2 * FOLD_GAP_M) / 2;
    const t = fold / lineLen;
    const down = (p: XYZ): XYZ => [p[0], 0, p[2] - FOLD_GAP_M];
    const tipA = down(at(t));
    const tipB = down(at(1 - t));
    return {
      top: [A, B],
      drops: [],
      ropes: [],
      ends: [tipA, tipB],
      folds: [
        { link: [A, down(A)], back: [down(A), tipA] },
        { link: [B, down(B)], back: [down(B), tipB] },
      ],
    };
  }
  if (form === LOADED) {
    const inner = num(d, 'coilFromFeedM');
    const tip = Math.max(0.05, L / 2 - inner);
    const cA = at(0.5 - inner / lineLen);
    const cB = at(0.5 + inner / lineLen);
    const eA = at(Math.max(0, 0.5 - (inner + tip) / lineLen));
    const eB = at(Math.min(1, 0.5 + (inner + tip) / lineLen));
    const ropes: [XYZ, XYZ][] =
      eA[0] > A[0] + 1e-3
        ? [
            [A, eA],
            [eB, B],
          ]
        : [];
    return {
      top: [cA, cB],
      drops: [],
      ropes,
      ends: [eA, eB],
      coils: {
        at: [cA, cB],
        tips: [
          [cA, eA],
          [cB, eB],
        ],
      },
    };
  }
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
    const lambda = band.wavelengthM;
    const nominal = 0.48 * lambda;
    const e = site.site.settings.minEndHeightM;
    for (const [a, b] of supportPairs(site.site.supports)) {
      const s = dist2(a.xy, b.xy);
      const where = `between ${a.name} and ${b.name}`;
      const ropeM = (s - nominal) / 2;
      if (ropeM > site.site.settings.maxRopeM) {
        // Shortfall: the rope it would need beyond the limit, over the rope it needs.
        out.rejectBy(
          (ropeM - site.site.settings.maxRopeM) / ropeM,
          [a.id, b.id],
          where,
          `span ${s.toFixed(1)} m needs ropes of ${ropeM.toFixed(1)} m, over the ${site.site.settings.maxRopeM} m rope limit${whereToChange('maxRopeM')}`,
        );
        continue;
      }
      const base = {
        ...acrossSupports(a, b),
        supports: [a.id, b.id],
        groupKey: `dipole:${a.id}:${b.id}`,
        where,
      };
      const params = { spanM: round(s, 3), heightAM: a.heightM, heightBM: b.heightM };
      const lineLen = Math.hypot(s, b.heightM - a.heightM);
      const low = Math.min(a.heightM, b.heightM);
      // 1. Plain, or ends hanging down: the longest wire whose hanging ends stay at or above the end height.
      const maxM = Math.min(0.56 * lambda, lineLen + 2 * (low - e));
      const minM = 0.4 * lambda;
      if (maxM >= HANG_MARGIN * nominal) {
        const hang = (Math.min(nominal, maxM) - lineLen) / 2;
        out.proposals.push({
          design: out.design(params, {
            name: 'total wire length',
            nominalM: Math.min(nominal, maxM),
            minM: Math.min(minM, maxM),
            maxM,
          }),
          ...base,
          ...(hang > 0.05
            ? {
                adaptations: [
                  `the span is shorter than the wire: each end hangs straight down at its support (about ${hang.toFixed(1)} m, trimmed)`,
                ],
              }
            : {}),
        });
        continue;
      }
      // 2. Ends folded back along the top.
      const foldMax = FOLD_MAX_FRACTION * (lineLen / 2);
      const foldedMax = lineLen + 2 * FOLD_GAP_M + 2 * foldMax;
      // The folds' fields partly cancel the top's: a folded dipole resonates some 15–20 % longer than
      // a straight one (measured with the solver on 40–160 m, spans 0.38–0.45 λ).
      const foldedNominal = FOLDED_LENGTH_FACTOR * nominal;
      if (foldedMax >= 1.1 * foldedNominal && low - FOLD_GAP_M >= e) {
        const fold = (foldedNominal - lineLen - 2 * FOLD_GAP_M) / 2;
        out.proposals.push({
          design: out.design(
            { ...params, endForm: FOLDED },
            {
              name: 'total wire length (folds included)',
              nominalM: foldedNominal,
              minM: 0.9 * lineLen,
              maxM: foldedMax,
            },
          ),
          ...base,
          adaptations: [
            `the span is shorter than the wire and the supports too low for hanging ends: the wire runs the whole span ` +
              `and each end folds back along it, ${FOLD_GAP_M} m below (about ${fold.toFixed(1)} m each, trimmed)`,
          ],
        });
        continue;
      }
      // 3. Loading coils.
      const minSpan = MIN_LOADED_FRACTION * lambda;
      if (lineLen < minSpan) {
        out.rejectBy(
          (minSpan - lineLen) / minSpan,
          [a.id, b.id],
          where,
          `the supports are ${s.toFixed(1)} m apart; even with loading coils a dipole needs at least ${minSpan.toFixed(1)} m ` +
            `(${MIN_LOADED_FRACTION} λ) here, and the ${low.toFixed(1)} m support is too low for hanging ends and the span too short for folded ones`,
        );
        continue;
      }
      const inner = COIL_POSITION_FRACTION * (lineLen / 2);
      const room = lineLen / 2 - inner;
      const x = loadingReactanceOhm(inner, COIL_TIP_SHARE * room, lambda, WIRE_RADIUS_M);
      const coilH = round(x / (2 * Math.PI * band.designFreqHz), 9);
      out.proposals.push({
        design: out.design(
          { ...params, endForm: LOADED, coilFromFeedM: round(inner, 3), coilH, coilQ: LOADING_COIL_Q },
          {
            name: 'total wire length (coils fixed)',
            nominalM: 2 * (inner + COIL_TIP_SHARE * room),
            minM: 2 * (inner + 0.3 * room),
            maxM: lineLen,
          },
        ),
        ...base,
        adaptations: [
          `the span is too short for a full-size dipole and the supports too low for hanging ends: loading coils of ` +
            `${microhenries(coilH)} (Q ${LOADING_COIL_Q}) ${inner.toFixed(1)} m out from the centre insulator on each side ` +
            `(${Math.round(COIL_POSITION_FRACTION * 100)} % of each half); the wire beyond the coils is trimmed`,
        ],
      });
    }
    return out.result();
  },
  model(d, L): WireModel {
    const lambda = lambdaOf(d);
    const sh = shape(d, L);
    const wires: ModelWire[] = [wire(sh.top[0], sh.top[1], lambda, 'top wire', true)];
    sh.drops.forEach(([p, q], k) => wires.push(wire(p, q, lambda, k === 0 ? 'end A drop' : 'end B drop')));
    sh.folds?.forEach((f, k) => {
      const side = k === 0 ? 'A' : 'B';
      wires.push(wire(f.link[0], f.link[1], lambda, `end ${side} turn down`));
      wires.push(wire(f.back[0], f.back[1], lambda, `end ${side} folded back`));
    });
    if (sh.coils) {
      const coilH = num(d, 'coilH');
      const q = num(d, 'coilQ');
      sh.coils.tips.forEach(([p, q2], k) =>
        wires.push(wire(p, q2, lambda, `leg ${k === 0 ? 'A' : 'B'} beyond the loading coil`)),
      );
      return {
        wires,
        feeds: [{ wire: 0, position: 0.5 }],
        radials: [],
        // The coils sit where the centre section meets each tip (the tips' first node).
        loads: [coilLoad(1, 0, coilH, d.designFreqHz, q), coilLoad(2, 0, coilH, d.designFreqHz, q)],
      };
    }
    return { wires, feeds: [{ wire: 0, position: 0.5 }], radials: [] };
  },
  elements(d, L): Element[] {
    const sh = shape(d, L);
    const s = num(d, 'spanM');
    const side = (k: number): string => (k === 0 ? 'A' : 'B');
    const els: Element[] = [
      {
        kind: 'wire',
        label: sh.coils ? 'centre section (between the loading coils)' : 'top wire',
        from: sh.top[0],
        to: sh.top[1],
      },
      ...sh.drops.map(([p, q], k): Element => ({
        kind: 'wire',
        label: `end ${side(k)} drop`,
        from: p,
        to: q,
      })),
      ...(sh.folds ?? []).flatMap((f, k): Element[] => [
        { kind: 'wire', label: `end ${side(k)} turn down`, from: f.link[0], to: f.link[1] },
        { kind: 'wire', label: `end ${side(k)} folded back`, from: f.back[0], to: f.back[1] },
      ]),
      ...(sh.coils?.tips ?? []).map(([p, q], k): Element => ({
        kind: 'wire',
        label: `leg ${side(k)} beyond the loading coil`,
        from: p,
        to: q,
      })),
      ...sh.ropes.map(([p, q], k): Element => ({
        kind: 'rope',
        label: `rope to support ${side(k)}`,
        from: p,
        to: q,
      })),
      ...sh.ends.map((p, k): Element => ({ kind: 'end', label: `wire end ${side(k)}`, at: p })),
      ...supportPairElements(s, num(d, 'heightAM'), num(d, 'heightBM')),
    ];
    return els;
  },
  heights(d, L) {
    const sh = shape(d, L);
    const hs = [
      { label: 'feed point', heightM: (sh.top[0][2] + sh.top[1][2]) / 2 },
      { label: 'end A', heightM: sh.ends[0][2] },
      { label: 'end B', heightM: sh.ends[1][2] },
    ];
    if (sh.coils) hs.push({ label: 'loading coils', heightM: (sh.coils.at[0][2] + sh.coils.at[1][2]) / 2 });
    return hs;
  },
  cutList(d, L) {
    const sh = shape(d, L);
    const items = sh.coils
      ? [
          cut('dipole leg, centre insulator to loading coil', 2, num(d, 'coilFromFeedM')),
          cut('dipole leg, loading coil to end', 2, L / 2 - num(d, 'coilFromFeedM')),
        ]
      : [
          cut(
            sh.folds
              ? `dipole leg (centre insulator to end, folded back ${FOLD_GAP_M} m below at the support)`
              : 'dipole leg (centre insulator to end)',
            2,
            L / 2,
          ),
        ];
    if (sh.ropes.length)
      items.push({
        ...cut('rope to support', 2, wireLength({ from: sh.ropes[0][0], to: sh.ropes[0][1] }), 0, 'rope'),
      });
    return items;
  },
};
