/**
 * Start-up failures of the desktop shell, said the way browser mode says them
 * (server/startup.ts): one line that says what to change, on stderr and in a dialog, never a
 * stack trace; then the app exits with code 2.
 */
import { startupMessage } from './server/startup.ts';

/** Where the desktop shell keeps its database: YARDWIRE_DATA_DIR when set, else Electron's userData folder. */
export function desktopDataDir(env: NodeJS.ProcessEnv, userDataDir: string): string {
  return env.YARDWIRE_DATA_DIR || userDataDir;
}

export interface StartFailureDeps {
  env: NodeJS.ProcessEnv;
  /** The data folder in use. */
  dataDir: string;
  stderr: (line: string) => void;
  showErrorBox: (title: string, content: string) => void;
  exit: (code: number) => void;
}

export const START_FAILURE_TITLE = 'Yardwire cannot start';

/** Report a start-up failure in one line and exit with code 2. */
export function failStartup(e: unknown, deps: StartFailureDeps): void {
  const line = startupMessage(e, deps.env, deps.dataDir).split('\n')[0];
  deps.stderr(`${START_FAILURE_TITLE}: ${line}\n`);
  deps.showErrorBox(START_FAILURE_TITLE, line);
  deps.exit(2);
}
