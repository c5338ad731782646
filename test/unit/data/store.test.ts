import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { LATEST_STORE_VERSION } from '../../../data/migrations.ts';
import { ProjectStore, StoreError } from '../../../data/store.ts';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'yw-store-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('project store on a real SQLite file', () => {
  it('refuses a 0-byte file (a truncated store) and leaves it alone, creating nothing beside it', () => {
    const file = join(dir, 'empty.sqlite');
    writeFileSync(file, '');
    expect(() => new ProjectStore(file)).toThrow(/empty \(0 bytes\)/);
    expect(readFileSync(file).length).toBe(0);
    expect(existsSync(`${file}-wal`) || existsSync(`${file}-shm`)).toBe(false);
  });

  it('creates a missing file at the latest version, in WAL mode, and re-running migrations is a no-op', () => {
    const file = join(dir, 'a.sqlite');
    const s = new ProjectStore(file);
    expect(s.storeVersion).toBe(LATEST_STORE_VERSION);
    expect(s.migrate()).toBe(0);
    s.close();
    const raw = new Database(file);
    expect(raw.pragma('journal_mode', { simple: true })).toBe('wal');
    raw.close();
  });

  it('round-trips a project through a close and reopen', () => {
    const file = join(dir, 'b.sqlite');
    const s = new ProjectStore(file);
    const demo = buildDemoProject();
    s.saveProject(demo);
    s.markOpened(demo.id);
    s.close();
    const t = new ProjectStore(file);
    expect(t.getProject(demo.id)).toEqual(demo);
    expect(t.lastOpenedId()).toBe(demo.id);
    expect(t.listProjects()).toEqual([
      expect.objectContaining({ id: demo.id, name: demo.name, supportCount: demo.supports.length }),
    ]);
    t.close();
  });

  it('refuses an invalid project and leaves the stored one unchanged', () => {
    const s = new ProjectStore(join(dir, 'c.sqlite'));
    const demo = buildDemoProject();
    s.saveProject(demo);
    const bad = { ...demo, supports: [{ ...demo.supports[0], usableHeightM: -1 }] };
    expect(() => s.saveProject(bad)).toThrow(StoreError);
    try {
      s.saveProject(bad);
    } catch (e) {
      expect((e as StoreError).fields[0]).toEqual({
        path: 'supports[0].usableHeightM',
        message: expect.stringMatching(/greater than 0/),
      });
    }
    expect(s.getProject(demo.id)).toEqual(demo);
    s.close();
  });

  it('does not overwrite a corrupt file, and says so', () => {
    const file = join(dir, 'bad.sqlite');
    const junk = Buffer.from('this is not a database, it is a shopping list\n'.repeat(200));
    writeFileSync(file, junk);
    expect(() => new ProjectStore(file)).toThrow(/damaged or is not a Yardwire database/);
    expect(readFileSync(file).equals(junk)).toBe(true);
  });

  it('does not touch a file from a newer schema version', () => {
    const file = join(dir, 'new.sqlite');
    const raw = new Database(file);
    raw.pragma(`user_version = ${LATEST_STORE_VERSION + 5}`);
    raw.exec('CREATE TABLE future (x)');
    raw.close();
    const before = readFileSync(file);
    let err: unknown;
    try {
      new ProjectStore(file);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(StoreError);
    expect((err as StoreError).code).toBe('newer-schema');
    expect(readFileSync(file).equals(before)).toBe(true);
  });

  it('deletes a project with its overlay and forgets it as the last opened', () => {
    const s = new ProjectStore(join(dir, 'd.sqlite'));
    const demo = buildDemoProject();
    s.saveProject(demo);
    s.markOpened(demo.id);
    s.setOverlay({
      projectId: demo.id,
      name: 'x',
      bounds: [
        [1, 2],
        [3, 4],
      ],
      pngDataUrl: 'data:image/png;base64,AAAA',
    });
    expect(s.getOverlay(demo.id)?.name).toBe('x');
    s.deleteProject(demo.id);
    expect(s.hasProject(demo.id)).toBe(false);
    expect(s.getOverlay(demo.id)).toBeNull();
    expect(s.lastOpenedId()).toBeNull();
    expect(() => s.deleteProject(demo.id)).toThrow(/no project/);
    s.close();
  });

  it('two connections on the same file (two windows, or a window and the command line) see each other’s saves', () => {
    const file = join(dir, 'e.sqlite');
    const a = new ProjectStore(file);
    const b = new ProjectStore(file);
    const demo = buildDemoProject();
    a.saveProject(demo);
    b.saveProject({ ...demo, name: 'Renamed by the second window' });
    expect(a.getProject(demo.id).name).toBe('Renamed by the second window');
    a.close();
    b.close();
  });
});

describe('copy-out of a refused database', () => {
  it('keeps a byte-identical copy, sets the original aside and starts afresh', async () => {
    const { openStoreWithRecovery } = await import('../../../data/store.ts');
    const { readdirSync } = await import('node:fs');
    const file = join(dir, 'broken.sqlite');
    const junk = Buffer.from('not a database\n'.repeat(500));
    writeFileSync(file, junk);
    expect(() => openStoreWithRecovery(file, { recover: false })).toThrow(/damaged/);
    expect(readFileSync(file).equals(junk)).toBe(true);
    const { store, keptCopy } = openStoreWithRecovery(file, { recover: true });
    expect(keptCopy).not.toBeNull();
    expect(readFileSync(keptCopy!).equals(junk)).toBe(true);
    expect(store.listProjects()).toEqual([]);
    store.close();
    expect(readdirSync(dir).some((f) => f.startsWith('broken.sqlite.set-aside-'))).toBe(true);
  });
});
