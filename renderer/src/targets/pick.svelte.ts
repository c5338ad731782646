/**
 * What a click on the bearing map does: toggle the nearest built-in region (the default), set the
 * centre of the user's own point target, or add a corner to the area being drawn.
 */
import type { LonLat } from '../../../core/project/schema.ts';
import { nearestRegion } from './bearingMap.ts';
import type { TargetsState } from './targets.svelte.ts';

export type PickMode = 'region' | 'point' | 'area';

export class PickState {
  mode = $state<PickMode>('region');
  /** Centre chosen for a point target. */
  point = $state.raw<LonLat | null>(null);
  /** Corners of the area being drawn. */
  corners = $state.raw<LonLat[]>([]);
  /** What the last click did, in words. */
  said = $state('');

  pick(at: LonLat, targets: TargetsState): void {
    if (this.mode === 'point') {
      this.point = at;
      this.said = `centre set at ${at[1].toFixed(2)}°, ${at[0].toFixed(2)}°`;
      return;
    }
    if (this.mode === 'area') {
      this.corners = [...this.corners, at];
      this.said = `${this.corners.length} corner${this.corners.length === 1 ? '' : 's'}`;
      return;
    }
    const r = nearestRegion(at);
    if (!r) {
      this.said = 'no built-in region near there: add your own target below';
      return;
    }
    const wasChosen = targets.isChosen(r.id);
    if (targets.toggleRegion(r.id)) this.said = wasChosen ? `removed ${r.name}` : `added ${r.name}`;
  }

  reset(): void {
    this.mode = 'region';
    this.point = null;
    this.corners = [];
  }
}
