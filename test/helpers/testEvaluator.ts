/**
 * The one test double of the field solver, for tests of planning mechanics only (trim loop, cache,
 * grouping, rotation of patterns, progress, sharing work, cancelling, faults, the tuning note).
 * It is not physics and never ranks anything outside tests.
 *
 * Feed: R = 50 Ω; the reactance grows linearly with the total wire length L (radials excluded),
 * X = ohmPerM·(L·f/f0 − resonantM), f0 the request's first frequency, so X = 0 where L equals
 * `resonantM` at f0 and the resonance moves as 1/L (a longer wire resonates lower).
 * Power: 90 % radiated, 4 % in the conductors, 6 % in the ground.
 * Pattern, `pattern`:
 * - 'wires' (default): a smooth function of each wire's direction, so orientation matters;
 * - 'directional': 6·cos²(azimuth) − elevation/10 dBi, whatever the wires;
 * - 'flat': 3 dBi everywhere.
 * `calls` counts the requests it has answered.
 */
import type { EvalFrequency, EvalRequest, Evaluator } from '../../core/rank/evaluator.ts';
import { wavelengthM } from '../../core/units/index.ts';

export interface TestEvaluatorOptions {
  /** Total wire length, metres, at which X = 0 at the request's first frequency; default `resonantAt(0.47)`. */
  resonantM?: (req: EvalRequest) => number;
  /** Slope of the reactance, Ω per metre of wire; default 20. */
  ohmPerM?: number;
  pattern?: 'wires' | 'directional' | 'flat';
}

export type CountingEvaluator = Evaluator & { calls: number };

/**
 * Resonance at a fraction of the wavelength of the request's first frequency; `withRadials`, when
 * given, is the fraction for a model with radials (a ground-mounted vertical resonates near λ/4).
 */
export function resonantAt(fraction: number, withRadials = fraction): (req: EvalRequest) => number {
  return (req) => (req.model.radials.length ? withRadials : fraction) * wavelengthM(req.frequenciesHz[0]!);
}

const wireLength = (w: { from: readonly number[]; to: readonly number[] }): number =>
  Math.hypot(w.to[0]! - w.from[0]!, w.to[1]! - w.from[1]!, w.to[2]! - w.from[2]!);

function gainAt(
  req: EvalRequest,
  kind: 'wires' | 'directional' | 'flat',
  elDeg: number,
  azDeg: number,
): number {
  if (kind === 'flat') return 3;
  const e = (elDeg * Math.PI) / 180;
  const a = (azDeg * Math.PI) / 180;
  if (kind === 'directional') return 6 * Math.cos(a) ** 2 - elDeg / 10;
  const u = [Math.cos(e) * Math.sin(a), Math.cos(e) * Math.cos(a), Math.sin(e)];
  let p = 1e-3;
  for (const w of req.model.wires) {
    const d = [w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]];
    const l = Math.hypot(d[0], d[1], d[2]);
    const c = (d[0] * u[0] + d[1] * u[1] + d[2] * u[2]) / l;
    p += l * (1 - c * c) * (1 + (0.3 * (d[0] * u[0] + d[1] * u[1])) / l);
  }
  return 10 * Math.log10(p) - 10;
}

export function testEvaluator(opts: TestEvaluatorOptions = {}): CountingEvaluator {
  const resonantM = opts.resonantM ?? resonantAt(0.47);
  const ohmPerM = opts.ohmPerM ?? 20;
  const kind = opts.pattern ?? 'wires';
  const ev = ((req: EvalRequest): EvalFrequency[] => {
    ev.calls++;
    const total = req.model.wires.reduce((s, w) => s + wireLength(w), 0);
    const f0 = req.frequenciesHz[0]!;
    const L0 = resonantM(req);
    const pattern = (): Float64Array | null => {
      if (!req.pattern) return null;
      const { elevationsDeg: els, azimuthsDeg: azs } = req.pattern;
      const gain = new Float64Array(els.length * azs.length);
      els.forEach((el, i) => azs.forEach((az, j) => (gain[i * azs.length + j] = gainAt(req, kind, el, az))));
      return gain;
    };
    return req.frequenciesHz.map((freqHz) => ({
      freqHz,
      zOhm: [50, ohmPerM * ((total * freqHz) / f0 - L0)],
      inputPowerW: 1,
      radiatedPowerW: 0.9,
      conductorLossW: 0.04,
      groundLossW: 0.06,
      gainDbi: pattern(),
      diagnostics: [],
    }));
  }) as CountingEvaluator;
  ev.calls = 0;
  return ev;
}
