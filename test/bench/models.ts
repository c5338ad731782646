/** The antennas the solver benchmarks share (test/bench/run.ts, test/bench/halfspace.ts). */
import type { AntennaModel } from '../../core/em/types.ts';

/** Average soil of the amateur classes (εr 13, σ 5 mS/m; common practice, no source). */
export const AVERAGE = { kind: 'soil' as const, permittivity: 13, conductivitySPerM: 0.005 };

/** Four 40 m dipoles, 10 m apart, 15 m up, fed in phase: 4 × 50 = 200 unknowns. */
export const array200: AntennaModel = {
  wires: [0, 1, 2, 3].map((i) => ({
    from: [-10.1, 10 * i, 15] as const,
    to: [10.1, 10 * i, 15] as const,
    radiusM: 0.001,
    segments: 51,
  })),
  feeds: [0, 1, 2, 3].map((i) => ({
    wire: i,
    position: 0.5,
    voltage: [Math.cos(i * 0.6), Math.sin(i * 0.6)] as const,
  })),
  ground: AVERAGE,
};

/** 80 m half-square, 25 + 51 + 25 segments: 100 unknowns. */
export const halfSquare100: AntennaModel = {
  wires: [
    { from: [0, 0, 2.5], to: [0, 0, 23], radiusM: 0.001, segments: 25 },
    { from: [0, 0, 23], to: [41, 0, 23], radiusM: 0.001, segments: 51 },
    { from: [41, 0, 23], to: [41, 0, 2.5], radiusM: 0.001, segments: 25 },
  ],
  feeds: [{ wire: 1, position: 0 }],
  ground: AVERAGE,
};
