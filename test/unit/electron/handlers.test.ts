import { describe, expect, it } from 'vitest';
import { DEMO_PROJECT_ID } from '../../../data/demo/demoProject.ts';
import { API_NAMES } from '../../../core/api/contract.ts';
import { useTempStore } from '../../helpers/tempStore.ts';

const t = useTempStore('yw-h-');

function value<T>(r: { ok: true; value: T } | { ok: false; error: unknown }): T {
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return r.value;
}

describe('API handlers', () => {
  it('has one handler per contract call', () => {
    expect(Object.keys(t.h).sort()).toEqual([...API_NAMES].sort());
  });

  it('opens the demo on first start, then the last project opened', () => {
    expect(value(t.h.openInitialProject({})).id).toBe(DEMO_PROJECT_ID);
    const p = value(t.h.createProject({ name: 'My lot' }));
    expect(value(t.h.openInitialProject({})).id).toBe(p.id);
  });

  it('saves, duplicates and deletes', () => {
    const demo = value(t.h.openInitialProject({}));
    value(t.h.saveProject({ project: { ...demo, name: 'Edited' } }));
    expect(value(t.h.openProject({ id: demo.id })).name).toBe('Edited');
    const copy = value(t.h.duplicateProject({ id: demo.id }));
    expect(copy.id).not.toBe(demo.id);
    expect(copy.name).toBe('Edited (copy)');
    expect(value(t.h.listProjects({})).length).toBe(2);
    value(t.h.deleteProject({ id: copy.id }));
    expect(value(t.h.listProjects({})).length).toBe(1);
  });

  it('validates every message and names the field', () => {
    const r = t.h.openProject({ id: '../../etc' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.fields?.[0]?.path).toBe('id');
    const extra = t.h.listProjects({ sneaky: 1 });
    expect(extra.ok).toBe(false);
    const notObject = t.h.saveProject('DROP TABLE projects');
    expect(notObject.ok).toBe(false);
    const badProject = t.h.saveProject({ project: { schemaVersion: 1, id: 'x', name: 'x', supports: [{}] } });
    expect(badProject.ok).toBe(false);
    if (!badProject.ok) {
      expect(badProject.error.code).toBe('invalid-project');
      expect(badProject.error.fields?.map((f) => f.path)).toContain('supports[0].usableHeightM');
    }
  });

  it('rejects oversized messages before parsing them', () => {
    const big = 'x'.repeat(25 * 1024 * 1024);
    const r = t.h.saveProject({ project: { name: big } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.code).toBe('too-large');
  });

  it('answers not-found for a missing project without throwing', () => {
    const r = t.h.openProject({ id: 'nope' });
    expect(r).toEqual({ ok: false, error: { code: 'not-found', message: 'no project with id "nope"' } });
  });
});
