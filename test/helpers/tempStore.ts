/**
 * A store on a real SQLite file for each test: before each, a fresh temporary folder, the store
 * `db.sqlite` in it and the API handlers over that store (browser shell); after each, the store
 * (whichever the test left in `store`) is closed and the folder removed.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach } from 'vitest';
import { ProjectStore } from '../../data/store.ts';
import { createHandlers, type HandlerTable } from '../../electron/api/handlers.ts';

export interface TempStore {
  dir: string;
  /** The store file, `db.sqlite` in `dir`. */
  file: string;
  store: ProjectStore;
  h: HandlerTable;
}

export function useTempStore(prefix: string): TempStore {
  const t = {} as TempStore;
  beforeEach(() => {
    t.dir = mkdtempSync(join(tmpdir(), prefix));
    t.file = join(t.dir, 'db.sqlite');
    t.store = new ProjectStore(t.file);
    t.h = createHandlers(t.store, { shell: 'browser', version: 'test' });
  });
  afterEach(() => {
    t.store.close();
    rmSync(t.dir, { recursive: true, force: true });
  });
  return t;
}
