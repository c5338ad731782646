// Shared builders for the solver's reference tests. Wavelength 1 m (299.792458 MHz) unless a
// test says otherwise, so lengths read directly in wavelengths.
import { evaluateAntenna, type FrequencyResult } from '../../../core/em/evaluate.ts';
import type { AntennaModel, GroundSpec } from '../../../core/em/types.ts';

export const F_LAMBDA_1M = 299.792458e6;
export const NO_PATTERN = { elevationsDeg: [], azimuthsDeg: [] };

export function centreFedDipole(
  lengthM: number,
  radiusM: number,
  ground: GroundSpec = { kind: 'free-space' },
  heightM = 0,
): AntennaModel {
  return {
    wires: [
      {
        from: [0, 0, heightM - lengthM / 2],
        to: [0, 0, heightM + lengthM / 2],
        radiusM,
        material: 'perfect',
      },
    ],
    feeds: [{ wire: 0, position: 0.5 }],
    ground,
  };
}

export function horizontalDipole(
  lengthM: number,
  radiusM: number,
  heightM: number,
  ground: GroundSpec,
): AntennaModel {
  return {
    wires: [
      { from: [-lengthM / 2, 0, heightM], to: [lengthM / 2, 0, heightM], radiusM, material: 'perfect' },
    ],
    feeds: [{ wire: 0, position: 0.5 }],
    ground,
  };
}

export function solveOne(
  model: AntennaModel,
  freqHz = F_LAMBDA_1M,
  segmentsPerWavelength?: number,
): FrequencyResult {
  return evaluateAntenna(model, { frequenciesHz: [freqHz], pattern: NO_PATTERN, segmentsPerWavelength })
    .frequencies[0];
}

export const dbOf = (g: number): number => 10 * Math.log10(g);
