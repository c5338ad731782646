/**
 * The API handlers, shared by the Electron main process (over IPC) and the browser-mode server
 * (over HTTP). Each handler takes `unknown`, validates it against the contract's request schema,
 * and answers `{ ok, value } | { ok: false, error }`. Nothing here imports electron.
 */
import { randomUUID } from 'node:crypto';
import {
  API,
  MAX_MESSAGE_BYTES,
  type ApiError,
  type ApiName,
  type ApiResponse,
  type ApiResults,
  type HostInfo,
  type PlanRecord,
} from '../../core/api/contract.ts';
import { emptyProject, formatPath, type Project } from '../../core/project/schema.ts';
import { buildDemoProject, DEMO_PROJECT_ID } from '../../data/demo/demoProject.ts';
import { ProjectStore, StoreError } from '../../data/store.ts';

export type HandlerTable = { [K in ApiName]: (request: unknown) => ApiResponse<ApiResults[K]> };

function fail(
  code: ApiError['code'],
  message: string,
  fields?: ApiError['fields'],
): { ok: false; error: ApiError } {
  return { ok: false, error: fields ? { code, message, fields } : { code, message } };
}

function fromError(e: unknown): { ok: false; error: ApiError } {
  if (e instanceof StoreError) {
    const code: ApiError['code'] =
      e.code === 'not-found' ||
      e.code === 'invalid-project' ||
      e.code === 'conflict' ||
      e.code === 'busy' ||
      e.code === 'unreadable'
        ? e.code
        : 'storage';
    return fail(code, e.message, e.fields.length > 0 ? e.fields : undefined);
  }
  return fail('internal', e instanceof Error ? e.message : String(e));
}

/** Short random id for a new project. */
export function newProjectId(): string {
  return `p-${randomUUID().replaceAll('-', '').slice(0, 16)}`;
}

/** Measure a message before parsing its schema (size limit on every message). */
export function messageTooLarge(request: unknown): boolean {
  try {
    return JSON.stringify(request ?? null).length > MAX_MESSAGE_BYTES;
  } catch {
    return true;
  }
}

export function createHandlers(store: ProjectStore, host: Omit<HostInfo, 'dataFile'>): HandlerTable {
  /** Remember the opened project; best effort (a busy database must not stop an open). */
  function markOpened(id: string): void {
    try {
      store.markOpened(id);
    } catch (e) {
      if (!(e instanceof StoreError && e.code === 'busy')) throw e;
    }
  }

  function ensureDemo(): Project {
    if (store.hasProject(DEMO_PROJECT_ID)) return store.getProject(DEMO_PROJECT_ID);
    return store.saveProject(buildDemoProject()).project;
  }

  /**
   * The project to open at start-up: the last opened if this version can read it, else the most
   * recent readable one, else the demo (created when missing), else a new empty project. A stored
   * project that cannot be read never blocks the start; it stays listed as unreadable.
   */
  function initialProject(): Project {
    const last = store.lastOpenedId();
    const list = store.listProjects();
    const readable = (id: string) => list.some((s) => s.id === id && s.readable);
    if (last && readable(last)) return store.getProject(last);
    const other = list.find((s) => s.readable);
    if (other) return store.getProject(other.id);
    if (!store.hasProject(DEMO_PROJECT_ID)) return ensureDemo();
    return store.saveProject(emptyProject(newProjectId(), 'New project')).project;
  }

  const impl: { [K in ApiName]: (req: never) => ApiResults[K] } = {
    hostInfo: () => ({ ...host, dataFile: store.file }),
    listProjects: () => store.listProjects(),
    openInitialProject: () => {
      const project = initialProject();
      markOpened(project.id);
      return project;
    },
    openProject: (req: { id: string }) => {
      const p = store.getProject(req.id);
      markOpened(p.id);
      return p;
    },
    saveProject: (req: { project: unknown; baseUpdatedAt?: string }) => ({
      updatedAt: store.saveProject(req.project, req.baseUpdatedAt).updatedAt,
    }),
    exportProject: (req: { id: string }) => {
      const raw = store.rawDocument(req.id);
      const base = raw.name.replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '') || req.id;
      return { fileName: `${base}.yardwire.json`, text: raw.doc };
    },
    createProject: (req: { name: string }) => {
      const p = store.saveProject(emptyProject(newProjectId(), req.name)).project;
      markOpened(p.id);
      return p;
    },
    duplicateProject: (req: { id: string }) => {
      const src = store.getProject(req.id);
      const copy = store.saveProject({
        ...src,
        id: newProjectId(),
        name: `${src.name} (copy)`.slice(0, 200),
      }).project;
      const overlay = store.getOverlay(src.id);
      if (overlay) store.setOverlay({ ...overlay, projectId: copy.id });
      markOpened(copy.id);
      return copy;
    },
    deleteProject: (req: { id: string }) => {
      store.deleteProject(req.id);
      return { deleted: true as const };
    },
    resetDemoProject: () => {
      const p = store.saveProject(buildDemoProject()).project;
      markOpened(p.id);
      return p;
    },
    getOverlay: (req: { projectId: string }) => store.getOverlay(req.projectId),
    setOverlay: (req: Parameters<ProjectStore['setOverlay']>[0]) => {
      store.setOverlay(req);
      return { saved: true as const };
    },
    clearOverlay: (req: { projectId: string }) => {
      store.clearOverlay(req.projectId);
      return { cleared: true as const };
    },
    getPlan: (req: { projectId: string }) => store.getPlan(req.projectId),
    savePlan: (req: {
      projectId: string;
      plan: unknown;
      selectedId: string | null;
      compareId: string | null;
    }) =>
      store.savePlan(req.projectId, req.plan as PlanRecord, {
        selectedId: req.selectedId,
        compareId: req.compareId,
      }),
    setPlanView: (req: { projectId: string; selectedId: string | null; compareId: string | null }) => ({
      saved: store.setPlanView(req.projectId, { selectedId: req.selectedId, compareId: req.compareId }),
    }),
  };

  const table = {} as Record<ApiName, (request: unknown) => ApiResponse<unknown>>;
  for (const name of Object.keys(API) as ApiName[]) {
    table[name] = (request: unknown) => {
      if (messageTooLarge(request)) return fail('too-large', `the ${name} message is larger than allowed`);
      const parsed = API[name].request.safeParse(request ?? {});
      if (!parsed.success) {
        return fail(
          'invalid-request',
          `invalid ${name} request`,
          parsed.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message })),
        );
      }
      try {
        return { ok: true, value: (impl[name] as (r: unknown) => unknown)(parsed.data) };
      } catch (e) {
        return fromError(e);
      }
    };
  }
  return table as HandlerTable;
}
