// @vitest-environment jsdom
// The "How to tune" note of a shown candidate: it asks the lead worker once, shows progress, then
// the rate in the user's units, and an error in words with a way to ask again. The workers are
// stand-ins over the real planning host with a toy evaluator (not physics: reactance grows with
// total wire length), so the numbers are only checked for their units and their consistency; the
// solver's rate is tested in planRunTune.svelte.test.ts.
import { fireEvent, render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import { tuningText } from '../../../core/report/tuning.ts';
import { ProjectState } from '../state/project.svelte.ts';
import { createPlanHost } from '../workers/planHost.ts';
import type { PlanWorker } from '../workers/pool.ts';
import type { FromWorker, ToWorker } from '../workers/protocol.ts';
import { Planning } from './planning.svelte.ts';
import { demoPlanProject } from './testShortlist.ts';
import TuningNote from './TuningNote.svelte';
import { testEvaluator } from '../../../test/helpers/testEvaluator.ts';

const toyEvaluator = testEvaluator({ pattern: 'flat' });

async function until(check: () => boolean, ms = 20_000): Promise<void> {
  const t0 = Date.now();
  while (!check()) {
    if (Date.now() - t0 > ms) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 1));
  }
}

/** A planning state with a finished plan of the demo lot; `tunes` counts tune requests. */
async function planned() {
  const doc = new ProjectState(async () => ({ ok: true, value: { updatedAt: 't' } }));
  doc.open(demoPlanProject());
  const counts = { tunes: 0 };
  const start = (): PlanWorker[] =>
    [0, 1].map(() => {
      const host = createPlanHost(toyEvaluator, () => 0);
      let handler: ((m: FromWorker) => void) | null = null;
      return {
        post(msg: ToWorker) {
          if (msg.type === 'tune') counts.tunes++;
          setTimeout(() => {
            for (const r of host.handle(structuredClone(msg))) handler?.(structuredClone(r));
          }, 5);
        },
        onMessage: (h) => (handler = h),
        terminate: () => (handler = null),
      };
    });
  const planning = new Planning(doc, start);
  planning.run();
  await until(() => !planning.runner.running);
  expect(planning.runner.status).toBe('done');
  return { planning, counts };
}

describe('TuningNote', () => {
  it('measures once when shown, shows progress, then the rate in inches for imperial users', async () => {
    const { planning, counts } = await planned();
    const c = planning.candidates.find((x) => x.type === 'dipole')!;
    render(TuningNote, { planning, c, units: 'imperial' });
    expect(screen.getByTestId('tuning-measuring').textContent).toMatch(/Measuring the tuning rate/);
    expect(screen.getByTestId('tuning-note').getAttribute('aria-busy')).toBe('true');
    expect(screen.getByText(/Take equal amounts off both ends/)).toBeTruthy();
    await until(() => planning.runner.measuredTuning(c.id) !== null);
    const m = planning.runner.measuredTuning(c.id)!;
    const rate = await screen.findByTestId('tuning-rate');
    const t = tuningText(m, 'imperial');
    expect(t.rate).toMatch(/ kHz per inch$/);
    expect(t.per10kHz).toMatch(/ in$/);
    expect(rate.textContent).toContain(t.rate);
    expect(rate.textContent).toContain(t.per10kHz);
    expect(rate.textContent).not.toMatch(/cm/);
    expect(screen.getByTestId('tuning-note').textContent).toMatch(/now \d+\.\d\d ft/);
    expect(counts.tunes).toBe(1);
  });

  it('metric users read centimetres; a measured candidate is not asked again', async () => {
    const { planning, counts } = await planned();
    const c = planning.candidates[0]!;
    await planning.runner.requestTuning(c);
    render(TuningNote, { planning, c, units: 'metric' });
    const rate = screen.getByTestId('tuning-rate');
    expect(rate.textContent).toContain(tuningText(planning.runner.measuredTuning(c.id)!, 'metric').rate);
    expect(rate.textContent).toMatch(/ kHz per cm/);
    expect(counts.tunes).toBe(1);
  });

  it('shows a failure in words and asks again when told to', async () => {
    const { planning, counts } = await planned();
    const first = planning.candidates[0]!;
    const c = { ...first, design: { ...first.design, type: 'no-such-type' } };
    render(TuningNote, { planning, c, units: 'metric' });
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toMatch(/could not be measured: the solver failed/);
    expect(counts.tunes).toBe(1);
    await fireEvent.click(screen.getByRole('button', { name: 'Measure again' }));
    expect(counts.tunes).toBe(2);
    expect(await screen.findByRole('alert')).toBeTruthy();
  });
});
