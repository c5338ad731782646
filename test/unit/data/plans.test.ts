import { describe, expect, it } from 'vitest';
import type { PlanRecord } from '../../../core/api/contract.ts';
import type { Shortlist } from '../../../core/rank/plan.ts';
import { planInputsHash } from '../../../core/rank/planInputs.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { ProjectStore, StoreError } from '../../../data/store.ts';
import { emptyProject } from '../../../core/project/schema.ts';
import { useTempStore } from '../../helpers/tempStore.ts';

const t = useTempStore('yw-plans-');

/** A plan record shaped like the planner's (two candidates; the rest of a shortlist does not matter here). */
function planOf(projectId: string): PlanRecord {
  const project = { ...buildDemoProject(), id: projectId };
  const shortlist = {
    projectId,
    candidates: [{ id: '80m-a' }, { id: '80m-b' }],
    rejected: [],
  } as unknown as Shortlist;
  return { inputs: planInputsHash(project, ['80m']), bands: ['80m'], madeFor: project, shortlist };
}

describe("each project's last plan in the store", () => {
  it('keeps a plan with its view across a close and reopen, and replaces it with the next', () => {
    const demo = buildDemoProject();
    t.store.saveProject(demo);
    expect(t.store.getPlan(demo.id)).toBeNull();
    t.store.savePlan(demo.id, planOf(demo.id), { selectedId: '80m-b', compareId: '80m-a' });
    t.store.close();
    t.store = new ProjectStore(t.file);
    const got = t.store.getPlan(demo.id)!;
    expect(got.plan.shortlist.candidates.map((c) => c.id)).toEqual(['80m-a', '80m-b']);
    expect(got.plan.inputs).toEqual(planInputsHash(demo, ['80m']));
    expect([got.selectedId, got.compareId]).toEqual(['80m-b', '80m-a']);
    expect(t.store.setPlanView(demo.id, { selectedId: '80m-a', compareId: null })).toBe(true);
    expect(t.store.getPlan(demo.id)).toMatchObject({ selectedId: '80m-a', compareId: null });
    // A selection that is not in the plan is not kept.
    t.store.savePlan(demo.id, planOf(demo.id), { selectedId: 'gone', compareId: null });
    expect(t.store.getPlan(demo.id)!.selectedId).toBeNull();
  });

  it("never gives one project's plan for another, and drops it with its project", () => {
    const demo = buildDemoProject();
    t.store.saveProject(demo);
    const other = t.store.saveProject(emptyProject('p-other', 'Other lot')).project;
    expect(() => t.store.savePlan(other.id, planOf(demo.id), { selectedId: null, compareId: null })).toThrow(
      StoreError,
    );
    try {
      t.store.savePlan(other.id, planOf(demo.id), { selectedId: null, compareId: null });
    } catch (e) {
      expect((e as StoreError).fields[0]!.path).toBe('plan.madeFor.id');
    }
    expect(t.store.getPlan(other.id)).toBeNull();
    expect(t.store.setPlanView(other.id, { selectedId: '80m-a', compareId: null })).toBe(false);
    t.store.savePlan(demo.id, planOf(demo.id), { selectedId: null, compareId: null });
    t.store.deleteProject(demo.id);
    expect(t.store.getPlan(demo.id)).toBeNull();
  });

  it('goes through the API: saves, reads back, and refuses a bad plan naming the field', () => {
    const demo = t.h.openInitialProject({});
    if (!demo.ok) throw new Error('no demo');
    const id = demo.value.id;
    expect(t.h.getPlan({ projectId: id })).toEqual({ ok: true, value: null });
    const saved = t.h.savePlan({ projectId: id, plan: planOf(id), selectedId: '80m-a', compareId: null });
    expect(saved.ok).toBe(true);
    const got = t.h.getPlan({ projectId: id });
    expect(got.ok && got.value?.selectedId).toBe('80m-a');
    expect(t.h.setPlanView({ projectId: id, selectedId: null, compareId: '80m-b' })).toEqual({
      ok: true,
      value: { saved: true },
    });

    const bad = planOf(id);
    const r = t.h.savePlan({
      projectId: id,
      plan: { ...bad, inputs: { ...bad.inputs, hash: 'not-a-hash' } },
      selectedId: null,
      compareId: null,
    });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('invalid-request');
      expect(r.error.fields?.[0]?.path).toBe('plan.inputs.hash');
    }
    const missing = t.h.savePlan({
      projectId: 'p-none',
      plan: planOf('p-none'),
      selectedId: null,
      compareId: null,
    });
    expect(!missing.ok && missing.error.code).toBe('not-found');
    // The plan kept before the refusals is still there.
    const still = t.h.getPlan({ projectId: id });
    expect(still.ok && still.value?.compareId).toBe('80m-b');
  });
});
