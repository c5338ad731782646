// @vitest-environment jsdom
// Component mounts: the unit-aware length field and the lot overview of the inspector.
import { fireEvent, render, screen } from '@testing-library/svelte';
import { describe, expect, it, vi } from 'vitest';
import type { YardwireApi } from '../../../core/api/contract.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { Session } from '../state/session.svelte.ts';
import LengthField from './LengthField.svelte';
import LotOverview from './LotOverview.svelte';

describe('LengthField', () => {
  it('shows metres as feet and commits what is typed in feet as metres', async () => {
    const onCommit = vi.fn();
    render(LengthField, { label: 'Height', valueM: 20, units: 'imperial', minM: 0, maxM: 200, onCommit });
    const input = screen.getByLabelText('Height') as HTMLInputElement;
    expect(input.value).toBe('65.62');
    expect(screen.getByText('ft')).toBeTruthy();
    await fireEvent.input(input, { target: { value: '50' } });
    await fireEvent.change(input);
    expect(onCommit).toHaveBeenCalledTimes(1);
    expect(onCommit.mock.calls[0]![0]).toBeCloseTo(15.24, 10);
  });

  it('refuses a value out of range, names the range in the chosen unit, and commits nothing', async () => {
    const onCommit = vi.fn();
    render(LengthField, { label: 'Clearance', valueM: 5, units: 'metric', minM: 0, maxM: 500, onCommit });
    const input = screen.getByLabelText('Clearance') as HTMLInputElement;
    await fireEvent.input(input, { target: { value: '600' } });
    await fireEvent.change(input);
    expect(onCommit).not.toHaveBeenCalled();
    expect(screen.getByRole('alert').textContent).toBe('Enter a length from 0.0 m up to 500.0 m.');
    expect(input.getAttribute('aria-invalid')).toBe('true');
    await fireEvent.input(input, { target: { value: 'twelve' } });
    await fireEvent.change(input);
    expect(onCommit).not.toHaveBeenCalled();
  });
});

describe('LotOverview', () => {
  function session(): Session {
    const notCalled = (): never => {
      throw new Error('not expected in this test');
    };
    const client = new Proxy({} as YardwireApi, { get: () => notCalled });
    const s = new Session(() => client);
    s.doc.open(buildDemoProject());
    return s;
  }

  it('lists the supports with their heights and selects one on click', async () => {
    const s = session();
    render(LotOverview, { session: s });
    expect(screen.getByRole('heading', { name: 'Supports (8)' })).toBeTruthy();
    const row = screen.getByRole('button', { name: /North-west tower\s*18\.0 m/ });
    await fireEvent.click(row);
    expect(s.doc.selection).toEqual({ kind: 'support', id: 'tower-nw' });
  });

  it('shows the empty states of a new project', () => {
    const s = session();
    s.doc.open({ ...buildDemoProject(), boundary: null, supports: [], keepOuts: [], station: null });
    render(LotOverview, { session: s });
    expect(screen.getByText(/No lot boundary yet — press/)).toBeTruthy();
    expect(screen.getByText(/No supports yet — press/)).toBeTruthy();
    expect(screen.getByRole('heading', { name: 'Keep-outs (0)' })).toBeTruthy();
  });
});
