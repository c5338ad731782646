/** The words of a provisional (live) shortlist, for the run bar and above the shortlist. */
import type { LiveView } from './planRun.svelte.ts';

/** 'settling' (the exact plan runs), 'following' (the drag moved on) or 'provisional'. */
export function liveState(v: LiveView): 'settling' | 'following' | 'provisional' {
  return v.settling ? 'settling' : v.following ? 'following' : 'provisional';
}

/** Short, for the run bar. */
export function liveShort(v: LiveView): string {
  const s = liveState(v);
  return s === 'settling'
    ? 'Provisional: the exact plan is running'
    : s === 'following'
      ? 'Provisional, following the drag'
      : `Provisional (${Math.round(v.ms)} ms)`;
}

/** In full, above the shortlist. */
export function liveText(v: LiveView): string {
  const borrowed = v.borrowed
    ? ` ${v.borrowed} placement${v.borrowed === 1 ? '' : 's'} use the evaluation of the most similar design already solved` +
      (v.leftOut ? `; ${v.leftOut} with none similar are left out.` : '.')
    : '';
  const head =
    liveState(v) === 'settling'
      ? 'Provisional ranking of the new position; the exact plan is running and will replace it.'
      : liveState(v) === 'following'
        ? 'Provisional ranking, following the drag (shown for an earlier position while the next is ranked).'
        : 'Provisional ranking at the drag position; the exact plan runs when you let go.';
  return `${head}${borrowed}${v.error ? ` The last re-ranking failed: ${v.error}` : ''}`;
}
