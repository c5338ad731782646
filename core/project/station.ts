/**
 * The station's defaults and limits, in one place: the project schema, the exposure estimate,
 * the build sheet, the command line and the settings panel all read them from here.
 */

/** Highest transmitter power the tools accept, watts PEP (above any amateur licence). */
export const MAX_POWER_W = 100_000;

/** A transmitter power the tools accept: above 0 and at most MAX_POWER_W watts. */
export function isPowerW(v: number): boolean {
  return Number.isFinite(v) && v > 0 && v <= MAX_POWER_W;
}

/** An on-time fraction the tools accept: 0…1 of the averaging time. */
export function isOnTimeFraction(v: number): boolean {
  return Number.isFinite(v) && v >= 0 && v <= 1;
}

/**
 * A new project's station: 100 W PEP SSB, on the air half of the averaging time, RG-213 feed line
 * (a typical amateur station; common practice, no source).
 */
export const STATION_DEFAULTS = {
  powerW: 100,
  mode: 'ssb',
  onTimeFraction: 0.5,
  coax: 'RG-213',
} as const;
