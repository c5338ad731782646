/**
 * A switched pair (issue 16, point 5): two separate single antennas already on the shortlist
 * (two half-squares at an angle, a half-square and a vertical, …), each as trimmed and placed,
 * selected by relays. The planner forms pairs (core/rank/pairs.ts); this builder only turns a
 * pair design into its model, elements, heights and cut list, so that every view can rebuild it
 * like any other design (it proposes nothing by itself).
 *
 * The switch (common practice, no source): the station line comes to a relay box at the foot of
 * antenna A's feed; relay K1 there (single-pole double-throw) connects the line to A's feed (coil
 * off) or to a coax run to antenna B (coil on). At B's feed relay K2 (single-pole single-throw,
 * energised with K1) closes B's feed. So the idle antenna is always open at its own feed: A is
 * open at K1's idle contact, B at K2's open contact. Both antennas stay in the model in both
 * states; the idle one couples to the driven one through its wires with its feed gap open
 * (core/em/network.ts: the idle port node has only the open contact's capacitance to the
 * return, RELAY_OPEN_CAPACITANCE_F).
 *
 * State A (params.driven = 0): a 1 V source at A's port, B's port left open. State B
 * (params.driven = 1): the source at the relay box, the coax run (a lossy line, COAX_LINE) to B's
 * port, A's port open. The run's own loss thus counts against state B.
 */
import { placeXYZ, type XYZ } from '../site/geometry.ts';
import type { Element } from '../site/feasibility.ts';
import { coaxCut, placeElements } from './common.ts';
import type { Builder, CutItem, Design, HeightItem, ModelWire, Placement, WireModel } from './types.ts';
import { COAX_LINE, COAX_VELOCITY_FACTOR } from './verticalPair.ts';
import { COAX_RUN_SLACK_M } from './halfSquareArrays.ts';

export const SWITCHED_PAIR_TYPE = 'switched-pair';

/** One antenna of a pair: its own design as trimmed, placed in the pair's frame. */
export interface PairPart {
  design: Design;
  trimM: number;
  /** The part's canonical frame → the pair's frame (the pair's frame is the site's, moved to A's origin). */
  placement: Placement;
}

/**
 * Capacitance across an open relay contact, farads: of the order of a picofarad (a value from
 * memory, no source). At the idle feed it is −j45 kΩ at 3.5 MHz, an open gap for the antenna,
 * and it keeps the idle port's voltage defined where the antenna itself draws next to no current
 * (a ground-mounted antenna open at its base: the radial loss in series with the gap).
 */
export const RELAY_OPEN_CAPACITANCE_F = 1e-12;

export type PartBuilderLookup = (type: string) => Builder;

const PART_NAMES = ['A', 'B'] as const;

function partsOf(d: Design): [PairPart, PairPart] {
  const p = d.parts;
  if (!p || p.length !== 2) throw new Error('a switched pair needs exactly two parts');
  return [p[0], p[1]];
}

function placedWire(w: ModelWire, p: Placement, name: string): ModelWire {
  return {
    ...w,
    from: placeXYZ(w.from, p.rotationDeg, p.originXY),
    to: placeXYZ(w.to, p.rotationDeg, p.originXY),
    label: `${name}: ${w.label}`,
  };
}

/** Feed point of a part in the pair's frame. */
function feedXYZ(model: WireModel, p: Placement): XYZ {
  const f = model.feeds[0];
  const w = model.wires[f.wire];
  const local: XYZ = [
    w.from[0] + (w.to[0] - w.from[0]) * f.position,
    w.from[1] + (w.to[1] - w.from[1]) * f.position,
    w.from[2] + (w.to[2] - w.from[2]) * f.position,
  ];
  return placeXYZ(local, p.rotationDeg, p.originXY);
}

/** Length of the coax run from the relay box (ground below A's feed) to B's feed, metres, slack included. */
export function pairRunM(feedA: XYZ, feedB: XYZ): number {
  return Math.hypot(feedA[0] - feedB[0], feedA[1] - feedB[1]) + feedA[2] + feedB[2] + 2 * COAX_RUN_SLACK_M;
}

export function switchedPairBuilder(builderOf: PartBuilderLookup): Builder {
  const models = (d: Design): [WireModel, WireModel] => {
    const [a, b] = partsOf(d);
    return [
      builderOf(a.design.type).model(a.design, a.trimM),
      builderOf(b.design.type).model(b.design, b.trimM),
    ];
  };
  const feeds = (d: Design): [XYZ, XYZ] => {
    const [a, b] = partsOf(d);
    const [ma, mb] = models(d);
    return [feedXYZ(ma, a.placement), feedXYZ(mb, b.placement)];
  };
  return {
    type: SWITCHED_PAIR_TYPE,
    label: 'Two antennas, relay-switched',
    array: true,
    elementCount: 2,
    propose: () => ({ proposals: [], rejections: [] }),
    model(d): WireModel {
      const parts = partsOf(d);
      const ms = models(d);
      const wires: ModelWire[] = [];
      const out: WireModel = { wires, feeds: [], radials: [], loads: [] };
      ms.forEach((m, k) => {
        if (m.network) throw new Error('a switched pair is made of single antennas (no feed network)');
        const off = wires.length;
        for (const w of m.wires) wires.push(placedWire(w, parts[k].placement, PART_NAMES[k]));
        out.feeds.push({ wire: m.feeds[0].wire + off, position: m.feeds[0].position });
        for (const r of m.radials)
          out.radials.push({
            ...r,
            wire: r.wire + off,
            ...(r.bearingsDeg
              ? { bearingsDeg: r.bearingsDeg.map((b) => (b + parts[k].placement.rotationDeg) % 360) }
              : {}),
          });
        for (const l of m.loads ?? []) out.loads!.push({ ...l, wire: l.wire + off });
      });
      if (!out.loads!.length) delete out.loads;
      const driven = d.params.driven === 1 ? 1 : 0;
      const run = d.params.runM;
      // The idle feed: the open relay contact, its capacitance across the gap.
      const open = {
        kind: 'impedance' as const,
        a: driven === 0 ? 'pb' : 'pa',
        b: 'common',
        rOhm: 0,
        xOhm: -1 / (2 * Math.PI * d.designFreqHz * RELAY_OPEN_CAPACITANCE_F),
      };
      out.network =
        driven === 0
          ? {
              portNodes: ['pa', 'pb'],
              elements: [open],
              sources: [{ node: 'pa', kind: 'voltage', value: [1, 0] }],
            }
          : {
              portNodes: ['pa', 'pb'],
              elements: [
                open,
                { kind: 'line', a: 'box', b: 'pb', lengthM: typeof run === 'number' ? run : 0, ...COAX_LINE },
              ],
              sources: [{ node: 'box', kind: 'voltage', value: [1, 0] }],
            };
      out.referenceFeed = driven;
      return out;
    },
    elements(d): Element[] {
      const parts = partsOf(d);
      const [fa, fb] = feeds(d);
      const box: XYZ = [fa[0], fa[1], 0];
      return [
        ...parts.flatMap((p) =>
          placeElements(builderOf(p.design.type).elements(p.design, p.trimM), p.placement),
        ),
        { kind: 'coax', label: 'coax, A’s feed to the relay box', from: fa, to: box },
        { kind: 'coax', label: 'coax run, relay box to B’s feed', from: fb, to: box },
      ];
    },
    heights(d): HeightItem[] {
      return partsOf(d).flatMap((p, k) =>
        builderOf(p.design.type)
          .heights(p.design, p.trimM)
          .map((h) => ({ ...h, label: `${PART_NAMES[k]}: ${h.label}` })),
      );
    },
    cutList(d): CutItem[] {
      const [fa, fb] = feeds(d);
      return [
        ...partsOf(d).flatMap((p, k) =>
          builderOf(p.design.type)
            .cutList(p.design, p.trimM)
            .map((c) => ({ ...c, label: `antenna ${PART_NAMES[k]}: ${c.label}` })),
        ),
        coaxCut('coax, A’s feed down to the relay box', 1, fa[2] + COAX_RUN_SLACK_M),
        coaxCut(
          `coax run, relay box to B’s feed (any length: B's relay opens its feed; VF ${COAX_VELOCITY_FACTOR})`,
          1,
          pairRunM(fa, fb),
        ),
      ];
    },
  };
}
