import { describe, expect, it } from 'vitest';
import { handleShortcut, type KeyLike, type ShortcutTarget } from './shortcuts.ts';

function target() {
  const calls: string[] = [];
  const t: ShortcutTarget = {
    setTool: (id) => calls.push(`tool:${id}`),
    undo: () => calls.push('undo'),
    redo: () => calls.push('redo'),
    deleteSelected: () => (calls.push('delete'), true),
    cancel: () => calls.push('cancel'),
    toggleHelp: () => calls.push('help'),
  };
  return { t, calls };
}

const key = (k: string, extra: Partial<KeyLike> = {}): KeyLike => ({
  key: k,
  ctrlKey: false,
  metaKey: false,
  shiftKey: false,
  altKey: false,
  target: { tagName: 'BODY' },
  ...extra,
});

describe('handleShortcut', () => {
  it('maps tool letters, undo and both redo chords', () => {
    const { t, calls } = target();
    for (const k of ['s', 'B', 'k', 'p', 't', 'v']) handleShortcut(key(k), t);
    handleShortcut(key('z', { ctrlKey: true }), t);
    handleShortcut(key('Z', { ctrlKey: true, shiftKey: true }), t);
    handleShortcut(key('y', { metaKey: true }), t);
    handleShortcut(key('Escape'), t);
    handleShortcut(key('Delete'), t);
    expect(calls).toEqual([
      'tool:support',
      'tool:boundary',
      'tool:building',
      'tool:power-line',
      'tool:station',
      'tool:select',
      'undo',
      'redo',
      'redo',
      'cancel',
      'delete',
    ]);
  });

  it('leaves keys alone while the user types in a field', () => {
    const { t, calls } = target();
    expect(handleShortcut(key('s', { target: { tagName: 'INPUT', type: 'text' } }), t)).toBe(false);
    expect(handleShortcut(key('Backspace', { target: { tagName: 'INPUT', type: 'number' } }), t)).toBe(false);
    expect(handleShortcut(key('z', { ctrlKey: true, target: { tagName: 'TEXTAREA' } }), t)).toBe(false);
    expect(calls).toEqual([]);
    expect(handleShortcut(key('s', { target: { tagName: 'INPUT', type: 'range' } }), t)).toBe(true);
  });

  it('ignores other chords', () => {
    const { t, calls } = target();
    expect(handleShortcut(key('s', { ctrlKey: true }), t)).toBe(false);
    expect(handleShortcut(key('x'), t)).toBe(false);
    expect(calls).toEqual([]);
  });
});
