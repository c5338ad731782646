/**
 * Editor state that is not part of the project: the active tool, the open inspector tab, the
 * cursor position, the last notice, and requests for the map (fit the lot, go to a place).
 */
import type { LonLat } from '../../../core/project/schema.ts';

export type ToolId = 'select' | 'support' | 'boundary' | 'building' | 'power-line' | 'path' | 'station';
export type TabId = 'lot' | 'project' | 'settings' | 'aerial' | 'help';

export interface ToolInfo {
  id: ToolId;
  label: string;
  key: string;
  /** What to do on the map while the tool is active. */
  hint: string;
}

export const TOOLS: readonly ToolInfo[] = [
  {
    id: 'select',
    label: 'Select and move',
    key: 'V',
    hint: 'Click an item to edit it; drag supports or corners to move them.',
  },
  {
    id: 'support',
    label: 'Add support',
    key: 'S',
    hint: 'Click the map where the tree, mast, tower or building stands.',
  },
  {
    id: 'boundary',
    label: 'Draw lot boundary',
    key: 'B',
    hint: 'Click each corner of the lot; click the first corner again (or press Enter) to close it.',
  },
  {
    id: 'building',
    label: 'Draw building keep-out',
    key: 'K',
    hint: 'Click the corners of the building; click the first corner (or Enter) to close.',
  },
  {
    id: 'power-line',
    label: 'Draw power line',
    key: 'P',
    hint: 'Click along the line pole to pole; click the last point again (or Enter) to finish.',
  },
  {
    id: 'path',
    label: 'Draw path or play area',
    key: 'W',
    hint: 'Click along a walkway, drive or play area where people walk; click the last point again (or Enter) to finish.',
  },
  {
    id: 'station',
    label: 'Place station',
    key: 'T',
    hint: 'Click where the radio (the feed line entry) is.',
  },
];

export const toolById = (id: ToolId): ToolInfo => TOOLS.find((t) => t.id === id) ?? TOOLS[0]!;

export interface Notice {
  kind: 'info' | 'error';
  text: string;
}

/** How long an information notice stays on screen. */
export const INFO_NOTICE_MS = 5000;

export class UiState {
  tool = $state<ToolId>('select');
  tab = $state<TabId>('lot');
  cursor = $state.raw<LonLat | null>(null);
  notice = $state.raw<Notice | null>(null);
  /** Incremented to ask the map to fit the whole project into view. */
  fitRequest = $state(0);
  /** A place the map should centre on (from "Go to"). */
  goTo = $state.raw<{ at: LonLat; seq: number } | null>(null);
  /**
   * Width in pixels of the map's left part that a panel covers (the empty-lot card), so that a
   * Go centres the place in the part of the map left in view.
   */
  mapCoverLeftPx = $state(0);
  /** The centre of the lot map as last moved (where a typed boundary starts without a Go). */
  mapCentre = $state.raw<LonLat | null>(null);

  toolInfo = $derived(toolById(this.tool));

  setTool(id: ToolId): void {
    this.tool = id;
    if (id !== 'select') this.tab = 'lot';
  }

  /** Show a notice; information fades after a few seconds, errors stay until dismissed. */
  notify(kind: Notice['kind'], text: string): void {
    const notice = { kind, text };
    this.notice = notice;
    if (kind === 'info') {
      setTimeout(() => {
        if (this.notice === notice) this.notice = null;
      }, INFO_NOTICE_MS);
    }
  }

  /** A point the map should bring into view if it is off screen (an item picked in a list). */
  reveal = $state.raw<{ at: LonLat; seq: number } | null>(null);

  requestReveal(at: LonLat): void {
    this.reveal = { at, seq: (this.reveal?.seq ?? 0) + 1 };
  }

  requestGoTo(at: LonLat): void {
    this.goTo = { at, seq: (this.goTo?.seq ?? 0) + 1 };
  }
}
