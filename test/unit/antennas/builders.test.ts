import { describe, expect, it } from 'vitest';
import { BUILDERS, builderFor } from '../../../core/antennas/registry.ts';
import { bandPlan, placeElements } from '../../../core/antennas/common.ts';
import type { Design, Proposal, WireModel } from '../../../core/antennas/types.ts';
import { placeXYZ } from '../../../core/site/geometry.ts';
import { supportPair, testLot, preparedLot } from '../site/lot.ts';
import { expectClose } from '../../helpers/expectClose.ts';

const EPS = 1e-9;
const len = (w: { from: readonly number[]; to: readonly number[] }): number =>
  Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]);
const total = (m: WireModel): number => m.wires.reduce((s, w) => s + len(w), 0);

function ctxFor(spec: Parameters<typeof testLot>[0], band: '160m' | '80m' | '40m' = '80m') {
  return { site: preparedLot(spec), band: bandPlan(band) };
}

function first(
  type: string,
  spec: Parameters<typeof testLot>[0],
  band: '160m' | '80m' | '40m' = '80m',
): Proposal {
  const out = builderFor(type).propose(ctxFor(spec, band));
  const p = out.proposals[0];
  if (!p) throw new Error(`no ${type} proposal: ${JSON.stringify(out.rejections)}`);
  return p;
}

describe('dipole', () => {
  const lambda = bandPlan('80m').wavelengthM;
  it('centres the wire with ropes when the span is longer than the wire', () => {
    const p = first('dipole', { halfX: 60, supports: supportPair(60, 15) });
    const m = builderFor('dipole').model(p.design, 40);
    expect(m.wires).toHaveLength(1);
    expectClose(total(m), 40, EPS, 'wire length equals the trim dimension by construction');
    expectClose(m.wires[0].from[0], -20, EPS, 'centred in a 60 m span');
    expect(m.feeds).toEqual([{ wire: 0, position: 0.5 }]);
    expect((m.wires[0].segments ?? 0) % 2).toBe(0);
    expect(p.broadsideDeg.sort((a, b) => a - b).map(Math.round)).toEqual([0, 180]);
  });

  it('hangs the ends down by half the excess when the span is short', () => {
    const p = first('dipole', { halfX: 40, supports: supportPair(30, 15) });
    const L = 0.48 * lambda;
    const m = builderFor('dipole').model(p.design, L);
    expectClose(total(m), L, 1e-9, 'total wire equals L');
    const hs = builderFor('dipole').heights(p.design, L);
    expectClose(hs[1].heightM, 15 - (L - 30) / 2, 1e-9, 'each end drops (L − span)/2');
  });

  it('slopes the wire when the heights differ', () => {
    const p = first('dipole', { halfX: 60, supports: supportPair(60, 20, 10) });
    const m = builderFor('dipole').model(p.design, 40);
    expect(m.wires[0].from[2]).toBeGreaterThan(m.wires[0].to[2]);
    expectClose(total(m), 40, 1e-9, 'total wire equals L');
  });
});

describe('inverted-V', () => {
  it('has its legs end at the end-height limit and its length equal to the trim dimension', () => {
    const p = first('inverted-v', { halfX: 60, supports: [{ id: 'a', x: 0, y: 0, h: 15 }] });
    const L = 38;
    const m = builderFor('inverted-v').model(p.design, L);
    expectClose(total(m), L, 1e-9, 'total wire equals L');
    expectClose(m.wires[1].to[2], 2.5, 1e-9, 'default end height 2.5 m');
    // Legs make an included angle of at least 90°.
    const leg = m.wires[1];
    const drop = leg.from[2] - leg.to[2];
    expect(
      Math.atan2(Math.hypot(leg.to[0] - leg.from[0], leg.to[1] - leg.from[1]), drop),
    ).toBeGreaterThanOrEqual(Math.PI / 4 - 1e-12);
  });

  it('offers orientations every 5° and bent plan angles', () => {
    const out = builderFor('inverted-v').propose(
      ctxFor({ halfX: 60, supports: [{ id: 'a', x: 0, y: 0, h: 15 }] }),
    );
    const straight = out.proposals.filter((p) => p.design.params.planAngleDeg === 180);
    expect(straight).toHaveLength(36);
    expect(new Set(out.proposals.map((p) => p.design.params.planAngleDeg))).toEqual(new Set([180, 140, 100]));
  });
});

describe('half-square', () => {
  const lambda = bandPlan('80m').wavelengthM;
  const spec = {
    halfX: 70,
    supports: supportPair(48, 22),
  };
  it('is a half-wave top and two drops fed at a top corner', () => {
    const p = first('half-square', spec);
    const d = 18;
    const m = builderFor('half-square').model(p.design, d);
    expect(m.wires).toHaveLength(3);
    expectClose(len(m.wires[1]), 0.5 * lambda, 1e-3, 'top wire half a wave (kept to the millimetre)');
    expectClose(len(m.wires[0]), d, 1e-9, 'drop = trim dimension');
    expect(m.feeds).toEqual([{ wire: 0, position: 0 }]);
    expectClose(m.wires[0].from[2], 22, 1e-9, 'feed at the top corner');
  });

  it('bends the lower ends inward at the end height when the supports are short', () => {
    const p = first('half-square', spec);
    const d = 0.245 * lambda; // longer than 22 − 2.5
    const m = builderFor('half-square').model(p.design, d);
    expect(m.wires).toHaveLength(5);
    const bendA = m.wires[3];
    expectClose(bendA.to[2], 2.5, 1e-9, 'bend at the end height');
    expectClose(len(bendA), d - (22 - 2.5), 1e-9, 'bend takes the rest of the drop');
    expect(bendA.to[0]).toBeGreaterThan(bendA.from[0]); // inward (toward +x from the −x corner)
    const els = builderFor('half-square')
      .elements(p.design, d)
      .filter((e) => e.kind === 'end');
    for (const e of els) if (e.kind === 'end') expect(e.at[2]).toBeGreaterThanOrEqual(2.5 - 1e-12);
  });
});

describe('vertical', () => {
  it('clips radials at the boundary for a support near the edge', () => {
    const lambda = bandPlan('40m').wavelengthM;
    const p = first(
      'vertical',
      { halfX: 30, halfY: 30, supports: [{ id: 'a', x: 24, y: 0, h: 14 }], settings: { radialCount: 16 } },
      '40m',
    );
    const r = p.design.params.radialLengthsM as number[];
    expect(r).toHaveLength(16);
    // Radial 4 points east (canonical bearing 90°): 30 − 24 − 1 (setback) = 5 m.
    expectClose(r[4], 5, 0.25, 'east edge 6 m away, 1 m setback, 0.25 m clipping step');
    expectClose(r[12], 0.25 * lambda, 1e-2, 'west radial full quarter wave');
  });

  it('rejects a self-supporting quarter wave taller than the user limit, saying so', () => {
    const out = builderFor('vertical').propose(ctxFor({ halfX: 60, settings: { maxVerticalHeightM: 12 } }));
    expect(
      out.rejections.some((r) => /taller than your 12\.0 m self-supporting limit/.test(r.reasons.join(' '))),
    ).toBe(true);
  });
});

describe('inverted-L', () => {
  it('is proposed only up supports too short for a quarter-wave vertical', () => {
    const lambda = bandPlan('80m').wavelengthM;
    const out = builderFor('inverted-l').propose(
      ctxFor({
        halfX: 60,
        supports: [
          { id: 'short', x: -10, y: 0, h: 14 },
          { id: 'tall', x: 15, y: 0, h: 22 },
        ],
      }),
    );
    expect(out.proposals.length).toBeGreaterThan(0);
    for (const p of out.proposals) expect(p.supports[0]).toBe('short');
    const p = out.proposals[0];
    const L = 0.26 * lambda;
    const m = builderFor('inverted-l').model(p.design, L);
    expectClose(total(m), L, 1e-9, 'vertical + top = L');
    expectClose(len(m.wires[0]), 14, 1e-9, 'vertical part up the 14 m support');
  });
});

describe('every builder', () => {
  const spec = {
    halfX: 80,
    halfY: 50,
    supports: [
      { id: 'a', x: -25, y: 0, h: 22 },
      { id: 'b', x: 25, y: 5, h: 18 },
      { id: 'c', x: 0, y: 30, h: 12 },
    ],
    settings: { maxVerticalHeightM: 12 },
  };
  for (const band of ['160m', '80m', '40m'] as const) {
    for (const b of BUILDERS) {
      it(`${b.type} on ${band}: wires above ground, placed wires match placed elements`, () => {
        const out = b.propose(ctxFor(spec, band));
        for (const p of out.proposals.slice(0, 3)) {
          const d: Design = p.design;
          const m = b.model(d, d.trim.nominalM);
          for (const w of m.wires) {
            expect(w.from[2]).toBeGreaterThanOrEqual(-EPS);
            expect(w.to[2]).toBeGreaterThanOrEqual(-EPS);
            expect(len(w)).toBeGreaterThan(0);
          }
          const els = placeElements(b.elements(d, d.trim.nominalM), p.placement).filter(
            (e) => e.kind === 'wire',
          );
          const placed = m.wires.map((w) => placeXYZ(w.from, p.placement.rotationDeg, p.placement.originXY));
          for (const q of placed) {
            const hit = els.some(
              (e) =>
                e.kind === 'wire' &&
                (Math.hypot(e.from[0] - q[0], e.from[1] - q[1], e.from[2] - q[2]) < 1e-6 ||
                  Math.hypot(e.to[0] - q[0], e.to[1] - q[1], e.to[2] - q[2]) < 1e-6),
            );
            expect(hit).toBe(true);
          }
          for (const s of p.supports) expect(spec.supports.map((x) => x.id)).toContain(s);
        }
      });
    }
  }
});
