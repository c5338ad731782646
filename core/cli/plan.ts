/**
 * `plan FILE.json | plan --demo`: the ranked shortlist of antennas for a lot.
 *
 * Options: --json (machine-readable, schema in core/rank/README.md), --band 160m|80m|40m (repeatable;
 * default the project's bands), --top N (placements per band, default 10), --workers N (default and
 * most: the machine's cores; 0 evaluates in this thread), --patterns (include canonical patterns in JSON),
 * --arrays (also plan the array types; slower).
 * A progress line goes to stderr while designs are evaluated.
 */
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { freshBundle, ROOT } from './bundle.mjs';
import { Worker } from 'node:worker_threads';
import { buildDemoProject } from '../demo/demoProject.ts';
import type { EvaluationRecord } from '../rank/evaluate.ts';
import {
  conductorJobs,
  soilRangeJobs,
  enumeratePlan,
  memoryCache,
  planFromSetup,
  PLAN_BOUNDS,
  soilRangeOf,
  type EvaluationCache,
  type PlanCut,
  type Job,
  type Shortlist,
  type Candidate,
} from '../rank/plan.ts';
import { solverEvaluator } from '../rank/solver.ts';
import { SWEEP_FRACTION } from '../rank/evaluate.ts';
import type { EvalGround } from '../rank/evaluator.ts';
import { bandPlan } from '../antennas/common.ts';
import type { WarmMessage } from './plan-worker.ts';
import { candidateMatching } from '../match/candidateMatch.ts';
import { efficiencySummary } from '../rank/lossSplit.ts';
import { BANDS, parseProject, type Band, type Project } from '../project/schema.ts';

export interface PlanIo {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
  readFile: (path: string) => Promise<string>;
}

const USAGE =
  'usage: plan (FILE.json | --demo) [--json] [--band 160m|80m|40m]... [--top N] [--workers N] [--patterns] [--arrays]\n';

interface Args {
  file: string | null;
  demo: boolean;
  json: boolean;
  patterns: boolean;
  arrays: boolean;
  bands: Band[];
  top: number;
  workers: number;
}

function parseArgs(argv: string[]): Args | string {
  const a: Args = {
    file: null,
    demo: false,
    json: false,
    patterns: false,
    arrays: false,
    bands: [],
    top: 10,
    workers: availableParallelism(),
  };
  for (let i = 0; i < argv.length; i++) {
    const v = argv[i];
    const next = (): string | undefined => argv[++i];
    if (v === '--demo') a.demo = true;
    else if (v === '--json') a.json = true;
    else if (v === '--patterns') a.patterns = true;
    else if (v === '--arrays') a.arrays = true;
    else if (v === '--band') {
      const b = next();
      if (!b || !(BANDS as readonly string[]).includes(b)) return `--band needs one of ${BANDS.join(', ')}`;
      a.bands.push(b as Band);
    } else if (v === '--top' || v === '--workers') {
      const n = Number(next());
      if (!Number.isInteger(n) || n < (v === '--top' ? 1 : 0)) return `${v} needs a whole number`;
      if (v === '--top') a.top = n;
      else a.workers = Math.min(n, availableParallelism());
    } else if (v.startsWith('--')) return `unknown option ${v}`;
    else if (a.file === null) a.file = v;
    else return 'give one project file';
  }
  if (a.demo === (a.file !== null)) return 'give a project file or --demo';
  return a;
}

async function loadProject(args: Args, io: PlanIo): Promise<Project | null> {
  if (args.demo) return buildDemoProject();
  const file = args.file as string;
  let doc: unknown;
  try {
    doc = JSON.parse(await io.readFile(file));
  } catch (e) {
    io.stderr(
      `${file}: ${e instanceof SyntaxError ? 'not valid JSON' : 'cannot read the file'} (${e instanceof Error ? e.message : String(e)})\n`,
    );
    return null;
  }
  const parsed = parseProject(doc);
  if (!parsed.ok) {
    for (const e of parsed.errors) io.stderr(`${file}: ${e.path}: ${e.message}\n`);
    return null;
  }
  return parsed.value;
}

/** Where the worker bundle is kept between runs (git-ignored). */
const BUNDLE_DIR = join(ROOT, '.cache', 'plan-worker');
const WORKER_SOURCE = join(ROOT, 'core', 'cli', 'plan-worker.ts');

let bundlePath: string | null | undefined;

/**
 * The worker as one plain ES module (bundle.mjs: bundled with esbuild at first use and rebuilt
 * when any of its inputs changes), so that a worker starts without a TypeScript loader. Null when
 * esbuild is not available; the caller then falls back to the loader.
 */
export function workerBundle(dir = BUNDLE_DIR): string | null {
  if (bundlePath !== undefined && dir === BUNDLE_DIR) return bundlePath;
  const out = freshBundle('core/cli/plan-worker.ts', dir, 'plan-worker');
  if (dir === BUNDLE_DIR) bundlePath = out;
  return out;
}

/**
 * Start one planning worker: from the bundle when there is one; otherwise through tsx's loader
 * (Node 20 workers cannot load .ts files, and a loader given in a worker's execArgv is not
 * applied there, so the worker registers it itself before it imports the worker module).
 */
function startWorker(): Worker {
  const bundle = workerBundle();
  if (bundle) return new Worker(bundle);
  const api = import.meta.resolve('tsx/esm/api');
  const entry = pathToFileURL(WORKER_SOURCE).href;
  const boot = `import(${JSON.stringify(api)}).then((m) => { m.register(); return import(${JSON.stringify(entry)}); });`;
  return new Worker(boot, { eval: true });
}

/** A set of planning workers that stays up between plans (for re-plans after an edit). */
export interface WorkerPool {
  readonly size: number;
  /** Evaluate the jobs missing from the cache (dynamic queue, costly designs first), filling it. */
  evaluate(
    jobs: readonly Job[],
    cache: EvaluationCache,
    onDone?: (done: number, total: number) => void,
  ): Promise<number>;
  /** Each worker builds the ground's tables for these frequencies now, before any job (no answer). */
  warm(ground: EvalGround, frequenciesHz: number[]): void;
  close(): Promise<void>;
}

export function createWorkerPool(size: number): WorkerPool {
  const workers = Array.from({ length: Math.max(1, size) }, startWorker);
  return {
    size: workers.length,
    async evaluate(jobs, cache, onDone) {
      // Designs with a radial system cost the solver several times more (the ground-loss
      // integral): start them first so that no worker is left with a long one at the end.
      const todo = jobs
        .filter((j) => !cache.has(j.key))
        .sort(
          (a, b) => Number('radialLengthsM' in b.design.params) - Number('radialLengthsM' in a.design.params),
        );
      if (todo.length === 0) return 0;
      let next = 0;
      let done = 0;
      const errors: string[] = [];
      await Promise.all(
        workers.map(
          (w) =>
            new Promise<void>((resolve, reject) => {
              const feed = (): void => {
                if (next < todo.length) w.postMessage(todo[next++]);
                else {
                  w.off('message', onMessage);
                  w.off('error', reject);
                  resolve();
                }
              };
              const onMessage = (m: { key: string; record?: EvaluationRecord; error?: string }): void => {
                if (m.record) cache.set(m.key, m.record);
                else errors.push(m.error ?? 'unknown error');
                done++;
                onDone?.(done, todo.length);
                feed();
              };
              w.on('message', onMessage);
              w.on('error', reject);
              feed();
            }),
        ),
      );
      if (errors.length) throw new Error(`the solver failed on ${errors.length} design(s): ${errors[0]}`);
      return todo.length;
    },
    warm(ground, frequenciesHz) {
      const msg: WarmMessage = { warm: { ground, frequenciesHz } };
      for (const w of workers) w.postMessage(msg);
    },
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}

const f1 = (v: number): string => v.toFixed(1);
const f2 = (v: number): string => v.toFixed(2);

function describe(c: Candidate): string {
  const lines: string[] = [];
  lines.push(
    `#${c.rank} ${c.band} ${c.typeLabel.toLowerCase()}: ${c.where}${c.bestOfType && c.rank > 1 ? ' (best of its type)' : ''}`,
  );
  lines.push(
    `    score ${f2(c.score)} dBi   peak ${f1(c.peak.gainDbi)} dBi at ${f1(c.peak.elevationDeg)}° elevation, ${f1(c.peak.azimuthDeg)}°`,
  );
  if (c.broadsideDeg.length)
    lines.push(`    broadside ${c.broadsideDeg.map((b) => `${f1(b)}°`).join(' / ')}`);
  lines.push(
    `    supports: ${c.supports.map((s) => `${s.name} (${f1(s.usableHeightM)} m)`).join(', ') || 'none (self-supporting)'}`,
  );
  lines.push(`    heights: ${c.heights.map((h) => `${h.label} ${f2(h.heightM)} m`).join(', ')}`);
  for (const r of c.regions) {
    lines.push(
      `    ${r.name.padEnd(26)} ${f1(r.gainDbi).padStart(6)} dBi  bearing ${f1(r.bearingDeg.from)}–${f1(r.bearingDeg.to)}°, ` +
        `${r.distanceKm.min.toFixed(0)}–${r.distanceKm.max.toFixed(0)} km, take-off median ${f1(r.takeoff.medianDeg)}° (10–90 %: ${f1(r.takeoff.p10Deg)}–${f1(r.takeoff.p90Deg)}°${r.takeoff.model === 'user-window' ? ', own window' : ''})`,
    );
  }
  const sr = c.soilRange;
  if (sr.scores.length > 1)
    lines.push(
      `    over the soil range: ${sr.scores.map((x) => `${x.soil} ${f2(x.scoreDbi)} dBi (#${x.rank})`).join(', ')}` +
        (sr.rankHolds ? '; the rank holds' : '; the rank does not hold'),
    );
  if (c.conductingSupports.length)
    lines.push(
      `    metal supports in the model: ${c.conductingSupports.map((m) => `${m.name} (${f1(m.heightM)} m, ${m.grounded ? 'grounded' : 'not grounded'})`).join(', ')}`,
    );
  const [r, x] = c.feed.zOhm;
  lines.push(
    `    feed ${f1(r)} ${x < 0 ? '−' : '+'} j${f1(Math.abs(x))} Ω at ${c.feed.freqMHz.toFixed(3)} MHz, SWR ${f2(c.feed.swr)} on ${c.feed.z0Ohm} Ω`,
  );
  const bw = c.bandwidth2to1;
  lines.push(
    `    2:1 SWR ${bw.widthKHz > 0 ? `${bw.lowMHz?.toFixed(3) ?? '?'}–${bw.highMHz?.toFixed(3) ?? '?'} MHz (${bw.widthKHz.toFixed(0)} kHz)` : 'none'}: ${bw.note}`,
  );
  const e = c.efficiency;
  lines.push(`    efficiency ${f1(e.percent)} % radiated (${efficiencySummary(e)})`);
  lines.push(
    `    trim: ${c.trim.dimension} ${f2(c.trim.valueM)} m${c.trim.resonant ? ' (resonant)' : ' (not resonant: lowest SWR kept)'}`,
  );
  lines.push(
    `    cut list: ${c.cutList.map((i) => `${i.count} × ${i.label} ${f2(i.lengthM)} m (cut ${f2(i.cutLengthM)} m)`).join('; ')}`,
  );
  lines.push(`    fits: ${c.fits.join('; ')}`);
  if (c.variants > 1) lines.push(`    (best of ${c.variants} orientations that fit)`);
  for (const d of c.diagnostics) lines.push(`    note: ${d}`);
  return lines.join('\n');
}

/** A bound of the enumeration that left placements out, in words. */
export function cutText(c: PlanCut): string {
  const from =
    c.supportsUsed < c.supportsTotal
      ? ` from the ${c.supportsUsed} most promising of ${c.supportsTotal} supports`
      : '';
  return (
    `${c.band} ${c.type}: considered ${c.considered} of ${c.proposed} placements${from}, ` +
    `${c.designs} designs evaluated (at most ${PLAN_BOUNDS.placements} placements and ${PLAN_BOUNDS.designs} designs per type; most promising first: the longest radial field, the highest wires, then facing the targets)`
  );
}

function humanReport(project: Project, s: Shortlist, seconds: number): string {
  const out: string[] = [];
  out.push(
    `${project.name} — ${s.candidates.length} placements shortlisted, ${s.rejected.length} rejected (${seconds.toFixed(1)} s)`,
  );
  for (const c of s.stats.cuts) out.push(`  ${cutText(c)}`);
  for (const p of s.paths) {
    out.push(
      `  target ${p.name} (weight ${p.weight}): bearing ${f1(p.bearingDeg.from)}–${f1(p.bearingDeg.to)}°, ` +
        `${p.distanceKm.min.toFixed(0)}–${p.distanceKm.max.toFixed(0)} km, fewest-hop elevation ${f1(p.elevationWindowDeg.min)}–${f1(p.elevationWindowDeg.max)}°`,
    );
    for (const [band, t] of Object.entries(p.takeoffByBand))
      out.push(
        `    take-off on ${band} (${t.model}): median ${f1(t.medianDeg)}°, 10–90 % ${f1(t.p10Deg)}–${f1(t.p90Deg)}°`,
      );
  }
  out.push('');
  for (const c of s.candidates) out.push(describe(c), '');
  out.push('Rejected:');
  for (const r of s.rejected) out.push(`  ${r.band} ${r.type} ${r.where}: ${r.reasons.join('; ')}`);
  return out.join('\n') + '\n';
}

/** A candidate's designed match for the JSON (core/match), or nothing when its SWR needs none. */
function matchingJson(c: Candidate): { matching?: object } {
  const m = candidateMatching(c);
  if (!m) return {};
  return {
    matching: {
      network: m.network,
      components: m.components,
      lossDb: m.lossDb,
      q: m.q,
      ...(m.vertical ? { vertical: m.vertical } : {}),
    },
  };
}

/**
 * The shortlist as `plan --json` prints it (core/rank/README.md): each candidate as the planner
 * made it, with its cautions as plain strings ("Title: text") and its feed points in the site
 * frame and as [lon, lat]; the canonical patterns only when asked for.
 */
export function shortlistJson(shortlist: Shortlist, withPatterns: boolean): object {
  const { patterns, candidates, ...rest } = shortlist;
  const out = {
    ...rest,
    candidates: candidates.map((c) => ({
      ...c,
      cautions: c.cautions.map((k) => `${k.title}: ${k.text}`),
      feedPoints: c.feedPoints.map((f) => ({ xyz: f.xyz, lonLat: f.lonLat })),
      ...matchingJson(c),
    })),
  };
  return withPatterns ? { ...out, patterns } : out;
}

export async function runPlan(argv: string[], io: PlanIo): Promise<number> {
  const args = parseArgs(argv);
  if (typeof args === 'string') {
    io.stderr(`${args}\n${USAGE}`);
    return 2;
  }
  const project = await loadProject(args, io);
  if (!project) return 1;
  const t0 = performance.now();
  const bands = args.bands.length ? args.bands : project.bands;
  // Workers start (load the solver) while this thread enumerates the proposals.
  const pool = args.workers > 0 ? createWorkerPool(args.workers) : null;
  if (pool) {
    // While this thread enumerates, the workers build the ground's tables every evaluation reuses:
    // the design frequency and the bandwidth points of each band, and the soil range at f0.
    const f0s = bands.map((b) => bandPlan(b, project.settings.operating?.[b]).designFreqHz);
    pool.warm(
      project.soil,
      f0s.flatMap((f0) => [f0, f0 * (1 - SWEEP_FRACTION), f0 * (1 + SWEEP_FRACTION)]),
    );
    for (const soilId of soilRangeOf(project)) pool.warm({ classId: soilId }, f0s);
  }
  let setup: ReturnType<typeof enumeratePlan>;
  try {
    // Say something from the start: enumeration of a lot with many supports takes seconds.
    io.stderr(
      `plan: placing ${project.supports.length} supports' antennas for ${bands.join(', ')} (enumerating)\n`,
    );
    setup = enumeratePlan(project, { bands, arrays: args.arrays });
    for (const c of setup.cuts) io.stderr(`plan: ${cutText(c)}\n`);
  } catch (e) {
    await pool?.close();
    throw e;
  }
  const cache = memoryCache();
  let lastPct = -1;
  const progress = (done: number, total: number): void => {
    const pct = Math.floor((100 * done) / total / 10) * 10;
    if (pct !== lastPct || done === total) {
      lastPct = pct;
      io.stderr(
        `plan: evaluated ${done}/${total} designs (${((performance.now() - t0) / 1000).toFixed(1)} s)\n`,
      );
    }
  };
  io.stderr(
    `plan: ${setup.jobs.length} designs to evaluate${pool ? ` on ${Math.min(pool.size, setup.jobs.length)} worker threads` : ''}\n`,
  );
  if (pool) {
    try {
      await pool.evaluate(setup.jobs, cache, progress);
      // Step 2: the best orientation of each placement near a metal support, with the support.
      const second = conductorJobs(setup, cache, project);
      if (second.length) {
        io.stderr(`plan: ${second.length} placements again with the metal supports near them\n`);
        await pool.evaluate(second, cache, progress);
      }
      // Step 3: the soil range of the shortlisted candidates only.
      const third = soilRangeJobs(setup, cache, project, args.top);
      if (third.length) {
        io.stderr(`plan: ${third.length} shortlisted designs over the soil range\n`);
        await pool.evaluate(third, cache, progress);
      }
    } finally {
      await pool.close();
    }
  }
  const shortlist = planFromSetup(setup, project, {
    evaluator: solverEvaluator,
    cache,
    shortlistSize: args.top,
    onProgress: (p) => progress(p.done, p.total),
  });
  shortlist.stats.evaluations = setup.jobs.length + (setup.conductorJobs?.length ?? 0);
  shortlist.stats.cacheHits = 0;
  const seconds = (performance.now() - t0) / 1000;
  if (args.json) io.stdout(JSON.stringify(shortlistJson(shortlist, args.patterns), null, 2) + '\n');
  else io.stdout(humanReport(project, shortlist, seconds));
  return 0;
}
