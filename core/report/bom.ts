/**
 * The bill of materials of one candidate: antenna wire (as modelled plus the cut allowance),
 * radials, insulators, halyards, pulleys, the coax and a choke where the design wants one. Each
 * line says what it is based on. Pure: everything comes from the candidate and its site.
 */
import { CUT_ALLOWANCE_PER_END_M, WIRE_RADIUS_M } from '../antennas/common.ts';
import { builderFor } from '../antennas/registry.ts';
import type { Candidate } from '../rank/plan.ts';
import type { XYZ } from '../site/geometry.ts';
import type { FeedLine } from './feedRun.ts';
import type { SheetLengths } from './format.ts';
import { COAX_SOURCE, gaugeText } from './materials.ts';

/** Rope margin beyond twice the support height, metres (common practice, no source). */
export const ROPE_MARGIN_M = 5;

/** Centre-fed types that want a choke balun at the feed point (common practice, no source). */
export const CENTRE_FED: ReadonlySet<string> = new Set(['dipole', 'inverted-v']);

export interface BomItem {
  item: string;
  quantity: number;
  unit: 'm' | 'pcs';
  detail: string;
  source: string;
}

export interface Materials {
  wire: { modelledM: number; allowanceM: number; totalM: number; gauge: string };
  radials: { count: number; totalM: number; gauge: string } | null;
  insulators: { count: number; where: string[]; rule: string };
  ropes: { support: string; heightM: number; lengthM: number }[];
  choke: string | null;
  bom: BomItem[];
}

const len3 = (a: XYZ, b: XYZ): number => Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
const near = (a: XYZ, b: XYZ, tol = 0.02): boolean => len3(a, b) < tol;

/** The model's wire radius (every builder uses one radius for its wires). */
function wireRadiusOf(c: Candidate): number {
  try {
    return builderFor(c.design.type).model(c.design, c.trim.valueM).wires[0]?.radiusM ?? WIRE_RADIUS_M;
  } catch {
    return WIRE_RADIUS_M;
  }
}

export const INSULATOR_RULE =
  'one at each wire end that is free (not joined to another wire) and above ground, and one where a support holds the wire at a joint or along it rather than at a free end (common practice, no source)';

/**
 * Insulators by INSULATOR_RULE: every free end above ground, and every support whose nearest wire
 * point is not one of those free ends (the apex of an inverted-V, the top corners of a half-square).
 */
export function insulatorsOf(
  c: Candidate,
  supports: { id: string; name: string; xy: readonly [number, number] }[],
  L: SheetLengths,
): Materials['insulators'] {
  const ends: { at: XYZ; label: string }[] = [];
  for (const w of c.wires) ends.push({ at: w.from, label: w.label }, { at: w.to, label: w.label });
  const free = ends.filter(
    (e, i) =>
      e.at[2] > 0.05 &&
      !ends.some((o, j) => j !== i && Math.floor(j / 2) !== Math.floor(i / 2) && near(o.at, e.at)),
  );
  const where: string[] = free.map((e) => `free end of the ${e.label} (${L.len(e.at[2])} high)`);
  for (const s of supports) {
    if (!c.supports.some((u) => u.id === s.id)) continue;
    let best: { at: XYZ; d: number } | null = null;
    for (const e of ends) {
      const d = Math.hypot(e.at[0] - s.xy[0], e.at[1] - s.xy[1]);
      if (!best || d < best.d) best = { at: e.at, d };
    }
    if (best && !free.some((f) => near(f.at, best.at)) && best.at[2] > 0.05)
      where.push(`attachment at ${s.name}`);
  }
  return { count: where.length, where, rule: INSULATOR_RULE };
}

export function materialsOf(
  c: Candidate,
  supports: { id: string; name: string; xy: readonly [number, number]; heightM: number }[],
  feedLine: FeedLine,
  L: SheetLengths,
  /** Where the station's line ends: the feed point, or an array's relay box. */
  lineEnd = 'feed point',
): Materials {
  const modelledM = c.wires.reduce((s, w) => s + len3(w.from, w.to), 0);
  const wireCuts = c.cutList.filter((i) => i.kind === 'wire');
  const allowanceM = wireCuts.reduce((s, i) => s + i.count * (i.cutLengthM - i.lengthM), 0);
  const wire = {
    modelledM,
    allowanceM,
    totalM: modelledM + allowanceM,
    gauge: gaugeText(wireRadiusOf(c), L.units),
  };

  const g = c.groundSystem;
  const radials: Materials['radials'] =
    g.kind === 'radials'
      ? {
          count: g.count,
          totalM: g.lengthsM.reduce((s, v) => s + v, 0),
          gauge: gaugeText(g.radiusM, L.units),
        }
      : null;

  const insulators = insulatorsOf(c, supports, L);

  const used = supports.filter((s) => c.supports.some((u) => u.id === s.id));
  const ropes = used.map((s) => ({
    support: s.name,
    heightM: s.heightM,
    lengthM: 2 * s.heightM + ROPE_MARGIN_M,
  }));
  const endRopeM = c.cutList.filter((i) => i.kind === 'rope').reduce((s, i) => s + i.count * i.cutLengthM, 0);

  const choke = CENTRE_FED.has(c.type)
    ? 'A common-mode choke (current balun) at the feed point, to keep RF off the outside of the coax (common practice, no source).'
    : null;

  const bom: BomItem[] = [
    {
      item: 'Antenna wire',
      quantity: wire.totalM,
      unit: 'm',
      detail: `${L.len(wire.modelledM, 2)} as modelled + ${L.len(wire.allowanceM, 2)} cut allowance (${L.small(CUT_ALLOWANCE_PER_END_M, 0)} per end); ${wire.gauge}`,
      source: 'model wire radius; gauge: common practice, no source',
    },
  ];
  if (radials)
    bom.push({
      item: 'Radial wire',
      quantity: radials.totalM,
      unit: 'm',
      detail: `${radials.count} radials; ${radials.gauge}`,
      source: 'the candidate’s radial lengths as modelled (clipped by the lot)',
    });
  bom.push({
    item: 'Insulators',
    quantity: insulators.count,
    unit: 'pcs',
    detail: insulators.where.join('; ') || 'none needed at the wire ends',
    source: INSULATOR_RULE,
  });
  if (ropes.length) {
    bom.push({
      item: 'Halyard rope',
      quantity: ropes.reduce((s, r) => s + r.lengthM, 0) + endRopeM,
      unit: 'm',
      detail:
        ropes.map((r) => `${r.support}: 2 × ${L.len(r.heightM)} + ${L.len(ROPE_MARGIN_M, 0)}`).join('; ') +
        (endRopeM > 0 ? `; end ropes from the cut list ${L.len(endRopeM)}` : ''),
      source: 'twice the support height plus a margin (common practice, no source); UV-resistant rope',
    });
    bom.push({
      item: 'Pulleys',
      quantity: ropes.length,
      unit: 'pcs',
      detail: `one per support used (${ropes.map((r) => r.support).join(', ')})`,
      source: 'common practice, no source',
    });
  }
  bom.push({
    item: `Coaxial cable ${feedLine.coax}`,
    quantity: feedLine.lengthM,
    unit: 'm',
    detail: `station to ${lineEnd}; matched loss ${feedLine.lossDb.toFixed(2)} dB at ${feedLine.freqMHz.toFixed(2)} MHz`,
    source: `${feedLine.note}; loss: ${COAX_SOURCE}`,
  });
  if (choke)
    bom.push({
      item: 'Choke balun',
      quantity: 1,
      unit: 'pcs',
      detail: 'at the feed point',
      source: 'common practice, no source',
    });
  return { wire, radials, insulators, ropes, choke, bom };
}
