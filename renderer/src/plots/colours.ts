/**
 * Colours of the planning views, chosen for this app: one hue per target region (muted, told
 * apart on white and on the pale map), and two strong inks for the candidates being compared.
 * Plots carry colours as SVG attributes, not CSS, so that an exported SVG or PNG looks the same.
 */
export const TARGET_COLOURS = [
  '#b4532a',
  '#3267a8',
  '#7d4e9e',
  '#2f7d4f',
  '#a87b12',
  '#b23c70',
  '#27808a',
  '#66702c',
];

export const targetColour = (index: number): string =>
  TARGET_COLOURS[((index % TARGET_COLOURS.length) + TARGET_COLOURS.length) % TARGET_COLOURS.length]!;

/** Candidate A (the selected one) and B (the one compared with it). */
export const CANDIDATE_COLOURS = ['#173f5f', '#d0711b'] as const;

/** The directions (relay states) of one switched array, drawn together in its detail (and on the build sheet). */
export { STATE_COLOURS } from '../../../core/rank/candidateStates.ts';

export const PLOT_INK = {
  text: '#1f2528',
  muted: '#5b656b',
  grid: '#dde1d9',
  axis: '#9aa39d',
  background: '#ffffff',
  font: "system-ui, 'Segoe UI', 'Noto Sans', 'DejaVu Sans', sans-serif",
};
