/**
 * The app's re-plan path, timed (part of test/bench/plan.ts; alone: `npx tsx test/bench/appReplan.ts`).
 *
 * The window plans through its lead worker's host (renderer/src/workers/planHost.ts), which keeps
 * the evaluation cache between runs. This drives one such host in this process with the messages
 * the window sends (each copied with structuredClone, as postMessage does), in the order the
 * runner sends them: enumerate, evaluate each missing design, rank. On 2 cores the app's pool is
 * one worker (poolSize), so this is the app's path there; with more cores the evaluations spread
 * over the workers and only that part shrinks.
 *
 * After a first plan of the demo, one support is moved a few metres and the project re-planned,
 * at several positions; each re-plan is split into enumeration, evaluation of the new designs,
 * ranking (with the conducting-support and soil-range solves it makes) and message copying. The
 * provisional re-rank of live mode (the 'preview' message) is timed at the same positions, and the
 * re-plan of a drop 1 m further on after the drag rested there (the app solves the position's new
 * designs while the drag rests).
 */
import { fileURLToPath } from 'node:url';
import type { Project } from '../../core/project/schema.ts';
import { solverEvaluator } from '../../core/rank/solver.ts';
import { buildDemoProject, demoLonLat } from '../../data/demo/demoProject.ts';
import { createPlanHost, type PlanHost } from '../../renderer/src/workers/planHost.ts';
import type { FromWorker, ToWorker } from '../../renderer/src/workers/protocol.ts';

export interface ReplanTiming {
  move: string;
  totalMs: number;
  /** Process CPU time of the re-plan (fairer than wall time on a shared machine). */
  cpuMs: number;
  enumerateMs: number;
  evaluateMs: number;
  rankMs: number;
  messagesMs: number;
  newDesigns: number;
  previewMs: number;
  previewBorrowed: number;
  /**
   * The same support dropped 1 m further on after the drag rested there: the solves the app makes
   * while the drag rests (restMs), then the exact re-plan at the drop (afterRestMs).
   */
  restMs: number;
  afterRestMs: number;
}

/** The demo's moves: a support and where it goes (metres east, north of the lot's corner). */
export const DEMO_MOVES: [string, number, number][] = [
  ['oak-west', 40, 70],
  ['pine-ridge', 123, 74],
  ['maple-yard', 60, 44],
  ['spruce-ne', 150, 89],
  ['oak-north', 83, 85],
  ['ash-east', 138, 32],
  ['oak-west', 36, 67],
];

/** One message to the host and its answers, each copied as postMessage would; the copying timed apart. */
function send(host: PlanHost, msg: ToWorker, t: { messagesMs: number }): { out: FromWorker[]; ms: number } {
  const c0 = performance.now();
  const m = structuredClone(msg);
  const c1 = performance.now();
  const raw = host.handle(m);
  const c2 = performance.now();
  const out = raw.map((r) => structuredClone(r));
  const c3 = performance.now();
  t.messagesMs += c1 - c0 + (c3 - c2);
  return { out, ms: c2 - c1 };
}

/** A full run as the window's runner makes it with one worker; its phases in ms. */
type RunTiming = Pick<
  ReplanTiming,
  'totalMs' | 'cpuMs' | 'enumerateMs' | 'evaluateMs' | 'rankMs' | 'messagesMs' | 'newDesigns'
>;

function runOnce(host: PlanHost, project: Project, runId: number): RunTiming {
  const bands = project.bands;
  const t = { messagesMs: 0 };
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const en = send(host, { type: 'enumerate', runId, project, bands }, t);
  const e = en.out[0];
  if (e?.type !== 'enumerated') throw new Error(`enumerate failed: ${JSON.stringify(e)}`);
  let evaluateMs = 0;
  for (const job of e.missing) evaluateMs += send(host, { type: 'evaluate', runId, job }, t).ms;
  const rk = send(
    host,
    { type: 'rank', runId, project, bands, evaluations: e.missing.length, cacheHits: e.cached },
    t,
  );
  if (rk.out[0]?.type !== 'ranked') throw new Error(`rank failed: ${JSON.stringify(rk.out[0])}`);
  const c1 = process.cpuUsage(c0);
  return {
    totalMs: performance.now() - t0,
    cpuMs: (c1.user + c1.system) / 1000,
    enumerateMs: en.ms,
    evaluateMs,
    rankMs: rk.ms,
    messagesMs: t.messagesMs,
    newDesigns: e.missing.length,
  };
}

export function appReplan(moves = DEMO_MOVES, log: (s: string) => void = () => {}): ReplanTiming[] {
  const host = createPlanHost(solverEvaluator);
  const demo = buildDemoProject();
  let runId = 0;
  const first = runOnce(host, demo, ++runId);
  log(`first plan through the host: ${(first.totalMs / 1000).toFixed(2)} s (${first.newDesigns} designs)`);
  const out: ReplanTiming[] = [];
  const moved = (id: string, e: number, n: number): Project => {
    const p: Project = structuredClone(demo);
    const s = p.supports.find((x) => x.id === id);
    if (!s) throw new Error(id);
    s.position = demoLonLat(e, n);
    return p;
  };
  const preview = (p: Project) => {
    const pv = send(host, { type: 'preview', liveId: runId, project: p, bands: p.bands }, { messagesMs: 0 });
    const pr = pv.out[0];
    if (pr?.type !== 'previewed') throw new Error(`preview failed: ${JSON.stringify(pr)}`);
    return { ms: pv.ms, borrowed: pr.borrowed, missing: pr.missing };
  };
  for (const [id, e, n] of moves) {
    // Live mode first (as in the app: provisional positions during the drag, the exact plan at its end).
    const p = moved(id, e, n);
    const pv = preview(p);
    const r = runOnce(host, p, ++runId);
    // Dropped after a rest 1 m further on: the designs of that position were solved during the rest.
    const q = moved(id, e + 1, n);
    const rest = { messagesMs: 0 };
    let restMs = 0;
    for (const job of preview(q).missing) restMs += send(host, { type: 'evaluate', runId: 0, job }, rest).ms;
    const after = runOnce(host, q, ++runId);
    const row = {
      move: id,
      ...r,
      previewMs: pv.ms,
      previewBorrowed: pv.borrowed,
      restMs,
      afterRestMs: after.totalMs,
    };
    out.push(row);
    log(
      `re-plan after moving ${id}: ${r.totalMs.toFixed(0)} ms (CPU ${r.cpuMs.toFixed(0)}) = enumerate ${r.enumerateMs.toFixed(0)} + ` +
        `${r.newDesigns} new designs ${r.evaluateMs.toFixed(0)} + rank ${r.rankMs.toFixed(0)} + ` +
        `messages ${r.messagesMs.toFixed(0)}; live preview ${pv.ms.toFixed(0)} ms (${pv.borrowed} borrowed); ` +
        `dropped after a rest: ${after.totalMs.toFixed(0)} ms (rest solves ${restMs.toFixed(0)} ms)`,
    );
  }
  return out;
}

/** The median of one figure over the re-plans. */
export function medianOf(rows: readonly ReplanTiming[], k: Exclude<keyof ReplanTiming, 'move'>): number {
  const s = rows.map((r) => r[k]).sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const rows = appReplan(DEMO_MOVES, (s) => process.stdout.write(s + '\n'));
  process.stdout.write(
    `medians: re-plan ${medianOf(rows, 'totalMs').toFixed(0)} ms (CPU ${medianOf(rows, 'cpuMs').toFixed(0)}), ` +
      `live preview ${medianOf(rows, 'previewMs').toFixed(0)} ms, re-plan after a rest ${medianOf(rows, 'afterRestMs').toFixed(0)} ms\n`,
  );
}
