// The plan runner's states when runs are cancelled at different points and when workers fail
// (throw, close themselves, keep quiet, send nonsense), over stand-in workers that run the real
// planning host and its message loop with a toy evaluator. After each, a re-run must end done.
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { createPlanHost, workerLoop } from '../workers/planHost.ts';
import type { PlanWorker } from '../workers/pool.ts';
import type { FromWorker, TestFault, ToWorker } from '../workers/protocol.ts';
import type { Candidate } from '../../../core/rank/plan.ts';
import { PlanRunner, type RunStatus } from './planRun.svelte.ts';
import { until } from './testWorkers.ts';
import { testEvaluator } from '../../../test/helpers/testEvaluator.ts';

const toyEvaluator = testEvaluator({ pattern: 'flat' });

interface Fake extends PlanWorker {
  terminated: boolean;
  /** Deliver a message as if this worker had sent it (even after it was stopped). */
  send(m: unknown): void;
}

interface Pools {
  starts: number;
  all: Fake[];
  /** Called with every message a worker is given, before it is handled. */
  onPost?: (msg: ToWorker) => void;
}

/**
 * Stand-in workers: the real message loop over the real host. An uncaught throw becomes a
 * 'crashed' report and the worker is gone, as the pool reports an error event; a closed worker
 * answers nothing more. A stopped worker keeps its handler, so late messages reach the runner.
 */
function pools(n: number): Pools & { start: () => Fake[] } {
  const p: Pools & { start: () => Fake[] } = {
    starts: 0,
    all: [],
    start: () => {
      p.starts++;
      const made = Array.from({ length: n }, () => {
        let handler: ((m: FromWorker) => void) | null = null;
        let dead = false;
        const loop = workerLoop(
          createPlanHost(toyEvaluator, () => 0),
          {
            close: () => (dead = true),
            postMessage: (m) => handler?.(structuredClone(m)),
          },
        );
        const w: Fake = {
          terminated: false,
          post(msg) {
            p.onPost?.(msg);
            setTimeout(() => {
              if (dead || w.terminated) return;
              try {
                loop(structuredClone(msg));
              } catch (e) {
                dead = true;
                handler?.({ type: 'crashed', message: (e as Error).message });
              }
            }, 0);
          },
          onMessage: (h) => (handler = h),
          terminate: () => (w.terminated = true),
          send: (m) => handler?.(m as FromWorker),
        };
        return w;
      });
      p.all.push(...made);
      return made;
    },
  };
  return p;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

const project = (() => {
  const p = buildDemoProject();
  return { ...p, targets: [{ regionId: 'europe', weight: 1 }], bands: ['80m' as const] };
})();

/** A runner whose next run carries `fault` (then none), and its pools. */
function runnerWith(n: number, fault: TestFault | null = null, stallMs = 5_000) {
  const p = pools(n);
  let next = fault;
  const runner = new PlanRunner(p.start, undefined, {
    stallMs,
    testFault: () => {
      const f = next;
      next = null;
      return f;
    },
  });
  return { runner, p };
}

/** A re-run ends done with a shortlist, and nothing is left running. */
async function rerunEndsDone(runner: PlanRunner): Promise<void> {
  runner.run(project, ['80m']);
  expect(runner.running).toBe(true);
  await until(() => !runner.running);
  expect(runner.error).toBeNull();
  expect(runner.status).toBe('done');
  expect(runner.shortlist!.candidates.length).toBeGreaterThan(0);
  expect(runner.done).toBe(runner.total);
}

const FAILED = /^a planning worker failed: .+; the project is unchanged; run again$/;

describe('PlanRunner cancelling', () => {
  it('cancel before any run does nothing and starts no worker', async () => {
    const { runner, p } = runnerWith(2);
    runner.cancel();
    expect(runner.status).toBe<RunStatus>('idle');
    expect(runner.running).toBe(false);
    expect(p.starts).toBe(0);
    await rerunEndsDone(runner);
  });

  // Where the cancel lands: before the enumeration answers, after the first result, halfway, and
  // while ranking (the rank request already sent).
  const points: { name: string; when: (r: PlanRunner, msg: ToWorker) => boolean }[] = [
    { name: 'while enumerating', when: (_r, m) => m.type === 'enumerate' },
    { name: 'after the first result', when: (r, m) => m.type === 'evaluate' && r.done === 1 },
    { name: 'halfway', when: (r, m) => m.type === 'evaluate' && r.total > 0 && r.done >= r.total / 2 },
    { name: 'while ranking', when: (_r, m) => m.type === 'rank' },
  ];
  for (const pt of points) {
    it(`cancels ${pt.name}; late answers change nothing; a re-run ends done`, async () => {
      const { runner, p } = runnerWith(2);
      let cancelledAt: { done: number; status: RunStatus } | null = null;
      p.onPost = (msg) => {
        if (!cancelledAt && runner.running && pt.when(runner, msg)) {
          cancelledAt = { done: runner.done, status: runner.status };
          runner.cancel();
        }
      };
      runner.run(project, ['80m']);
      await until(() => cancelledAt !== null);
      expect(runner.status).toBe('cancelled');
      expect(runner.running).toBe(false);
      await sleep(40); // the in-flight answers arrive and are ignored
      expect(runner.status).toBe('cancelled');
      expect(runner.shortlist).toBeNull();
      expect(runner.error).toBeNull();
      expect(p.all.every((w) => !w.terminated)).toBe(true); // the cache is kept
      p.onPost = undefined;
      const solvedBefore = cancelledAt!.done;
      await rerunEndsDone(runner);
      expect(p.starts).toBe(1);
      if (pt.name === 'while ranking')
        expect(runner.total).toBe(0); // everything came from the cache
      else expect(runner.cached).toBeGreaterThanOrEqual(solvedBefore);
    });
  }

  it('a second run started mid-run replaces the first', async () => {
    const { runner } = runnerWith(2);
    runner.run(project, ['80m']);
    await until(() => runner.done >= 2);
    await rerunEndsDone(runner);
  });
});

describe('PlanRunner with a failing worker', () => {
  it('a worker that throws ends the run with the failure in words and stops every worker', async () => {
    const { runner, p } = runnerWith(3, { kind: 'throw', afterEvaluations: 2 });
    const before = structuredClone(project);
    runner.run(project, ['80m']);
    await until(() => !runner.running);
    expect(runner.status).toBe('error');
    expect(runner.error).toMatch(FAILED);
    expect(runner.error).toMatch(/test fault: thrown after 2 evaluations/);
    expect(runner.done).toBeGreaterThanOrEqual(2);
    expect(runner.done).toBeLessThan(runner.total);
    expect(p.all).toHaveLength(3);
    expect(p.all.every((w) => w.terminated)).toBe(true);
    expect(runner.workerCount).toBe(0);
    expect(project).toEqual(before);
    await sleep(20);
    expect(runner.status).toBe('error'); // nothing from the stopped pool counts
    await rerunEndsDone(runner);
    expect(p.starts).toBe(2); // a fresh pool
  });

  for (const kind of ['hang', 'close'] as const) {
    it(`a worker that never answers (${kind}) fails the run after the stall time`, async () => {
      const { runner, p } = runnerWith(2, { kind, afterEvaluations: 1, stallMs: 60 });
      runner.run(project, ['80m']);
      const t0 = Date.now();
      await until(() => !runner.running, 5_000);
      expect(Date.now() - t0).toBeGreaterThanOrEqual(60);
      expect(runner.status).toBe('error');
      expect(runner.error).toMatch(FAILED);
      expect(runner.error).toMatch(/no answer for 0\.1 s/);
      expect(p.all.every((w) => w.terminated)).toBe(true);
      await rerunEndsDone(runner);
    });
  }

  it('a worker that never answers can be cancelled at once; the pool is stopped after the stall time', async () => {
    const { runner, p } = runnerWith(1, { kind: 'hang', afterEvaluations: 1 }, 80);
    runner.run(project, ['80m']);
    await until(() => runner.done >= 1);
    await sleep(20); // the worker now holds a job it will never answer
    expect(runner.running).toBe(true);
    runner.cancel();
    expect(runner.status).toBe('cancelled');
    expect(runner.running).toBe(false);
    await until(() => p.all[0]!.terminated, 2_000);
    expect(runner.status).toBe('cancelled'); // a cancelled run does not turn into an error
    expect(runner.error).toBeNull();
    await rerunEndsDone(runner);
    expect(p.starts).toBe(2);
  });

  it('a message of an unknown kind counts as a failed worker', async () => {
    const { runner, p } = runnerWith(2);
    runner.run(project, ['80m']);
    await until(() => runner.done >= 1);
    p.all[1]!.send({ type: 'gibberish' });
    expect(runner.status).toBe('error');
    expect(runner.error).toMatch(FAILED);
    expect(runner.error).toMatch(/"gibberish"/);
    expect(p.all.every((w) => w.terminated)).toBe(true);
    await rerunEndsDone(runner);
  });

  /**
   * After a finished plan, `ask` starts a request about its first candidate and a worker crashes:
   * the request fails in words, the shown shortlist stays and every worker is stopped.
   */
  async function crashDuring(ask: (runner: PlanRunner, c: Candidate) => Promise<unknown>) {
    const { runner, p } = runnerWith(2);
    await rerunEndsDone(runner);
    const c = runner.shortlist!.candidates[0]!;
    const pending = ask(runner, c);
    p.all[0]!.send({ type: 'crashed', message: 'out of memory' });
    await expect(pending).rejects.toThrow(/a planning worker failed: out of memory/);
    expect(runner.status).toBe('done');
    expect(runner.shortlist).not.toBeNull();
    expect(p.all.every((w) => w.terminated)).toBe(true);
    return { runner, p, c };
  }

  it('a crash after a plan fails the waiting sweep but keeps the shown shortlist', async () => {
    const { runner } = await crashDuring((r, c) => r.sweep(c.design, project.soil, c.trim.valueM, [3.5e6]));
    await rerunEndsDone(runner);
  });

  it('a crash fails the waiting tuning in words; asked again, a fresh pool measures it', async () => {
    const { runner, p, c } = await crashDuring((r, c) => {
      const tuning = r.requestTuning(c);
      expect(r.tuningOf(c.id)).toEqual({ status: 'measuring' });
      return tuning;
    });
    expect(runner.tuningOf(c.id)).toEqual({ status: 'error', message: expect.stringMatching(FAILED) });
    expect(runner.measuredTuning(c.id)).toBeNull();
    await sleep(20); // the stopped lead's late answer (if any) changes nothing
    expect(runner.tuningOf(c.id)?.status).toBe('error');
    // The new lead has never enumerated: it finds the design from the plan's project.
    const m = await runner.requestTuning(c);
    expect(p.starts).toBe(2);
    expect(m.kHzPerCm).toBeLessThan(0);
    expect(runner.measuredTuning(c.id)).toEqual(m);
  });

  it('a lead that keeps quiet fails the waiting tuning after the stall time', async () => {
    const { runner, p } = runnerWith(1, null, 60);
    await rerunEndsDone(runner);
    const c = runner.shortlist!.candidates[0]!;
    p.all[0]!.terminated = true; // stand-in for a lead that stopped answering
    await expect(runner.tune(c)).rejects.toThrow(/no answer for 0\.1 s/);
    expect(runner.tuningOf(c.id)).toBeNull();
  });

  it('a solver error on one design ends the run in words and keeps the pool', async () => {
    const { runner, p } = runnerWith(2);
    runner.run(project, ['80m']);
    await until(() => runner.done >= 1);
    p.all[0]!.send({ type: 'error', runId: 1, key: 'k', message: 'the solver failed on a dipole (80m): x' });
    expect(runner.status).toBe('error');
    expect(runner.error).toMatch(/the solver failed/);
    expect(p.all.some((w) => w.terminated)).toBe(false);
    await rerunEndsDone(runner);
  });
});
