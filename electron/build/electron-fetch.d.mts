// Types of electron-fetch.mjs (a plain Node script, run by `npm start` without a compiler).
export const ROOT: string;
export const DEFAULT_FETCH_TIMEOUT_S: number;
export const RETRY_AFTER_MS: number;
export const MARKER_FILE: string;

export type FetchResult = { ok: true } | { ok: false; reason: string };
export type Shell =
  { shell: 'electron'; bin: string; fetched: boolean } | { shell: 'browser'; reason: string };

export function findElectronBinary(): string | null;
export function fetchElectronBinary(options?: {
  timeoutMs?: number;
  log?: (line: string) => void;
  spawnFn?: typeof import('node:child_process').spawn;
}): Promise<FetchResult>;
export function chooseShell(deps?: {
  env?: Record<string, string | undefined>;
  findBinary?: () => string | null;
  fetchBinary?: (o: { timeoutMs: number; log: (line: string) => void }) => Promise<FetchResult>;
  markerFile?: string;
  now?: () => number;
  log?: (line: string) => void;
}): Promise<Shell>;
