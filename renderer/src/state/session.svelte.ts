/**
 * The editing session: the open project, the editor state, the aerial overlay, the planning
 * state (targets, runs, the shortlist and what its views show, kept per project in the store)
 * with what the map draws of it, the list of recent projects, and the project-level commands
 * (open, new, duplicate, delete, reset demo).
 */
import type { ApiResponse, ProjectSummary, YardwireApi } from '../../../core/api/contract.ts';
import type { Project } from '../../../core/project/schema.ts';
import { Planning, type PlanKeeper } from '../plan/planning.svelte.ts';
import { closeReport } from '../plan/reportView.svelte.ts';
import { startPool, type PlanWorker } from '../workers/pool.ts';
import { MapOverlays } from './mapOverlays.svelte.ts';
import { OverlayState } from './overlay.svelte.ts';
import { ProjectState } from './project.svelte.ts';
import { UiState } from './ui.svelte.ts';
import { downloadText } from '../plan/download.ts';

/** The props of a component that takes only the session (the open project, the editor and planning state). */
export interface SessionProps {
  session: Session;
}

export class Session {
  doc: ProjectState;
  ui = new UiState();
  overlay: OverlayState;
  planning: Planning;
  /** What the lot map draws of the planning state. */
  mapOverlays: MapOverlays;
  projects = $state.raw<ProjectSummary[]>([]);
  /** False while starting, true once the first project is open. */
  started = $state(false);
  /** Why the host could not be reached (the first project could not be opened), or null. */
  startError = $state<string | null>(null);
  #api: () => YardwireApi;

  /** Stored timestamp the open project's edits build on (conflict check of saveProject). */
  #base: string | undefined;

  constructor(client: () => YardwireApi, startWorkers: () => PlanWorker[] = startPool) {
    this.#api = client;
    this.doc = new ProjectState((project) => this.#save(project));
    this.overlay = new OverlayState(client);
    this.planning = new Planning(this.doc, startWorkers, apiKeeper(client));
    this.mapOverlays = new MapOverlays(this.doc, this.planning);
  }

  dispose(): void {
    this.planning.dispose();
  }

  /**
   * Save with the conflict check: a 'busy' database is retried a few times off the request path
   * (the host answers at once); a 'conflict' (another window saved first) is told to the user.
   */
  async #save(project: Project): Promise<ApiResponse<{ updatedAt: string }>> {
    let r = await this.#api().saveProject({ project, baseUpdatedAt: this.#base });
    for (let i = 0; i < 4 && !r.ok && r.error.code === 'busy'; i++) {
      await new Promise((res) => setTimeout(res, 250 * (i + 1)));
      r = await this.#api().saveProject({ project, baseUpdatedAt: this.#base });
    }
    if (r.ok) this.#base = r.value.updatedAt;
    else if (r.error.code === 'conflict') this.ui.notify('error', r.error.message);
    return r;
  }

  /** Save the stored document of a project as a file, exactly as kept (also one that cannot be opened). */
  async exportProject(id: string): Promise<void> {
    const r = await this.#api().exportProject({ id });
    if (!r.ok) return this.ui.notify('error', `Cannot export: ${r.error.message}`);
    downloadText(r.value.text, r.value.fileName, 'application/json');
    this.ui.notify('info', `Exported as ${r.value.fileName}.`);
  }

  async start(): Promise<void> {
    const r = await this.#api().openInitialProject({});
    if (!r.ok) {
      this.startError = r.error.message;
      return;
    }
    await this.#show(r.value);
    this.started = true;
  }

  async refreshList(): Promise<void> {
    const r = await this.#api().listProjects({});
    if (r.ok) this.projects = r.value;
    else this.ui.notify('error', `Cannot list projects: ${r.error.message}`);
  }

  async openProject(id: string): Promise<void> {
    await this.#swap(() => this.#api().openProject({ id }), 'Opened');
  }

  async createProject(name: string): Promise<void> {
    await this.#swap(() => this.#api().createProject({ name }), 'Created');
  }

  async duplicateProject(): Promise<void> {
    const id = this.doc.project?.id;
    if (id) await this.#swap(() => this.#api().duplicateProject({ id }), 'Duplicated as');
  }

  /** Delete the open project, then open the most recent remaining one (or the demo). */
  async deleteProject(): Promise<void> {
    const p = this.doc.project;
    if (!p) return;
    await this.doc.flush();
    const r = await this.#api().deleteProject({ id: p.id });
    if (!r.ok) return this.ui.notify('error', `Cannot delete: ${r.error.message}`);
    this.ui.notify('info', `Deleted “${p.name}”.`);
    const next = await this.#api().openInitialProject({});
    if (next.ok) await this.#show(next.value);
    else this.ui.notify('error', next.error.message);
  }

  async resetDemo(): Promise<void> {
    await this.#swap(() => this.#api().resetDemoProject({}), 'Reset');
  }

  async #swap(call: () => Promise<ApiResponse<Project>>, verb: string): Promise<void> {
    await this.doc.flush();
    const r = await call();
    if (!r.ok) return this.ui.notify('error', r.error.message);
    await this.#show(r.value);
    this.ui.notify('info', `${verb} “${r.value.name}”.`);
  }

  async #show(p: Project): Promise<void> {
    this.#base = undefined;
    // Nothing of the project shown before stays on screen: its print view closes with it.
    closeReport();
    this.doc.open(p);
    this.ui.setTool('select');
    this.ui.fitRequest++;
    await Promise.all([this.overlay.load(p.id), this.refreshList(), this.planning.openProject(p.id)]);
    if (this.#base === undefined) this.#base = this.projects.find((s) => s.id === p.id)?.updatedAt;
  }
}

/** Plans kept in the store through the API; a failure to keep one is reported, never thrown. */
function apiKeeper(client: () => YardwireApi): PlanKeeper {
  const must = async <T>(r: Promise<{ ok: true; value: T } | { ok: false; error: { message: string } }>) => {
    const x = await r;
    if (!x.ok) throw new Error(x.error.message);
    return x.value;
  };
  return {
    load: (projectId) => must(client().getPlan({ projectId })),
    save: async (projectId, plan, view) => {
      // The request schema checks the plan at the host; its TypeScript input type is looser than PlanRecord.
      await must(client().savePlan({ projectId, plan: plan as never, ...view }));
    },
    setView: async (projectId, view) => {
      await must(client().setPlanView({ projectId, ...view }));
    },
  };
}
