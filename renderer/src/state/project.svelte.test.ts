// The project state: edits, validation, undo/redo over snapshots, save queue, unit display.
import { unitPreference } from './unitPreference.svelte.ts';
import { describe, expect, it } from 'vitest';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import type { Project } from '../../../core/project/schema.ts';
import { ProjectState, type SaveFn } from './project.svelte.ts';

function recorder(fail = false) {
  const saved: Project[] = [];
  let release: (() => void) | null = null;
  let hold = false;
  const saver: SaveFn = async (p) => {
    if (hold) await new Promise<void>((r) => (release = r));
    saved.push(p);
    return fail
      ? { ok: false, error: { code: 'storage', message: 'disk full' } }
      : { ok: true, value: { updatedAt: `t${saved.length}` } };
  };
  return {
    saver,
    saved,
    hold: () => (hold = true),
    release: () => {
      hold = false;
      release?.();
    },
  };
}

function opened(fail = false) {
  const rec = recorder(fail);
  const state = new ProjectState(rec.saver);
  state.open(buildDemoProject());
  return { state, rec };
}

describe('ProjectState edits', () => {
  it('adds a support where clicked, selects it, and saves', async () => {
    const { state, rec } = opened();
    const id = state.addSupport([-93.75, 44.9025]);
    expect(id).not.toBeNull();
    expect(state.project!.supports).toHaveLength(9);
    expect(state.selectedSupport?.position).toEqual([-93.75, 44.9025]);
    expect(state.selectedSupport?.name).toBe('Support 1');
    expect(state.save.status).toBe('saving');
    await state.flush();
    expect(state.save).toEqual({ status: 'saved', at: 't1' });
    expect(rec.saved.at(-1)!.supports.some((s) => s.id === id)).toBe(true);
  });

  it('refuses a height the schema rejects and keeps the old value', async () => {
    const { state, rec } = opened();
    expect(state.updateSupport('oak-west', { usableHeightM: -3 })).toBe(false);
    expect(state.editError).toMatch(/usableHeightM: must be greater than 0/);
    expect(state.project!.supports[0]!.usableHeightM).toBe(20);
    expect(state.canUndo).toBe(false);
    await state.flush();
    expect(rec.saved).toHaveLength(0);
  });

  it('does not record an edit that changes nothing', () => {
    const { state } = opened();
    expect(state.updateSupport('oak-west', { usableHeightM: 20 })).toBe(false);
    expect(state.rename('  Larkspur Ridge (demo lot) ')).toBe(false);
    expect(state.past).toHaveLength(0);
  });

  it('draws a boundary from open corners and closes the ring', () => {
    const { state } = opened();
    state.setBoundary([
      [0, 0],
      [0.001, 0],
      [0.001, 0.001],
    ]);
    const ring = state.project!.boundary!.coordinates[0]!;
    expect(ring).toHaveLength(4);
    expect(ring[3]).toEqual(ring[0]);
  });

  it('deletes the selection, whatever it is', () => {
    const { state } = opened();
    state.select({ kind: 'keepOut', id: 'house' });
    expect(state.deleteSelected()).toBe(true);
    expect(state.project!.keepOuts.map((k) => k.id)).toEqual(['road-line', 'garden-path']);
    expect(state.selection).toBeNull();
    state.select({ kind: 'station' });
    state.deleteSelected();
    expect(state.project!.station).toBeNull();
  });

  it('adds a power line with a clearance and a building', () => {
    const { state } = opened();
    const id = state.addKeepOut('power-line', {
      type: 'LineString',
      coordinates: [
        [-93.75, 44.9],
        [-93.749, 44.9],
      ],
    });
    expect(state.selectedKeepOut?.id).toBe(id);
    expect(state.selectedKeepOut?.clearanceM).toBeGreaterThan(0);
    expect(state.selectedKeepOut?.name).toBe('Power line 1');
  });
});

describe('ProjectState undo and redo', () => {
  it('walks back and forth over snapshots', async () => {
    const { state, rec } = opened();
    state.updateSupport('oak-west', { usableHeightM: 17 });
    state.moveSupport('oak-west', [-93.7505, 44.9026]);
    expect(state.past).toHaveLength(2);
    state.undo();
    expect(state.project!.supports[0]!.usableHeightM).toBe(17);
    expect(state.project!.supports[0]!.position).toEqual(buildDemoProject().supports[0]!.position);
    expect(state.lastAction).toBe('Undid: move West oak');
    state.undo();
    expect(state.project!.supports[0]!.usableHeightM).toBe(20);
    expect(state.canUndo).toBe(false);
    state.redo();
    expect(state.project!.supports[0]!.usableHeightM).toBe(17);
    expect(state.canRedo).toBe(true);
    await state.flush();
    expect(rec.saved.at(-1)!.supports[0]!.usableHeightM).toBe(17);
  });

  it('drops the redo stack on a new edit', () => {
    const { state } = opened();
    state.rename('First');
    state.undo();
    state.rename('Second');
    expect(state.canRedo).toBe(false);
    state.undo();
    expect(state.project!.name).toBe('Larkspur Ridge (demo lot)');
  });

  it('clears a selection that undo makes vanish', () => {
    const { state } = opened();
    state.addSupport([-93.75, 44.9025]);
    expect(state.selection?.kind).toBe('support');
    state.undo();
    expect(state.selection).toBeNull();
  });

  it('forgets history when another project opens', () => {
    const { state } = opened();
    state.rename('Changed');
    state.open(buildDemoProject());
    expect(state.canUndo).toBe(false);
    expect(state.save.status).toBe('idle');
  });
});

describe('ProjectState saving', () => {
  it('sends only the newest snapshot after a save in flight', async () => {
    const { state, rec } = opened();
    rec.hold();
    state.rename('A');
    state.rename('B');
    state.rename('C');
    rec.release();
    await state.flush();
    expect(rec.saved.map((p) => p.name)).toEqual(['A', 'C']);
    expect(state.save.status).toBe('saved');
  });

  it('reports a failed save', async () => {
    const { state } = opened(true);
    state.rename('Anything');
    await state.flush();
    expect(state.save).toEqual({ status: 'error', message: 'disk full' });
  });

  it('retries with the current snapshot', async () => {
    const { state, rec } = opened();
    state.rename('Kept');
    await state.flush();
    state.retrySave();
    await state.flush();
    expect(rec.saved.map((p) => p.name)).toEqual(['Kept', 'Kept']);
    expect(state.save).toEqual({ status: 'saved', at: 't2' });
  });
});

describe('ProjectState units', () => {
  it('is the user preference: kept across projects, not an edit that undo reverts', () => {
    unitPreference.reset();
    const { state } = opened();
    expect(state.units).toBe('metric');
    state.rename('Renamed');
    const before = state.project;
    state.setUnits('imperial');
    expect(state.units).toBe('imperial');
    // Not an edit: the project is untouched, and undo reverts the last edit (the rename), not the units.
    expect(state.project).toBe(before);
    state.undo();
    expect(state.project!.name).not.toBe('Renamed');
    expect(state.units).toBe('imperial');
    // Another project opened afterwards keeps the choice.
    const { state: other } = opened();
    expect(other.units).toBe('imperial');
    unitPreference.reset();
  });
});
