/**
 * Start-up problems of browser mode (and the desktop shell) as one line that says what to change:
 * a port in use or out of range, a data folder that is a file or cannot be written.
 */
import { defaultDataDir } from './dataDir.ts';

/**
 * Startup problems the user can fix, as one line saying what to change (no stack trace). `dir` is
 * the data folder in use (browser mode's unless the desktop shell gives its own).
 */
export function startupMessage(
  e: unknown,
  env: NodeJS.ProcessEnv = process.env,
  dir: string = defaultDataDir(env),
): string {
  const err = e as NodeJS.ErrnoException & { port?: number };
  if (err?.code === 'EADDRINUSE')
    return `port ${err.port ?? env.YARDWIRE_PORT ?? 5719} is already in use (another Yardwire or another program): set YARDWIRE_PORT to another port, or to 0 for any free one`;
  if (err?.code === 'EACCES' && err.syscall === 'listen')
    return `port ${err.port ?? env.YARDWIRE_PORT} needs privileges: set YARDWIRE_PORT to a port above 1023, or to 0`;
  if (err?.code === 'ENOTDIR' || err?.code === 'EEXIST')
    return `the data folder ${dir} (YARDWIRE_DATA_DIR) is a file, not a folder: point YARDWIRE_DATA_DIR at a folder`;
  if (err?.code === 'EACCES' || err?.code === 'EROFS' || err?.code === 'EPERM')
    return `cannot write in the data folder ${dir} (${err.code}): point YARDWIRE_DATA_DIR at a folder you can write to`;
  return e instanceof Error ? e.message : String(e);
}

/** YARDWIRE_PORT as a port number, or the reason it is not one. */
export function portFromEnv(v: string | undefined): number | string {
  if (v === undefined || v === '') return 5719;
  if (!/^\d+$/.test(v.trim()) || Number(v) > 65535)
    return `YARDWIRE_PORT must be a whole number from 0 to 65535 (0: any free port); it is "${v.slice(0, 40)}"`;
  return Number(v);
}
