import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createHandlers, type HandlerTable } from '../../../electron/api/handlers.ts';
import { ProjectStore } from '../../../data/store.ts';
import { DEMO_PROJECT_ID } from '../../../data/demo/demoProject.ts';
import { API_NAMES } from '../../../core/api/contract.ts';

let dir: string;
let store: ProjectStore;
let h: HandlerTable;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'yw-h-'));
  store = new ProjectStore(join(dir, 'db.sqlite'));
  h = createHandlers(store, { shell: 'browser', version: 'test' });
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

function value<T>(r: { ok: true; value: T } | { ok: false; error: unknown }): T {
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return r.value;
}

describe('API handlers', () => {
  it('has one handler per contract call', () => {
    expect(Object.keys(h).sort()).toEqual([...API_NAMES].sort());
  });

  it('opens the demo on first start, then the last project opened', () => {
    expect(value(h.openInitialProject({})).id).toBe(DEMO_PROJECT_ID);
    const p = value(h.createProject({ name: 'My lot' }));
    expect(value(h.openInitialProject({})).id).toBe(p.id);
  });

  it('saves, duplicates and deletes', () => {
    const demo = value(h.openInitialProject({}));
    value(h.saveProject({ project: { ...demo, name: 'Edited' } }));
    expect(value(h.openProject({ id: demo.id })).name).toBe('Edited');
    const copy = value(h.duplicateProject({ id: demo.id }));
    expect(copy.id).not.toBe(demo.id);
    expect(copy.name).toBe('Edited (copy)');
    expect(value(h.listProjects({})).length).toBe(2);
    value(h.deleteProject({ id: copy.id }));
    expect(value(h.listProjects({})).length).toBe(1);
  });

  it('validates every message and names the field', () => {
    const r = h.openProject({ id: '../../etc' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.fields?.[0]?.path).toBe('id');
    const extra = h.listProjects({ sneaky: 1 });
    expect(extra.ok).toBe(false);
    const notObject = h.saveProject('DROP TABLE projects');
    expect(notObject.ok).toBe(false);
    const badProject = h.saveProject({ project: { schemaVersion: 1, id: 'x', name: 'x', supports: [{}] } });
    expect(badProject.ok).toBe(false);
    if (!badProject.ok) {
      expect(badProject.error.code).toBe('invalid-project');
      expect(badProject.error.fields?.map((f) => f.path)).toContain('supports[0].usableHeightM');
    }
  });

  it('rejects oversized messages before parsing them', () => {
    const big = 'x'.repeat(25 * 1024 * 1024);
    const r = h.saveProject({ project: { name: big } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.code).toBe('too-large');
  });

  it('answers not-found for a missing project without throwing', () => {
    const r = h.openProject({ id: 'nope' });
    expect(r).toEqual({ ok: false, error: { code: 'not-found', message: 'no project with id "nope"' } });
  });
});
