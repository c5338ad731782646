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
import type { Candidate } from '../rank/plan.ts';
import type { XY } from '../site/frame.ts';
import type { BomItem } from './bom.ts';
import type { SheetLengths } from './format.ts';

export interface ArrayWiring {
  /** Where the relay or control box goes, site frame (null: no box). */
  boxXY: XY | null;
  boxWhere: string;
  /** Relays, one line each: name, kind, what each contact does. */
  relays: string[];
  /** One row per direction: its number, the relay coils energised, the beam, what it does. */
  directions: { n: number; coils: string; beamDeg: number; name: string; serves: string[] }[];
  control: string[];
  /** Per element: drive impedance and the current relative to the reference element (direction 1). */
  feed: { label: string; zText: string; current: string }[];
  networkLossPercent: number | null;
}

const ARRAYS_WITH_BOX: Readonly<Record<string, string>> = {
  'vertical-pair': 'on the ground midway between the two verticals',
  'half-square-switched': 'on the ground midway between the feet of the two fed drops',
  'half-square-l': 'on the ground midway between the feet of the two fed drops, near the corner support',
  'four-square': 'at the centre of the square',
  'switched-pair': 'on the ground at the foot of antenna A’s feed (a second relay at B’s feed)',
};

/** The relays of each array type and the coils each direction energises (common practice, no source). */
function relaysOf(c: Candidate): { relays: string[]; coils: string[] } {
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
    case 'four-square':
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
      };
    default:
      return { relays: [], coils: [] };
  }
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
  const coax = c.elements.filter((e) => e.role === 'coax');
  const ground = coax.flatMap((e) => ('to' in e && e.to[2] === 0 ? [[e.to[0], e.to[1]] as XY] : []));
  // the box: where the array's coax meets on the ground, else (verticals) the array's centre
  const boxXY: XY | null = ground.length
    ? ground[0]
    : ARRAYS_WITH_BOX[c.type]
      ? [c.placement.originXY[0], c.placement.originXY[1]]
      : null;
  const { relays, coils } = relaysOf(c);
  const directions =
    c.states.length > 1
      ? c.states.map((s, i) => ({
          n: i + 1,
          coils: coils[i] ?? '',
          beamDeg: s.beamDeg,
          name: s.name,
          serves: s.regions
            .filter((r) =>
              c.states.every(
                (o) => (o.regions.find((q) => q.id === r.id)?.gainDbi ?? -Infinity) <= r.gainDbi,
              ),
            )
            .map((r) => regionNames.get(r.id) ?? r.id),
        }))
      : [];
  const amps = Math.sqrt(powerW / 50);
  const control = relays.length
    ? [
        `A ${coils.some((k) => k.includes('K2')) ? 'three' : 'two'}-conductor control cable from the station to the box, along the feed line; 12 V DC switched at the station for each relay coil.`,
        'At the box, a diode across each relay coil (cathode to +12 V) and a 10 nF capacitor across it; a weatherproof box with the coax connectors at the bottom.',
        `Relay contacts rated for at least ${amps.toFixed(1)} A RF (√(${powerW} W / 50 Ω)) with margin; switch only while not transmitting.`,
      ]
    : [];
  const feed = (c.arrayFeed?.elements ?? []).map((el) => ({
    label: el.label,
    zText: fmtZ(el.driveImpedanceOhm, el.currentRatio),
    current:
      el.currentRatio < 1e-3
        ? '≈ 0'
        : `${el.currentRatio.toFixed(2)} at ${el.currentPhaseDeg >= 0 ? '+' : '−'}${Math.abs(el.currentPhaseDeg).toFixed(0)}°`,
  }));
  return {
    boxXY,
    boxWhere: ARRAYS_WITH_BOX[c.type] ?? 'no relay box: the array has one direction',
    relays,
    directions,
    control,
    feed,
    networkLossPercent: c.arrayFeed ? 100 * c.arrayFeed.networkLossShare : null,
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
    w.relays.length === 0 ? 0 : c.type === 'four-square' ? 4 : c.type === 'switched-pair' ? 2 : 1;
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
      quantity: 1,
      unit: 'pcs',
      detail: w.boxWhere,
      source: 'common practice, no source',
    });
    out.push({
      item: 'Control cable',
      quantity: controlRunM,
      unit: 'm',
      detail: w.control[0] ?? '',
      source: 'the feed line’s length (it runs beside it)',
    });
  }
  return out;
}
