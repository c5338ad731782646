/**
 * The Evaluator backed by the project's method-of-moments field solver (core/em). The only
 * place where the planner meets the solver's types.
 */
import { evaluateAntenna, evaluatePrepared, prepareFor } from '../em/evaluate.ts';
import { ModelError } from '../em/errors.ts';
import { assertWork } from '../em/limits.ts';
import { solveFrequency, type FrequencySolution, type PreparedModel } from '../em/solver.ts';
import { sweepImpedance } from '../em/sweep.ts';
import { soilGround } from '../em/soils.ts';
import type { AntennaModel, GroundSpec } from '../em/types.ts';
import type { EvalGround, Evaluator } from './evaluator.ts';

export class UnknownSoilError extends Error {
  override name = 'UnknownSoilError';
}

export function groundSpec(g: EvalGround): GroundSpec {
  if (g === 'perfect') return { kind: 'perfect' };
  if (g === 'free-space') return { kind: 'free-space' };
  const spec = soilGround(g);
  if (!spec) throw new UnknownSoilError(`unknown soil class "${'classId' in g ? g.classId : ''}"`);
  return spec;
}

/**
 * Ground model of every planning evaluation over soil: the exact half-space, for the trim and
 * pattern at f0 and for the f0 ± 2 % bandwidth points alike (all designs of a band share these
 * three frequencies, so each process builds three remainder tables per band and soil and then
 * reuses them from the module-level cache in core/em/halfspace/table.ts).
 */
export const PLAN_GROUND_MODEL = 'exact' as const;

export const solverEvaluator: Evaluator = (req) => {
  const model: AntennaModel = {
    wires: req.model.wires.map((w) => ({
      from: w.from,
      to: w.to,
      radiusM: w.radiusM,
      ...(w.segments !== undefined ? { segments: w.segments } : {}),
      ...(w.material !== undefined ? { material: w.material } : {}),
    })),
    feeds: req.model.feeds.map((f) => ({ wire: f.wire, position: f.position })),
    radials: req.model.radials.map((r) => ({
      wire: r.wire,
      count: r.count,
      lengthsM: r.lengthsM,
      radiusM: r.radiusM,
    })),
    ground: groundSpec(req.ground),
    ...(req.model.loads?.length ? { loads: req.model.loads } : {}),
    ...(req.model.network ? { network: req.model.network } : {}),
    ...(req.model.radialsBonded ? { radialsBonded: true } : {}),
  };
  if (req.pattern === null && req.frequenciesHz.length === 1) {
    // Feed only at one frequency (a trim step): solved and kept, so that the pattern request of
    // the trimmed design at the same frequency reads this solution instead of solving it again.
    const f = req.frequenciesHz[0];
    const key = JSON.stringify([model, f]);
    const pm = prepareFor(model, [f], undefined, PLAN_GROUND_MODEL);
    const sol = solveFrequency(pm, f);
    keepSolved(key, pm, sol);
    return [{ freqHz: f, zOhm: feedImpedanceOf(sol), gainDbi: null, diagnostics: [] }];
  }
  if (req.pattern === null) {
    // Feed only: the solver's sweep meshes once and skips the far field.
    const sw = sweepImpedance(model, req.frequenciesHz, { groundModel: PLAN_GROUND_MODEL });
    return sw.points.map((p) => ({
      freqHz: p.frequencyHz,
      zOhm: [p.impedanceOhm.re, p.impedanceOhm.im],
      gainDbi: null,
      diagnostics: [],
    }));
  }
  const opts = {
    frequenciesHz: req.frequenciesHz,
    pattern: req.pattern,
    groundModel: PLAN_GROUND_MODEL,
    // The planner reads the total gain on its grid and finds its own peak there (evaluate.ts).
    gainGridOnly: true,
  };
  const kept =
    req.frequenciesHz.length === 1 ? takeSolved(JSON.stringify([model, req.frequenciesHz[0]])) : null;
  if (kept) assertWork(model, opts);
  const res = kept
    ? evaluatePrepared(kept.pm, opts, new Map([[req.frequenciesHz[0], kept.sol]]))
    : evaluateAntenna(model, opts);
  const diagnostics = res.diagnostics.filter((d) => d.level === 'warning').map((d) => d.message);
  return res.frequencies.map((f) => {
    // an array is fed through its network: the impedance at the feed is its first source's
    const feed = f.sources.length ? f.sources[0] : f.feeds[0];
    const gain = f.gainGridDbi ?? new Float64Array(f.pattern.map((p) => p.gainDbi));
    return {
      freqHz: f.frequencyHz,
      zOhm: [feed.impedanceOhm[0], feed.impedanceOhm[1]],
      inputPowerW: f.inputPowerW,
      radiatedPowerW: f.radiatedPowerW,
      conductorLossW: f.conductorLossW,
      ...(model.loads?.length ? { loadLossW: f.loadLossW } : {}),
      groundLossW: f.groundLossW,
      ...(f.groundSystems.some((g) => g.radials > 0)
        ? { groundSystemLossW: f.groundSystems.reduce((s, g) => s + (g.radials > 0 ? g.lossW : 0), 0) }
        : {}),
      ...(f.groundSystems.some((g) => g.radials === 0)
        ? { bareContactLossW: f.groundSystems.reduce((s, g) => s + (g.radials === 0 ? g.lossW : 0), 0) }
        : {}),
      ...(model.network
        ? {
            ports: f.feeds.map((p) => ({
              zOhm: [p.impedanceOhm[0], p.impedanceOhm[1]] as [number, number],
              currentA: [p.currentA[0], p.currentA[1]] as [number, number],
            })),
            networkLossW: f.networkLossW,
          }
        : {}),
      gainDbi: gain,
      diagnostics,
    };
  });
};

/**
 * The last feed-only solves at one frequency (a design's trim steps, at most TRIM_MAX_EVALUATIONS
 * of them), by model and frequency. The design's pattern request at its trimmed value is the
 * same model at the same frequency as one of them: the same mesh and the same solution, so only
 * the far field is left to compute (one fill, factorisation and ground-loss integral fewer per
 * design; the figures are the same to the last digit).
 */
const SOLVED_KEPT = 8;
const solved = new Map<string, { pm: PreparedModel; sol: FrequencySolution }>();

function keepSolved(key: string, pm: PreparedModel, sol: FrequencySolution): void {
  solved.delete(key);
  solved.set(key, { pm, sol });
  while (solved.size > SOLVED_KEPT) solved.delete(solved.keys().next().value!);
}

function takeSolved(key: string): { pm: PreparedModel; sol: FrequencySolution } | null {
  const hit = solved.get(key);
  if (hit) solved.delete(key);
  return hit ?? null;
}

/** The feed impedance of a solution as the sweep reads it: a feed network's first source, else the first feed. */
function feedImpedanceOf(sol: FrequencySolution): [number, number] {
  const z =
    sol.network && sol.network.sources.length > 0
      ? sol.network.sources[0].impedance
      : sol.feeds[0]?.impedance;
  if (!z) throw new ModelError('feed', 'there is no feed 0');
  return [z.re, z.im];
}

/**
 * Builds what every planning evaluation over `ground` at these frequencies reuses (the exact
 * ground's remainder tables, core/em/halfspace/table.ts) by solving a small probe wire, so that a
 * worker can do it while the plan is still being enumerated. Nothing is returned; the tables stay
 * in this thread's module-level cache.
 */
export function warmGround(ground: EvalGround, frequenciesHz: readonly number[]): void {
  if (ground === 'perfect' || ground === 'free-space' || frequenciesHz.length === 0) return;
  const lambda = 299_792_458 / Math.max(...frequenciesHz);
  // A sloping half-wave wire from 1 m up to a quarter wave: near and far pairs alike.
  const model: AntennaModel = {
    wires: [{ from: [0, 0, 1], to: [lambda / 2.2, 0, lambda / 4], radiusM: 0.001, segments: 10 }],
    feeds: [{ wire: 0, position: 0.5 }],
    radials: [],
    ground: groundSpec(ground),
  };
  sweepImpedance(model, frequenciesHz, { groundModel: PLAN_GROUND_MODEL });
}
