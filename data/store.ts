/**
 * The project store: one SQLite file (better-sqlite3) in WAL mode with a busy timeout, so that
 * two windows, or a window and the command line, can share it without corrupting it. Every edit
 * is one transaction. The store validates each project document with the one project schema
 * before writing it, and never overwrites a file it cannot read or that was written by a newer
 * schema version: it throws a StoreError that tells the caller what to offer the user.
 */
import { copyFileSync, existsSync, renameSync } from 'node:fs';
import Database from 'better-sqlite3';
import { parseProject, type FieldError, type Project } from '../core/project/schema.ts';
import type { ImageOverlay, PlanRecord, PlanView, ProjectSummary, StoredPlan } from '../core/api/contract.ts';
import { LATEST_STORE_VERSION, MIGRATIONS } from './migrations.ts';

export type StoreErrorCode = 'corrupt' | 'newer-schema' | 'not-found' | 'invalid-project' | 'io';

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

  constructor(file: string, options: StoreOptions = {}) {
    this.file = file;
    try {
      this.db = new Database(file, {
        ...(options.nativeBinding ? { nativeBinding: options.nativeBinding } : {}),
        readonly: options.readonly ?? false,
        fileMustExist: options.readonly ?? false,
      });
      this.db.pragma(`busy_timeout = ${Math.max(0, Math.round(options.busyTimeoutMs ?? 5000))}`);
      // Reading the header here is what detects a file that is not a database at all.
      const version = this.db.pragma('user_version', { simple: true }) as number;
      if (version > LATEST_STORE_VERSION) {
        this.db.close();
        throw new StoreError(
          'newer-schema',
          `the project database ${file} was written by a newer Yardwire (store version ${version}; this version knows up to ${LATEST_STORE_VERSION}). It was not changed. Copy it out before using an older version.`,
        );
      }
      if (!options.readonly) {
        this.db.pragma('journal_mode = WAL');
        this.db.pragma('synchronous = FULL');
        this.db.pragma('foreign_keys = ON');
        this.migrate();
      }
    } catch (e) {
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
      let supportCount = 0;
      try {
        const d = JSON.parse(r.doc) as { supports?: unknown[] };
        supportCount = Array.isArray(d.supports) ? d.supports.length : 0;
      } catch {
        supportCount = 0;
      }
      return { id: r.id, name: r.name, updatedAt: r.updated_at, supportCount };
    });
  }

  hasProject(id: string): boolean {
    return this.db.prepare('SELECT 1 FROM projects WHERE id = ?').get(id) !== undefined;
  }

  getProject(id: string): Project {
    const row = this.db.prepare('SELECT id, name, doc, updated_at FROM projects WHERE id = ?').get(id) as
      Row | undefined;
    if (!row) throw new StoreError('not-found', `no project with id "${id}"`);
    let doc: unknown;
    try {
      doc = JSON.parse(row.doc);
    } catch {
      throw new StoreError('corrupt', `the stored project "${id}" is not valid JSON`);
    }
    const parsed = parseProject(doc);
    if (!parsed.ok)
      throw new StoreError('invalid-project', `the stored project "${id}" does not validate`, parsed.errors);
    return parsed.value;
  }

  /** Validates and writes the whole document in one transaction. Returns the stored timestamp. */
  saveProject(doc: unknown): { project: Project; updatedAt: string } {
    const parsed = parseProject(doc);
    if (!parsed.ok) {
      throw new StoreError(
        'invalid-project',
        'the project does not validate; nothing was saved',
        parsed.errors,
      );
    }
    const p = parsed.value;
    const now = new Date().toISOString();
    this.db
      .prepare(
        `INSERT INTO projects (id, name, doc, created_at, updated_at) VALUES (@id, @name, @doc, @now, @now)
         ON CONFLICT (id) DO UPDATE SET name = excluded.name, doc = excluded.doc, updated_at = excluded.updated_at`,
      )
      .run({ id: p.id, name: p.name, doc: JSON.stringify(p), now });
    return { project: p, updatedAt: now };
  }

  deleteProject(id: string): void {
    const tx = this.db.transaction(() => {
      const info = this.db.prepare('DELETE FROM projects WHERE id = ?').run(id);
      if (info.changes === 0) throw new StoreError('not-found', `no project with id "${id}"`);
      const last = this.getState(LAST_PROJECT_KEY);
      if (last === id) this.db.prepare('DELETE FROM app_state WHERE key = ?').run(LAST_PROJECT_KEY);
    });
    tx();
  }

  /** Marks a project as the one opened most recently (for the recent list and the next start). */
  markOpened(id: string): void {
    const now = new Date().toISOString();
    this.db.transaction(() => {
      this.db.prepare('UPDATE projects SET opened_at = ? WHERE id = ?').run(now, id);
      this.setState(LAST_PROJECT_KEY, id);
    })();
  }

  lastOpenedId(): string | null {
    return this.getState(LAST_PROJECT_KEY);
  }

  getOverlay(projectId: string): ImageOverlay | null {
    const row = this.db
      .prepare('SELECT project_id, name, bounds, png_data_url FROM overlays WHERE project_id = ?')
      .get(projectId) as
      { project_id: string; name: string; bounds: string; png_data_url: string } | undefined;
    if (!row) return null;
    return {
      projectId: row.project_id,
      name: row.name,
      bounds: JSON.parse(row.bounds) as ImageOverlay['bounds'],
      pngDataUrl: row.png_data_url,
    };
  }

  setOverlay(o: ImageOverlay): void {
    if (!this.hasProject(o.projectId))
      throw new StoreError('not-found', `no project with id "${o.projectId}"`);
    this.db
      .prepare(
        `INSERT INTO overlays (project_id, name, bounds, png_data_url, updated_at) VALUES (?, ?, ?, ?, ?)
         ON CONFLICT (project_id) DO UPDATE SET name = excluded.name, bounds = excluded.bounds,
           png_data_url = excluded.png_data_url, updated_at = excluded.updated_at`,
      )
      .run(o.projectId, o.name, JSON.stringify(o.bounds), o.pngDataUrl, new Date().toISOString());
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
