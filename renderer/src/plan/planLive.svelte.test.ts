// Live re-ranking while a support is dragged: the order of provisional results (a newer position
// supersedes an older one, a stale answer never replaces a newer one), what is kept (only the
// exact plan at the drag's end) and the out-of-date mark, over a stand-in worker that runs the real
// planning host with a toy evaluator and answers only when the test pumps it.
import { describe, expect, it } from 'vitest';
import type { PlanRecord } from '../../../core/api/contract.ts';
import type { LonLat, Project } from '../../../core/project/schema.ts';
import { demoLonLat } from '../../../data/demo/demoProject.ts';
import { testEvaluator } from '../../../test/helpers/testEvaluator.ts';
import { ProjectState } from '../state/project.svelte.ts';
import { createPlanHost } from '../workers/planHost.ts';
import type { PlanWorker } from '../workers/pool.ts';
import type { FromWorker, ToWorker } from '../workers/protocol.ts';
import { LiveQueue } from './liveQueue.ts';
import { withMove } from './liveMove.ts';
import { Planning, type PlanKeeper } from './planning.svelte.ts';
import { demoPlanProject } from './testShortlist.ts';

describe('LiveQueue', () => {
  it('keeps one position in flight, lets the newest wait, and never shows an older answer', () => {
    const sent: number[] = [];
    const q = new LiveQueue<string>((a) => sent.push(a.seq));
    q.move('a');
    q.move('b');
    q.move('c'); // replaces b: b is never sent
    expect(sent).toEqual([1]);
    expect(q.following).toBe(true);
    expect(q.answer(1)).toBe('a');
    expect(sent).toEqual([1, 3]);
    expect(q.following).toBe(true);
    expect(q.answer(2)).toBeNull(); // never asked
    expect(q.answer(3)).toBe('c');
    expect(q.following).toBe(false);
    expect(q.answer(1)).toBeNull(); // repeated, older
  });

  it('shows nothing of a drag that ended, nor of an earlier drag in a new one', () => {
    const sent: number[] = [];
    const q = new LiveQueue<string>((a) => sent.push(a.seq));
    q.move('a');
    q.end();
    expect(q.answer(1)).toBeNull();
    q.move('b'); // seq 2, a new drag
    q.move('c');
    q.move('d'); // waits behind b, replacing c
    expect(q.answer(2)).toBe('b');
    expect(sent).toEqual([1, 2, 4]);
    q.end();
    expect(q.answer(4)).toBeNull(); // in flight when the drag ended: not shown
    q.move('e');
    expect(sent).toEqual([1, 2, 4, 5]);
  });
});

/** A worker over the real host whose messages wait until the test pumps them. */
function pumpedWorker(): {
  start: () => PlanWorker[];
  pump(n?: number): number;
  inject(m: FromWorker): void;
  posted: ToWorker[];
} {
  const host = createPlanHost(testEvaluator({ pattern: 'directional' }), () => 0);
  const inbox: ToWorker[] = [];
  const posted: ToWorker[] = [];
  let handler: ((m: FromWorker) => void) | null = null;
  const w: PlanWorker = {
    post: (m) => (inbox.push(structuredClone(m)), posted.push(m)),
    onMessage: (h) => (handler = h),
    terminate: () => (handler = null),
  };
  return {
    start: () => [w],
    pump(n = Infinity) {
      let done = 0;
      while (inbox.length && done < n) {
        const m = inbox.shift()!;
        for (const r of host.handle(m)) handler?.(structuredClone(r));
        done++;
      }
      return done;
    },
    inject: (m) => handler?.(m),
    posted,
  };
}

function setup() {
  const saved: PlanRecord[] = [];
  const keeper: PlanKeeper = {
    load: () => Promise.resolve(null),
    save: (_id, plan) => (saved.push(plan), Promise.resolve()),
    setView: () => Promise.resolve(),
  };
  const doc = new ProjectState(async () => ({ ok: true, value: { updatedAt: 't' } }));
  doc.open(demoPlanProject());
  const worker = pumpedWorker();
  const planning = new Planning(doc, worker.start, keeper);
  return { doc, planning, worker, saved };
}

const oakAt = (p: Project, to: LonLat): Project => withMove(p, { kind: 'support', id: 'oak-west', to });
const oakOf = (p: Project | null | undefined): LonLat | undefined =>
  p?.supports.find((s) => s.id === 'oak-west')?.position;

describe('Planning live re-ranking', () => {
  it('starts only with a plan shown', () => {
    const { doc, planning, worker } = setup();
    planning.liveMove(oakAt(doc.project!, demoLonLat(40, 70)));
    expect(worker.pump()).toBe(0);
    expect(planning.live).toBeNull();
  });

  it('shows provisional results in order, keeps only the exact plan at the drag end, and keeps the stale mark true', () => {
    const { doc, planning, worker, saved } = setup();
    planning.run();
    worker.pump();
    expect(planning.runner.status).toBe('done');
    expect(saved).toHaveLength(1);
    const kept = planning.runner.shortlist;
    const p0 = doc.project!;
    const at = [demoLonLat(39, 70), demoLonLat(40, 70), demoLonLat(42, 71)];

    planning.liveMove(oakAt(p0, at[0]!));
    planning.liveMove(oakAt(p0, at[1]!));
    planning.liveMove(oakAt(p0, at[2]!)); // supersedes at[1], which is never ranked
    expect(worker.pump(1)).toBe(1); // the first position
    expect(planning.live).not.toBeNull();
    expect(oakOf(planning.madeFor)).toEqual(at[0]);
    expect(planning.live!.following).toBe(true);
    expect(planning.shortlist).toBe(planning.runner.live!.shortlist);
    const first = planning.shortlist;

    // An answer for a position never asked for (older than the one shown next) changes nothing.
    worker.inject({
      type: 'previewed',
      liveId: 2,
      shortlist: kept!,
      borrowed: 0,
      leftOut: 0,
      missing: [],
      ms: 1,
    });
    expect(planning.shortlist).toBe(first);

    expect(worker.pump(1)).toBe(1); // the newest position
    expect(oakOf(planning.madeFor)).toEqual(at[2]);
    expect(planning.live!.following).toBe(false);
    expect(planning.shortlist!.candidates.length).toBeGreaterThan(0);
    // at[1] was never sent; while the drag rests, the designs the newest position lacks are solved.
    const previews = worker.posted.filter((m) => m.type === 'preview');
    expect(previews.map((m) => m.type === 'preview' && oakOf(m.project))).toEqual([at[0], at[2]]);
    const sent = worker.posted.length;
    worker.pump();
    const warmed = worker.posted.slice(sent).filter((m) => m.type === 'evaluate').length;
    expect(warmed).toBeGreaterThan(0);
    // Nothing provisional is kept, the shown plan is not the stored one, and the project is unchanged.
    expect(saved).toHaveLength(1);
    expect(planning.runner.shortlist).toBe(kept);
    expect(oakOf(doc.project)).toEqual(oakOf(p0));
    expect(planning.stale).toBe(false);

    // The drag ends: one edit, then the exact plan of the final position, kept.
    expect(doc.moveSupport('oak-west', at[2]!)).toBe(true);
    planning.liveEnd();
    expect(planning.live!.settling).toBe(true);
    expect(planning.stale).toBe(false); // provisional, not out of date
    worker.pump();
    expect(planning.runner.status).toBe('done');
    expect(planning.runner.total).toBe(0); // every new design was solved while the drag rested
    expect(planning.runner.cached).toBeGreaterThan(warmed);
    expect(planning.live).toBeNull();
    expect(saved).toHaveLength(2);
    expect(oakOf(saved[1]!.madeFor)).toEqual(at[2]);
    expect(planning.shortlist).toBe(planning.runner.shortlist);
    expect(planning.shortlist).not.toBe(kept);
    expect(planning.stale).toBe(false);

    // Undo moves the support back: the kept plan (made for the new position) is out of date.
    doc.undo();
    expect(oakOf(doc.project)).toEqual(oakOf(p0));
    expect(planning.stale).toBe(true);
    expect(planning.changes).toEqual(['supports']);
  });

  it('drops a late answer of a drag that ended where it started and shows the kept plan again', () => {
    const { doc, planning, worker, saved } = setup();
    planning.run();
    worker.pump();
    const kept = planning.runner.shortlist;
    planning.liveMove(oakAt(doc.project!, demoLonLat(41, 70)));
    planning.liveEnd(); // released before the worker answered, with no edit
    worker.pump();
    expect(planning.live).toBeNull();
    expect(planning.shortlist).toBe(kept);
    expect(planning.runner.status).toBe('done');
    expect(saved).toHaveLength(1);
  });
});
