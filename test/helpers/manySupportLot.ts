/**
 * Invented lots with many supports for the planning benchmarks (test/bench/plan.ts) and the
 * bounded-enumeration test (test/unit/rank/planBounds.test.ts):
 * a 300 m × 200 m lot with `n` trees at seeded pseudo-random positions and heights (10–24 m),
 * the station on the south side, Europe (weight 3) and Japan (weight 1) as targets, 80 m only.
 * Deterministic: the same `n` gives the same project on every machine.
 */
import { makeSiteFrame } from '../../core/site/frame.ts';
import { ProjectSchema, PROJECT_SCHEMA_VERSION, type Project } from '../../core/project/schema.ts';

export function lotWithSupports(n: number): Project {
  const frame = makeSiteFrame([-93.75, 44.9]);
  const ll = (x: number, y: number): [number, number] => frame.toLonLat([x, y]);
  let seed = 20240601;
  const rnd = (): number => {
    seed = (seed * 16807) % 2147483647;
    return seed / 2147483647;
  };
  const boundary = [ll(-150, -100), ll(150, -100), ll(150, 100), ll(-150, 100), ll(-150, -100)];
  return ProjectSchema.parse({
    schemaVersion: PROJECT_SCHEMA_VERSION,
    id: `bench-${n}`,
    name: `Invented ${n}-support lot`,
    boundary: { type: 'Polygon', coordinates: [boundary] },
    supports: Array.from({ length: n }, (_, i) => ({
      id: `s${i}`,
      name: `Support ${i}`,
      kind: 'tree',
      position: ll(-140 + 280 * rnd(), -90 + 180 * rnd()),
      usableHeightM: Math.round(10 + 14 * rnd()),
    })),
    station: ll(0, -90),
    targets: [
      { regionId: 'europe', weight: 3 },
      { regionId: 'japan', weight: 1 },
    ],
    bands: ['80m'],
  });
}
