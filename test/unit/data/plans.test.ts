import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { PlanRecord } from '../../../core/api/contract.ts';
import type { Shortlist } from '../../../core/rank/plan.ts';
import { planInputsHash } from '../../../core/rank/planInputs.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { ProjectStore, StoreError } from '../../../data/store.ts';
import { createHandlers, type HandlerTable } from '../../../electron/api/handlers.ts';
import { emptyProject } from '../../../core/project/schema.ts';

let dir: string;
let store: ProjectStore;
let h: HandlerTable;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'yw-plans-'));
  store = new ProjectStore(join(dir, 'db.sqlite'));
  h = createHandlers(store, { shell: 'browser', version: 'test' });
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

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
    store.saveProject(demo);
    expect(store.getPlan(demo.id)).toBeNull();
    store.savePlan(demo.id, planOf(demo.id), { selectedId: '80m-b', compareId: '80m-a' });
    store.close();
    store = new ProjectStore(join(dir, 'db.sqlite'));
    const got = store.getPlan(demo.id)!;
    expect(got.plan.shortlist.candidates.map((c) => c.id)).toEqual(['80m-a', '80m-b']);
    expect(got.plan.inputs).toEqual(planInputsHash(demo, ['80m']));
    expect([got.selectedId, got.compareId]).toEqual(['80m-b', '80m-a']);
    expect(store.setPlanView(demo.id, { selectedId: '80m-a', compareId: null })).toBe(true);
    expect(store.getPlan(demo.id)).toMatchObject({ selectedId: '80m-a', compareId: null });
    // A selection that is not in the plan is not kept.
    store.savePlan(demo.id, planOf(demo.id), { selectedId: 'gone', compareId: null });
    expect(store.getPlan(demo.id)!.selectedId).toBeNull();
  });

  it("never gives one project's plan for another, and drops it with its project", () => {
    const demo = buildDemoProject();
    store.saveProject(demo);
    const other = store.saveProject(emptyProject('p-other', 'Other lot')).project;
    expect(() => store.savePlan(other.id, planOf(demo.id), { selectedId: null, compareId: null })).toThrow(
      StoreError,
    );
    try {
      store.savePlan(other.id, planOf(demo.id), { selectedId: null, compareId: null });
    } catch (e) {
      expect((e as StoreError).fields[0]!.path).toBe('plan.madeFor.id');
    }
    expect(store.getPlan(other.id)).toBeNull();
    expect(store.setPlanView(other.id, { selectedId: '80m-a', compareId: null })).toBe(false);
    store.savePlan(demo.id, planOf(demo.id), { selectedId: null, compareId: null });
    store.deleteProject(demo.id);
    expect(store.getPlan(demo.id)).toBeNull();
  });

  it('goes through the API: saves, reads back, and refuses a bad plan naming the field', () => {
    const demo = h.openInitialProject({});
    if (!demo.ok) throw new Error('no demo');
    const id = demo.value.id;
    expect(h.getPlan({ projectId: id })).toEqual({ ok: true, value: null });
    const saved = h.savePlan({ projectId: id, plan: planOf(id), selectedId: '80m-a', compareId: null });
    expect(saved.ok).toBe(true);
    const got = h.getPlan({ projectId: id });
    expect(got.ok && got.value?.selectedId).toBe('80m-a');
    expect(h.setPlanView({ projectId: id, selectedId: null, compareId: '80m-b' })).toEqual({
      ok: true,
      value: { saved: true },
    });

    const bad = planOf(id);
    const r = h.savePlan({
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
    const missing = h.savePlan({
      projectId: 'p-none',
      plan: planOf('p-none'),
      selectedId: null,
      compareId: null,
    });
    expect(!missing.ok && missing.error.code).toBe('not-found');
    // The plan kept before the refusals is still there.
    const still = h.getPlan({ projectId: id });
    expect(still.ok && still.value?.compareId).toBe('80m-b');
  });
});
