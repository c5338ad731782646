// Issue 15 points 3-5: damage found at start-up, unreadable stored projects, conflicting saves,
// and another writer holding the lock while the server stays responsive.
import {
  openSync,
  closeSync,
  writeSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { buildDemoProject, DEMO_PROJECT_ID } from '../../../data/demo/demoProject.ts';
import { ProjectStore, StoreError } from '../../../data/store.ts';
import { createHandlers } from '../../../electron/api/handlers.ts';
import { startBrowserServer } from '../../../electron/server/server.ts';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'yw-hard-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const project = (id: string, name = id) => ({ ...buildDemoProject(), id, name });

/** Put a stored document in place directly, as a newer version or a damaged write would. */
function storeRaw(file: string, id: string, doc: string): void {
  const db = new Database(file);
  db.prepare(
    `INSERT OR REPLACE INTO projects (id, name, doc, created_at, updated_at) VALUES (?, ?, ?, '2030-01-01T00:00:00.000Z', '2030-01-01T00:00:00.000Z')`,
  ).run(id, `Stored ${id}`, doc);
  db.close();
}

/**
 * A store of forty demo projects in the test folder, closed, its write-ahead log folded into the
 * file; with journal 'delete' it also leaves WAL mode, so no -wal or -shm file stays beside it.
 */
function storeOfForty(opts: { journal?: 'wal' | 'delete' } = {}): string {
  const file = join(dir, 'db.sqlite');
  const s = new ProjectStore(file);
  for (let i = 0; i < 40; i++) s.saveProject(project(`p${i}`));
  s.close();
  const db = new Database(file);
  db.pragma('wal_checkpoint(TRUNCATE)');
  if (opts.journal === 'delete') db.pragma('journal_mode = DELETE');
  db.close();
  return file;
}

describe('start-up integrity check', () => {
  it('finds random bytes written into the pages (header intact), refuses the file and leaves it unchanged', () => {
    const file = storeOfForty();
    // seeded garbage over pages 3..6 (page 1 holds the header)
    let seed = 12345;
    const junk = Buffer.alloc(4 * 4096);
    for (let i = 0; i < junk.length; i++) {
      seed = (seed * 1103515245 + 12345) >>> 0;
      junk[i] = seed >>> 24;
    }
    const fd = openSync(file, 'r+');
    writeSync(fd, junk, 0, junk.length, 2 * 4096);
    closeSync(fd);
    const before = readFileSync(file);
    let err: unknown;
    try {
      new ProjectStore(file).close();
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(StoreError);
    expect((err as StoreError).code).toBe('corrupt');
    expect((err as StoreError).message).toMatch(/damaged/);
    expect(readFileSync(file).equals(before)).toBe(true);
  });

  it('refuses a truncated database without creating -wal or -shm files beside it', () => {
    const file = storeOfForty({ journal: 'delete' });
    const whole = readFileSync(file);
    writeFileSync(file, whole.subarray(0, 3 * 4096));
    expect(() => new ProjectStore(file)).toThrow(/truncated/);
    expect(existsSync(`${file}-wal`)).toBe(false);
    expect(existsSync(`${file}-shm`)).toBe(false);
  });

  it('records what the check cost', () => {
    const s = new ProjectStore(join(dir, 'db.sqlite'));
    expect(s.integrityCheckMs).toBeGreaterThanOrEqual(0);
    expect(s.integrityCheckMs).toBeLessThan(2000);
    s.close();
  });
});

describe('a stored project this version cannot read', () => {
  const newer = JSON.stringify({ ...project('future'), schemaVersion: 99, hologram: { x: 1 } });

  it('is listed as unreadable, never blocks the start, exports byte for byte, and is never replaced', () => {
    const file = join(dir, 'db.sqlite');
    new ProjectStore(file).close();
    storeRaw(file, 'future', newer);
    storeRaw(file, 'broken', '{"schemaVersion":2,"id":"broken","name":"B","supports":"many"}');
    const store = new ProjectStore(file);
    const db = new Database(file);
    db.prepare(`INSERT INTO app_state (key, value) VALUES ('lastProjectId', 'future')`).run();
    db.close();
    const h = createHandlers(store, { shell: 'browser', version: 't' });
    const start = h.openInitialProject({});
    expect(start.ok).toBe(true);
    const list = h.listProjects({});
    if (!list.ok) throw new Error('list failed');
    const f = list.value.find((p) => p.id === 'future')!;
    expect(f.readable).toBe(false);
    expect(f.problem).toMatch(/newer Yardwire/);
    expect(list.value.find((p) => p.id === 'broken')!.problem).toMatch(/supports/);
    const open = h.openProject({ id: 'future' });
    expect(!open.ok && open.error.code).toBe('unreadable');
    const exp = h.exportProject({ id: 'future' });
    expect(exp.ok && exp.value.text).toBe(newer);
    const save = h.saveProject({ project: project('future') });
    expect(!save.ok && save.error.code).toBe('unreadable');
    storeRaw(file, DEMO_PROJECT_ID, JSON.stringify({ ...buildDemoProject(), schemaVersion: 7 }));
    const reset = h.resetDemoProject({});
    expect(!reset.ok && reset.error.code).toBe('unreadable');
    expect(store.rawDocument('future').doc).toBe(newer);
    store.close();
  });
});

describe('two windows on one project', () => {
  it('the second save from an old base is refused as a conflict, and the first is kept', () => {
    const store = new ProjectStore(join(dir, 'db.sqlite'));
    const base = store.saveProject(project('p', 'Original')).updatedAt;
    const a = store.saveProject(project('p', 'From window A'), base);
    expect(a.updatedAt > base).toBe(true);
    let err: unknown;
    try {
      store.saveProject(project('p', 'From window B'), base);
    } catch (e) {
      err = e;
    }
    expect((err as StoreError).code).toBe('conflict');
    expect((err as StoreError).message).toMatch(/changed elsewhere/);
    expect(store.getProject('p').name).toBe('From window A');
    // saves in the same millisecond still get distinct, increasing stamps
    const s1 = store.saveProject(project('p', 'x'), a.updatedAt).updatedAt;
    const s2 = store.saveProject(project('p', 'y'), s1).updatedAt;
    expect(s2 > s1).toBe(true);
    store.close();
  });
});

describe('another writer holds the lock', () => {
  it('a save fails fast as busy and the server answers another request within 200 ms', async () => {
    const file = join(dir, 'db.sqlite');
    const store = new ProjectStore(file);
    store.saveProject(project('p'));
    const web = join(dir, 'web');
    mkdirSync(web);
    writeFileSync(join(web, 'index.html'), '<!doctype html><title>t</title>');
    const srv = await startBrowserServer({
      handlers: createHandlers(store, { shell: 'browser', version: 't' }),
      staticDir: web,
      port: 0,
    });
    const other = new Database(file);
    other.pragma('busy_timeout = 0');
    other.prepare('BEGIN IMMEDIATE').run();
    const call = (name: string, body: unknown) =>
      new Promise<{ ms: number; body: { ok: boolean; error?: { code: string; message: string } } }>(
        (ok, bad) => {
          const t0 = performance.now();
          const data = JSON.stringify(body);
          const req = request(
            {
              host: '127.0.0.1',
              port: srv.port,
              path: `/api/${name}`,
              method: 'POST',
              headers: {
                host: `127.0.0.1:${srv.port}`,
                'x-yardwire-token': srv.token,
                'content-type': 'application/json',
                'content-length': Buffer.byteLength(data),
              },
            },
            (res) => {
              let text = '';
              res.on('data', (c: Buffer) => (text += c.toString()));
              res.on('end', () => ok({ ms: performance.now() - t0, body: JSON.parse(text) }));
            },
          );
          req.on('error', bad);
          req.end(data);
        },
      );
    try {
      const [save, list] = await Promise.all([
        call('saveProject', { project: project('p', 'edited') }),
        call('listProjects', {}),
      ]);
      expect(save.body.ok).toBe(false);
      expect(save.body.error?.code).toBe('busy');
      expect(save.body.error?.message).toMatch(/try again/);
      expect(list.body.ok).toBe(true);
      expect(list.ms).toBeLessThan(200);
      other.prepare('ROLLBACK').run();
      const again = await call('saveProject', { project: project('p', 'edited') });
      expect(again.body.ok).toBe(true);
    } finally {
      other.close();
      await srv.close();
      store.close();
    }
  });
});
