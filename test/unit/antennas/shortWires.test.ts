/**
 * Dipoles on short spans and low supports (issue 19): hanging ends, then ends folded back along
 * the top, then loading coils; each variant lists every element it puts on the lot (every wire
 * of the model, every free end, the ropes and the supports), so the feasibility check sees it all.
 */
import { describe, expect, it } from 'vitest';
import { builderFor } from '../../../core/antennas/registry.ts';
import { bandPlan, placeElements } from '../../../core/antennas/common.ts';
import { FOLD_GAP_M, LOADING_COIL_Q, coilLossOhm } from '../../../core/antennas/loading.ts';
import type { Design, Proposal, WireModel } from '../../../core/antennas/types.ts';
import type { Element } from '../../../core/site/feasibility.ts';
import { checkPlacement } from '../../../core/site/feasibility.ts';
import { supportPair, preparedLot } from '../site/lot.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';

type Band = '160m' | '80m' | '40m';
const site = (span: number, hA: number, hB = hA) =>
  preparedLot({ halfX: 60, supports: supportPair(span, hA, hB) });
function dipole(span: number, hA: number, hB: number, band: Band): Proposal {
  const out = builderFor('dipole').propose({ site: site(span, hA, hB), band: bandPlan(band) });
  const p = out.proposals[0];
  if (!p) throw new Error(JSON.stringify(out.rejections));
  return p;
}
const len = (w: { from: readonly number[]; to: readonly number[] }): number =>
  Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]);
const same = (a: readonly number[], b: readonly number[]): boolean =>
  Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]) < 1e-9;

/** Every model wire is an element wire, and every free wire end an element end. */
function expectAllListed(m: WireModel, els: Element[]): void {
  const wires = els.filter((e): e is Extract<Element, { kind: 'wire' }> => e.kind === 'wire');
  for (const w of m.wires) {
    const hit = wires.some(
      (e) => (same(e.from, w.from) && same(e.to, w.to)) || (same(e.from, w.to) && same(e.to, w.from)),
    );
    expect(hit, `model wire "${w.label}" listed as an element`).toBe(true);
  }
  const pts = m.wires.flatMap((w) => [w.from, w.to]);
  const ends = els.filter((e): e is Extract<Element, { kind: 'end' }> => e.kind === 'end');
  for (const p of pts) {
    if (pts.filter((q) => same(p, q)).length > 1) continue; // a junction
    expect(
      ends.some((e) => same(e.at, p)),
      `free end ${p.join(', ')} listed`,
    ).toBe(true);
  }
  expect(els.filter((e) => e.kind === 'support')).toHaveLength(2);
}

describe('dipole on a short span between low supports', () => {
  it('hangs its ends when the supports are tall enough, and says so', () => {
    const p = dipole(30, 15, 15, '80m');
    expect(p.design.params.endForm).toBeUndefined();
    expect(p.adaptations?.[0]).toMatch(/each end hangs straight down/);
  });

  it('folds its ends back along the top when the supports are too low to hang them', () => {
    const p = dipole(33, 4, 4, '80m');
    expect(p.design.params.endForm).toBe(1);
    const b = builderFor('dipole');
    const L = 46;
    const m = b.model(p.design, L);
    const total = m.wires.reduce((s, w) => s + len(w), 0);
    expectClose(total, L, 1e-9, 'the whole wire, folds included, is the trim dimension');
    // The folds run parallel to the top, FOLD_GAP_M below it (≥ 0.2 m: the solver's thin-wire kernel).
    const folds = m.wires.filter((w) => /folded back/.test(w.label));
    expect(folds).toHaveLength(2);
    for (const f of folds) {
      expectClose(f.from[2], 4 - FOLD_GAP_M, 1e-9, 'fold 0.3 m below the top');
      expectClose(f.to[2], f.from[2], 1e-9, 'fold parallel to the level top');
    }
    expect(FOLD_GAP_M).toBeGreaterThanOrEqual(0.2);
    const els = b.elements(p.design, L);
    expectAllListed(m, els);
    expect(p.adaptations?.[0]).toMatch(/folds back along it, 0\.3 m below/);
    const placed = placeElements(els, p.placement);
    expect(checkPlacement(site(33, 4, 4), placed).ok).toBe(true);
  });

  it('takes loading coils where folding is not enough, stated with their value, place and Q', () => {
    const p = dipole(38, 11, 15, '160m');
    expect(p.design.params.endForm).toBe(2);
    const b = builderFor('dipole');
    const d: Design = p.design;
    const lH = d.params.coilH as number;
    expect(lH).toBeGreaterThan(20e-6);
    const m = b.model(d, d.trim.nominalM);
    expect(m.loads).toHaveLength(2);
    for (const l of m.loads ?? []) {
      expect(l.kind).toBe('series-rlc');
      if (l.kind !== 'series-rlc') continue;
      expectClose(l.lH ?? 0, lH, 0, 'the stated inductance');
      expectClose(l.rOhm ?? 0, coilLossOhm(lH, d.designFreqHz, LOADING_COIL_Q), 1e-12, 'R = ωL/Q');
      // The coil sits where the centre section meets a tip, as far out as stated.
      const at = l.position === 0 ? m.wires[l.wire].from : m.wires[l.wire].to;
      expectClose(
        Math.abs(at[0]),
        (d.params.coilFromFeedM as number) * (38 / Math.hypot(38, 4)),
        1e-6,
        'coil place',
      );
    }
    expect(p.adaptations?.[0]).toMatch(
      /loading coils of \d+ µH \(Q 200\) 9\.6 m out from the centre insulator/,
    );
    // Trimmed short, the tips stop before the supports and ropes take up the rest: listed too.
    const short = d.trim.minM;
    const els = b.elements(d, short);
    expectAllListed(b.model(d, short), els);
    expect(els.filter((e) => e.kind === 'rope')).toHaveLength(2);
    const placed = placeElements(els, p.placement);
    expect(checkPlacement(site(38, 11, 15), placed).ok).toBe(true);
  });

  it('rejects a pair too close even for coils, with its shortfall', () => {
    const lambda = bandPlan('160m').wavelengthM;
    const out = builderFor('dipole').propose({ site: site(15, 6, 6), band: bandPlan('160m') });
    expect(out.proposals).toHaveLength(0);
    const r = out.rejections[0];
    expect(r.reasons[0]).toMatch(/even with loading coils a dipole needs at least 24\.6 m/);
    expectClose(r.shortfall ?? -1, (0.15 * lambda - 15) / (0.15 * lambda), 1e-9, 'shortfall = lack / need');
  });
});

describe('inverted-V on a lot too small for its legs', () => {
  const small = (half: number, h: number) =>
    preparedLot({ halfX: half, halfY: half, supports: [{ id: 's', x: 0, y: 0, h }] });
  const variants = (half: number, h: number, band: Band) =>
    builderFor('inverted-v')
      .propose({ site: small(half, h), band: bandPlan(band) })
      .proposals.filter((p) => p.design.params.reachM !== undefined);

  it('offers no reach-limited design where the plain legs fit', () => {
    expect(variants(60, 15, '80m')).toHaveLength(0);
  });

  it('folds its ends back along the legs, FOLD_GAP_M above them, in the same groups as the plain designs', () => {
    const vs = variants(14, 12, '80m').filter((p) => p.design.params.endForm === 1);
    expect(vs.length).toBeGreaterThan(0);
    const p = vs[0];
    expect(p.groupKey).toMatch(/^inverted-v:s:\d+$/);
    expect(p.adaptations?.[0]).toMatch(
      /legs shortened to reach .* folded back along its leg, 0\.3 m above it/,
    );
    const b = builderFor('inverted-v');
    const L = p.design.trim.nominalM;
    const m = b.model(p.design, L);
    expectClose(
      m.wires.reduce((s, w) => s + len(w), 0),
      L,
      1e-9,
      'the whole wire, folds included, is the trim dimension',
    );
    // Each fold is parallel to its leg, FOLD_GAP_M from it.
    for (const side of ['L', 'R']) {
      const leg = m.wires.find((w) => w.label === `leg ${side}`)!;
      const fold = m.wires.find((w) => w.label === `leg ${side} folded back`)!;
      const u = [0, 1, 2].map((k) => (leg.to[k] - leg.from[k]) / len(leg));
      for (const q of [fold.from, fold.to]) {
        const r = [0, 1, 2].map((k) => q[k] - leg.from[k]);
        const along = r[0] * u[0] + r[1] * u[1] + r[2] * u[2];
        const perp = Math.sqrt(Math.max(0, r[0] ** 2 + r[1] ** 2 + r[2] ** 2 - along ** 2));
        expectClose(perp, FOLD_GAP_M, 1e-9, 'fold 0.3 m from its leg');
      }
    }
    const els = b.elements(p.design, L);
    expectAllListedV(m, els);
    const fits = vs.some(
      (q) => checkPlacement(small(14, 12), placeElements(b.elements(q.design, L), q.placement)).ok,
    );
    expect(fits).toBe(true);
  });

  it('takes loading coils on a lot too small for folds, with their value, place and Q', () => {
    const vs = variants(14, 12, '160m').filter((p) => p.design.params.endForm === 2);
    expect(vs.length).toBeGreaterThan(0);
    const p = vs[0];
    expect(p.adaptations?.[0]).toMatch(
      /loading coils of \d+ µH \(Q 200\) \d+\.\d m down each leg from the apex/,
    );
    const b = builderFor('inverted-v');
    const m = b.model(p.design, p.design.trim.minM);
    expect(m.loads).toHaveLength(2);
    for (const l of m.loads ?? []) {
      expect(m.wires[l.wire].label).toMatch(/beyond the loading coil/);
      expect(l.position).toBe(0);
    }
    expectAllListedV(m, b.elements(p.design, p.design.trim.minM));
  });
});

/** As expectAllListed, for a one-support design (the feed wire's ends are junctions). */
function expectAllListedV(m: WireModel, els: Element[]): void {
  const wires = els.filter((e): e is Extract<Element, { kind: 'wire' }> => e.kind === 'wire');
  for (const w of m.wires)
    expect(
      wires.some(
        (e) => (same(e.from, w.from) && same(e.to, w.to)) || (same(e.from, w.to) && same(e.to, w.from)),
      ),
      `model wire "${w.label}" listed as an element`,
    ).toBe(true);
  const pts = m.wires.flatMap((w) => [w.from, w.to]);
  const ends = els.filter((e): e is Extract<Element, { kind: 'end' }> => e.kind === 'end');
  for (const p of pts) {
    if (pts.filter((q) => same(p, q)).length > 1) continue;
    expect(
      ends.some((e) => same(e.at, p)),
      `free end ${p.join(', ')} listed`,
    ).toBe(true);
  }
  expect(els.filter((e) => e.kind === 'anchor')).toHaveLength(2);
  expect(els.filter((e) => e.kind === 'support')).toHaveLength(1);
}

describe('the adapted forms reach resonance inside their trim limits (field solver, perfect ground)', () => {
  // The nominal lengths and coil values are estimates (core/antennas/loading.ts); the trim limits
  // must leave the solver's resonance inside them, or the planner would keep a mismatched wire.
  const ivs = (band: Band, form: number) =>
    builderFor('inverted-v')
      .propose({
        site: preparedLot({ halfX: 14, halfY: 14, supports: [{ id: 's', x: 0, y: 0, h: 12 }] }),
        band: bandPlan(band),
      })
      .proposals.find((p) => p.design.params.endForm === form)!;
  const cases: [string, Proposal][] = [
    ['dipole, folded ends (80 m)', dipole(33, 4, 4, '80m')],
    ['dipole, loading coils (40 m)', dipole(10, 4, 4, '40m')],
    ['inverted-V, folded ends (80 m)', ivs('80m', 1)],
    ['inverted-V, loading coils (160 m)', ivs('160m', 2)],
  ];
  for (const [name, p] of cases)
    it(name, () => {
      const r = evaluateDesign(p.design, 'perfect', solverEvaluator);
      expect(r.resonant, r.diagnostics.join('; ')).toBe(true);
      expect(r.trimM).toBeGreaterThan(p.design.trim.minM);
      expect(r.trimM).toBeLessThan(p.design.trim.maxM);
    });
});
