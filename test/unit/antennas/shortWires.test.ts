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
import { buildSite } from '../../../core/site/site.ts';
import { checkPlacement, prepareSite } from '../../../core/site/feasibility.ts';
import { supportPair, testLot } from '../site/lot.ts';
import { expectClose } from '../../helpers/expectClose.ts';

type Band = '160m' | '80m' | '40m';
const site = (span: number, hA: number, hB = hA) =>
  prepareSite(buildSite(testLot({ halfX: 60, supports: supportPair(span, hA, hB) })));
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
