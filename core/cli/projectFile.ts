/** Reading the project a command works on: a JSON file (checked against the schema) or the demo lot. */
import { buildDemoProject } from '../demo/demoProject.ts';
import { parseProject, type Project } from '../project/schema.ts';

interface ReadIo {
  stderr: (s: string) => void;
  readFile: (path: string) => Promise<string>;
}

const reason = (e: unknown): string => (e instanceof Error ? e.message : String(e));

/**
 * The parsed JSON of `file`, or undefined after writing to stderr why not (the file cannot be read,
 * or it is not valid JSON), the file's name first.
 */
export async function readJsonFile(file: string, io: ReadIo): Promise<{ doc: unknown } | undefined> {
  let text: string;
  try {
    text = await io.readFile(file);
  } catch (e) {
    io.stderr(`${file}: cannot read the file (${reason(e)})\n`);
    return undefined;
  }
  try {
    return { doc: JSON.parse(text) };
  } catch (e) {
    io.stderr(`${file}: not valid JSON (${reason(e)})\n`);
    return undefined;
  }
}

/** The demo project, or the project in `file`; null after writing each problem to stderr (with its JSON path). */
export async function loadProject(args: ProjectSource, io: ReadIo): Promise<Project | null> {
  if (args.demo) return buildDemoProject();
  const file = args.file as string;
  const read = await readJsonFile(file, io);
  if (!read) return null;
  const parsed = parseProject(read.doc);
  if (!parsed.ok) {
    for (const e of parsed.errors) io.stderr(`${file}: ${e.path}: ${e.message}\n`);
    return null;
  }
  return parsed.value;
}

/** Where a command's project comes from: the demo lot or a file. */
export interface ProjectSource {
  file: string | null;
  demo: boolean;
}

/**
 * Walk a project command's arguments: --demo and the one project file here, every other option
 * through `option`, which reads its value with `next` and returns an error in words, true when it
 * took the option or false when it does not know it. The project's source, or the first error.
 */
export function walkProjectArgs(
  argv: readonly string[],
  option: (v: string, next: () => string | undefined) => string | boolean,
): ProjectSource | string {
  const a: ProjectSource = { file: null, demo: false };
  for (let i = 0; i < argv.length; i++) {
    const v = argv[i];
    if (v === '--demo') a.demo = true;
    else if (v.startsWith('--')) {
      const took = option(v, () => argv[++i]);
      if (typeof took === 'string') return took;
      if (!took) return `unknown option ${v}`;
    } else if (a.file === null) a.file = v;
    else return 'give one project file';
  }
  return a.demo === (a.file !== null) ? 'give a project file or --demo' : a;
}

/**
 * The start of a project command: its arguments parsed by `parse` and its project loaded; or the
 * exit code after writing why not (2: a usage error, followed by `usage`; 1: no project).
 */
export async function startProjectCommand<A extends ProjectSource>(
  argv: string[],
  parse: (argv: string[]) => A | string,
  usage: string,
  io: ReadIo,
): Promise<{ args: A; project: Project } | number> {
  const args = parse(argv);
  if (typeof args === 'string') {
    io.stderr(`${args}\n${usage}`);
    return 2;
  }
  const project = await loadProject(args, io);
  return project ? { args, project } : 1;
}
