/**
 * Where browser mode keeps its database: YARDWIRE_DATA_DIR if set, otherwise the platform's
 * per-user data folder (XDG_DATA_HOME or ~/.local/share on Linux, ~/Library/Application Support
 * on macOS, %APPDATA% on Windows), in a `Yardwire` subfolder. The Electron shell uses
 * YARDWIRE_DATA_DIR too, otherwise its userData folder (electron/startFailure.ts desktopDataDir).
 */
import { mkdirSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';

export const DATABASE_FILE_NAME = 'yardwire.sqlite';

export function defaultDataDir(env: NodeJS.ProcessEnv = process.env, platform = process.platform): string {
  if (env.YARDWIRE_DATA_DIR) return env.YARDWIRE_DATA_DIR;
  if (platform === 'win32') return join(env.APPDATA ?? join(homedir(), 'AppData', 'Roaming'), 'Yardwire');
  if (platform === 'darwin') return join(homedir(), 'Library', 'Application Support', 'Yardwire');
  return join(env.XDG_DATA_HOME ?? join(homedir(), '.local', 'share'), 'Yardwire');
}

export function databasePath(dir: string): string {
  mkdirSync(dir, { recursive: true });
  return join(dir, DATABASE_FILE_NAME);
}
