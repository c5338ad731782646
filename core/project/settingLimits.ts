/**
 * Where each limit a rejection cites is set: every limit the planner holds a placement to is a
 * project setting, and a rejection names the setting so the user knows where to change it. The
 * labels are the ones the Settings panel shows (renderer/src/components/SettingsPanel.svelte).
 */
export const LIMIT_SETTINGS = {
  setbackM: 'Setback from the lot line',
  minEndHeightM: 'Lowest wire end above ground',
  maxVerticalHeightM: 'Largest self-supporting vertical',
  maxRopeM: 'Longest rope from a wire end to its support',
  buriedClearanceM: 'Radials from poles and buried lines',
} as const;

export type LimitSetting = keyof typeof LIMIT_SETTINGS;

/** The tail a rejection adds after citing a limit, e.g. "; change it in Settings › Setback from the lot line". */
export function whereToChange(key: LimitSetting): string {
  return `; change it in Settings › ${LIMIT_SETTINGS[key]}`;
}
