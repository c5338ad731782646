// Four-square hung from four supports near a square (core/antennas/fourSquareHung.ts): which
// supports it accepts, the real positions in the model, the lot rules, and physical checks of the
// four directions each solved with its own relay routing.
import { describe, expect, it } from 'vitest';
import { bandPlan, placeElements } from '../../../core/antennas/common.ts';
import { builderFor } from '../../../core/antennas/registry.ts';
import { baseCoilH, fitSquare, fourSquareHungBuilder } from '../../../core/antennas/fourSquareHung.ts';
import { oddQuarterWaveM, quarterWaveCoaxM } from '../../../core/antennas/fourSquare.ts';
import { arrayFeedReport } from '../../../core/antennas/arrayFeed.ts';
import { coilLoad } from '../../../core/antennas/loading.ts';
import { evaluateAntenna } from '../../../core/em/evaluate.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { groundSpec, solverEvaluator } from '../../../core/rank/solver.ts';
import { PATTERN_GRID } from '../../../core/rank/pattern.ts';
import { statePattern } from '../../../core/rank/states.ts';
import { checkPlacement, prepareSite } from '../../../core/site/feasibility.ts';
import { placeXY } from '../../../core/site/geometry.ts';
import { buildSite } from '../../../core/site/site.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { testLot } from '../site/lot.ts';

const band = bandPlan('40m');
const lambda = band.wavelengthM;
const a = (0.25 * lambda) / Math.SQRT2;
type S = { id: string; x: number; y: number; h: number };
/** Four supports on the corners of a λ/4 square (diamond-wise: corners north, east, south, west), moved by `jitter`. */
const square = (jitter: [number, number][] = [], h = 14): S[] =>
  [
    [0, a],
    [a, 0],
    [0, -a],
    [-a, 0],
  ].map(([x, y], i) => ({ id: `t${i}`, x: x + (jitter[i]?.[0] ?? 0), y: y + (jitter[i]?.[1] ?? 0), h }));
const siteOf = (supports: S[]) =>
  prepareSite(
    buildSite(
      testLot({ halfX: 40, halfY: 40, station: [-30, -30], supports, settings: { radialCount: 16 } }),
    ),
  );

function gainAt(g: readonly number[], elDeg: number, azDeg: number): number {
  const az = (((Math.round(azDeg / 2) * 2) % 360) + 360) % 360;
  return g[
    PATTERN_GRID.elevationsDeg.indexOf(elDeg) * PATTERN_GRID.azimuthsDeg.length +
      PATTERN_GRID.azimuthsDeg.indexOf(az)
  ];
}
/** Azimuth of the largest gain at 15° elevation. */
function peakAz(g: readonly number[]): number {
  let best = -Infinity;
  let at = 0;
  for (const az of PATTERN_GRID.azimuthsDeg)
    if (gainAt(g, 15, az) > best) [best, at] = [gainAt(g, 15, az), az];
  return at;
}
const angleDiff = (x: number, y: number) => Math.abs(((x - y + 540) % 360) - 180);

describe('fitSquare', () => {
  it('recovers a turned, shifted square exactly and measures the worst miss of a moved corner', () => {
    const t = (p: [number, number]) => placeXY(p, 20, [5, -3]);
    const pts = (
      [
        [0, 7],
        [7, 0],
        [0, -7],
        [-7, 0],
      ] as [number, number][]
    ).map(t);
    const f = fitSquare(pts);
    expectClose(f.sideM, 7 * Math.SQRT2, 1e-9, 'corners 7 m from the centre');
    expect(f.worstM).toBeLessThan(1e-9);
    expectClose(f.centre[0], 5, 1e-9, 'centre');
    pts[1] = [pts[1][0] + 1, pts[1][1]];
    // least squares over four points: a corner moved by δ misses its fitted corner by δ/2 (the
    // centre moves by δ/4 and the fitted corner by another δ/4 toward it)
    expectClose(fitSquare(pts).worstM, 0.5, 1e-9, 'δ/2 for δ = 1 m');
  });
  it('chooses the smallest odd number of quarter waves that reaches', () => {
    const q = quarterWaveCoaxM(band.designFreqHz);
    expectClose(oddQuarterWaveM(q - 2, band.designFreqHz), q, 1e-12, 'one quarter wave reaches');
    expectClose(oddQuarterWaveM(q, band.designFreqHz), 3 * q, 1e-12, 'slack: three quarter waves');
  });
});

describe('four-square hung from supports', () => {
  const exact = siteOf(square());
  const out = fourSquareHungBuilder.propose({ site: exact, band });
  const p = out.proposals[0];

  it('is a registered array of four elements with four directions, three of them solved as variants', () => {
    expect(builderFor('four-square-hung')).toBe(fourSquareHungBuilder);
    expect(fourSquareHungBuilder.array).toBe(true);
    expect(out.proposals).toHaveLength(1);
    expect(p.supports).toHaveLength(4);
    expect(p.design.states?.map((s) => s.variant)).toEqual([undefined, 1, 2, 3]);
    expect(fourSquareHungBuilder.model(p.design, p.design.trim.nominalM).stateNetworks).toHaveLength(3);
  });

  it('hangs each vertical at its support, runs the coax to the centre, and passes the lot rules', () => {
    const jit: [number, number][] = [
      [0.4, -0.3],
      [-0.3, 0.5],
      [0.2, 0.3],
      [-0.5, -0.2],
    ];
    const sup = square(jit);
    const site = siteOf(sup);
    const q = fourSquareHungBuilder.propose({ site, band }).proposals[0];
    expect(q).toBeDefined();
    const H = q.design.trim.nominalM;
    const m = fourSquareHungBuilder.model(q.design, H);
    const bases = m.wires.map((w) =>
      placeXY([w.from[0], w.from[1]], q.placement.rotationDeg, q.placement.originXY),
    );
    for (const b of bases) {
      const nearest = Math.min(...sup.map((s) => Math.hypot(s.x - b[0], s.y - b[1])));
      expect(nearest).toBeLessThan(0.01);
    }
    const placed = placeElements(fourSquareHungBuilder.elements(q.design, H), q.placement);
    expect(placed.filter((e) => e.kind === 'coax')).toHaveLength(4);
    expect(placed.filter((e) => e.kind === 'rope')).toHaveLength(4);
    expect(checkPlacement(site, placed).ok).toBe(true);
    // the lines reach from the box to the farthest base (with slack)
    const far = Math.max(...m.wires.map((w) => Math.hypot(w.from[0], w.from[1])));
    expect(q.design.params.lineLengthM as number).toBeGreaterThan(far);
  });

  it('refuses supports off a square, too short, or on a square of the wrong size, saying by how much', () => {
    const off = fourSquareHungBuilder.propose({
      site: siteOf(
        square([
          [0, 0],
          [2.5, 0],
        ]),
      ),
      band,
    });
    expect(off.proposals).toHaveLength(0);
    expect(off.rejections[0].reasons[0]).toMatch(/from the corner of the nearest square/);
    expect(off.rejections[0].shortfall).toBeGreaterThan(0);
    const short = fourSquareHungBuilder.propose({ site: siteOf(square([], 5)), band });
    expect(short.proposals).toHaveLength(0);
    expect(short.rejections[0].reasons[0]).toMatch(/too short even for a base-loaded vertical/);
    expectClose(short.rejections[0].shortfall!, 1 - 5 / (0.15 * lambda), 1e-9, 'lacking over needed');
    const big = fourSquareHungBuilder.propose({
      site: siteOf(square().map((s) => ({ ...s, x: s.x * 1.3, y: s.y * 1.3 }))),
      band,
    });
    expect(big.proposals).toHaveLength(0);
    expect(big.rejections[0].reasons[0]).toMatch(/outside the 0.2–0.3 λ/);
    const none = fourSquareHungBuilder.propose({ site: siteOf([]), band });
    expect(none.rejections[0].reasons[0]).toMatch(/no four supports stand near a square/);
  });

  it('on an exact square the four directions are turns of one another and beam where they say (average soil)', () => {
    const rec = evaluateDesign(p.design, { classId: 'average' }, solverEvaluator);
    const variants = (rec.variants ?? []).map((v) => v.gainDbi);
    expect(variants).toHaveLength(3);
    const states = p.design.states!;
    const fwd = states.map((s) => {
      const g = statePattern(rec.gainDbi, s, variants);
      // physical check: the peak at 15° lies on the state's beam bearing (end-fire along a diagonal)
      expect(angleDiff(peakAz(g), s.beamDeg!)).toBeLessThanOrEqual(4);
      // front-to-back at 15° (common practice, no source: a four-square's rear is 15–25 dB down)
      expect(gainAt(g, 15, s.beamDeg!) - gainAt(g, 15, s.beamDeg! + 180)).toBeGreaterThan(12);
      return gainAt(g, 15, s.beamDeg!);
    });
    // symmetry: the square turns into itself by 90°, so the forward gains agree to the solver's precision
    for (const f of fwd) expectClose(f, fwd[0], 0.05, 'symmetry of the square under a quarter turn');
  });

  it('on a near-square (every support within 0.6 m of its corner) the directions stay within a stated tolerance', () => {
    const site = siteOf(
      square([
        [0.5, -0.3],
        [-0.3, 0.5],
        [0.2, 0.4],
        [-0.5, -0.2],
      ]),
    );
    const q = fourSquareHungBuilder.propose({ site, band }).proposals[0];
    const rec = evaluateDesign(q.design, { classId: 'average' }, solverEvaluator);
    const variants = (rec.variants ?? []).map((v) => v.gainDbi);
    const fwd = q.design.states!.map((s) => {
      const g = statePattern(rec.gainDbi, s, variants);
      expect(angleDiff(peakAz(g), s.beamDeg!)).toBeLessThanOrEqual(10);
      expect(gainAt(g, 15, s.beamDeg!) - gainAt(g, 15, s.beamDeg! + 180)).toBeGreaterThan(10);
      return gainAt(g, 15, s.beamDeg!);
    });
    // a chosen tolerance: 0.5 dB between the directions for a miss of 0.025 λ at most
    expect(Math.max(...fwd) - Math.min(...fwd)).toBeLessThan(0.5);
    // the lines force the currents: the front one near 180° from the back one (Pozar §2.5)
    const m = fourSquareHungBuilder.model(q.design, rec.trimM);
    const fr = arrayFeedReport(m, groundSpec({ classId: 'average' }), q.design.designFreqHz, 2);
    expect(Math.abs(Math.abs(fr.elements[0].currentPhaseDeg) - 180)).toBeLessThan(15);
    expect(fr.networkLossShare).toBeLessThan(0.25);
  });

  it('on supports shorter than a quarter wave loads all four alike with a base coil that tunes one alone, and still beams', () => {
    const h = 8;
    const q = fourSquareHungBuilder.propose({ site: siteOf(square([], h)), band }).proposals[0];
    expect(q).toBeDefined();
    expect(q.design.trim.nominalM).toBe(h);
    expect(q.adaptations?.[0]).toMatch(/each with a [\d.]+ µH loading coil at its base/);
    const lH = (q.design.params.coilUH as number) * 1e-6;
    expectClose(lH, baseCoilH(band.designFreqHz, h), 1e-8, 'the design keeps the solved coil');
    // one such vertical with its coil alone over perfect ground: the coil cancels its reactance
    // (series elements at the feed add; the coil's loss ωL/Q adds resistance only)
    const m1 = fourSquareHungBuilder.model(q.design, h);
    const one = evaluateAntenna(
      {
        wires: [{ ...m1.wires[0], from: [0, 0, 0], to: [0, 0, h] }],
        feeds: [{ wire: 0, position: 0 }],
        loads: [coilLoad(0, 0, lH, band.designFreqHz)],
        ground: { kind: 'perfect' },
      },
      { frequenciesHz: [band.designFreqHz], pattern: { elevationsDeg: [], azimuthsDeg: [] } },
    ).frequencies[0].feeds[0].impedanceOhm;
    expect(Math.abs(one[1])).toBeLessThan(1);
    // shorter than a quarter wave: its radiation resistance over perfect ground is below the
    // quarter-wave's 36 Ω (Balanis, Antenna Theory, 4th ed., §4.7.4: half the dipole's 73 Ω)
    expect(one[0]).toBeLessThan(36);
    expect(m1.loads).toHaveLength(4);
    const rec = evaluateDesign(q.design, { classId: 'average' }, solverEvaluator);
    expect(rec.power.loadLossW ?? 0).toBeGreaterThan(0);
    const s1 = q.design.states![0];
    expect(gainAt(rec.gainDbi, 15, s1.beamDeg!) - gainAt(rec.gainDbi, 15, s1.beamDeg! + 180)).toBeGreaterThan(
      10,
    );
  });
});
