// Issue 15 point 2: coincident supports give a design the field solver cannot build (a wire of
// zero length); that one design is rejected with the solver's reason and the plan goes on.
// The evaluator is the planning test double (testEvaluator), refusing zero-length wires with the
// same ModelError the solver's mesh throws (test/unit/robustness/evaluate.property.test.ts checks
// the real solver does).
import { describe, expect, it } from 'vitest';
import { ModelError } from '../../../core/em/errors.ts';
import type { EvalRequest, Evaluator } from '../../../core/rank/evaluator.ts';
import { planSite } from '../../../core/rank/plan.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { testEvaluator } from '../../helpers/testEvaluator.ts';

describe('one unsolvable design never ends the plan', () => {
  it('coincident supports: the design between them is rejected with the reason, the others are ranked', () => {
    const project = buildDemoProject();
    const s0 = project.supports[0];
    project.supports.push({ ...s0, id: `${s0.id}-twin`, name: `${s0.name} twin` });
    const fake = testEvaluator();
    const ev: Evaluator = (req: EvalRequest) => {
      req.model.wires.forEach((w, i) => {
        if (Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]) < 1e-6)
          throw new ModelError(`wires[${i}]`, 'the wire has zero length');
      });
      return fake(req);
    };
    const s = planSite(project, { evaluator: ev, types: ['dipole'], bands: ['40m'] });
    expect(s.candidates.length).toBeGreaterThan(0);
    const twin = s.rejected.filter((r) => r.supports.includes(`${s0.id}-twin`) && r.supports.includes(s0.id));
    expect(twin.length).toBeGreaterThan(0);
    expect(
      twin.some((r) => r.reasons.some((m) => /field solver cannot solve it: .*zero length/.test(m))),
    ).toBe(true);
  });
});
