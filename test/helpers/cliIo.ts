/**
 * An in-memory stand-in for the command line's input and output: what it printed, what it wrote,
 * and the files it may read (`files` by path; with `disk`, other paths are read from disk).
 */
import { readFile } from 'node:fs/promises';

export function cliIo(files: Record<string, string> = {}, opts: { disk?: boolean } = {}) {
  const out: string[] = [];
  const err: string[] = [];
  const written: Record<string, string> = {};
  return {
    out,
    err,
    written,
    io: {
      stdout: (s: string) => out.push(s),
      stderr: (s: string) => err.push(s),
      readFile: async (p: string) => {
        if (p in files) return files[p];
        if (opts.disk) return readFile(p, 'utf8');
        throw new Error('ENOENT: no such file');
      },
      writeFile: async (p: string, d: string) => {
        written[p] = d;
      },
    },
  };
}
