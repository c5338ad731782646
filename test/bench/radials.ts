/**
 * Radial ground loss, two ways (a benchmark that prints agreement, not a test):
 *   npx tsx test/bench/radials.ts [--quick] [--json]
 *
 *  A. the solver's ground-system model: a quarter-wave vertical at 3.6 MHz with N buried radials,
 *     its loss from the Wait–Pope surface-impedance integral over the near-field disc
 *     (core/em/radials.ts, `NEAR_FIELD_WAVELENGTHS`);
 *  B. the same vertical with its radials as wires 5 cm above the soil, base 5 cm up, with no
 *     ground-system model at all: every pair near the soil from the exact Sommerfeld half-space
 *     (core/em/halfspace), so the soil loss comes from the field of the currents alone.
 * Both use the same far field (space wave with Fresnel coefficients), so the difference in
 * efficiency, in dB, is the difference in the near-field soil loss. Grid: poor, average and very
 * good soil (core/em/soils.ts) × 4, 8, 16, 32, 60, 120 radials × 0.1, 0.2, 0.3, 0.4, 0.5 λ
 * (`--quick`: 4, 16, 60 × 0.1, 0.25, 0.5). Prints each case and the median and worst |ΔdB|.
 * Radials just above the soil are not buried radials: with few radials of 0.3–0.4 λ the elevated
 * wires resonate as a counterpoise, which is the whole worst case.
 *
 * Measured (this machine, NEAR_FIELD_WAVELENGTHS = 0.25): full grid, 90 cases, median |Δ| 0.35 dB,
 * worst 4.65 dB (very good soil, 4 radials of 0.4 λ); with 16 or more radials (60 cases) median
 * 0.24 dB, worst 1.95 dB; by soil, median 0.79 (poor), 0.34 (average), 0.21 dB (very good).
 * `--quick` (27 cases): 0.28 / 1.66 dB; the same with the old outer limit max(0.5 λ, longest
 * radial): 0.69 / 2.25 dB. Discs of 0.15 and 0.35 λ gave 0.35 / 1.54 and 0.43 / 1.94 dB on
 * `--quick`. Radials 1 cm up instead of 5 cm gave a worse median on the cases tried.
 */
import { evaluateAntenna } from '../../core/em/evaluate.ts';
import { soilById } from '../../core/em/soils.ts';
import type { AntennaModel, GroundSpec } from '../../core/em/types.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../core/units/index.ts';

export const F_HZ = 3.6e6;
const LAM = SPEED_OF_LIGHT_M_PER_S / F_HZ;
/** Height of the elevated radials and of the vertical's base in model B. */
export const ELEVATION_M = 0.05;
const HEIGHT_WL = 0.25;
const SEGMENTS_PER_WAVELENGTH = 20;
const OPTS = {
  frequenciesHz: [F_HZ],
  pattern: { elevationsDeg: [], azimuthsDeg: [] },
  segmentsPerWavelength: SEGMENTS_PER_WAVELENGTH,
};

function soilSpec(id: string): GroundSpec {
  const s = soilById(id);
  if (!s) throw new Error(`no soil ${id}`);
  return { kind: 'soil', permittivity: s.permittivity, conductivitySPerM: s.conductivitySPerM };
}

export function buriedModel(ground: GroundSpec, n: number, lenWl: number): AntennaModel {
  return {
    wires: [{ from: [0, 0, 0], to: [0, 0, HEIGHT_WL * LAM], radiusM: 0.01, material: 'perfect' }],
    feeds: [{ wire: 0, position: 0 }],
    radials: [{ wire: 0, count: n, lengthsM: new Array<number>(n).fill(lenWl * LAM), radiusM: 1e-3 }],
    ground,
  };
}

export function elevatedModel(ground: GroundSpec, n: number, lenWl: number): AntennaModel {
  const h0 = ELEVATION_M;
  const wires: AntennaModel['wires'][number][] = [
    { from: [0, 0, h0], to: [0, 0, h0 + HEIGHT_WL * LAM], radiusM: 0.01, material: 'perfect' },
  ];
  for (let i = 0; i < n; i++) {
    const a = (2 * Math.PI * i) / n;
    wires.push({
      from: [0, 0, h0],
      to: [lenWl * LAM * Math.cos(a), lenWl * LAM * Math.sin(a), h0],
      radiusM: 1e-3,
      material: 'perfect',
    });
  }
  return { wires, feeds: [{ wire: 0, position: 0 }], ground };
}

export interface RadialCase {
  soil: string;
  n: number;
  lenWl: number;
  buriedEff: number;
  elevatedEff: number;
  deltaDb: number;
}

export function compareCase(soil: string, n: number, lenWl: number): RadialCase {
  const g = soilSpec(soil);
  const a = evaluateAntenna(buriedModel(g, n, lenWl), OPTS).frequencies[0];
  const b = evaluateAntenna(elevatedModel(g, n, lenWl), OPTS).frequencies[0];
  return {
    soil,
    n,
    lenWl,
    buriedEff: a.efficiency,
    elevatedEff: b.efficiency,
    deltaDb: 10 * Math.log10(a.efficiency / b.efficiency),
  };
}

export function summarise(cases: readonly RadialCase[]): { medianDb: number; worstDb: number } {
  const d = cases.map((c) => Math.abs(c.deltaDb)).sort((x, y) => x - y);
  const m = d.length % 2 ? d[(d.length - 1) / 2] : (d[d.length / 2 - 1] + d[d.length / 2]) / 2;
  return { medianDb: m, worstDb: d[d.length - 1] };
}

const isMain = import.meta.url === `file://${process.argv[1]}`;
if (isMain) {
  const quick = process.argv.includes('--quick');
  const counts = quick ? [4, 16, 60] : [4, 8, 16, 32, 60, 120];
  const lengths = quick ? [0.1, 0.25, 0.5] : [0.1, 0.2, 0.3, 0.4, 0.5];
  const cases: RadialCase[] = [];
  const t0 = performance.now();
  for (const soil of ['poor', 'average', 'very-good'])
    for (const n of counts)
      for (const len of lengths) {
        const c = compareCase(soil, n, len);
        cases.push(c);
        if (!process.argv.includes('--json'))
          console.log(
            `${soil.padEnd(9)} ${String(n).padStart(3)} × ${len.toFixed(2)} λ: buried ${(100 * c.buriedEff).toFixed(1)} %, elevated (exact ground) ${(100 * c.elevatedEff).toFixed(1)} %, Δ ${c.deltaDb >= 0 ? '+' : ''}${c.deltaDb.toFixed(2)} dB`,
          );
      }
  const s = summarise(cases);
  if (process.argv.includes('--json')) console.log(JSON.stringify({ ...s, cases }, null, 1));
  else
    console.log(
      `${cases.length} cases: median |Δ| ${s.medianDb.toFixed(2)} dB, worst ${s.worstDb.toFixed(2)} dB (${((performance.now() - t0) / 1000).toFixed(0)} s)`,
    );
}
