/**
 * The one toy evaluator of the renderer's tests (not physics): the feed reactance grows with the
 * total wire length, X = 900 Ω·(length/λ − 0.48), so the planner's trim loop converges; the
 * pattern is flat (3 dBi everywhere) or, with `pattern: 'directional'`, 6·cos²(azimuth) − elevation/10
 * dBi so that orientation matters. For tests of planning mechanics only: progress, sharing work,
 * caching, cancelling, faults, the tuning note. (test/unit/rank/fakeEvaluator.ts is the core's
 * double with a chosen resonant length.)
 */
import type { EvalFrequency, Evaluator } from '../../core/rank/evaluator.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../../core/units/index.ts';

export function toyEvaluator(opts: { pattern?: 'flat' | 'directional' } = {}): Evaluator {
  const directional = opts.pattern === 'directional';
  return (req) =>
    req.frequenciesHz.map((f): EvalFrequency => {
      const len = req.model.wires.reduce(
        (s, w) => s + Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]),
        0,
      );
      let gain: Float64Array | null = null;
      if (req.pattern) {
        const { elevationsDeg: els, azimuthsDeg: azs } = req.pattern;
        gain = new Float64Array(els.length * azs.length);
        if (!directional) gain.fill(3);
        else
          els.forEach((el, i) =>
            azs.forEach((az, j) => {
              gain![i * azs.length + j] = 6 * Math.cos((az * Math.PI) / 180) ** 2 - el / 10;
            }),
          );
      }
      return {
        freqHz: f,
        zOhm: [60, 900 * (len / (SPEED_OF_LIGHT_M_PER_S / f) - 0.48)],
        inputPowerW: 1,
        radiatedPowerW: 0.8,
        conductorLossW: 0.05,
        groundLossW: 0.15,
        gainDbi: gain,
        diagnostics: [],
      };
    });
}
