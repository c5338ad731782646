/**
 * `evaluate FILE.json`: read an antenna description (core/em/README.md), run the field solver,
 * print the result as JSON on stdout. Errors: a JSON `{ "error": … }` on stdout, a plain line on
 * stderr, and exit code 1 (bad input or a model that cannot be built) or 2 (usage).
 */
import { pathToFileURL } from 'node:url';
import { evaluateAntenna, type EvaluationResult } from '../em/evaluate.ts';
import { ModelError } from '../em/errors.ts';
import { parseAntennaInput } from '../em/input.ts';
import { checkWork } from '../em/limits.ts';
import { hzToMhz } from '../units/index.ts';
import { readTextFile } from './text.ts';

export interface EvaluateIo {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
  readFile: (path: string) => Promise<string>;
}

const USAGE = 'usage: evaluate FILE.json   (antenna description, see core/em/README.md)\n';

/** Round to 6 significant digits for output; refuses non-finite numbers. */
function tidy(v: number): number {
  if (!Number.isFinite(v)) throw new Error('internal error: a non-finite number reached the output');
  if (v === 0) return 0;
  return Number(v.toPrecision(6));
}

function tidyDeep(x: unknown): unknown {
  if (typeof x === 'number') return tidy(x);
  if (Array.isArray(x)) return x.map(tidyDeep);
  if (x && typeof x === 'object')
    return Object.fromEntries(Object.entries(x).map(([k, v]) => [k, tidyDeep(v)]));
  return x;
}

export function formatEvaluation(r: EvaluationResult): unknown {
  return tidyDeep({
    unknowns: r.unknowns,
    segments: r.segments,
    groundModel: r.groundModel,
    frequencies: r.frequencies.map((f) => ({
      frequencyMHz: hzToMhz(f.frequencyHz),
      feeds: f.feeds.map((fd) => ({
        wire: fd.wire,
        position: fd.position,
        impedanceOhm: fd.impedanceOhm,
        swr: fd.swr,
      })),
      inputPowerW: f.inputPowerW,
      radiatedPowerW: f.radiatedPowerW,
      conductorLossW: f.conductorLossW,
      loadLossW: f.loadLossW,
      groundLossW: f.groundLossW,
      ...(f.groundAbsorbedW !== null
        ? { groundAbsorbedW: f.groundAbsorbedW, powerBalanceError: f.powerBalanceError }
        : {}),
      groundSystems: f.groundSystems,
      efficiency: f.efficiency,
      averageGain: f.averageGain,
      averageGainDb: f.averageGainDb,
      peak: f.peak,
      pattern: f.pattern,
    })),
    diagnostics: r.diagnostics,
  });
}

function fail(
  io: EvaluateIo,
  field: string,
  message: string,
  all?: { field: string; message: string }[],
): number {
  io.stdout(
    JSON.stringify({ error: { field, message, ...(all && all.length > 1 ? { all } : {}) } }, null, 2) + '\n',
  );
  io.stderr(`evaluate: ${field ? `${field}: ` : ''}${message}\n`);
  return 1;
}

export async function runEvaluate(argv: string[], io: EvaluateIo): Promise<number> {
  const files = argv.filter((a) => !a.startsWith('--'));
  if (files.length !== 1 || argv.includes('--help')) {
    io.stderr(USAGE);
    return 2;
  }
  let text: string;
  try {
    text = await io.readFile(files[0]);
  } catch (e) {
    return fail(io, '', `cannot read ${files[0]}: ${e instanceof Error ? e.message : String(e)}`);
  }
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    return fail(io, '', `not valid JSON: ${e instanceof Error ? e.message : String(e)}`);
  }
  const parsed = parseAntennaInput(doc);
  if (!parsed.ok) return fail(io, parsed.errors[0].field, parsed.errors[0].message, parsed.errors);
  const over = checkWork(parsed.model, parsed.options);
  if (over.length) return fail(io, over[0].field, over[0].message, over);
  try {
    const result = evaluateAntenna(parsed.model, parsed.options);
    io.stdout(JSON.stringify(formatEvaluation(result), null, 2) + '\n');
    return 0;
  } catch (e) {
    if (e instanceof ModelError)
      return fail(
        io,
        e.field,
        e.message.startsWith(`${e.field}: `) ? e.message.slice(e.field.length + 2) : e.message,
      );
    // Not a model error: still one JSON line and no stack trace; say what to send with a report.
    return fail(
      io,
      '',
      `internal error while solving (${e instanceof Error ? e.message : String(e)}); please report it with the input file`,
    );
  }
}

const entry = process.argv[1];
if (entry !== undefined && import.meta.url === pathToFileURL(entry).href) {
  runEvaluate(process.argv.slice(2), {
    stdout: (s) => process.stdout.write(s),
    stderr: (s) => process.stderr.write(s),
    readFile: readTextFile,
  }).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`evaluate: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    },
  );
}
