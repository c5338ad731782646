/**
 * The one API contract between the user interface and the host (Electron main process or the
 * browser-mode server). Each call has a request schema and a result type. The Electron preload,
 * the main-process handlers, the browser-mode HTTP server and the renderer's client are all built
 * from this table, so there is nothing to keep in sync by hand.
 *
 * Every call answers `{ ok: true, value } | { ok: false, error }` (one error policy, STYLE §8).
 */
import { z } from 'zod';
import { ProjectSchema, type FieldError, type Project } from '../project/schema.ts';
import { AerialReferenceSchema, type AerialReference } from '../project/aerialReference.ts';

/** Largest message the host accepts, in bytes of JSON (an overlay image is the biggest payload). */
export const MAX_MESSAGE_BYTES = 24 * 1024 * 1024;

const projectId = z
  .string()
  .min(1)
  .max(64)
  .regex(/^[A-Za-z0-9_-]+$/, 'may contain only letters, digits, "-" and "_"');

export interface ProjectSummary {
  id: string;
  name: string;
  updatedAt: string;
  supportCount: number;
  /**
   * False when the stored document cannot be opened by this version (written by a newer one,
   * or not valid): it is listed, kept byte for byte, and can be exported (`exportProject`).
   */
  readable: boolean;
  /** Why it cannot be opened (readable false). */
  problem?: string;
}

export interface ImageOverlay {
  projectId: string;
  name: string;
  /** [[south, west], [north, east]] in degrees. */
  bounds: [[number, number], [number, number]];
  /** PNG image as a data: URL, when the image is embedded in the project. */
  pngDataUrl?: string;
  /** The image file and its georeference, when it is referenced (issue 18): the file stays the user's. */
  source?: AerialReference;
}

export interface HostInfo {
  shell: 'electron' | 'browser';
  version: string;
  dataFile: string;
}

export const ImageOverlaySchema = z.object({
  projectId,
  name: z.string().min(1).max(200),
  bounds: z.tuple([
    z.tuple([z.number().min(-90).max(90), z.number().min(-180).max(180)]),
    z.tuple([z.number().min(-90).max(90), z.number().min(-180).max(180)]),
  ]),
  pngDataUrl: z
    .string()
    .max(MAX_MESSAGE_BYTES)
    .regex(/^data:image\/png;base64,[A-Za-z0-9+/=]+$/, 'must be a PNG data URL')
    .optional(),
  source: AerialReferenceSchema.optional(),
});

/** The table of calls. Request schemas validate every message at the host. */
export const API = {
  hostInfo: { request: z.object({}).strict() },
  listProjects: { request: z.object({}).strict() },
  /** Opens the most recently used project, or creates and opens the demo on first start. */
  openInitialProject: { request: z.object({}).strict() },
  openProject: { request: z.object({ id: projectId }).strict() },
  /** Saves the whole document in one transaction; returns the stored timestamp. */
  /**
   * `baseUpdatedAt`: the stored timestamp the edit started from (the last save's, or the list's
   * at opening); when the stored project has changed since, nothing is saved ('conflict').
   */
  saveProject: {
    request: z.object({ project: z.unknown(), baseUpdatedAt: z.string().max(40).optional() }).strict(),
  },
  /** The stored document exactly as kept (also one that cannot be opened), to save as a file. */
  exportProject: { request: z.object({ id: projectId }).strict() },
  createProject: { request: z.object({ name: z.string().trim().min(1).max(200) }).strict() },
  duplicateProject: { request: z.object({ id: projectId }).strict() },
  deleteProject: { request: z.object({ id: projectId }).strict() },
  resetDemoProject: { request: z.object({}).strict() },
  getOverlay: { request: z.object({ projectId }).strict() },
  setOverlay: {
    request: ImageOverlaySchema.strict().refine((o) => o.pngDataUrl !== undefined || o.source !== undefined, {
      message: 'needs the embedded image (pngDataUrl) or a reference to its file (source)',
      path: ['source'],
    }),
  },
  clearOverlay: { request: z.object({ projectId }).strict() },
} as const;

export type ApiName = keyof typeof API;

/** Result type of each call. */
export interface ApiResults {
  hostInfo: HostInfo;
  listProjects: ProjectSummary[];
  openInitialProject: Project;
  openProject: Project;
  saveProject: { updatedAt: string };
  exportProject: { fileName: string; text: string };
  createProject: Project;
  duplicateProject: Project;
  deleteProject: { deleted: true };
  resetDemoProject: Project;
  getOverlay: ImageOverlay | null;
  setOverlay: { saved: true };
  clearOverlay: { cleared: true };
}

export type ApiRequest<K extends ApiName> = z.input<(typeof API)[K]['request']>;

export interface ApiError {
  /** Stable machine-readable code. */
  code:
    | 'invalid-request'
    | 'invalid-project'
    | 'not-found'
    | 'storage'
    | 'too-large'
    | 'internal'
    /** The stored project changed since the edit began (another window): reopen it. */
    | 'conflict'
    /** Another program holds the database's write lock: try again in a moment. */
    | 'busy'
    /** The stored project cannot be opened by this version; it can be exported. */
    | 'unreadable';
  message: string;
  /** Field-level problems, each with a JSON path. */
  fields?: FieldError[];
}

export type ApiResponse<T> = { ok: true; value: T } | { ok: false; error: ApiError };

/** The client shape the renderer sees (the preload bridge and the HTTP client both provide it). */
export type YardwireApi = {
  [K in ApiName]: (request: ApiRequest<K>) => Promise<ApiResponse<ApiResults[K]>>;
};

export const API_NAMES = Object.keys(API) as ApiName[];

/** The IPC channel name for a call (Electron) and the HTTP path (browser mode). */
export const channelOf = (name: ApiName): string => `yardwire:${name}`;
export const httpPathOf = (name: ApiName): string => `/api/${name}`;

export { ProjectSchema };
