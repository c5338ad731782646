/**
 * The user's unit system: a preference of the person, not of a project. It is kept across
 * projects and reloads (localStorage, like the other view preferences), and switching it is not
 * an edit: undo never reverts it and nothing is saved into the project. The project's own
 * `settings.units` is the default for the command line's report only.
 */
import type { UnitSystem } from '../../../core/units/index.ts';

export const UNITS_KEY = 'yardwire.units';

function stored(): UnitSystem | null {
  try {
    const v = typeof localStorage === 'undefined' ? null : localStorage.getItem(UNITS_KEY);
    return v === 'metric' || v === 'imperial' ? v : null;
  } catch {
    return null;
  }
}

class UnitPreference {
  /** Null until the user chooses or a first project is opened. */
  #chosen = $state<UnitSystem | null>(stored());
  units: UnitSystem = $derived(this.#chosen ?? 'metric');

  /** The user's choice: kept for every project from now on. */
  set(units: UnitSystem): void {
    this.#chosen = units;
    try {
      if (typeof localStorage !== 'undefined') localStorage.setItem(UNITS_KEY, units);
    } catch {
      // A browser that refuses storage keeps the choice for this session only.
    }
  }

  /** With no choice made yet, take a project's setting as the starting point (not stored). */
  adoptDefault(units: UnitSystem): void {
    if (this.#chosen === null && stored() === null) this.#chosen = units;
  }

  /** For tests: forget the choice. */
  reset(): void {
    this.#chosen = null;
    try {
      if (typeof localStorage !== 'undefined') localStorage.removeItem(UNITS_KEY);
    } catch {
      // nothing stored
    }
  }
}

export const unitPreference = new UnitPreference();
