// Verticals for short supports and the two sloping wires (issue 19 point 2): what each builder
// proposes on an invented lot, that its elements pass the lot's feasibility check, that its
// rejections give a number, and that the field solver trims each loaded vertical to resonance.
import { describe, expect, it } from 'vitest';
import { builderFor } from '../../../core/antennas/registry.ts';
import { bandPlan, placeElements } from '../../../core/antennas/common.ts';
import type { Proposal, Rejection } from '../../../core/antennas/types.ts';
import {
  COIL_Q,
  coilInductanceH,
  coilTurns,
  COIL_FORMER_DIAMETER_M,
  COIL_PITCH_M,
} from '../../../core/antennas/shortLoading.ts';
import { checkPlacement } from '../../../core/site/feasibility.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { type LotSpec, preparedLot } from '../site/lot.ts';
import { expectClose } from '../../helpers/expectClose.ts';

type BandId = '160m' | '80m' | '40m';

/** An open 100 m × 100 m lot: a 15 m tree in the middle, two more west and east, one short one. */
const OPEN: LotSpec = {
  halfX: 50,
  halfY: 50,
  supports: [
    { id: 'oak', x: 0, y: 0, h: 15 },
    { id: 'ash', x: -30, y: 4, h: 12 },
    { id: 'elm', x: 32, y: -3, h: 11 },
    { id: 'stub', x: 0, y: 35, h: 5 },
  ],
  settings: { radialCount: 16 },
};

function propose(type: string, band: BandId, spec: LotSpec = OPEN) {
  const site = preparedLot(spec);
  return { site, ...builderFor(type).propose({ site, band: bandPlan(band) }) };
}

const placedOk = (site: ReturnType<typeof propose>['site'], p: Proposal, trimM: number) =>
  checkPlacement(site, placeElements(builderFor(p.design.type).elements(p.design, trimM), p.placement));

const len = (w: { from: readonly number[]; to: readonly number[] }): number =>
  Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]);

function expectNumbered(r: Rejection | undefined, pattern: RegExp): void {
  expect(r, 'a rejection').toBeDefined();
  expect(r!.reasons.join(' ')).toMatch(pattern);
  expect(r!.reasons.join(' ')).toMatch(/\d+(\.\d+)? m/);
}

describe('verticals on a short support (160 m on a 15 m tree)', () => {
  for (const type of ['top-hat-vertical', 't-top-vertical', 'loaded-vertical']) {
    it(`${type}: proposed on the 15 m tree, its elements fit at the nominal and longest trim`, () => {
      const { site, proposals } = propose(type, '160m');
      const onOak = proposals.filter((p) => p.supports[0] === 'oak');
      expect(onOak.length).toBeGreaterThan(0);
      for (const p of onOak) {
        for (const t of [p.design.trim.nominalM, p.design.trim.maxM]) {
          const res = placedOk(site, p, t);
          expect(res.violations.map((v) => v.message)).toEqual([]);
        }
        expect(p.adaptations?.length).toBe(1);
        // The vertical wire is the tree's full height, fed at the base against radials.
        const m = builderFor(type).model(p.design, p.design.trim.nominalM);
        expectClose(len(m.wires[0]), 15, 1e-9, 'the vertical reaches the attachment');
        expect(m.feeds).toEqual([{ wire: 0, position: 0 }]);
        expect(m.radials[0].count).toBeGreaterThan(0);
      }
    });
  }

  it('top hat: each hat wire is the trim long and its end stays above the end-height limit at the longest trim', () => {
    const { site, proposals } = propose('top-hat-vertical', '160m');
    const p = proposals.find((q) => q.supports[0] === 'oak')!;
    const m = builderFor('top-hat-vertical').model(p.design, p.design.trim.maxM);
    const hat = m.wires.slice(1);
    expect(hat.length).toBeGreaterThanOrEqual(2);
    for (const w of hat) {
      expectClose(len(w), p.design.trim.maxM, 1e-9, 'hat wire = trim');
      expect(w.to[2]).toBeGreaterThanOrEqual(site.site.settings.minEndHeightM - 1e-9);
      expect(w.to[2]).toBeLessThan(15); // it droops
    }
  });

  it('T top: the two top wires run toward the two other trees, the trim long each', () => {
    const { proposals } = propose('t-top-vertical', '160m');
    const p = proposals.find((q) => q.supports[0] === 'oak')!;
    expect([...p.supports].sort()).toEqual(['ash', 'elm', 'oak']);
    const L = p.design.trim.nominalM;
    const m = builderFor('t-top-vertical').model(p.design, L);
    expect(m.wires).toHaveLength(3);
    for (const w of m.wires.slice(1)) expectClose(len(w), L, 1e-9, 'top wire = trim');
    // West and east of the oak: the arms point (nearly) opposite ways.
    const [b, c] = [m.wires[1].to, m.wires[2].to];
    expect(b[0] * c[0] + b[1] * c[1]).toBeLessThan(0);
  });

  it('loading coil: a series load of R = ωL/Q at the base or halfway up, its inductance from the winding', () => {
    const { proposals } = propose('loaded-vertical', '160m');
    const onOak = proposals.filter((q) => q.supports[0] === 'oak');
    expect(onOak.map((p) => p.design.params.coilHeightM).sort()).toEqual([0, 7.5]);
    for (const p of onOak) {
      const w = p.design.trim.nominalM;
      const m = builderFor('loaded-vertical').model(p.design, w);
      const load = m.loads![0];
      expect(load.kind).toBe('series-rlc');
      if (load.kind !== 'series-rlc') continue;
      expectClose(load.position, Number(p.design.params.coilHeightM) / 15, 1e-9, 'coil height');
      expectClose(load.lH!, coilInductanceH(w), 1e-15, 'inductance of the winding');
      expectClose(load.rOhm!, (2 * Math.PI * p.design.designFreqHz * load.lH!) / COIL_Q, 1e-9, 'R = ωL/Q');
    }
  });

  it("Wheeler's coil formula tends to the long solenoid µ0πr²N²/ℓ as the coil grows long", () => {
    const r = COIL_FORMER_DIAMETER_M / 2;
    const ratio = (windingM: number): number => {
      const n = coilTurns(windingM);
      const long = (4e-7 * Math.PI * Math.PI * r * r * n * n) / (n * COIL_PITCH_M);
      return coilInductanceH(windingM) / long;
    };
    // ℓ/r = 2, 20, 200: the ratio 10ℓ/(9r + 10ℓ) rises toward 1 (Wheeler, Proc. IRE 16 (1928) 1398, from memory).
    const ws = [2, 20, 200].map((k) => (k * r * Math.PI * COIL_FORMER_DIAMETER_M) / COIL_PITCH_M);
    const q = ws.map(ratio);
    expect(q[0]).toBeLessThan(q[1]);
    expect(q[1]).toBeLessThan(q[2]);
    expectClose(q[2], 2000 / 2009, 0.005, 'long-solenoid limit (ratio 10ℓ/(9r+10ℓ) at ℓ = 200r)');
  });

  it('rejects a support under 5 % of a wavelength, with the height it needs and its shortfall', () => {
    for (const type of ['top-hat-vertical', 't-top-vertical', 'loaded-vertical']) {
      const r = propose(type, '160m').rejections.find((x) => x.supports[0] === 'stub');
      expectNumbered(r, /stub at 5\.0 m is too short .*at least 8\.2 m/);
      expectClose(r!.shortfall!, 1 - 5 / (0.05 * bandPlan('160m').wavelengthM), 1e-9, 'shortfall');
    }
  });

  it('T top: rejected with the widest angle when the other supports stand on one side', () => {
    const oneSide: LotSpec = {
      ...OPEN,
      supports: [
        { id: 'oak', x: 0, y: 0, h: 15 },
        { id: 'ash', x: 30, y: 4, h: 12 },
        { id: 'elm', x: 32, y: -6, h: 11 },
      ],
    };
    const r = propose('t-top-vertical', '160m', oneSide).rejections.find((x) => x.supports[0] === 'oak');
    expect(r!.reasons[0]).toMatch(/at least 60° apart .* the widest is \d+°/);
    expect(r!.shortfall).toBeGreaterThan(0);
  });

  it('top hat: rejected, saying where the anchors go, when no layout fits a small lot', () => {
    const small: LotSpec = { halfX: 6, halfY: 6, supports: [{ id: 'oak', x: 0, y: 0, h: 15 }] };
    const r = propose('top-hat-vertical', '160m', small).rejections.find((x) => x.supports[0] === 'oak');
    expectNumbered(r, /each anchor is 15\.0 m out from oak/);
  });
});

describe('the field solver trims each loaded vertical to resonance (80 m, 15 m tree, perfect ground)', () => {
  const trims = new Map<string, number>();
  for (const type of ['top-hat-vertical', 't-top-vertical', 'loaded-vertical']) {
    it(`${type}`, () => {
      const { proposals } = propose(type, '80m');
      for (const p of proposals.filter((q) => q.supports[0] === 'oak')) {
        const rec = evaluateDesign(p.design, 'perfect', solverEvaluator);
        expect(rec.resonant, `${p.where}: ${rec.diagnostics.join('; ')}`).toBe(true);
        expect(Math.abs(rec.zOhm[1])).toBeLessThan(0.5);
        expect(rec.trimM).toBeGreaterThan(p.design.trim.minM);
        expect(rec.trimM).toBeLessThan(p.design.trim.maxM);
        if (type === 'loaded-vertical') {
          // The coil's loss is reported apart and is the only loss besides the wire's.
          expect(rec.power.loadLossW).toBeGreaterThan(0);
          trims.set(String(p.design.params.coilHeightM), coilInductanceH(rec.trimM));
        } else expect(rec.power.loadLossW ?? 0).toBe(0);
      }
    });
  }
  it('a coil halfway up needs more inductance than one at the base (common practice, no source)', () => {
    expect(trims.size).toBe(2);
    expect(trims.get('7.5')!).toBeGreaterThan(trims.get('0')!);
  });
});

describe('sloping wires', () => {
  it('half-wave sloper (40 m, 15 m tree): centre-fed, its lower end above the limit at the longest trim, fits', () => {
    const { site, proposals } = propose('sloper', '40m');
    const onOak = proposals.filter((p) => p.supports[0] === 'oak');
    expect(onOak.length).toBeGreaterThan(1); // several bearings, one design
    expect(new Set(onOak.map((p) => JSON.stringify(p.design))).size).toBe(1);
    const fitting = onOak.filter((p) => placedOk(site, p, p.design.trim.maxM).ok);
    expect(fitting.length).toBeGreaterThan(0);
    const p = fitting[0];
    const m = builderFor('sloper').model(p.design, p.design.trim.maxM);
    expect(m.feeds).toEqual([{ wire: 0, position: 0.5 }]);
    expect(m.wires[0].segments! % 2).toBe(0);
    expect(m.radials).toEqual([]);
    const low = Math.min(m.wires[0].from[2], m.wires[0].to[2]);
    expect(low).toBeGreaterThanOrEqual(site.site.settings.minEndHeightM);
  });

  it('half-wave sloper: rejected on 160 m from a 15 m tree, with the height it would need', () => {
    const r = propose('sloper', '160m').rejections.find((x) => x.supports[0] === 'oak');
    expectNumbered(r, /too short for a half-wave sloper .* needs a support of about \d+\.\d m/);
    expect(r!.shortfall).toBeGreaterThan(0);
  });

  it('sloping quarter-wave (80 m, 15 m tree): fed at its foot against radials, running toward the tree, fits', () => {
    const { site, proposals } = propose('sloping-vertical', '80m');
    const onOak = proposals.filter((p) => p.supports[0] === 'oak');
    expect(onOak.length).toBeGreaterThan(0);
    for (const p of onOak) {
      expect(placedOk(site, p, p.design.trim.maxM).ok).toBe(true);
      const m = builderFor('sloping-vertical').model(p.design, p.design.trim.nominalM);
      expect(m.wires[0].from).toEqual([0, 0, 0]);
      expect(m.radials[0].count).toBeGreaterThan(0);
      // The wire points at the tree's attachment: the tree is at canonical (0, span).
      const top = m.wires[0].to;
      const span = Number(p.design.params.spanM);
      expectClose(top[0], 0, 1e-9, 'in the plane of the tree');
      expectClose(top[2] / top[1], 15 / span, 1e-9, 'along the line to the attachment');
    }
  });

  it('sloping quarter-wave: rejected on 160 m from a 15 m tree, with its slope and the height it needs', () => {
    const r = propose('sloping-vertical', '160m').rejections.find((x) => x.supports[0] === 'oak');
    expectNumbered(r, /slopes only 18\.\d°; at least 30° needs a support of about 23\.2 m/);
  });
});
