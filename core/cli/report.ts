/**
 * `report FILE.json --candidate ID --out report.html | report --demo [--candidate ID] --out FILE`:
 * the station report (build sheet) of one shortlisted candidate as a standalone printable HTML
 * file. Options: --power W (PEP, default 100), --mode ssb|cw|ft8 (default ssb), --on-time 0…1
 * (default 0.5), --units imperial|metric (default: the project's choice), --coax RG-58|RG-8X|RG-213|"low-loss 10 mm foam" (default RG-213), --workers N,
 * --arrays (the plan includes the array types, so an array candidate can be given).
 * Options not given come from the project's station settings (whose defaults are the ones above).
 * The plan is computed for the candidate's band (default candidate: the first of the first band).
 */
import { writeFile as fsWriteFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { startProjectCommand, walkProjectArgs, type ProjectSource } from './projectFile.ts';
import { BANDS, type Band } from '../project/schema.ts';
import { enumeratePlan, memoryCache, planFromSetup } from '../rank/plan.ts';
import { solverEvaluator } from '../rank/solver.ts';
import { COAX_TYPES, isCoaxType, measureTuning, type StationOptions } from '../report/buildSheet.ts';
import { tuningNotMeasured } from '../report/tuning.ts';
import { stationReport } from '../report/stationReport.ts';
import type { UnitSystem } from '../units/index.ts';
import type { Mode } from '../report/exposure.ts';
import { createWorkerPool, evaluateOnPool, warmPool } from './plan.ts';
import { isOnTimeFraction, isPowerW, MAX_POWER_W } from '../project/station.ts';

export interface ReportIo {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
  readFile: (path: string) => Promise<string>;
  /** Defaults to node:fs. */
  writeFile?: (path: string, data: string) => Promise<void>;
}

const MODES = ['ssb', 'cw', 'ft8'] as const;
const USAGE = `usage: report (FILE.json | --demo) [--candidate ID] --out FILE.html [--units imperial|metric] [--power W] [--mode ${MODES.join('|')}] [--on-time 0..1] [--coax ${COAX_TYPES.join('|')}] [--workers N] [--arrays]\n`;

interface Args extends ProjectSource {
  candidate: string | null;
  out: string | null;
  /** Only what the command line gave; the rest comes from the project's station settings. */
  station: Partial<StationOptions>;
  workers: number;
  /** Null: the project's choice. */
  units: UnitSystem | null;
  arrays: boolean;
}

function parseArgs(argv: string[]): Args | string {
  const a: Omit<Args, keyof ProjectSource> = {
    candidate: null,
    out: null,
    station: {},
    workers: availableParallelism(),
    units: null,
    arrays: false,
  };
  const source = walkProjectArgs(argv, (v, next) => {
    if (v === '--arrays') a.arrays = true;
    else if (v === '--candidate' || v === '--out') {
      const s = next();
      if (!s) return `${v} needs a value`;
      if (v === '--candidate') a.candidate = s;
      else a.out = s;
    } else if (v === '--power') {
      const n = Number(next());
      if (!isPowerW(n)) return `--power needs watts between 0 and ${MAX_POWER_W}`;
      a.station.powerW = n;
    } else if (v === '--mode') {
      const m = next();
      if (!m || !(MODES as readonly string[]).includes(m)) return `--mode needs one of ${MODES.join(', ')}`;
      a.station.mode = m as Mode;
    } else if (v === '--on-time') {
      const n = Number(next());
      if (!isOnTimeFraction(n)) return '--on-time needs a fraction from 0 to 1';
      a.station.onTimeFraction = n;
    } else if (v === '--coax') {
      const c = next();
      if (!c || !isCoaxType(c)) return `--coax needs one of ${COAX_TYPES.join(', ')}`;
      a.station.coax = c;
    } else if (v === '--units') {
      const u = next();
      if (u !== 'imperial' && u !== 'metric') return '--units needs imperial or metric';
      a.units = u;
    } else if (v === '--workers') {
      const n = Number(next());
      if (!Number.isInteger(n) || n < 0) return '--workers needs a whole number';
      a.workers = n;
    } else return false;
    return true;
  });
  if (typeof source === 'string') return source;
  if (!a.out) return '--out FILE.html is required';
  return { ...a, ...source };
}

export async function runReport(argv: string[], io: ReportIo): Promise<number> {
  const start = await startProjectCommand(argv, parseArgs, USAGE, io);
  if (typeof start === 'number') return start;
  const { args, project } = start;
  const wanted = args.candidate;
  const bandOf = wanted ? (BANDS as readonly string[]).find((b) => wanted.startsWith(`${b}-`)) : undefined;
  if (wanted && !bandOf) {
    io.stderr(`no candidate "${wanted}": ids start with the band (${BANDS.join(', ')})\n`);
    return 1;
  }
  const band = (bandOf ?? project.bands[0]) as Band | undefined;
  if (!band) {
    io.stderr('the project has no bands to plan\n');
    return 1;
  }
  // The workers start and build the ground's tables while this thread enumerates (as plan does).
  const pool = args.workers > 0 ? createWorkerPool(args.workers) : null;
  if (pool) warmPool(pool, project, [band]);
  const cache = memoryCache();
  let setup: ReturnType<typeof enumeratePlan>;
  try {
    setup = enumeratePlan(project, { bands: [band], ...(args.arrays ? { arrays: true } : {}) });
    io.stderr(`report: planning ${band} (${setup.jobs.length} designs)\n`);
    if (pool) await evaluateOnPool(pool, setup, project, cache, 10);
  } finally {
    await pool?.close();
  }
  const shortlist = planFromSetup(setup, project, { evaluator: solverEvaluator, cache });
  const candidate = wanted ? shortlist.candidates.find((c) => c.id === wanted) : shortlist.candidates[0];
  if (!candidate) {
    io.stderr(
      wanted
        ? `no candidate "${wanted}" in the shortlist; candidates: ${shortlist.candidates.map((c) => c.id).join(', ')}\n`
        : 'the shortlist is empty: nothing fits the lot\n',
    );
    return 1;
  }
  // The candidate carries its design: the tuning rate is measured on it, nothing is found again.
  // A switched pair keeps each antenna's own trim: no rate of its own (the app says the same).
  const none = tuningNotMeasured(candidate.design);
  io.stderr(
    none
      ? `report: no tuning rate for ${candidate.id}: ${none}\n`
      : `report: measuring the tuning rate of ${candidate.id}\n`,
  );
  const tuning = none
    ? null
    : measureTuning(candidate.design, candidate.trim.valueM, project.soil, solverEvaluator);
  const { html } = stationReport({
    project,
    shortlist,
    candidate,
    station: args.station,
    units: args.units ?? project.settings.units,
    tuning,
    generatedAt: new Date().toISOString().slice(0, 10),
  });
  const write = io.writeFile ?? ((p: string, d: string) => fsWriteFile(p, d, 'utf8'));
  await write(args.out as string, html);
  io.stdout(`report: ${candidate.id} → ${args.out}\n`);
  return 0;
}
