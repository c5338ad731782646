/**
 * Which of the core's plain-words cautions apply to a shortlisted candidate on this lot.
 */
import { cautionsFor, type Caution } from '../../../core/report/cautions.ts';
import type { Candidate } from '../../../core/rank/plan.ts';
import type { Project } from '../../../core/project/schema.ts';

export function candidateCautions(c: Candidate, p: Project): Caution[] {
  return cautionsFor({
    hasPowerLine: p.keepOuts.some((k) => k.kind === 'power-line'),
    // Every wire type here but the ground-mounted vertical has its ends up in the air at high RF voltage.
    highVoltageEnds: c.type !== 'vertical',
    usesSupports: c.supports.length > 0,
    newStructure: c.supports.length === 0,
  });
}
