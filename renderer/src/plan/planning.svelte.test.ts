// The planning workflow state: bands as project edits, staleness after an edit, selection.
import { describe, expect, it } from 'vitest';
import { ProjectState } from '../state/project.svelte.ts';
import { Planning } from './planning.svelte.ts';
import { demoPlanProject } from './testShortlist.ts';

function planning() {
  const doc = new ProjectState(async () => ({ ok: true, value: { updatedAt: 't' } }));
  doc.open(demoPlanProject());
  const posted: unknown[] = [];
  const p = new Planning(doc, () => [
    { post: (m) => posted.push(m), onMessage: () => {}, terminate: () => {} },
  ]);
  return { doc, p, posted };
}

describe('Planning', () => {
  it('keeps the bands in the project, in band order, and never empties them', () => {
    const { doc, p } = planning();
    expect(p.bands).toEqual(['80m']);
    expect(p.toggleBand('160m')).toBe(true);
    expect(doc.project!.bands).toEqual(['160m', '80m']);
    expect(p.toggleBand('160m')).toBe(true);
    expect(p.toggleBand('80m')).toBe(false);
    expect(doc.project!.bands).toEqual(['80m']);
  });

  it('sends a snapshot of the project and the bands to the lead worker and opens the shortlist', () => {
    const { p, posted } = planning();
    p.run();
    expect(posted).toEqual([expect.objectContaining({ type: 'enumerate', bands: ['80m'] })]);
    expect(p.tab).toBe('shortlist');
    expect(p.runner.status).toBe('enumerating');
  });

  it('selecting resets the plot choices and drops a comparison with itself', () => {
    const { p } = planning();
    p.compareId = 'x';
    p.elevationDeg = 20;
    p.cutToward = 'japan';
    p.select('x');
    expect(p.compareId).toBeNull();
    expect(p.elevationDeg).toBeNull();
    expect(p.cutToward).toBe('');
  });
});
