/**
 * A test double for the solver, for tests of planning mechanics only (trim loop, cache, grouping,
 * rotation of patterns, reasons). It is not physics and never ranks anything outside tests:
 * reactance grows linearly with total wire length through zero at `resonantM`, and the "gain" is
 * a smooth function of each wire's direction so that orientation matters.
 */
import type { EvalFrequency, EvalRequest, Evaluator } from '../../../core/rank/evaluator.ts';

export interface FakeOptions {
  /** Total wire length (radials excluded) at which X = 0 at the design frequency. */
  resonantM: (req: EvalRequest) => number;
  ohmPerM?: number;
}

export function fakeEvaluator(opts: FakeOptions): Evaluator & { calls: number } {
  const f = ((req: EvalRequest): EvalFrequency[] => {
    f.calls++;
    const total = req.model.wires.reduce(
      (s, w) => s + Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]),
      0,
    );
    const L0 = opts.resonantM(req);
    return req.frequenciesHz.map((freqHz, i) => {
      const f0 = req.frequenciesHz.length === 1 ? freqHz : req.frequenciesHz[0];
      const x = (opts.ohmPerM ?? 20) * (total * (freqHz / f0) ** (i === 0 ? 0 : 1) - L0);
      let gain: Float64Array | null = null;
      if (req.pattern) {
        const { elevationsDeg, azimuthsDeg } = req.pattern;
        gain = new Float64Array(elevationsDeg.length * azimuthsDeg.length);
        elevationsDeg.forEach((el, ie) => {
          azimuthsDeg.forEach((az, ia) => {
            const e = (el * Math.PI) / 180;
            const a = (az * Math.PI) / 180;
            const u = [Math.cos(e) * Math.sin(a), Math.cos(e) * Math.cos(a), Math.sin(e)];
            let p = 1e-3;
            for (const w of req.model.wires) {
              const d = [w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]];
              const l = Math.hypot(d[0], d[1], d[2]);
              const c = (d[0] * u[0] + d[1] * u[1] + d[2] * u[2]) / l;
              p += l * (1 - c * c) * (1 + (0.3 * (d[0] * u[0] + d[1] * u[1])) / l);
            }
            gain![ie * azimuthsDeg.length + ia] = 10 * Math.log10(p) - 10;
          });
        });
      }
      return {
        freqHz,
        zOhm: [50, x],
        inputPowerW: 1,
        radiatedPowerW: 0.9,
        conductorLossW: 0.04,
        groundLossW: 0.06,
        gainDbi: gain,
        diagnostics: [],
      };
    });
  }) as Evaluator & { calls: number };
  f.calls = 0;
  return f;
}
