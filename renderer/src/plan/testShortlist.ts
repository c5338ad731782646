/**
 * For tests: a real shortlist of the demo lot from the planning core and the field solver
 * (80 m, two target regions, the inverted-V and vertical types to keep it quick).
 */
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { planSite, type Shortlist } from '../../../core/rank/plan.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import type { Project } from '../../../core/project/schema.ts';

export function demoPlanProject(): Project {
  return {
    ...buildDemoProject(),
    targets: [
      { regionId: 'europe', weight: 2 },
      { regionId: 'japan', weight: 1 },
    ],
    bands: ['80m'],
  };
}

let cached: Shortlist | null = null;

export function demoShortlist(): Shortlist {
  cached ??= planSite(demoPlanProject(), {
    evaluator: solverEvaluator,
    bands: ['80m'],
    types: ['inverted-v', 'vertical', 'dipole'],
  });
  return cached;
}
