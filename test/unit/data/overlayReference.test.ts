// Migration 3 (issue 18 point 2): overlays keep a reference to the image file and its
// georeference; the PNG is kept only when the user embeds it. A store from version 1 keeps its
// embedded images through the migration.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { API } from '../../../core/api/contract.ts';
import type { AerialReference } from '../../../core/project/aerialReference.ts';
import { crsFromEpsg } from '../../../core/project/crs.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { LATEST_STORE_VERSION, MIGRATIONS } from '../../../data/migrations.ts';
import { ProjectStore } from '../../../data/store.ts';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'yw-overlay-ref-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const bounds: [[number, number], [number, number]] = [
  [44.9, -93.76],
  [44.91, -93.74],
];
const reference = (): AerialReference => ({
  fileName: 'county-ortho.tif',
  sizeBytes: 412_000_000,
  modifiedMs: 1_700_000_000_000,
  widthPx: 11_000,
  heightPx: 11_000,
  crs: crsFromEpsg(32615),
  transform: [440_000, 0.15, 0, 4_975_000, 0, -0.15],
});

describe('overlay references (store migration 3)', () => {
  it('migrates a version-1 store and keeps its embedded image', () => {
    const file = join(dir, 'v1.sqlite');
    const raw = new Database(file);
    const v1 = MIGRATIONS.find((m) => m.version === 1)!;
    raw.exec(v1.sql);
    raw.pragma('user_version = 1');
    const demo = buildDemoProject();
    const now = new Date().toISOString();
    raw
      .prepare('INSERT INTO projects (id, name, doc, created_at, updated_at) VALUES (?, ?, ?, ?, ?)')
      .run(demo.id, demo.name, JSON.stringify(demo), now, now);
    raw
      .prepare(
        'INSERT INTO overlays (project_id, name, bounds, png_data_url, updated_at) VALUES (?, ?, ?, ?, ?)',
      )
      .run(demo.id, 'old', JSON.stringify(bounds), 'data:image/png;base64,AAAA', now);
    raw.close();
    const s = new ProjectStore(file);
    expect(s.storeVersion).toBe(LATEST_STORE_VERSION);
    expect(s.getOverlay(demo.id)).toEqual({
      projectId: demo.id,
      name: 'old',
      bounds,
      pngDataUrl: 'data:image/png;base64,AAAA',
    });
    s.close();
  });

  it('stores a reference without the image, and refuses a row with neither', () => {
    const s = new ProjectStore(join(dir, 'r.sqlite'));
    const demo = buildDemoProject();
    s.saveProject(demo);
    s.setOverlay({ projectId: demo.id, name: 'county-ortho.tif', bounds, source: reference() });
    const back = s.getOverlay(demo.id)!;
    expect(back.pngDataUrl).toBeUndefined();
    expect(back.source).toEqual(reference());
    expect(() => s.setOverlay({ projectId: demo.id, name: 'x', bounds })).toThrow(/CHECK constraint/);
    expect(s.getOverlay(demo.id)?.source?.fileName).toBe('county-ortho.tif'); // nothing lost
    s.close();
  });

  it('the API refuses an overlay with neither image nor reference, naming the field', () => {
    const r = API.setOverlay.request.safeParse({ projectId: 'p1', name: 'x', bounds });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(['source']);
    expect(
      API.setOverlay.request.safeParse({ projectId: 'p1', name: 'x', bounds, source: reference() }).success,
    ).toBe(true);
  });
});
