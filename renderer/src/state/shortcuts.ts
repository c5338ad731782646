/**
 * Keyboard shortcuts of the editor. Tool keys act only when the focus is not in a text field;
 * undo/redo and Escape work everywhere except inside a field being typed in.
 */
import { TOOLS, type ToolId } from './ui.svelte.ts';

export interface ShortcutTarget {
  setTool(id: ToolId): void;
  undo(): void;
  redo(): void;
  deleteSelected(): boolean;
  cancel(): void;
  toggleHelp(): void;
}

export interface KeyLike {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey: boolean;
  /** The element that has the focus (or null). */
  target: { tagName?: string; isContentEditable?: boolean; type?: string } | null;
}

/** Each tool's key as the tool rail shows it (ui.svelte.ts TOOLS), in lower case. */
const TOOL_KEYS: Record<string, ToolId> = Object.fromEntries(TOOLS.map((t) => [t.key.toLowerCase(), t.id]));

/** The help list: each tool's key and name (ui.svelte.ts TOOLS), then the keys that act on the map. */
export const SHORTCUTS: readonly { keys: string; does: string }[] = [
  ...TOOLS.map((t) => ({ keys: t.key, does: t.label })),
  { keys: 'Enter', does: 'Finish the shape being drawn' },
  { keys: 'Esc', does: 'Cancel the tool or drawing' },
  { keys: 'Del', does: 'Delete the selected item' },
  { keys: 'Ctrl+Z', does: 'Undo' },
  { keys: 'Ctrl+Shift+Z, Ctrl+Y', does: 'Redo' },
  { keys: '?', does: 'Show or hide this list' },
];

function typing(t: KeyLike['target']): boolean {
  if (!t) return false;
  const tag = (t.tagName ?? '').toUpperCase();
  if (t.isContentEditable) return true;
  if (tag === 'TEXTAREA' || tag === 'SELECT') return true;
  if (tag !== 'INPUT') return false;
  return !['button', 'checkbox', 'radio', 'range', 'file', 'submit'].includes(
    (t.type ?? 'text').toLowerCase(),
  );
}

/** Handle a key press; true if it was a shortcut (the caller then prevents the default). */
export function handleShortcut(e: KeyLike, to: ShortcutTarget): boolean {
  if (typing(e.target)) return false;
  const mod = e.ctrlKey || e.metaKey;
  const key = e.key.toLowerCase();
  if (mod && !e.altKey) {
    if (key === 'z' && !e.shiftKey) return (to.undo(), true);
    if ((key === 'z' && e.shiftKey) || key === 'y') return (to.redo(), true);
    return false;
  }
  if (e.altKey) return false;
  if (key === 'escape') return (to.cancel(), true);
  if (key === 'delete' || key === 'backspace') return to.deleteSelected();
  if (e.key === '?') return (to.toggleHelp(), true);
  const tool = TOOL_KEYS[key];
  if (tool && !e.shiftKey) return (to.setTool(tool), true);
  return false;
}
