/**
 * What a builder needs to wire an array (issue 16): where its relay box goes, what the relays
 * connect in each direction, the control cable from the station, what the feed network achieves
 * (each element's drive impedance and current), and the array's extra items for the bill of
 * materials (the coax lines and stubs of its cut list, relays, the box, the control cable).
 * Pure: everything comes from the candidate (its design, elements, states and arrayFeed).
 *
 * The relay and control practice here is common practice, no source: 12 V DC relay coils, a diode
 * across each coil against its switching spike and a 10 nF capacitor across it against RF, a
 * control cable along the feed line; relays whose contacts carry the station's RF current
 * (√(P / 50 Ω) into a 50 Ω line) with margin.
 */
import type { ElementFeed, StateFeed } from '../antennas/arrayFeed.ts';
import type { Candidate } from '../rank/plan.ts';
import { servingState } from '../rank/candidateStates.ts';
import type { PlacedElement } from '../rank/candidate.ts';
import type { XY } from '../site/frame.ts';
import type { BomItem } from './bom.ts';
import type { SheetLengths } from './format.ts';
import type { NetworkSpec } from '../em/network.ts';
import { builderFor } from '../antennas/registry.ts';

export interface ArrayWiring {
  /** Where the relay or control box goes, site frame (null: no box). */
  boxXY: XY | null;
  boxWhere: string;
  /** Relays, one line each: name, kind, what each contact does. */
  relays: string[];
  /** One row per direction: its number, the relay coils energised, the beam, what it does. */
  directions: { n: number; coils: string; beamDeg: number; name: string; serves: string[] }[];
  control: string[];
  /**
   * The control cable's runs: from the station to the box along the feed line, and, where a relay
   * sits away from the box (a switched pair's K2 at B's feed), from the box to it along its coax.
   */
  controlRuns: { from: string; to: string; conductors: number; lengthM: number | null }[];
  /** The array's coax pieces as cut (kind 'coax' of the cut list): what each joins, count, cut length. */
  coax: { label: string; count: number; cutLengthM: number }[];
  /** What else goes in the box: the feed network's parts other than lines (hybrid, transformer, resistor). */
  boxParts: { item: string; detail: string }[];
  /** Boxes to buy: the relay box, and one more for each relay away from it (at the ground below it, site frame). */
  boxes: { where: string; xy: XY | null }[];
  /** Per element: drive impedance and the current relative to the reference element (direction 1). */
  feed: { label: string; zText: string; current: string }[];
  networkLossPercent: number | null;
  /**
   * Directions of another phasing (a state with `variant`) or solved apart (a switched pair's
   * direction 2, ArrayFeed.states): the impedance the station's line sees there and what that
   * network achieves, per element; in the order of the directions.
   */
  otherPhasings: {
    n: number;
    name: string;
    feedText: string;
    feed: { label: string; zText: string; current: string }[];
    networkLossPercent: number;
  }[];
}

const ARRAYS_WITH_BOX: Readonly<Record<string, string>> = {
  'vertical-pair': 'on the ground midway between the two verticals',
  'half-square-switched': 'on the ground midway between the feet of the two fed drops',
  'half-square-l': 'on the ground midway between the feet of the two fed drops, near the corner support',
  'four-square': 'at the centre of the square',
  'four-square-hung': 'on the ground at the centre of the four supports',
  'phased-pair': 'on the ground midway between the two verticals',
  'vertical-pair-director': 'on the ground midway between the two verticals',
  'switched-pair': 'on the ground at the foot of antenna A’s feed (a second relay at B’s feed)',
};

/**
 * Where an array's relay box sits on the site: where the array's coax meets the ground, else (a
 * group of verticals) the array's centre; null for a type without a box. The station's feed line
 * ends there (the build sheet's feed run, the plan's feed-line element, the app's route).
 */
export function relayBoxXY(
  type: string,
  elements: readonly PlacedElement[],
  originXY: readonly [number, number],
): XY | null {
  const ground = elements.flatMap((e) =>
    e.role === 'coax' && 'to' in e && e.to[2] === 0 ? [[e.to[0], e.to[1]] as XY] : [],
  );
  if (ground.length) return ground[0];
  return ARRAYS_WITH_BOX[type] ? [originXY[0], originXY[1]] : null;
}

/**
 * Where the station's feed line ends for a candidate: an array's relay box (on the ground), else
 * its first feed point; null without either.
 */
export function stationLineEnd(c: Candidate): [number, number, number] | null {
  const box = c.elementCount >= 2 ? relayBoxXY(c.type, c.elements, c.placement.originXY) : null;
  if (box) return [box[0], box[1], 0];
  const f = c.feedPoints[0]?.xyz;
  return f ? [f[0], f[1], f[2]] : null;
}

/**
 * The relays of each array type and the coils each direction energises (common practice, no
 * source); `remote`: a relay away from the box, with the cut-list coax its control wire follows.
 */
function relaysOf(c: Candidate): {
  relays: string[];
  coils: string[];
  /** `feed`: the index of the feed point the remote relay sits at. */
  remote?: { where: string; alongCoax: RegExp; feed: number };
} {
  switch (c.type) {
    case 'vertical-pair':
    case 'half-square-switched': {
      const [a, b] =
        c.type === 'vertical-pair'
          ? ['vertical A', 'vertical B']
          : ['front (A) half-square', 'rear (B) half-square'];
      return {
        relays: [
          `K1, double-pole double-throw. Pole 1: the line to the ${a} goes to the station line (coil off) or to the loading stub (coil on). Pole 2: the line to the ${b} goes to the loading stub (coil off) or to the station line (coil on).`,
        ],
        coils: ['none', 'K1'],
      };
    }
    case 'half-square-l':
      return {
        relays: [
          'K1, single-pole double-throw: its common contact takes the station line; the normally closed contact goes to the line to leg 1, the normally open one to the line to leg 2. The idle line stays open at the relay (do not ground it: a whole number of half waves repeats the open circuit at the idle half-square).',
        ],
        coils: ['none', 'K1'],
      };
    case 'vertical-pair-director':
      return {
        relays: [
          'K1, double-pole double-throw. Pole 1: the line to the vertical B goes to the station line (coil off) or to the director stub (coil on). Pole 2: the line to the vertical A goes to the director stub (coil off) or to the station line (coil on). The stub’s far end stays open: tape and seal it.',
        ],
        coils: ['none', 'K1'],
      };
    case 'phased-pair':
      return {
        relays: [
          'K1, double-pole double-throw, swaps the two element lines: coil off, the line to vertical R goes to the junction of the station line and the line to vertical F to the far end of the delay line; coil on, the other way round.',
          'K2, double-pole double-throw, takes the delay line out: coil off, the delay line runs from the junction to K1; coil on, both ends of the delay line are disconnected (left open) and K1’s delayed side is joined straight to the junction.',
        ],
        coils: ['none', 'K1', 'K2'],
      };
    case 'four-square':
    case 'four-square-hung':
      return {
        relays: [
          'K1 and K2, each a pair of double-pole double-throw relays, route the hybrid’s back, front and side outputs to the four lines so that the chosen vertical is the back one (direction 1: both off; 2: K1; 3: K1 and K2; 4: K2).',
        ],
        coils: ['none', 'K1', 'K1 + K2', 'K2'],
      };
    case 'switched-pair':
      return {
        relays: [
          'K1, single-pole double-throw, in the box at A’s feed: its common contact takes the station line; the normally closed contact goes to A’s feed, the normally open one to the coax run to B. With the coil on, A’s feed is open at K1.',
          'K2, single-pole single-throw (normally open), at B’s feed, its coil wired with K1’s: it closes B’s feed when B is chosen and leaves it open otherwise, so the idle antenna is open at its own feed whatever the run’s length.',
        ],
        coils: ['none', 'K1 + K2'],
        remote: {
          where: 'K2 at B’s feed (in its own small weatherproof box)',
          alongCoax: /relay box to B/,
          feed: 1,
        },
      };
    default:
      return { relays: [], coils: [] };
  }
}

/**
 * The feed network's parts other than its lines, from the design's own model (the network the
 * field solver solved): a hybrid coupler, a transformer, a resistor. A pure reactance (a switched
 * pair's open relay contact) is part of a relay, not a part to buy.
 */
function boxPartsOf(c: Candidate, powerW: number): { item: string; detail: string }[] {
  let net: NetworkSpec | undefined;
  try {
    net = builderFor(c.design.type).model(c.design, c.trim.valueM).network;
  } catch {
    return [];
  }
  const lossW = c.arrayFeed ? c.arrayFeed.networkLossShare * powerW : null;
  return (net?.elements ?? []).flatMap((el) => {
    switch (el.kind) {
      case 'hybrid':
        return [
          {
            item: `90° hybrid coupler, ${el.z0Ohm} Ω`,
            detail: `in the relay box: the station line at its input, its isolated port to the load resistor`,
          },
        ];
      case 'transformer': {
        const inverting = el.primary[1] === el.secondary[0];
        return [
          {
            item: `Transformer ${el.turnsRatio === 1 ? '1:1' : `1:${el.turnsRatio}`}${inverting ? ', wired to invert' : ''}`,
            detail: `in the relay box, between the hybrid and one element’s line${inverting ? ' (it turns that element’s current by 180°)' : ''}; a bifilar winding on a ferrite core (common practice, no source)`,
          },
        ];
      }
      case 'impedance':
        return el.xOhm === 0 && el.rOhm > 0
          ? [
              {
                item: `Load resistor, ${el.rOhm} Ω non-inductive`,
                detail: `in the relay box, on the hybrid’s isolated port: it takes the power the elements send back${
                  lossW !== null
                    ? `; the whole network loses ${lossW.toFixed(1)} W at ${powerW} W, so rate it for at least that (more with margin)`
                    : ''
                }`,
              },
            ]
          : [];
      default:
        return [];
    }
  });
}

/** Below this current ratio, with an impedance above IDLE_IMPEDANCE_OHM, an element counts as idle (open at its relay). */
export const IDLE_CURRENT_RATIO = 0.1;
export const IDLE_IMPEDANCE_OHM = 300;

function fmtZ(z: readonly [number, number], ratio: number): string {
  // An idle element's port carries almost no current: V/I there is large and says nothing useful.
  if (ratio < IDLE_CURRENT_RATIO && Math.hypot(z[0], z[1]) > IDLE_IMPEDANCE_OHM)
    return 'idle: open at the relay';
  const x = z[1];
  return `${z[0].toFixed(1)} ${x < 0 ? '−' : '+'} j${Math.abs(x).toFixed(1)} Ω`;
}

/** The wiring of an array candidate; null for a single antenna. */
export function arrayWiring(
  c: Candidate,
  regionNames: ReadonlyMap<string, string>,
  powerW: number,
): ArrayWiring | null {
  if (c.elementCount < 2) return null;
  const boxXY = relayBoxXY(c.type, c.elements, c.placement.originXY);
  const r = relaysOf(c);
  const { relays, coils } = r;
  const directions =
    c.states.length > 1
      ? c.states.map((s, i) => ({
          n: i + 1,
          coils: coils[i] ?? '',
          beamDeg: s.beamDeg,
          name: s.name,
          serves: s.regions
            .filter((r) => servingState(c, r.id)?.n === i + 1)
            .map((r) => regionNames.get(r.id) ?? r.id),
        }))
      : [];
  const amps = Math.sqrt(powerW / 50);
  // One switched wire per coil line the station drives on its own (coils energised together share
  // one), and a common return.
  const lines = new Set(coils.filter((k) => k !== 'none')).size;
  const groups = new Set(coils.flatMap((k) => (k === 'none' ? [] : k.split(' + ')))).size;
  const driven = Math.min(lines, groups);
  const conductors = driven + 1;
  const words = ['no', 'one', 'two', 'three', 'four', 'five'];
  const word = (n: number): string => words[n] ?? String(n);
  const coax = c.cutList
    .filter((i) => i.kind === 'coax')
    .map((i) => ({ label: i.label, count: i.count, cutLengthM: i.cutLengthM }));
  const remoteCoax = r.remote ? coax.find((i) => r.remote!.alongCoax.test(i.label)) : undefined;
  const controlRuns: ArrayWiring['controlRuns'] = relays.length
    ? [
        { from: 'the station', to: 'the relay box, along the feed line', conductors, lengthM: null },
        ...(r.remote
          ? [
              {
                from: 'the relay box',
                to: `${r.remote.where}, along its coax`,
                conductors: 2,
                lengthM: remoteCoax?.cutLengthM ?? null,
              },
            ]
          : []),
      ]
    : [];
  const control = relays.length
    ? [
        `A ${word(conductors)}-conductor control cable from the station to the box, along the feed line: ${
          driven === 1
            ? 'one wire switched to +12 V DC at the station energises the relays of direction 2'
            : `${word(driven)} wires, each switched to +12 V DC at the station for its relay coil, as the table says`
        }, and the common return.${
          r.remote
            ? ` From the box a two-conductor cable runs along the coax to ${r.remote.where}, its coil wired with K1’s.`
            : ''
        }`,
        'At the box, a diode across each relay coil (cathode to +12 V) and a 10 nF capacitor across it; a weatherproof box with the coax connectors at the bottom.',
        `Relay contacts rated for at least ${amps.toFixed(1)} A RF (√(${powerW} W / 50 Ω)) with margin; switch only while not transmitting.`,
      ]
    : [];
  const feedRows = (els: readonly ElementFeed[]) =>
    els.map((el) => ({
      label: el.label,
      zText: fmtZ(el.driveImpedanceOhm, el.currentRatio),
      current:
        el.currentRatio < 1e-3
          ? '≈ 0'
          : `${el.currentRatio.toFixed(2)} at ${Math.round(el.currentPhaseDeg) >= 0 ? '+' : '−'}${Math.abs(Math.round(el.currentPhaseDeg))}°`,
    }));
  const feed = feedRows(c.arrayFeed?.elements ?? []);
  const specs = c.design.states ?? [];
  const phasing = (n: number, name: string, v: StateFeed | undefined) =>
    v
      ? [
          {
            n,
            name,
            feedText: `${fmtZ(v.feedZOhm, 1)}, SWR ${v.swr.toFixed(2)} on 50 Ω`,
            feed: feedRows(v.elements),
            networkLossPercent: 100 * v.networkLossShare,
          },
        ]
      : [];
  const otherPhasings = [
    ...specs.flatMap((s, i) =>
      phasing(i + 1, s.name, s.variant !== undefined ? c.arrayFeed?.variants?.[s.variant - 1] : undefined),
    ),
    ...(c.arrayFeed?.states ?? []).flatMap((v) =>
      phasing(v.state, c.states[v.state - 1]?.name ?? `direction ${v.state}`, v),
    ),
  ].sort((x, y) => x.n - y.n);
  const remoteFeed = r.remote ? c.feedPoints[r.remote.feed]?.xyz : undefined;
  const remoteXY: XY | null = remoteFeed ? [remoteFeed[0], remoteFeed[1]] : null;
  const boxWhere = ARRAYS_WITH_BOX[c.type] ?? 'no relay box: the array has one direction';
  return {
    boxXY,
    boxWhere,
    relays,
    directions,
    control,
    controlRuns,
    coax,
    boxParts: boxPartsOf(c, powerW),
    boxes: relays.length
      ? [{ where: boxWhere, xy: boxXY }, ...(r.remote ? [{ where: r.remote.where, xy: remoteXY }] : [])]
      : [],
    feed,
    networkLossPercent: c.arrayFeed ? 100 * c.arrayFeed.networkLossShare : null,
    otherPhasings,
  };
}

/** The array's extra items in the bill of materials: its coax lines and stubs, relays, box, control cable. */
export function arrayBom(
  c: Candidate,
  w: ArrayWiring | null,
  controlRunM: number,
  L: SheetLengths,
): BomItem[] {
  if (!w) return [];
  const out: BomItem[] = [];
  const lines = c.cutList.filter((i) => i.kind === 'coax');
  if (lines.length)
    out.push({
      item: 'Coaxial cable for the array’s lines and stubs',
      quantity: lines.reduce((s, i) => s + i.count * i.cutLengthM, 0),
      unit: 'm',
      detail: lines.map((i) => `${i.count} × ${L.cut(i.cutLengthM)} (${i.label})`).join('; '),
      source: 'the cut list (lengths designed from the velocity factor); connectors at each end',
    });
  const relayCount =
    w.relays.length === 0
      ? 0
      : c.type === 'four-square' || c.type === 'four-square-hung'
        ? 4
        : c.type === 'switched-pair'
          ? 2
          : w.relays.length;
  for (const p of w.boxParts)
    out.push({
      item: p.item,
      quantity: 1,
      unit: 'pcs',
      detail: p.detail,
      source: 'the feed network as modelled',
    });
  if (relayCount) {
    out.push({
      item: 'Relays, 12 V DC coil',
      quantity: relayCount,
      unit: 'pcs',
      detail: w.relays.join(' '),
      source: 'common practice, no source',
    });
    out.push({
      item: 'Relay box (weatherproof) with coax connectors',
      quantity: w.boxes.length,
      unit: 'pcs',
      detail: w.boxes.map((b) => b.where).join('; '),
      source: 'common practice, no source',
    });
    const runs = w.controlRuns.map((r) => ({ ...r, lengthM: r.lengthM ?? controlRunM }));
    out.push({
      item: 'Control cable',
      quantity: runs.reduce((s, r) => s + r.lengthM, 0),
      unit: 'm',
      detail: runs
        .map((r) => `${L.len(r.lengthM)} of ${r.conductors}-conductor from ${r.from} to ${r.to}`)
        .join('; '),
      source:
        runs.length > 1
          ? 'the feed line’s length and the coax run’s (it runs beside them)'
          : 'the feed line’s length (it runs beside it)',
    });
  }
  return out;
}
