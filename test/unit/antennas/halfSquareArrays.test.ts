// Half-square arrays (core/antennas/halfSquareArrays.ts): placement from four supports near a
// rectangle and three in an L, the designed stub and lines, feasibility of every part, trimming
// through the network, and loose physical checks marked as such.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseProject } from '../../../core/project/schema.ts';
import { bandPlan, placeElements } from '../../../core/antennas/common.ts';
import { builderFor } from '../../../core/antennas/registry.ts';
import {
  PLACEMENT_TOL_WAVELENGTHS,
  REFLECTOR_REACTANCE_BY_SPACING,
  coaxRunM,
  halfSquareLBuilder,
  halfSquareReflectorBuilder,
  halfSquareSwitchedBuilder,
  reflectorReactanceOhm,
} from '../../../core/antennas/halfSquareArrays.ts';
import { halfSquareBuilder } from '../../../core/antennas/halfSquare.ts';
import { COAX_VELOCITY_FACTOR, COAX_Z0_OHM, stubLengthM } from '../../../core/antennas/verticalPair.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { statePattern } from '../../../core/rank/states.ts';
import { checkPlacement, prepareSite } from '../../../core/site/feasibility.ts';
import { buildSite } from '../../../core/site/site.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../../core/units/index.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { gridGain } from '../../helpers/arrayChecks.ts';
import { preparedLot } from '../site/lot.ts';

const band = bandPlan('80m');
const lambda = band.wavelengthM;

/** An invented lot: four supports within a metre of a 60 × 12.7 m rectangle, the station to the west. */
const rectSupports = [
  { id: 'a1', x: -30, y: 6.3, h: 22 },
  { id: 'a2', x: 30, y: 6.6, h: 24 },
  { id: 'b1', x: -30.5, y: -6.3, h: 23 },
  { id: 'b2', x: 29.8, y: -6.4, h: 24 },
];
const siteOf = (supports: { id: string; x: number; y: number; h: number }[]) =>
  preparedLot({ halfX: 80, halfY: 70, station: [-60, 0], supports });
const rect = siteOf(rectSupports);

describe('half-square with a parasitic reflector (four supports near a rectangle)', () => {
  const out = halfSquareReflectorBuilder.propose({ site: rect, band });

  it('is a registered array of two elements, offered with either pair driven, one direction each', () => {
    expect(builderFor('half-square-reflector')).toBe(halfSquareReflectorBuilder);
    expect(halfSquareReflectorBuilder.array).toBe(true);
    expect(halfSquareReflectorBuilder.elementCount).toBe(2);
    expect(out.proposals).toHaveLength(2);
    expect(new Set(out.proposals.map((p) => p.groupKey)).size).toBe(1);
    expect(out.proposals.every((p) => p.design.states === undefined)).toBe(true);
    const [r0, r1] = out.proposals.map((p) => p.placement.rotationDeg);
    expectClose(Math.abs(r1 - r0), 180, 1e-9, 'the second variant is the first turned half round');
  });

  it('hangs two identical parallel half-squares at the lowest support height, ropes to the real supports, and passes the lot rules', () => {
    const p = out.proposals[0];
    const d = p.design;
    const m = halfSquareReflectorBuilder.model(d, d.trim.nominalM);
    expect(d.params.heightM).toBe(22);
    expectClose(d.params.spacingM as number, 12.8, 0.1, 'the rectangle is 12.7–12.9 m deep');
    const tops = m.wires.filter((w) => w.label.endsWith('top wire'));
    expect(tops).toHaveLength(2);
    for (const t of tops) {
      expect(t.from[1]).toBeCloseTo(t.to[1], 9); // along canonical x
      expectClose(
        t.to[0] - t.from[0],
        0.5 * lambda,
        0.01,
        'top wire half a wave (common practice, no source)',
      );
    }
    // every rope ends at a support as it stands on the lot
    const placed = placeElements(halfSquareReflectorBuilder.elements(d, d.trim.nominalM), p.placement);
    const ropes = placed.filter((e) => e.kind === 'rope' && e.label.includes('rope to'));
    expect(ropes).toHaveLength(4);
    for (const r of ropes) {
      if (r.kind !== 'rope') continue;
      const nearest = Math.min(
        ...rect.site.supports.map((s) => Math.hypot(s.xy[0] - r.from[0], s.xy[1] - r.from[1])),
      );
      expect(nearest).toBeLessThan(0.02);
    }
    expect(checkPlacement(rect, placed).ok).toBe(true);
  });

  it("designs the reflector's shorted stub for the loading reactance of its spacing", () => {
    const d = out.proposals[0].design;
    const lineLambda = (COAX_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / d.designFreqHz;
    const x = reflectorReactanceOhm((d.params.spacingM as number) / lambda);
    // shorted lossless stub: X = Z0 tan βℓ (Pozar, Microwave Engineering, 4th ed., §2.3)
    expectClose(
      COAX_Z0_OHM * Math.tan((2 * Math.PI * (d.params.stubLengthM as number)) / lineLambda),
      x,
      0.3,
      'Pozar §2.3',
    );
    expect(reflectorReactanceOhm(0.05)).toBe(REFLECTOR_REACTANCE_BY_SPACING[0][1]);
    const cuts = halfSquareReflectorBuilder.cutList(d, 20);
    expect(cuts.filter((c) => c.kind === 'coax')).toHaveLength(1);
    expect(cuts.find((c) => c.label.startsWith('drop'))?.count).toBe(4);
  });

  it('refuses supports too far off a rectangle, saying by how much', () => {
    const skew = siteOf(
      rectSupports.map((s) => (s.id === 'b1' ? { ...s, y: -14 } : s.id === 'b2' ? { ...s, y: 1 } : s)),
    );
    const r = halfSquareReflectorBuilder.propose({ site: skew, band });
    expect(r.proposals).toHaveLength(0);
    expect(r.rejections.map((x) => x.reasons.join(' ')).join(' ')).toMatch(
      new RegExp(`off a rectangle \\(more than ${(PLACEMENT_TOL_WAVELENGTHS * lambda).toFixed(1)} m`),
    );
  });

  it('over very good ground: resonant through its stub, with a back; the stub near the best (the +3 dB trade check: test/reference/plan/arrays-trade.test.ts)', () => {
    const ground = { classId: 'very-good' } as const;
    const d = out.proposals[0].design;
    const arr = evaluateDesign(d, ground, solverEvaluator);
    expect(arr.resonant).toBe(true);
    const fwd = gridGain(arr.gainDbi, 15, 0);
    expect(fwd - gridGain(arr.gainDbi, 15, 180), 'a reflector gives the array a back').toBeGreaterThan(8);
    // what the network achieves: the reflector's current leads the driven element's by 90–180°
    const feed = arr.arrayFeed!;
    expect(feed.elements[1].currentRatio).toBeGreaterThan(0.4);
    expect(feed.elements[1].currentRatio).toBeLessThan(1.2);
    expect(feed.elements[1].currentPhaseDeg).toBeGreaterThan(90);
    // the designed stub is within 0.3 dB of the best of a sweep of the loading reactance
    const sweep = [20, 30, 40, 50, 60].map((x) => {
      const r = evaluateDesign(
        { ...d, params: { ...d.params, stubLengthM: stubLengthM(x, d.designFreqHz) } },
        ground,
        solverEvaluator,
      );
      return gridGain(r.gainDbi, 15, 0);
    });
    expect(fwd).toBeGreaterThan(Math.max(...sweep) - 0.3);
  }, 60_000);
});

describe('relay-switched half-square pair', () => {
  const out = halfSquareSwitchedBuilder.propose({ site: rect, band });
  const p = out.proposals[0];

  it('has two states, the second the mirror of the first across the array’s centre line', () => {
    expect(out.proposals).toHaveLength(1);
    expect(p.design.states).toEqual([
      { name: 'front (A) driven, rear (B) reflects', rotationDeg: 0 },
      { name: 'rear (B) driven, front (A) reflects', rotationDeg: 0, mirrorAxisDeg: 90 },
    ]);
  });

  it('joins each fed corner to the box by a whole number of electrical half waves that reaches it', () => {
    const d = p.design;
    const half = (0.5 * COAX_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / d.designFreqHz;
    const line = d.params.lineLengthM as number;
    expectClose(line / half, Math.round(line / half), 0.001, 'a whole number of half waves');
    expect(line).toBeGreaterThan(coaxRunM(d, d.trim.maxM));
    const placed = placeElements(halfSquareSwitchedBuilder.elements(d, d.trim.nominalM), p.placement);
    expect(placed.filter((e) => e.kind === 'coax')).toHaveLength(2);
    expect(checkPlacement(rect, placed).ok).toBe(true);
    expect(halfSquareSwitchedBuilder.cutList(d, 20).filter((c) => c.kind === 'coax')).toHaveLength(2);
  });

  it('beams both ways: state 2 forward is state 1 backward, and each beats the other’s rear', () => {
    const r = evaluateDesign(p.design, { classId: 'very-good' }, solverEvaluator);
    expect(r.resonant).toBe(true);
    const s2 = statePattern(r.gainDbi, p.design.states![1]);
    expectClose(gridGain(s2, 15, 180), gridGain(r.gainDbi, 15, 0), 1e-12, 'mirror across the centre line');
    expect(gridGain(r.gainDbi, 15, 0) - gridGain(r.gainDbi, 15, 180)).toBeGreaterThan(8);
    // the lines' loss: at least one matched half wave of the driven element's line (Pozar §2.7)
    expect(r.arrayFeed!.networkLossShare).toBeGreaterThan(0.05);
    expect(r.arrayFeed!.networkLossShare).toBeLessThan(0.35);
  }, 30_000);
});

describe('two half-squares at 90° on three supports in an L', () => {
  // an invented L: the corner support at the origin, legs of 56 m east and 52 m north
  const L = [
    { id: 'k', x: 0, y: 0, h: 21 },
    { id: 'p', x: 56, y: 0.5, h: 20 },
    { id: 'q', x: 0.4, y: 52, h: 23 },
  ];
  const site = preparedLot({ halfX: 90, halfY: 90, station: [-20, -20], supports: L });
  const out = halfSquareLBuilder.propose({ site, band });
  const p = out.proposals[0];

  it('is proposed on the L with the two states mirrored across the corner’s bisector, every part on the lot', () => {
    expect(out.proposals).toHaveLength(1);
    expect(p.supports[0]).toBe('k');
    expect(p.design.states?.[1].mirrorAxisDeg).toBe(45);
    const placed = placeElements(halfSquareLBuilder.elements(p.design, p.design.trim.nominalM), p.placement);
    expect(checkPlacement(site, placed).ok).toBe(true);
    expect(p.design.params.heightM).toBe(20);
  });

  it('refuses legs far off a right angle, saying why', () => {
    const bent = preparedLot({
      halfX: 90,
      halfY: 90,
      station: [-20, -20],
      supports: [L[0], L[1], { id: 'q', x: 7, y: 52, h: 23 }],
    });
    const r = halfSquareLBuilder.propose({ site: bent, band });
    expect(r.proposals).toHaveLength(0);
    expect(r.rejections.map((x) => x.reasons.join(' ')).join(' ')).toMatch(/off a right angle/);
  });

  it('the idle half-square is open at its corner, and the two states cover all four broadside directions', () => {
    const ground = { classId: 'very-good' } as const;
    const r = evaluateDesign(p.design, ground, solverEvaluator);
    expect(r.resonant).toBe(true);
    expect(r.arrayFeed!.elements[1].currentRatio).toBeLessThan(0.1);
    const single = evaluateDesign(
      halfSquareBuilder.propose({ site: rect, band }).proposals[0].design,
      ground,
      solverEvaluator,
    );
    const ref = gridGain(single.gainDbi, 15, 0);
    const s2 = statePattern(r.gainDbi, p.design.states![1]);
    for (const az of [0, 90, 180, 270]) {
      const best = Math.max(gridGain(r.gainDbi, 15, az), gridGain(s2, 15, az));
      // a loose check: within the coax loss and coupling of a single half-square's broadside gain
      expect(best, `broadside ${az}°`).toBeGreaterThan(ref - 2);
    }
  }, 30_000);
});

describe('the example lot with four supports near a rectangle (data/examples)', () => {
  it('holds every half-square array, each part passing the lot rules', () => {
    const text = readFileSync(
      fileURLToPath(new URL('../../../data/examples/four-supports-near-a-rectangle.json', import.meta.url)),
      'utf8',
    );
    const parsed = parseProject(JSON.parse(text));
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
    expect(parsed.value.settings.planArrays).toBe(true);
    const site = prepareSite(buildSite(parsed.value));
    for (const b of [halfSquareReflectorBuilder, halfSquareSwitchedBuilder, halfSquareLBuilder]) {
      const out = b.propose({ site, band });
      expect(out.proposals.length, b.type).toBeGreaterThan(0);
      for (const p of out.proposals)
        expect(
          checkPlacement(site, placeElements(b.elements(p.design, p.design.trim.nominalM), p.placement)).ok,
          `${b.type} ${p.where}`,
        ).toBe(true);
    }
  });
});
