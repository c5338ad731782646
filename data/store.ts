/**
 * The project store: one SQLite file (better-sqlite3) in WAL mode with a busy timeout, so that
 * two windows, or a window and the command line, can share it without corrupting it. Every edit
 * is one transaction. The store validates each project document with the one project schema
 * before writing it, and never overwrites a file it cannot read or that was written by a newer
 * schema version: it throws a StoreError that tells the caller what to offer the user.
 */
import {
  closeSync,
  copyFileSync,
  existsSync,
  openSync,
  readSync,
  renameSync,
  statSync,
  unlinkSync,
} from 'node:fs';
import Database from 'better-sqlite3';
import { parseProject, type FieldError, type Project } from '../core/project/schema.ts';
import type { ImageOverlay, PlanRecord, PlanView, ProjectSummary, StoredPlan } from '../core/api/contract.ts';
import { LATEST_STORE_VERSION, MIGRATIONS } from './migrations.ts';

export type StoreErrorCode =
  | 'corrupt'
  | 'newer-schema'
  | 'not-found'
  | 'invalid-project'
  | 'io'
  /** The stored project changed since the caller's base timestamp; nothing was written. */
  | 'conflict'
  /** Another connection holds the write lock (after the short busy timeout); retry later. */
  | 'busy'
  /** The stored project cannot be opened by this version; it is kept as it is. */
  | 'unreadable';

/**
 * Busy timeout by default, ms: short, because better-sqlite3 waits synchronously and the host
 * serves every window from one thread; a save that meets another writer's lock fails at once
 * with a retryable 'busy' error instead of freezing the other requests.
 */
export const DEFAULT_BUSY_TIMEOUT_MS = 50;

export class StoreError extends Error {
  readonly code: StoreErrorCode;
  readonly fields: FieldError[];
  constructor(code: StoreErrorCode, message: string, fields: FieldError[] = []) {
    super(message);
    this.name = 'StoreError';
    this.code = code;
    this.fields = fields;
  }
}

export interface StoreOptions {
  /** Path of the better-sqlite3 native binding to use (an Electron build kept apart from Node's). */
  nativeBinding?: string;
  /** Busy timeout in milliseconds when another connection holds the write lock. */
  busyTimeoutMs?: number;
  readonly?: boolean;
}

const LAST_PROJECT_KEY = 'lastProjectId';

type Row = { id: string; name: string; doc: string; updated_at: string };

export class ProjectStore {
  readonly file: string;
  private readonly db: Database.Database;

  /**
   * Time the start-up integrity check (PRAGMA quick_check) took, ms: about 140 ms for a 33 MB
   * store of 4 000 projects here (`npx tsx test/bench/store-check.ts`), linear in the file size.
   */
  integrityCheckMs = 0;

  constructor(file: string, options: StoreOptions = {}) {
    this.file = file;
    const header = checkFileHeader(file);
    if (header) throw new StoreError('corrupt', header);
    const hadSide = { wal: existsSync(`${file}-wal`), shm: existsSync(`${file}-shm`) };
    try {
      this.db = new Database(file, {
        ...(options.nativeBinding ? { nativeBinding: options.nativeBinding } : {}),
        readonly: options.readonly ?? false,
        fileMustExist: options.readonly ?? false,
      });
      this.db.pragma(
        `busy_timeout = ${Math.max(0, Math.round(options.busyTimeoutMs ?? DEFAULT_BUSY_TIMEOUT_MS))}`,
      );
      // Reading the header here is what detects a file that is not a database at all.
      const version = this.db.pragma('user_version', { simple: true }) as number;
      if (version > LATEST_STORE_VERSION) {
        this.db.close();
        throw new StoreError(
          'newer-schema',
          `the project database ${file} was written by a newer Yardwire (store version ${version}; this version knows up to ${LATEST_STORE_VERSION}). It was not changed. Copy it out before using an older version.`,
        );
      }
      const t0 = performance.now();
      const check = this.db.pragma('quick_check', { simple: true }) as string;
      this.integrityCheckMs = performance.now() - t0;
      if (check !== 'ok') {
        this.db.close();
        throw new StoreError(
          'corrupt',
          `the project database ${file} is damaged (integrity check: ${String(check).slice(0, 200)}). It was not changed; copy it out and start a new one.`,
        );
      }
      if (!options.readonly) {
        this.db.pragma('journal_mode = WAL');
        this.db.pragma('synchronous = FULL');
        this.db.pragma('foreign_keys = ON');
        this.migrate();
      }
    } catch (e) {
      removeNewEmptySideFiles(file, hadSide);
      if (e instanceof StoreError) throw e;
      const msg = e instanceof Error ? e.message : String(e);
      if (/not a database|malformed|file is encrypted/i.test(msg)) {
        throw new StoreError(
          'corrupt',
          `the project database ${file} is damaged or is not a Yardwire database (${msg}). It was not changed; copy it out and start a new one.`,
        );
      }
      throw new StoreError('io', `cannot open the project database ${file}: ${msg}`);
    }
  }

  /** Applies pending migrations, each in its own transaction with its version bump. Safe to re-run. */
  migrate(): number {
    let applied = 0;
    for (const m of MIGRATIONS) {
      const current = this.db.pragma('user_version', { simple: true }) as number;
      if (m.version <= current) continue;
      this.db.transaction(() => {
        this.db.exec(m.sql);
        this.db.pragma(`user_version = ${m.version}`);
      })();
      applied++;
    }
    return applied;
  }

  get storeVersion(): number {
    return this.db.pragma('user_version', { simple: true }) as number;
  }

  close(): void {
    this.db.close();
  }

  listProjects(): ProjectSummary[] {
    const rows = this.db
      .prepare(
        'SELECT id, name, doc, updated_at FROM projects ORDER BY COALESCE(opened_at, updated_at) DESC, name',
      )
      .all() as Row[];
    return rows.map((r) => {
      const read = readStored(r);
      const d = read.raw as { supports?: unknown[] } | null;
      const supportCount = d && Array.isArray(d.supports) ? d.supports.length : 0;
      return {
        id: r.id,
        name: r.name,
        updatedAt: r.updated_at,
        supportCount,
        readable: read.ok,
        ...(read.ok ? {} : { problem: read.problem }),
      };
    });
  }

  /** The stored document text of a project, exactly as kept (readable or not). */
  rawDocument(id: string): { doc: string; name: string; updatedAt: string } {
    const row = this.db.prepare('SELECT id, name, doc, updated_at FROM projects WHERE id = ?').get(id) as
      Row | undefined;
    if (!row) throw new StoreError('not-found', `no project with id "${id}"`);
    return { doc: row.doc, name: row.name, updatedAt: row.updated_at };
  }

  /** The stored timestamp of a project, or null when there is none. */
  updatedAtOf(id: string): string | null {
    const row = this.db.prepare('SELECT updated_at FROM projects WHERE id = ?').get(id) as
      { updated_at: string } | undefined;
    return row?.updated_at ?? null;
  }

  hasProject(id: string): boolean {
    return this.db.prepare('SELECT 1 FROM projects WHERE id = ?').get(id) !== undefined;
  }

  getProject(id: string): Project {
    const row = this.db.prepare('SELECT id, name, doc, updated_at FROM projects WHERE id = ?').get(id) as
      Row | undefined;
    if (!row) throw new StoreError('not-found', `no project with id "${id}"`);
    const read = readStored(row);
    if (!read.ok) throw new StoreError('unreadable', read.problem, read.fields);
    return read.project;
  }

  /**
   * Validates and writes the whole document in one transaction. Returns the stored timestamp.
   * Never replaces a stored document this version cannot read (a newer schema, or invalid):
   * 'unreadable'. With `baseUpdatedAt`, refuses when the stored project changed since:
   * 'conflict'. Timestamps of one project strictly increase, so a base is never ambiguous.
   */
  saveProject(doc: unknown, baseUpdatedAt?: string): { project: Project; updatedAt: string } {
    const parsed = parseProject(doc);
    if (!parsed.ok) {
      throw new StoreError(
        'invalid-project',
        'the project does not validate; nothing was saved',
        parsed.errors,
      );
    }
    const p = parsed.value;
    return this.write(() => {
      const row = this.db.prepare('SELECT id, name, doc, updated_at FROM projects WHERE id = ?').get(p.id) as
        Row | undefined;
      if (row) {
        const read = readStored(row);
        if (!read.ok)
          throw new StoreError(
            'unreadable',
            `the stored project "${row.name}" (${p.id}) cannot be opened by this version (${read.problem}); it was not replaced. Export it from the project list first.`,
          );
        if (baseUpdatedAt !== undefined && row.updated_at !== baseUpdatedAt)
          throw new StoreError(
            'conflict',
            `“${row.name}” was changed elsewhere (another window) at ${row.updated_at}, after this window opened it; these edits were not saved. Reopen the project to see the other changes, then edit again.`,
          );
      }
      let now = new Date().toISOString();
      if (row && now <= row.updated_at) now = new Date(Date.parse(row.updated_at) + 1).toISOString();
      this.db
        .prepare(
          `INSERT INTO projects (id, name, doc, created_at, updated_at) VALUES (@id, @name, @doc, @now, @now)
           ON CONFLICT (id) DO UPDATE SET name = excluded.name, doc = excluded.doc, updated_at = excluded.updated_at`,
        )
        .run({ id: p.id, name: p.name, doc: JSON.stringify(p), now });
      return { project: p, updatedAt: now };
    });
  }

  /** One write transaction (BEGIN IMMEDIATE); a held lock becomes a retryable 'busy' StoreError. */
  private write<T>(fn: () => T): T {
    try {
      return this.db.transaction(fn).immediate();
    } catch (e) {
      if (e instanceof StoreError) throw e;
      const code = (e as { code?: unknown }).code;
      if (typeof code === 'string' && (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED')))
        throw new StoreError(
          'busy',
          'the project database is busy: another program is writing to it. Nothing was saved; try again in a moment.',
        );
      throw e;
    }
  }

  deleteProject(id: string): void {
    this.write(() => {
      const info = this.db.prepare('DELETE FROM projects WHERE id = ?').run(id);
      if (info.changes === 0) throw new StoreError('not-found', `no project with id "${id}"`);
      const last = this.getState(LAST_PROJECT_KEY);
      if (last === id) this.db.prepare('DELETE FROM app_state WHERE key = ?').run(LAST_PROJECT_KEY);
    });
  }

  /** Marks a project as the one opened most recently (for the recent list and the next start). */
  markOpened(id: string): void {
    const now = new Date().toISOString();
    this.write(() => {
      this.db.prepare('UPDATE projects SET opened_at = ? WHERE id = ?').run(now, id);
      this.setState(LAST_PROJECT_KEY, id);
    });
  }

  lastOpenedId(): string | null {
    return this.getState(LAST_PROJECT_KEY);
  }

  getOverlay(projectId: string): ImageOverlay | null {
    const row = this.db
      .prepare('SELECT project_id, name, bounds, png_data_url, source FROM overlays WHERE project_id = ?')
      .get(projectId) as
      | {
          project_id: string;
          name: string;
          bounds: string;
          png_data_url: string | null;
          source: string | null;
        }
      | undefined;
    if (!row) return null;
    return {
      projectId: row.project_id,
      name: row.name,
      bounds: JSON.parse(row.bounds) as ImageOverlay['bounds'],
      ...(row.png_data_url !== null ? { pngDataUrl: row.png_data_url } : {}),
      ...(row.source !== null
        ? { source: JSON.parse(row.source) as NonNullable<ImageOverlay['source']> }
        : {}),
    };
  }

  setOverlay(o: ImageOverlay): void {
    if (!this.hasProject(o.projectId))
      throw new StoreError('not-found', `no project with id "${o.projectId}"`);
    this.db
      .prepare(
        `INSERT INTO overlays (project_id, name, bounds, png_data_url, source, updated_at) VALUES (?, ?, ?, ?, ?, ?)
         ON CONFLICT (project_id) DO UPDATE SET name = excluded.name, bounds = excluded.bounds,
           png_data_url = excluded.png_data_url, source = excluded.source, updated_at = excluded.updated_at`,
      )
      .run(
        o.projectId,
        o.name,
        JSON.stringify(o.bounds),
        o.pngDataUrl ?? null,
        o.source ? JSON.stringify(o.source) : null,
        new Date().toISOString(),
      );
  }

  clearOverlay(projectId: string): void {
    this.db.prepare('DELETE FROM overlays WHERE project_id = ?').run(projectId);
  }

  /**
   * The project's last plan, or null when it has none. A stored plan that cannot be read (or that
   * belongs to another project) is reported as none, never shown; it stays in the file untouched
   * until the next plan of the project replaces it.
   */
  getPlan(projectId: string): StoredPlan | null {
    const row = this.db
      .prepare('SELECT doc, selected_id, compare_id, updated_at FROM plans WHERE project_id = ?')
      .get(projectId) as
      { doc: string; selected_id: string | null; compare_id: string | null; updated_at: string } | undefined;
    if (!row) return null;
    let plan: PlanRecord;
    try {
      plan = JSON.parse(row.doc) as PlanRecord;
    } catch {
      return null;
    }
    if (plan?.shortlist?.projectId !== projectId || plan.madeFor?.id !== projectId) return null;
    return {
      projectId,
      plan,
      selectedId: row.selected_id,
      compareId: row.compare_id,
      savedAt: row.updated_at,
    };
  }

  /**
   * Keeps a plan as the project's last, in one transaction, replacing the one before. The plan
   * must be the project's own: its shortlist and the project it was made for carry the same id,
   * and that project document validates.
   */
  savePlan(projectId: string, plan: PlanRecord, view: PlanView): { savedAt: string } {
    if (!this.hasProject(projectId)) throw new StoreError('not-found', `no project with id "${projectId}"`);
    const parsed = parseProject(plan.madeFor);
    if (!parsed.ok)
      throw new StoreError(
        'invalid-project',
        'the project the plan was made for does not validate; the plan was not kept',
        parsed.errors.map((e) => ({ ...e, path: `plan.madeFor${e.path ? `.${e.path}` : ''}` })),
      );
    for (const [path, id] of [
      ['plan.madeFor.id', parsed.value.id],
      ['plan.shortlist.projectId', plan.shortlist.projectId],
    ] as const) {
      if (id !== projectId)
        throw new StoreError('invalid-project', `the plan belongs to another project; it was not kept`, [
          { path, message: `must be "${projectId}" (the project it is kept for), not "${id}"` },
        ]);
    }
    const ids = new Set(plan.shortlist.candidates.map((c) => c.id));
    const now = new Date().toISOString();
    this.db
      .prepare(
        `INSERT INTO plans (project_id, inputs_hash, doc, selected_id, compare_id, updated_at)
         VALUES (@projectId, @hash, @doc, @selected, @compare, @now)
         ON CONFLICT (project_id) DO UPDATE SET inputs_hash = excluded.inputs_hash, doc = excluded.doc,
           selected_id = excluded.selected_id, compare_id = excluded.compare_id, updated_at = excluded.updated_at`,
      )
      .run({
        projectId,
        hash: plan.inputs.hash,
        doc: JSON.stringify({ ...plan, madeFor: parsed.value }),
        selected: view.selectedId !== null && ids.has(view.selectedId) ? view.selectedId : null,
        compare: view.compareId !== null && ids.has(view.compareId) ? view.compareId : null,
        now,
      });
    return { savedAt: now };
  }

  /** Keeps which candidates the views show; false when the project has no plan kept. */
  setPlanView(projectId: string, view: PlanView): boolean {
    const info = this.db
      .prepare('UPDATE plans SET selected_id = ?, compare_id = ? WHERE project_id = ?')
      .run(view.selectedId, view.compareId, projectId);
    return info.changes > 0;
  }

  private getState(key: string): string | null {
    const row = this.db.prepare('SELECT value FROM app_state WHERE key = ?').get(key) as
      { value: string } | undefined;
    return row?.value ?? null;
  }

  private setState(key: string, value: string): void {
    this.db
      .prepare(
        'INSERT INTO app_state (key, value) VALUES (?, ?) ON CONFLICT (key) DO UPDATE SET value = excluded.value',
      )
      .run(key, value);
  }
}

/**
 * Copies a database the store refused (damaged, or from a newer version) to a dated file beside
 * it, with its WAL and shared-memory files, so that the user keeps it and can start afresh.
 * The original is left where it was; the caller decides whether to move it aside.
 */
export function copyOutDatabase(file: string, now = new Date()): string {
  const stamp = now.toISOString().replace(/[:.]/g, '-');
  const target = `${file}.kept-${stamp}`;
  copyFileSync(file, target);
  for (const suffix of ['-wal', '-shm']) {
    if (existsSync(file + suffix)) copyFileSync(file + suffix, target + suffix);
  }
  return target;
}

/**
 * Opens the store; when the file is damaged or from a newer version and `recover` is set, first
 * copies it out, moves the original aside (renamed, never deleted) and starts a fresh database.
 * Returns the store and, when recovery happened, where the old file was kept.
 */
export function openStoreWithRecovery(
  file: string,
  options: StoreOptions & { recover: boolean },
): { store: ProjectStore; keptCopy: string | null } {
  try {
    return { store: new ProjectStore(file, options), keptCopy: null };
  } catch (e) {
    if (!(e instanceof StoreError) || !options.recover || (e.code !== 'corrupt' && e.code !== 'newer-schema'))
      throw e;
    const kept = copyOutDatabase(file);
    renameSync(file, `${file}.set-aside-${Date.now()}`);
    for (const suffix of ['-wal', '-shm'])
      if (existsSync(file + suffix)) renameSync(file + suffix, `${file}${suffix}.set-aside-${Date.now()}`);
    return { store: new ProjectStore(file, options), keptCopy: kept };
  }
}

type StoredRead =
  | { ok: true; project: Project; raw: unknown }
  | { ok: false; problem: string; fields: FieldError[]; raw: unknown };

/** Read a stored row: the project, or why this version cannot open it. */
function readStored(row: Row): StoredRead {
  let raw: unknown;
  try {
    raw = JSON.parse(row.doc);
  } catch {
    return { ok: false, problem: 'the stored document is not valid JSON', fields: [], raw: null };
  }
  const parsed = parseProject(raw);
  if (parsed.ok) return { ok: true, project: parsed.value, raw };
  const first = parsed.errors[0];
  const newer = first?.path === 'schemaVersion';
  return {
    ok: false,
    problem: newer
      ? first.message
      : `the stored document does not validate (${first ? `${first.path}: ${first.message}` : 'no detail'}${parsed.errors.length > 1 ? `, and ${parsed.errors.length - 1} more` : ''})`,
    fields: parsed.errors,
    raw,
  };
}

/**
 * Check an existing file's SQLite header before opening it (the file format, "The Database
 * Header", sqlite.org/fileformat2.html §1.3; core/REFERENCES.md §17): a 0-byte file, a file that does not start with
 * the magic string, or one shorter than its header's page count says is refused without
 * touching it (opening would create -wal and -shm files beside it). Returns the reason, or null.
 */
export function checkFileHeader(file: string): string | null {
  if (!existsSync(file)) return null;
  let fd: number | null = null;
  try {
    const size = statSync(file).size;
    const keep = 'It was not changed; copy it out and start a new one.';
    if (size === 0)
      return `the project database ${file} is damaged or is not a Yardwire database: it is empty (0 bytes), truncated or never written. ${keep}`;
    fd = openSync(file, 'r');
    const h = Buffer.alloc(100);
    const n = readSync(fd, h, 0, 100, 0);
    if (n < 100 || h.toString('latin1', 0, 16) !== 'SQLite format 3\0')
      return `the project database ${file} is damaged or is not a Yardwire database (no SQLite header). ${keep}`;
    const ps = h.readUInt16BE(16);
    const pageSize = ps === 1 ? 65536 : ps;
    const pages = h.readUInt32BE(28);
    const valid = h.readUInt32BE(24) === h.readUInt32BE(92); // in-header size valid (§1.3.7)
    if (valid && pages > 0 && size < pages * pageSize && !existsSync(`${file}-wal`))
      return `the project database ${file} is damaged: truncated to ${size} bytes (its header says ${pages * pageSize}). ${keep}`;
    return null;
  } catch {
    return null; // unreadable for another reason: the open that follows reports it
  } finally {
    if (fd !== null) closeSync(fd);
  }
}

/** After a refused open, remove -wal/-shm files the attempt created (empty, and not there before). */
function removeNewEmptySideFiles(file: string, had: { wal: boolean; shm: boolean }): void {
  for (const [suffix, existed] of [
    ['-wal', had.wal],
    ['-shm', had.shm],
  ] as const) {
    const f = file + suffix;
    try {
      if (!existed && existsSync(f) && (suffix === '-shm' || statSync(f).size === 0)) unlinkSync(f);
    } catch {
      // leave it: removing is a courtesy
    }
  }
}
