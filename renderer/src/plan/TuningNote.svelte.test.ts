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
import { Planning } from './planning.svelte.ts';
import { demoPlanProject } from './testShortlist.ts';
import { hostWorkers, until } from './testWorkers.ts';
import TuningNote from './TuningNote.svelte';
import { testEvaluator } from '../../../test/helpers/testEvaluator.ts';

const toyEvaluator = testEvaluator({ pattern: 'flat' });

/** A planning state with a finished plan of the demo lot; `tunes` counts tune requests. */
async function planned() {
  const doc = new ProjectState(async () => ({ ok: true, value: { updatedAt: 't' } }));
  doc.open(demoPlanProject());
  const counts = { tunes: 0 };
  const start = () =>
    hostWorkers(2, toyEvaluator, {
      delayMs: 5,
      onPost: (msg) => void (msg.type === 'tune' && counts.tunes++),
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
