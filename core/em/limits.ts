/**
 * The field solver's documented limits (core/em/README.md, "Limits"): every input that drives the
 * cost of an evaluation (unknowns, frequencies, pattern points) and the numeric range of every
 * physical quantity (frequency, wire radius, soil, loads, sources) is bounded here, and
 * `checkWork` refuses a model beyond them with the offending field named, before the solver
 * allocates anything. The bounds on cost are chosen so that the largest accepted evaluation
 * finishes in tens of seconds on a two-core machine (measure with `npx tsx test/bench/limits.ts`);
 * the physical ranges are those of the models used (thin-wire kernel, homogeneous soil).
 */
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';
import { ModelError } from './errors.ts';
import {
  DEFAULT_MIN_SEGMENT_RADII,
  DEFAULT_SEGMENTS_PER_WAVELENGTH,
  GROUND_CONTACT_TOLERANCE_M,
} from './mesh.ts';
import type { AntennaModel } from './types.ts';

export const LIMITS = {
  /** Frequency range, Hz: 10 kHz … 1 GHz. */
  minFreqHz: 1e4,
  maxFreqHz: 1e9,
  /** Frequencies in one evaluation. */
  maxFrequencies: 401,
  /** Unknowns (segments) of the meshed model; the dense matrix is 16·N² bytes (about 100 MB at 2 500). */
  maxUnknowns: 2500,
  /**
   * Solver work, frequencies × unknowns³ (fill and dense LU grow as about N³ here): one frequency
   * at 2 025 unknowns (8.3e9) takes about 8 s on this two-core machine, so the bound is about
   * 50 s (e.g. 6 frequencies at 2 000 unknowns, 60 at 930, the 401 allowed below 500).
   */
  maxSolveWork: 5e10,
  /** Pattern directions per frequency, and over all frequencies. */
  maxPatternPoints: 65_341, // 181 × 361, a 1° grid over the whole sphere
  maxPatternPointsTotal: 400_000,
  /**
   * Wire radius, m: 1 nm (the thin-wire limit checks of test/reference/em use 1e-9 m; at 1e-100 m
   * the kernel's logarithm no longer separates the self term) … and at most this fraction of
   * the shortest wavelength (thin-wire model).
   */
  minRadiusM: 1e-9,
  maxRadiusWavelengths: 0.02,
  /**
   * Size of the antenna (diagonal of the box around its wires, in wavelengths at the highest
   * frequency): the far-field integration's quadrature is sized for up to about 20 λ.
   */
  maxSizeWavelengths: 19,
  /** Coordinates, m from the origin. */
  maxCoordinateM: 20_000,
  /**
   * Soil: relative permittivity 1 … 100 (water is about 80; a lossless soil of 1e8 made the
   * Sommerfeld integrals run for minutes), conductivity 0 … 1e9 S/m (sea water is about 5; the
   * limit checks toward perfect ground use up to 1e9).
   */
  maxPermittivity: 100,
  maxSoilConductivitySPerM: 1e9,
  /** Wire conductivity, S/m: 1e3 … 1e9 (graphite to beyond silver). */
  minWireConductivitySPerM: 1e3,
  maxWireConductivitySPerM: 1e9,
  maxRelativePermeability: 1e4,
  /** Load resistance and reactance, Ω (resistance never negative: a load does not supply power). */
  maxLoadOhm: 1e9,
  /** Inductance up to 10 H; capacitance 0.01 pF … 1 F. */
  maxInductanceH: 10,
  minCapacitanceF: 1e-14,
  maxCapacitanceF: 1,
  /** Source voltage magnitude, V. */
  maxVoltageV: 1e6,
  /** Radial length, m. */
  maxRadialLengthM: 10_000,
} as const;

/**
 * Smallest height (m) of a wire that does not touch the ground: 1 cm, or 4 radii if more. Lower,
 * the thin-wire kernel's image term and the exact ground's tables lose their accuracy (the image
 * is closer than a few radii), so such a wire is refused rather than solved with a silent switch.
 */
export function minGroundClearanceM(radiusM: number): number {
  return Math.max(0.01, 4 * radiusM);
}

/**
 * `groundPowerCheck` work (spectral points × segments, absorption.ts `groundAbsorptionWork`) at
 * most this, about 20 s here at 100–150 ns per unit (`npx tsx test/bench/limits.ts`): a 40 m
 * dipole 2 m over the ground on 80 m costs 2e7 (3 s); at 0.5 m 2.5e8, refused.
 */
export const MAX_GROUND_CHECK_WORK = 1.5e8;
/** Measured cost of one unit of ground-check work, s (for the refusal's estimate). */
export const GROUND_CHECK_S_PER_UNIT = 150e-9;

export interface WorkOptions {
  frequenciesHz: readonly number[];
  pattern?: { elevationsDeg: readonly number[]; azimuthsDeg: readonly number[] };
  segmentsPerWavelength?: number;
}

const fmt = (v: number): string =>
  Math.abs(v) >= 1e4 || Math.abs(v) < 1e-3 ? v.toExponential(2) : String(v);

/** Estimated segment count of wire i (the mesh's rule, before alignment to feeds and loads). */
function estimatedSegments(
  lengthM: number,
  radiusM: number,
  given: number | undefined,
  lambda: number,
  spw: number,
): number {
  if (given !== undefined) return given;
  const n0 = Math.max(1, Math.ceil((lengthM * spw) / lambda));
  const maxByRadius = Math.max(1, Math.floor(lengthM / (DEFAULT_MIN_SEGMENT_RADII * radiusM)));
  return Math.min(n0, maxByRadius);
}

/**
 * Check a model and its options against LIMITS. Returns every violation (field, message); the
 * first is what `assertWork` throws. Costs O(wires + loads + frequencies): nothing is allocated
 * in proportion to the work it guards.
 */
export function checkWork(model: AntennaModel, opts: WorkOptions): { field: string; message: string }[] {
  const out: { field: string; message: string }[] = [];
  const add = (field: string, message: string) => out.push({ field, message });
  const fs = opts.frequenciesHz;
  if (fs.length > LIMITS.maxFrequencies)
    add('frequenciesMHz', `${fs.length} frequencies: at most ${LIMITS.maxFrequencies} in one evaluation`);
  let fMax = 0;
  fs.forEach((f, i) => {
    if (!(f >= LIMITS.minFreqHz && f <= LIMITS.maxFreqHz))
      add(
        `frequenciesMHz[${i}]`,
        `${fmt(f / 1e6)} MHz is outside the solver's range ${LIMITS.minFreqHz / 1e6}…${LIMITS.maxFreqHz / 1e6} MHz`,
      );
    else fMax = Math.max(fMax, f);
  });
  const g = model.ground;
  if (g.kind === 'soil') {
    if (!(g.permittivity >= 1 && g.permittivity <= LIMITS.maxPermittivity))
      add(
        'ground.permittivity',
        `relative permittivity ${fmt(g.permittivity)} is outside 1…${LIMITS.maxPermittivity} (water is about 80)`,
      );
    if (!(g.conductivitySPerM >= 0 && g.conductivitySPerM <= LIMITS.maxSoilConductivitySPerM))
      add(
        'ground.conductivitySPerM',
        `conductivity ${fmt(g.conductivitySPerM)} S/m is outside 0…${LIMITS.maxSoilConductivitySPerM} S/m (sea water is about 5); use "perfect" for a metal ground`,
      );
  }
  const lambda = fMax > 0 ? SPEED_OF_LIGHT_M_PER_S / fMax : 0;
  const spw = opts.segmentsPerWavelength ?? DEFAULT_SEGMENTS_PER_WAVELENGTH;
  let segments = 0;
  model.wires.forEach((w, i) => {
    for (const [key, p] of [
      ['from', w.from],
      ['to', w.to],
    ] as const)
      p.forEach((v, j) => {
        if (!(Math.abs(v) <= LIMITS.maxCoordinateM))
          add(
            `wires[${i}].${key}[${j}]`,
            `${fmt(v)} m is more than ${LIMITS.maxCoordinateM} m from the origin`,
          );
      });
    if (!(w.radiusM >= LIMITS.minRadiusM))
      add(`wires[${i}].radiusM`, `radius ${fmt(w.radiusM)} m is below ${LIMITS.minRadiusM} m (1 nm)`);
    else if (lambda > 0 && w.radiusM > LIMITS.maxRadiusWavelengths * lambda)
      add(
        `wires[${i}].radiusM`,
        `radius ${fmt(w.radiusM)} m is ${(w.radiusM / lambda).toFixed(3)} λ at ${fmt(fMax / 1e6)} MHz: the thin-wire model holds below ${LIMITS.maxRadiusWavelengths} λ (${(LIMITS.maxRadiusWavelengths * lambda).toPrecision(3)} m); describe a thick conductor by several thinner wires`,
      );
    const m = w.material;
    if (m !== undefined && typeof m !== 'string') {
      if (!(
        m.conductivitySPerM >= LIMITS.minWireConductivitySPerM &&
        m.conductivitySPerM <= LIMITS.maxWireConductivitySPerM
      ))
        add(
          `wires[${i}].material.conductivitySPerM`,
          `${fmt(m.conductivitySPerM)} S/m is outside ${fmt(LIMITS.minWireConductivitySPerM)}…${fmt(LIMITS.maxWireConductivitySPerM)} S/m`,
        );
      if (!(m.relativePermeability >= 1 && m.relativePermeability <= LIMITS.maxRelativePermeability))
        add(
          `wires[${i}].material.relativePermeability`,
          `${fmt(m.relativePermeability)} is outside 1…${fmt(LIMITS.maxRelativePermeability)}`,
        );
    }
    const L = Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]);
    if (lambda > 0 && Number.isFinite(L) && w.radiusM > 0)
      segments += estimatedSegments(L, w.radiusM, w.segments, lambda, spw);
  });
  if (out.length === 0 && lambda > 0) {
    const lo = [Infinity, Infinity, Infinity];
    const hi = [-Infinity, -Infinity, g.kind === 'free-space' ? -Infinity : 0];
    for (const w of model.wires)
      for (const p of [w.from, w.to])
        for (let j = 0; j < 3; j++) {
          lo[j] = Math.min(lo[j], j === 2 && g.kind !== 'free-space' ? 0 : p[j]);
          hi[j] = Math.max(hi[j], p[j]);
        }
    const size = Math.hypot(hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2]) / lambda;
    if (size > LIMITS.maxSizeWavelengths)
      add(
        'wires',
        `the antenna spans ${size.toFixed(1)} λ at ${fmt(fMax / 1e6)} MHz (at most ${LIMITS.maxSizeWavelengths} λ): make it smaller or lower the highest frequency`,
      );
  }
  if (out.length === 0 && segments > LIMITS.maxUnknowns)
    add(
      'wires',
      `the model needs about ${segments} segments at ${fmt(fMax / 1e6)} MHz (at most ${LIMITS.maxUnknowns}): shorten the wires, lower the highest frequency, or give fewer segments`,
    );
  const work = fs.length * segments ** 3;
  if (out.length === 0 && work > LIMITS.maxSolveWork)
    add(
      'frequenciesMHz',
      `${fs.length} frequencies at about ${segments} unknowns is too much work for one evaluation (frequencies × unknowns³ at most ${fmt(LIMITS.maxSolveWork)}): give at most ${Math.max(1, Math.floor(LIMITS.maxSolveWork / segments ** 3))} frequencies`,
    );
  if (g.kind !== 'free-space')
    model.wires.forEach((w, i) => {
      const zMin = Math.min(w.from[2], w.to[2]);
      const zMax = Math.max(w.from[2], w.to[2]);
      const tol = Math.max(GROUND_CONTACT_TOLERANCE_M, w.radiusM);
      const low = w.from[2] <= w.to[2] ? 'from' : 'to';
      if (!Number.isFinite(zMin) || !Number.isFinite(zMax)) return;
      if (zMax <= tol)
        add(
          `wires[${i}]`,
          'the wire lies on the ground: the solver cannot model a conductor along the soil; describe buried or on-ground wires as radials, or raise the wire',
        );
      else if (zMin > tol && zMin < minGroundClearanceM(w.radiusM))
        add(
          `wires[${i}].${low}[2]`,
          `the wire comes within ${(zMin * 1000).toFixed(1)} mm of the ground without touching it; raise it to at least ${(minGroundClearanceM(w.radiusM) * 1000).toFixed(0)} mm, or end it on the ground (z = 0)`,
        );
    });
  (model.feeds ?? []).forEach((f, i) => {
    const v = f.voltage;
    if (v && !(Math.hypot(v[0], v[1]) <= LIMITS.maxVoltageV))
      add(`feeds[${i}].voltage`, `magnitude above ${fmt(LIMITS.maxVoltageV)} V`);
  });
  (model.loads ?? []).forEach((l, i) => {
    const p = `loads[${i}]`;
    if (l.rOhm !== undefined) {
      if (l.rOhm < 0)
        add(
          `${p}.rOhm`,
          'a load resistance cannot be negative (a load absorbs power; it does not supply it)',
        );
      else if (!(l.rOhm <= LIMITS.maxLoadOhm)) add(`${p}.rOhm`, `above ${fmt(LIMITS.maxLoadOhm)} Ω`);
    }
    if (l.kind === 'impedance' && !(Math.abs(l.xOhm) <= LIMITS.maxLoadOhm))
      add(`${p}.xOhm`, `magnitude above ${fmt(LIMITS.maxLoadOhm)} Ω`);
    if (l.kind !== 'impedance') {
      if (l.lH !== undefined && !(l.lH > 0 && l.lH <= LIMITS.maxInductanceH))
        add(`${p}.lH`, `outside 0…${LIMITS.maxInductanceH} H`);
      if (l.cF !== undefined && !(l.cF >= LIMITS.minCapacitanceF && l.cF <= LIMITS.maxCapacitanceF))
        add(`${p}.cF`, `outside ${fmt(LIMITS.minCapacitanceF)}…${LIMITS.maxCapacitanceF} F`);
    }
  });
  (model.radials ?? []).forEach((r, i) => {
    if (!(r.radiusM >= 1e-6 && r.radiusM <= 0.1))
      add(`radials[${i}].radiusM`, `radius ${fmt(r.radiusM)} m is outside 1e-6…0.1 m`);
    r.lengthsM.forEach((len, j) => {
      if (!(len > 0 && len <= LIMITS.maxRadialLengthM))
        add(
          r.lengthsM.every((x) => x === r.lengthsM[0])
            ? `radials[${i}].lengthM`
            : `radials[${i}].lengthsM[${j}]`,
          `length ${fmt(len)} m is outside 0…${LIMITS.maxRadialLengthM} m`,
        );
    });
  });
  const pat = opts.pattern;
  if (pat) {
    const n = pat.elevationsDeg.length * pat.azimuthsDeg.length;
    if (n > LIMITS.maxPatternPoints)
      add(
        'pattern',
        `${pat.elevationsDeg.length} × ${pat.azimuthsDeg.length} = ${n} directions: at most ${LIMITS.maxPatternPoints} (a 1° grid over the sphere)`,
      );
    else if (n * fs.length > LIMITS.maxPatternPointsTotal)
      add(
        'pattern',
        `${n} directions at ${fs.length} frequencies = ${n * fs.length} pattern rows: at most ${LIMITS.maxPatternPointsTotal}; use a coarser grid or fewer frequencies`,
      );
  }
  return out;
}

/** Throw the first violation of LIMITS as a ModelError naming its field. */
export function assertWork(model: AntennaModel, opts: WorkOptions): void {
  const v = checkWork(model, opts);
  if (v.length) throw new ModelError(v[0].field, v[0].message);
}
