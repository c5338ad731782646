import { describe, expect, it } from 'vitest';
import { complianceDistanceM, estimateExposure, exposureLimit } from '../../../core/report/exposure.ts';
import { expectClose } from '../../helpers/expectClose.ts';

// Worked example of core/REFERENCES.md §8 (computed from 47 CFR §1.1310 Table 1 and FCC OET Bulletin 65
// Ed. 97-01 eq. (3)/(6)): 1500 W PEP, 3.6 MHz, 6 dBi, SSB 20 % × 50 % on-time.
const SOURCE = 'FCC OET Bulletin 65 (Ed. 97-01) eq. (3), (6) with 47 CFR §1.1310 Table 1';

describe('RF exposure screening', () => {
  it('general-population limit at 3.6 MHz is 180/f² = 13.89 mW/cm² (47 CFR §1.1310 Table 1)', () => {
    expectClose(
      exposureLimit('fcc-general', 3.6).powerDensityWPerM2 / 10,
      13.889,
      0.001,
      '47 CFR §1.1310 Table 1(B)',
    );
    expectClose(
      exposureLimit('fcc-controlled', 3.6).powerDensityWPerM2 / 10,
      69.444,
      0.001,
      '47 CFR §1.1310 Table 1(A)',
    );
    expect(exposureLimit('fcc-general', 1.0).powerDensityWPerM2).toBe(1000);
  });

  it('reproduces the worked example: average 150 W, EIRP 597 W, 0.58 m free space, 0.94 m with the ground factor', () => {
    const e = estimateExposure(
      { peakEnvelopePowerW: 1500, mode: 'ssb', onTimeFraction: 0.5, feedLossDb: 0, gainDbi: 6, freqMhz: 3.6 },
      ['fcc-general'],
    );
    expectClose(e.averagePowerW, 150, 1e-9, SOURCE);
    expectClose(e.eirpW, 597.2, 0.1, SOURCE);
    const d = e.distances[0]!;
    expectClose(d.freeSpaceM, 0.58, 0.005, SOURCE);
    expectClose(d.withGroundReflectionM, 0.94, 0.005, SOURCE);
    expect(e.notes[0]).toMatch(/near field/);
  });

  it('CW at 40 % duty gives 1.32 m with the ground factor (worked example)', () => {
    const e = estimateExposure(
      { peakEnvelopePowerW: 1500, mode: 'cw', onTimeFraction: 0.5, feedLossDb: 0, gainDbi: 6, freqMhz: 3.6 },
      ['fcc-general'],
    );
    expectClose(e.distances[0]!.withGroundReflectionM, 1.32, 0.005, SOURCE);
  });

  it('distance scales as the square root of power and of the reflection factor (physics of the far-field formula)', () => {
    const a = complianceDistanceM(100, 50, 1);
    expectClose(complianceDistanceM(400, 50, 1) / a, 2, 1e-12, 'S ∝ P/R²');
    expectClose(complianceDistanceM(100, 50, 2.56) / a, 1.6, 1e-12, 'OET 65: factor 2.56 = 1.6²');
  });

  it('refuses nonsense input', () => {
    expect(() =>
      estimateExposure({
        peakEnvelopePowerW: -5,
        mode: 'cw',
        onTimeFraction: 0.5,
        feedLossDb: 0,
        gainDbi: 0,
        freqMhz: 3.6,
      }),
    ).toThrow(/peakEnvelopePowerW/);
    expect(() => exposureLimit('fcc-general', 144)).toThrow(RangeError);
  });
});
