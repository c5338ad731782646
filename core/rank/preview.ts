/**
 * A provisional plan, for live re-ranking: while the user drags a support, a keep-out corner or
 * the station, the window re-ranks at every position it can afford and shows the result marked as
 * provisional; the exact plan runs once the drag ends.
 *
 * The provisional plan is the plan of a setup (`enumeratePlan`) ranked with the evaluations at
 * hand only, so it costs no solver work. A design whose evaluation is not in the cache (a span
 * that changed with the moved support) borrows the record of the most similar evaluated design:
 * same type, band, design frequency and ground, the nearest parameters; its trim is held within
 * the design's own limits and its diagnostics say that it was borrowed. A placement with a
 * conducting support near it whose model with the metal is not evaluated takes its record without
 * the metal; the soil range is shown only where it is already known. Placements with no similar
 * evaluated design are left out. Nothing here is ever stored as a project's plan.
 */
import type { Design } from '../antennas/types.ts';
import type { Project } from '../project/schema.ts';
import type { EvaluationRecord } from './evaluate.ts';
import type { EvalGround } from './evaluator.ts';
import {
  conductorJobs,
  rankPlan,
  type EvaluationCache,
  type Job,
  type PlanSetup,
  type Shortlist,
} from './plan.ts';

/** The designs behind the cache's evaluations, by similarity class, to find stand-ins. */
export class DesignIndex {
  readonly #byClass = new Map<string, Map<string, Design>>();

  static #classOf(design: Design, ground: EvalGround): string {
    return `${design.type}|${design.band}|${design.designFreqHz}|${JSON.stringify(ground)}`;
  }

  /** Remember the design of a job (jobs with conducting supports are not used as stand-ins). */
  add(job: Job): void {
    if (job.soilOnly || job.design.conductors?.length) return;
    const c = DesignIndex.#classOf(job.design, job.ground);
    let m = this.#byClass.get(c);
    if (!m) this.#byClass.set(c, (m = new Map()));
    m.set(job.key, job.design);
  }

  /** The cached record of the evaluated design most like `design` (same class), if any. */
  nearest(design: Design, ground: EvalGround, cache: EvaluationCache): EvaluationRecord | undefined {
    const m = this.#byClass.get(DesignIndex.#classOf(design, ground));
    if (!m) return undefined;
    let best: EvaluationRecord | undefined;
    let bestD = Infinity;
    for (const [key, d] of m) {
      const rec = cache.get(key);
      if (!rec || rec.unsolvable !== undefined) continue;
      const dist = paramDistance(design.params, d.params);
      if (dist < bestD) {
        bestD = dist;
        best = rec;
      }
    }
    return best;
  }
}

/** Sum of the relative differences of two designs' parameters (a missing one counts 1). */
export function paramDistance(a: Design['params'], b: Design['params']): number {
  const rel = (x: number, y: number): number => Math.abs(x - y) / Math.max(Math.abs(x), Math.abs(y), 1);
  let s = 0;
  for (const k of new Set([...Object.keys(a), ...Object.keys(b)])) {
    const x = a[k];
    const y = b[k];
    if (x === undefined || y === undefined) s += 1;
    else if (typeof x === 'number' && typeof y === 'number') s += rel(x, y);
    else {
      const xs = typeof x === 'number' ? [x] : x;
      const ys = typeof y === 'number' ? [y] : y;
      for (let i = 0; i < Math.max(xs.length, ys.length); i++) {
        s += xs[i] === undefined || ys[i] === undefined ? 1 : rel(xs[i]!, ys[i]!);
      }
    }
  }
  return s;
}

export const BORROWED_NOTE =
  'provisional: evaluated as the most similar design already solved; the exact plan follows when the drag ends';

export interface PreviewResult {
  shortlist: Shortlist;
  /** Placements ranked with a borrowed evaluation. */
  borrowed: number;
  /** Placements left out: no similar design evaluated. */
  leftOut: number;
}

/**
 * Rank a setup with the evaluations in `cache` only (read, never written), borrowing from
 * `index` where one is missing. The setup is not changed.
 */
export function previewPlan(
  setup: PlanSetup,
  project: Project,
  cache: EvaluationCache,
  index: DesignIndex,
  shortlistSize = 10,
): PreviewResult {
  const own = new Map<string, EvaluationRecord>();
  const view: EvaluationCache = {
    get: (k) => cache.get(k) ?? own.get(k),
    has: (k) => cache.has(k) || own.has(k),
    set: (k, r) => void own.set(k, r),
  };
  const ground = setup.jobs[0]?.ground;
  let borrowed = 0;
  let leftOut = 0;
  const bands = setup.bands.map((b) => {
    const proposed = b.proposed.filter((q) => {
      if (view.has(q.key)) return true;
      const near = ground === undefined ? undefined : index.nearest(q.proposal.design, ground, cache);
      if (!near) {
        leftOut++;
        return false;
      }
      const t = q.proposal.design.trim;
      own.set(q.key, {
        ...near,
        trimM: Math.min(t.maxM, Math.max(t.minM, near.trimM)),
        diagnostics: [...near.diagnostics, BORROWED_NOTE],
      });
      borrowed++;
      return true;
    });
    return { ...b, proposed };
  });
  // The setup with these placements only; the conducting-support step is chosen again over them.
  const copy: PlanSetup = { ...setup, bands, conductorJobs: undefined, conductorChoice: undefined };
  // With a metal support near: the model with it where evaluated, else the record without it.
  for (const b of copy.bands)
    for (const q of b.proposed) {
      if (q.withConductors && !view.has(q.withConductors.key))
        own.set(q.withConductors.key, view.get(q.key)!);
    }
  conductorJobs(copy, view, project);
  const ranked = rankPlan(copy, view, project, shortlistSize);
  const feasible = copy.bands.reduce((s, b) => s + b.proposed.length, 0);
  return {
    shortlist: {
      ...ranked,
      stats: {
        proposals: feasible + copy.bands.reduce((s, b) => s + b.rejections.length, 0),
        feasibleAtNominal: feasible,
        evaluations: 0,
        cacheHits: feasible - borrowed,
        cuts: setup.cuts,
      },
    },
    borrowed,
    leftOut,
  };
}
