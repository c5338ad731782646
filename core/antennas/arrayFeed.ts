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

export interface ArrayFeedReport {
  elements: ElementFeed[];
  /** The impedance the station's line sees (the network's first source). */
  feedImpedanceOhm: [number, number];
  /** Shares of the input power. */
  radiatedShare: number;
  networkLossShare: number;
  groundLossShare: number;
}

/** The feed report of a wire model with a network; `reference` is the element the ratios refer to. */
export function arrayFeedReport(
  model: WireModel,
  ground: GroundSpec,
  freqHz: number,
  reference = 0,
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
  const ref = r.feeds[reference].currentA;
  const refAbs = Math.hypot(ref[0], ref[1]);
  const refArg = Math.atan2(ref[1], ref[0]);
  const elements = r.feeds.map((f, i) => {
    const d = ((((Math.atan2(f.currentA[1], f.currentA[0]) - refArg) * 180) / Math.PI + 540) % 360) - 180;
    return {
      label: model.wires[model.feeds[i].wire].label,
      driveImpedanceOhm: [f.impedanceOhm[0], f.impedanceOhm[1]] as [number, number],
      currentRatio: refAbs > 0 ? Math.hypot(f.currentA[0], f.currentA[1]) / refAbs : 0,
      currentPhaseDeg: d,
    };
  });
  const p = r.inputPowerW;
  return {
    elements,
    feedImpedanceOhm: [r.sources[0].impedanceOhm[0], r.sources[0].impedanceOhm[1]],
    radiatedShare: r.radiatedPowerW / p,
    networkLossShare: r.networkLossW / p,
    groundLossShare: r.groundLossW / p,
  };
}
