/**
 * What an array's feed network actually does: each element's drive impedance (the impedance at
 * its base with all the others excited as the network excites them), the current ratios achieved
 * relative to a reference element, and where the power goes (the network's lines and resistors,
 * the radiated power, the ground). One solve of the field solver with the network
 * (core/em/network.ts) at the design frequency.
 */
import { evaluateAntenna } from '../em/evaluate.ts';
import type { AntennaModel, GroundSpec } from '../em/types.ts';
import type { WireModel } from './types.ts';

export interface ElementFeed {
  label: string;
  driveImpedanceOhm: [number, number];
  /** |I| / |I_ref| and arg(I / I_ref) in degrees (−180…180). */
  currentRatio: number;
  currentPhaseDeg: number;
}

/** What one relay state's network achieves and the impedance the station's line sees there. */
export interface StateFeed {
  elements: ElementFeed[];
  networkLossShare: number;
  feedZOhm: [number, number];
  swr: number;
}

/** What the planner keeps of it (EvaluationRecord.arrayFeed, Candidate.arrayFeed). */
export interface ArrayFeed {
  elements: ElementFeed[];
  networkLossShare: number;
  /** States of another phasing (Design.states[].variant; variant k is variants[k − 1]). */
  variants?: StateFeed[];
  /**
   * Relay states solved apart, each with its own model (a switched pair's direction 2: the
   * station's line through the relay box and the coax run to B); `state` numbers the candidate's
   * states from 1.
   */
  states?: (StateFeed & { state: number })[];
}

/** Drive impedances and current ratios of the feeds, relative to feed `reference`. */
export function feedRatios(
  labels: readonly string[],
  ports: readonly { zOhm: readonly [number, number]; currentA: readonly [number, number] }[],
  reference: number,
): ElementFeed[] {
  const ref = ports[reference].currentA;
  const refAbs = Math.hypot(ref[0], ref[1]);
  const refArg = Math.atan2(ref[1], ref[0]);
  return ports.map((p, i) => ({
    label: labels[i],
    driveImpedanceOhm: [p.zOhm[0], p.zOhm[1]],
    currentRatio: refAbs > 0 ? Math.hypot(p.currentA[0], p.currentA[1]) / refAbs : 0,
    currentPhaseDeg:
      ((((Math.atan2(p.currentA[1], p.currentA[0]) - refArg) * 180) / Math.PI + 540) % 360) - 180,
  }));
}

export interface ArrayFeedReport {
  elements: ElementFeed[];
  /** The impedance the station's line sees (the network's first source). */
  feedImpedanceOhm: [number, number];
  /** Shares of the input power. */
  radiatedShare: number;
  networkLossShare: number;
  groundLossShare: number;
}

/** The feed report of a wire model with a network; `reference` (default the model's) is the element the ratios refer to. */
export function arrayFeedReport(
  model: WireModel,
  ground: GroundSpec,
  freqHz: number,
  reference?: number,
): ArrayFeedReport {
  if (!model.network) throw new Error('arrayFeedReport: the model has no feed network');
  const am: AntennaModel = {
    wires: model.wires.map(({ from, to, radiusM, segments, material }) => ({
      from,
      to,
      radiusM,
      ...(segments !== undefined ? { segments } : {}),
      ...(material !== undefined ? { material } : {}),
    })),
    feeds: model.feeds.map((f) => ({ wire: f.wire, position: f.position })),
    radials: model.radials,
    network: model.network,
    ...(model.radialsBonded ? { radialsBonded: true } : {}),
    ground,
  };
  const r = evaluateAntenna(am, { frequenciesHz: [freqHz], pattern: { elevationsDeg: [], azimuthsDeg: [] } })
    .frequencies[0];
  const elements = feedRatios(
    model.feeds.map((f) => model.wires[f.wire].label),
    r.feeds.map((f) => ({ zOhm: f.impedanceOhm, currentA: f.currentA })),
    reference ?? model.referenceFeed ?? 0,
  );
  const p = r.inputPowerW;
  return {
    elements,
    feedImpedanceOhm: [r.sources[0].impedanceOhm[0], r.sources[0].impedanceOhm[1]],
    radiatedShare: r.radiatedPowerW / p,
    networkLossShare: r.networkLossW / p,
    groundLossShare: r.groundLossW / p,
  };
}
