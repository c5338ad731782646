// Two switched quarter-wave verticals (core/antennas/verticalPair.ts): geometry, the feed
// network's lengths, trimming through the network, and loose physical checks marked as such.
import { describe, expect, it } from 'vitest';
import { builderFor } from '../../../core/antennas/registry.ts';
import { bandPlan } from '../../../core/antennas/common.ts';
import {
  COAX_LOSS_DB_PER_100M,
  COAX_VELOCITY_FACTOR,
  COAX_Z0_OHM,
  DIRECTOR_REACTANCE_OHM,
  REFLECTOR_REACTANCE_OHM,
  directorPairBuilder,
  verticalPairBuilder,
} from '../../../core/antennas/verticalPair.ts';
import { evaluateDesign } from '../../../core/rank/evaluate.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../../core/units/index.ts';
import { preparedLot } from '../site/lot.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { gridGain, oneVertical } from '../../helpers/arrayChecks.ts';

const ctx = (maxVerticalHeightM: number) => ({
  site: preparedLot({ halfX: 70, halfY: 50, settings: { maxVerticalHeightM, radialCount: 16 } }),
  band: bandPlan('80m'),
});

describe('two switched verticals', () => {
  const lambda = bandPlan('80m').wavelengthM;
  const out = verticalPairBuilder.propose(ctx(25));
  const p = out.proposals[0];

  it('is registered as an array of two elements with two states 180° apart', () => {
    expect(builderFor('vertical-pair')).toBe(verticalPairBuilder);
    expect(verticalPairBuilder.array).toBe(true);
    expect(verticalPairBuilder.elementCount).toBe(2);
    expect(p.design.states?.map((s) => s.rotationDeg)).toEqual([0, 180]);
  });

  it('places two verticals 0.15 λ apart with radials cut on the line midway (bonded there)', () => {
    const m = verticalPairBuilder.model(p.design, 20);
    expect(m.wires).toHaveLength(2);
    expectClose(
      m.wires[0].from[1] - m.wires[1].from[1],
      0.15 * lambda,
      0.01,
      'spacing 0.15 λ (common practice, no source)',
    );
    expect(m.radialsBonded).toBe(true);
    // A at +s/2: no radial of A reaches past y = 0 (the midline); canonical bearing k·360/N
    const s = p.design.params.spacingM as number;
    const ra = p.design.params.radialLengthsAM as number[];
    ra.forEach((l, k) => {
      const b = (2 * Math.PI * k) / ra.length;
      expect(s / 2 + l * Math.cos(b)).toBeGreaterThan(-0.01);
    });
    expectClose(
      Math.max(...ra),
      0.25 * lambda,
      0.01,
      'radials away from the partner are a full quarter wave',
    );
  });

  it('joins each vertical by an electrical half wave of coax and loads the reflector with a +j25 Ω stub', () => {
    const line = p.design.params.lineLengthM as number;
    const stub = p.design.params.stubLengthM as number;
    const lineLambda = (COAX_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / p.design.designFreqHz;
    expectClose(line, lineLambda / 2, 0.01, 'half wave in the cable');
    // shorted lossless stub: X = Z0 tan βℓ (Pozar §2.3, core/REFERENCES.md §15)
    expectClose(
      COAX_Z0_OHM * Math.tan((2 * Math.PI * stub) / lineLambda),
      REFLECTOR_REACTANCE_OHM,
      0.5,
      'Pozar §2.3',
    );
    const cuts = verticalPairBuilder.cutList(p.design, 20);
    expect(cuts.filter((c) => c.kind === 'coax')).toHaveLength(2);
  });

  it('rejects the pair when a quarter wave is taller than the self-supporting limit, saying so', () => {
    const r = verticalPairBuilder.propose(ctx(12));
    expect(r.proposals).toHaveLength(0);
    expect(r.rejections[0].reasons[0]).toMatch(/taller than your 12\.0 m self-supporting limit/);
  });

  it('trims to resonance through its network and beats one vertical forward, with a rear (over very good ground)', () => {
    const ground = { classId: 'very-good' } as const;
    const pair = evaluateDesign(p.design, ground, solverEvaluator);
    expect(pair.resonant).toBe(true);
    const one = evaluateDesign(
      oneVertical(p.design, p.design.params.radialLengthsAM, p.design.trim),
      ground,
      solverEvaluator,
    );
    const fwd = gridGain(pair.gainDbi, 15, 0);
    const back = gridGain(pair.gainDbi, 15, 180);
    // Loose, marked checks (common practice, no source): a two-element parasitic vertical array
    // gains about 2–3 dB over one vertical and has a front-to-back ratio of several dB.
    expect(fwd - gridGain(one.gainDbi, 15, 0)).toBeGreaterThan(1.5);
    expect(fwd - gridGain(one.gainDbi, 15, 0)).toBeLessThan(4);
    expect(fwd - back).toBeGreaterThan(4);
    // what the network achieves: the reflector's current, relative to the driven element's
    const feed = pair.arrayFeed!;
    expect(feed.elements.map((e) => e.label)).toEqual(['vertical A', 'vertical B']);
    expect(feed.elements[1].currentRatio).toBeGreaterThan(0.3);
    expect(feed.elements[1].currentRatio).toBeLessThan(1.2);
    // the network's loss: at least the matched loss of the driven element's half-wave line
    // (1 − 10^(−αℓ/10), Pozar §2.7; mismatch only adds to it), and the reflector's line and stub on top
    const lineDb =
      (COAX_LOSS_DB_PER_100M *
        Math.sqrt(p.design.designFreqHz / 3.6e6) *
        (p.design.params.lineLengthM as number)) /
      100;
    expect(feed.networkLossShare).toBeGreaterThan(1 - 10 ** (-lineDb / 10));
    expect(feed.networkLossShare).toBeLessThan(0.3);
    // the driven element's resistance drops with the close reflector (mutual coupling): below one vertical's
    expect(pair.zOhm[0]).toBeLessThan(one.zOhm[0]);
  });
});

describe('two switched verticals, driven + director', () => {
  const band40 = bandPlan('40m');
  const lambda = band40.wavelengthM;
  const site = preparedLot({ halfX: 70, halfY: 50, settings: { maxVerticalHeightM: 15, radialCount: 16 } });
  const p = directorPairBuilder.propose({ site, band: band40 }).proposals[0];

  it('is registered, 0.1 λ apart, the director loaded by an open stub of −j20 Ω (Pozar §2.3)', () => {
    expect(builderFor('vertical-pair-director')).toBe(directorPairBuilder);
    expect(p).toBeDefined();
    expectClose(p.design.params.spacingM as number, 0.1 * lambda, 0.01, 'spacing 0.1 λ');
    const stub = p.design.params.stubLengthM as number;
    const lineLambda = (COAX_VELOCITY_FACTOR * SPEED_OF_LIGHT_M_PER_S) / p.design.designFreqHz;
    // open lossless stub: Z = −j Z0 cot βℓ
    expectClose(
      -COAX_Z0_OHM / Math.tan((2 * Math.PI * stub) / lineLambda),
      DIRECTOR_REACTANCE_OHM,
      0.5,
      'Pozar §2.3',
    );
    const net = directorPairBuilder.model(p.design, 10).network!;
    // the stub ends at a node of its own (open), not at the common return
    expect(net.elements.some((e) => e.kind === 'line' && e.b === 'stub-open-end')).toBe(true);
  });

  it('beats one vertical forward toward the director, with a rear (over average soil, 40 m)', () => {
    const ground = { classId: 'average' } as const;
    const pair = evaluateDesign(p.design, ground, solverEvaluator);
    expect(pair.resonant).toBe(true);
    const one = evaluateDesign(oneVertical(p.design), ground, solverEvaluator);
    const fwd = gridGain(pair.gainDbi, 15, 0);
    // Loose, marked checks (common practice, no source): a two-element parasitic array gains over
    // one vertical, a director pair somewhat less than a reflector pair, and has a rear of some dB.
    expect(fwd - gridGain(one.gainDbi, 15, 0)).toBeGreaterThan(0.5);
    expect(fwd - gridGain(one.gainDbi, 15, 0)).toBeLessThan(3);
    expect(fwd - gridGain(pair.gainDbi, 15, 180)).toBeGreaterThan(3);
    // the director's current lags the driven element's by more than 90° (it is the front element)
    const [A] = pair.arrayFeed!.elements;
    expect(A.currentRatio).toBeGreaterThan(0.3);
    expect(Math.abs(A.currentPhaseDeg)).toBeGreaterThan(90);
  });
});
