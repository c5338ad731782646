/**
 * `plan FILE.json | plan --demo`: the ranked shortlist of antennas for a lot.
 *
 * Options: --json (machine-readable, schema in core/rank/README.md), --band 160m|80m|40m (repeatable;
 * default the project's bands), --top N (placements per band, default 10), --workers N (default and
 * most: the machine's cores; 0 evaluates in this thread), --patterns (include canonical patterns in JSON),
 * --arrays (also plan the array types; slower; without it, the project's settings.planArrays decides).
 * A progress line goes to stderr while designs are evaluated.
 */
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { freshBundle, ROOT } from './bundle.mjs';
import { Worker } from 'node:worker_threads';
import { startProjectCommand, walkProjectArgs, type ProjectSource } from './projectFile.ts';
import type { EvaluationRecord } from '../rank/evaluate.ts';
import {
  conductorJobs,
  soilRangeJobs,
  pairJobs,
  enumeratePlan,
  memoryCache,
  planFromSetup,
  PLAN_BOUNDS,
  soilRangeOf,
  type EvaluationCache,
  type PlanCut,
  type PlanSetup,
  type Job,
  type Shortlist,
  type Candidate,
} from '../rank/plan.ts';
import { solverEvaluator } from '../rank/solver.ts';
import { SWEEP_FRACTION } from '../rank/evaluate.ts';
import type { EvalGround } from '../rank/evaluator.ts';
import { bandPlan } from '../antennas/common.ts';
import type { TablesMessage, WarmMessage } from './plan-worker.ts';
import { candidateMatching } from '../match/candidateMatch.ts';
import { efficiencySummary } from '../rank/lossSplit.ts';
import { BANDS, type Band, type Project } from '../project/schema.ts';

export interface PlanIo {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
  readFile: (path: string) => Promise<string>;
}

const USAGE =
  'usage: plan (FILE.json | --demo) [--json] [--band 160m|80m|40m]... [--top N] [--workers N] [--patterns] [--arrays]\n';

interface Args extends ProjectSource {
  json: boolean;
  patterns: boolean;
  arrays: boolean;
  bands: Band[];
  top: number;
  workers: number;
}

function parseArgs(argv: string[]): Args | string {
  const a: Omit<Args, keyof ProjectSource> = {
    json: false,
    patterns: false,
    arrays: false,
    bands: [],
    top: 10,
    workers: availableParallelism(),
  };
  const source = walkProjectArgs(argv, (v, next) => {
    if (v === '--json') a.json = true;
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
    } else return false;
    return true;
  });
  return typeof source === 'string' ? source : { ...a, ...source };
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
  /**
   * Build the exact ground's tables for these (ground, frequency) pairs now, shared out among the
   * workers; each worker's tables go to the others. Later evaluations wait until all are in.
   */
  warm(tasks: { ground: EvalGround; frequencyHz: number }[]): void;
  close(): Promise<void>;
}

export function createWorkerPool(size: number): WorkerPool {
  const workers = Array.from({ length: Math.max(1, size) }, startWorker);
  let warming: Promise<void> | null = null;
  return {
    size: workers.length,
    async evaluate(jobs, cache, onDone) {
      // Tables still being built and shared: jobs sent now would build them again.
      if (warming) await warming;
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
    warm(tasks) {
      const shares = workers.map((): WarmMessage => ({ warm: [] }));
      tasks.forEach((t, i) =>
        shares[i % workers.length].warm.push({ ground: t.ground, frequenciesHz: [t.frequencyHz] }),
      );
      const done = workers.map(
        (w, i) =>
          new Promise<void>((resolve) => {
            if (!shares[i].warm.length) return resolve();
            const onMessage = (m: { warmed?: TablesMessage['tables'] }): void => {
              if (!m.warmed) return;
              w.off('message', onMessage);
              w.off('error', onError);
              const msg: TablesMessage = { tables: m.warmed };
              for (const other of workers) if (other !== w) other.postMessage(msg);
              resolve();
            };
            // A worker that fails is reported by the evaluation that needs it.
            const onError = (): void => {
              w.off('message', onMessage);
              resolve();
            };
            w.on('message', onMessage);
            w.once('error', onError);
            w.postMessage(shares[i]);
          }),
      );
      warming = Promise.all(done).then(() => undefined);
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
    `#${c.rank} ${c.band} ${c.typeLabel.charAt(0).toLowerCase()}${c.typeLabel.slice(1)}: ${c.where}${c.bestOfType && c.rank > 1 ? ' (best of its type)' : ''}`,
  );
  lines.push(
    `    score ${f2(c.score)} dBi   peak ${f1(c.peak.gainDbi)} dBi at ${f1(c.peak.elevationDeg)}° elevation, ${f1(c.peak.azimuthDeg)}°`,
  );
  if (c.adaptations?.length) lines.push(`    fitted to the lot: ${c.adaptations.join('; ')}`);
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
  if (s.missing.length) {
    out.push('Why not? (each type without a placement on a band, its closest miss):');
    for (const m of s.missing) out.push(`  ${m.band} ${m.closestMiss}`);
    out.push('');
  }
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

/**
 * The workers build the ground's tables every evaluation of this plan reuses (the design
 * frequency and the bandwidth points of each band, and the soil range at the design frequency),
 * each a share and then all of them, so that they are ready about when the enumeration is.
 */
export function warmPool(pool: WorkerPool, project: Project, bands: readonly Band[]): void {
  const f0s = bands.map((b) => bandPlan(b, project.settings.operating?.[b]).designFreqHz);
  pool.warm([
    ...f0s
      .flatMap((f0) => [f0, f0 * (1 - SWEEP_FRACTION), f0 * (1 + SWEEP_FRACTION)])
      .map((frequencyHz) => ({ ground: project.soil, frequencyHz })),
    ...soilRangeOf(project).flatMap((classId) =>
      f0s.map((frequencyHz) => ({ ground: { classId }, frequencyHz })),
    ),
  ]);
}

/**
 * The three evaluation steps of a plan on the workers, filling `cache`: every design alone, the
 * best orientation of each placement near a metal support again with it, and the shortlisted
 * designs over the soil range. Then planFromSetup ranks without solver work.
 */
export async function evaluateOnPool(
  pool: WorkerPool,
  setup: PlanSetup,
  project: Project,
  cache: EvaluationCache,
  shortlistSize: number,
  onDone?: (done: number, total: number) => void,
  say: (line: string) => void = () => {},
): Promise<void> {
  await pool.evaluate(setup.jobs, cache, onDone);
  const second = conductorJobs(setup, cache, project);
  if (second.length) {
    say(`${second.length} placements again with the metal supports near them`);
    await pool.evaluate(second, cache, onDone);
  }
  const third = soilRangeJobs(setup, cache, project, shortlistSize);
  if (third.length) {
    say(`${third.length} shortlisted designs over the soil range`);
    await pool.evaluate(third, cache, onDone);
  }
  const fourth = pairJobs(setup, cache, project);
  if (fourth.length) {
    say(`${fourth.length / 2} switched pairs of two antennas, both states of each`);
    await pool.evaluate(fourth, cache, onDone);
  }
  // step 5: the listed pairs over the soil range (the singles' range jobs are cached)
  const fifth = soilRangeJobs(setup, cache, project, shortlistSize).filter((j) => !cache.has(j.key));
  if (fifth.length) {
    say(`${fifth.length / 2} listed switched pairs over the soil range`);
    await pool.evaluate(fifth, cache, onDone);
  }
}

export async function runPlan(argv: string[], io: PlanIo): Promise<number> {
  const start = await startProjectCommand(argv, parseArgs, USAGE, io);
  if (typeof start === 'number') return start;
  const { args, project } = start;
  const t0 = performance.now();
  const bands = args.bands.length ? args.bands : project.bands;
  // Workers start (load the solver, build the ground's tables) while this thread enumerates.
  const pool = args.workers > 0 ? createWorkerPool(args.workers) : null;
  if (pool) warmPool(pool, project, bands);
  let setup: ReturnType<typeof enumeratePlan>;
  try {
    // Say something from the start: enumeration of a lot with many supports takes seconds.
    io.stderr(
      `plan: placing ${project.supports.length} supports' antennas for ${bands.join(', ')} (enumerating)\n`,
    );
    setup = enumeratePlan(project, { bands, ...(args.arrays ? { arrays: true } : {}) });
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
      await evaluateOnPool(pool, setup, project, cache, args.top, progress, (line) =>
        io.stderr(`plan: ${line}\n`),
      );
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
  shortlist.stats.evaluations =
    setup.jobs.length + (setup.conductorJobs?.length ?? 0) + (setup.pairJobs?.length ?? 0);
  shortlist.stats.cacheHits = 0;
  const seconds = (performance.now() - t0) / 1000;
  if (args.json) io.stdout(JSON.stringify(shortlistJson(shortlist, args.patterns), null, 2) + '\n');
  else io.stdout(humanReport(project, shortlist, seconds));
  return 0;
}
