/**
 * The command-line entry (`npm run -s cli -- <command> …`). The only part of core/ that may use
 * node:*; each command is a function of (argv, io) → exit code, so tests call it directly.
 */
import { runSite } from './site.ts';
import { readTextFile } from './text.ts';
import { runPlan } from './plan.ts';
import { runEvaluate } from './evaluate.ts';
import { runReport } from './report.ts';

export interface CliIo {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
  readFile: (path: string) => Promise<string>;
}

type Command = (argv: string[], io: CliIo) => Promise<number>;

const COMMANDS: Record<string, { run: Command; summary: string }> = {
  evaluate: {
    run: runEvaluate,
    summary: 'evaluate FILE.json   field-solver result for one antenna (core/em/README.md)',
  },
  plan: {
    run: runPlan,
    summary: 'plan --demo | plan FILE.json [--json] [--band B] [--top N]   rank antennas for the lot',
  },
  report: {
    run: runReport,
    summary: 'report --demo | report FILE.json [--candidate ID] --out FILE.html   build sheet',
  },
  site: {
    run: runSite,
    summary: 'site --demo --json | site FILE.json   print the demo project, or validate a project file',
  },
};

export const USAGE = `Usage: npm run -s cli -- <command> [options]

Commands:
${Object.values(COMMANDS)
  .map((c) => `  ${c.summary}`)
  .join('\n')}
`;

export async function runCli(argv: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.stdout(USAGE);
    return name === undefined ? 2 : 0;
  }
  const cmd = COMMANDS[name];
  if (!cmd) {
    io.stderr(`unknown command "${name}"\n${USAGE}`);
    return 2;
  }
  return cmd.run(rest, io);
}

/** Runs the command in process.argv with the process's streams; sets the exit code. */
export function runFromArgv(): void {
  const io: CliIo = {
    stdout: (s) => process.stdout.write(s),
    stderr: (s) => process.stderr.write(s),
    readFile: readTextFile,
  };
  runCli(process.argv.slice(2), io).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`yardwire: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    },
  );
}

const isEntry =
  process.argv[1] !== undefined && import.meta.url.endsWith(process.argv[1].replace(/\\/g, '/'));
if (isEntry) runFromArgv();
