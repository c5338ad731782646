/**
 * A designed match from a solved feed impedance: the two-element L-network in both of its usable
 * arrangements (component values and their loss at a stated component Q), and for a
 * ground-mounted vertical the common alternatives, a shunt coil at the base and a broadband
 * transformer. Pure; SI inside (ohms, hertz, henries, farads), µH and pF only in the results.
 *
 * Source: D. M. Pozar, Microwave Engineering, 4th ed. (Wiley, 2012), §5.1 "Matching with lumped
 * elements (L networks)", eq. (5.3a, b) for R_L > Z0 and eq. (5.6a, b) for R_L < Z0
 * (core/REFERENCES.md §12). Symbols as there: Z_L = R_L + jX_L the load, jB the shunt
 * susceptance, jX the series reactance, Z0 the line.
 */

/** Quality factors the loss is estimated at (stated on every result; from memory, typical values). */
export interface ComponentQ {
  /** An air-wound or toroid coil at HF: about 200 (typical, from memory). */
  inductor: number;
  /** A mica, ceramic or air-variable capacitor at HF: about 1000 (typical, from memory). */
  capacitor: number;
}
export const DEFAULT_Q: ComponentQ = { inductor: 200, capacitor: 1000 };

/** The SWR above which a candidate gets a designed match (at or below it the feed line is used as is). */
export const MATCH_ABOVE_SWR = 1.5;

export type ComponentKind = 'inductor' | 'capacitor';

export interface MatchComponent {
  kind: ComponentKind;
  /** Where it sits: in series with the line, or across it (shunt). */
  position: 'series' | 'shunt';
  /** µH for an inductor, pF for a capacitor. */
  value: number;
  unit: 'µH' | 'pF';
  /** Its reactance at the design frequency, Ω (positive inductive). */
  reactanceOhm: number;
}

export interface LNetworkDesign {
  /** Which element sits next to the antenna: the shunt one (R_L > Z0) or the series one (R_L < Z0). */
  nextToAntenna: 'shunt' | 'series';
  /** Plain words, e.g. "series 2.1 µH coil at the antenna, 1200 pF capacitor across the line at the transmitter side". */
  arrangement: string;
  /** Listed from the transmitter side to the antenna. */
  components: MatchComponent[];
  /** The solution's B (siemens) and X (ohms) of Pozar's eq. (5.3)/(5.6). */
  susceptanceS: number;
  reactanceOhm: number;
  /** Power lost in the components at the stated Q, dB. */
  lossDb: number;
}

interface C {
  re: number;
  im: number;
}
const c = (re: number, im = 0): C => ({ re, im });
const add = (a: C, b: C): C => c(a.re + b.re, a.im + b.im);
const inv = (a: C): C => {
  const d = a.re * a.re + a.im * a.im;
  return c(a.re / d, -a.im / d);
};
const abs2 = (a: C): number => a.re * a.re + a.im * a.im;

/** Impedance of a component of reactance x at quality factor q (series loss resistance |x|/q). */
function lossyZ(x: number, q: number): C {
  return c(Math.abs(x) / q, x);
}

function qOf(x: number, q: ComponentQ): number {
  return x >= 0 ? q.inductor : q.capacitor;
}

function component(position: 'series' | 'shunt', reactanceOhm: number, omega: number): MatchComponent {
  if (reactanceOhm >= 0)
    return { kind: 'inductor', position, value: (reactanceOhm / omega) * 1e6, unit: 'µH', reactanceOhm };
  return {
    kind: 'capacitor',
    position,
    value: (-1 / (omega * reactanceOhm)) * 1e12,
    unit: 'pF',
    reactanceOhm,
  };
}

/**
 * Loss of an L-network at the stated Q: with 1 V (shunt at the input) or 1 A (series at the
 * input) at the network's input, the power into the network over the power into the load.
 */
export function lNetworkLossDb(
  zL: C,
  B: number,
  X: number,
  nextToAntenna: 'shunt' | 'series',
  q: ComponentQ = DEFAULT_Q,
): number {
  const xShunt = -1 / B; // a shunt susceptance jB is a reactance −1/B
  // No shunt element (B = 0): no admittance across the line.
  const yShunt = B === 0 ? c(0) : inv(lossyZ(xShunt, qOf(xShunt, q)));
  const zSeries = lossyZ(X, qOf(X, q));
  let pIn: number;
  let pLoad: number;
  if (nextToAntenna === 'series') {
    // Input: shunt across 1 V; the series element and the load after it.
    const z1 = add(zL, zSeries);
    const yIn = add(yShunt, inv(z1));
    pIn = yIn.re;
    pLoad = abs2(inv(z1)) * zL.re;
  } else {
    // Input: 1 A through the series element; the shunt element across the load.
    const z2 = inv(add(inv(zL), yShunt));
    const zIn = add(zSeries, z2);
    pIn = zIn.re;
    pLoad = abs2(z2) * inv(zL).re;
  }
  return 10 * Math.log10(pIn / pLoad);
}

const fmtValue = (m: MatchComponent): string =>
  m.unit === 'µH' ? `${m.value.toPrecision(3)} µH coil` : `${Math.round(m.value)} pF capacitor`;

/**
 * Both usable L-networks that bring Z_L to Z0 at the frequency (the two signs of Pozar's
 * solution), lower loss first. Throws a RangeError for a load without resistance.
 */
export function designLNetworks(
  zLoadOhm: readonly [number, number],
  freqHz: number,
  z0Ohm = 50,
  q: ComponentQ = DEFAULT_Q,
): LNetworkDesign[] {
  const [RL, XL] = zLoadOhm;
  if (!(RL > 0) || !Number.isFinite(XL)) throw new RangeError('the load needs a positive, finite resistance');
  if (!(freqHz > 0)) throw new RangeError('the frequency must be positive');
  const omega = 2 * Math.PI * freqHz;
  const Z0 = z0Ohm;
  const out: LNetworkDesign[] = [];
  if (RL > Z0) {
    // Pozar eq. (5.3a, b): shunt jB across the load, series jX toward the line.
    const root = Math.sqrt(RL / Z0) * Math.sqrt(RL * RL + XL * XL - Z0 * RL);
    for (const s of [1, -1]) {
      const B = (XL + s * root) / (RL * RL + XL * XL);
      const X = 1 / B + (XL * Z0) / RL - Z0 / (B * RL);
      const shunt = component('shunt', -1 / B, omega);
      const series = component('series', X, omega);
      out.push({
        nextToAntenna: 'shunt',
        arrangement: `${fmtValue(shunt)} across the antenna terminals, ${fmtValue(series)} in series toward the transmitter`,
        components: [series, shunt],
        susceptanceS: B,
        reactanceOhm: X,
        lossDb: lNetworkLossDb(c(RL, XL), B, X, 'shunt', q),
      });
    }
  } else {
    // Pozar eq. (5.6a, b): series jX next to the load, shunt jB across the line.
    const root = Math.sqrt(RL * (Z0 - RL));
    for (const s of [1, -1]) {
      const X = s * root - XL;
      const B = (s * Math.sqrt((Z0 - RL) / RL)) / Z0;
      if (B === 0) {
        // R_L = Z0: the series element alone cancels X_L (both signs give it; keep one).
        if (out.length) continue;
        const series = component('series', X, omega);
        out.push({
          nextToAntenna: 'series',
          arrangement: `${fmtValue(series)} in series at the antenna`,
          components: [series],
          susceptanceS: 0,
          reactanceOhm: X,
          lossDb: lNetworkLossDb(c(RL, XL), 0, X, 'series', q),
        });
        continue;
      }
      const shunt = component('shunt', -1 / B, omega);
      const series = component('series', X, omega);
      out.push({
        nextToAntenna: 'series',
        arrangement: `${fmtValue(series)} in series at the antenna, ${fmtValue(shunt)} across the line at the transmitter side`,
        components: [shunt, series],
        susceptanceS: B,
        reactanceOhm: X,
        lossDb: lNetworkLossDb(c(RL, XL), B, X, 'series', q),
      });
    }
  }
  return out.sort((a, b) => a.lossDb - b.lossDb);
}

/** The impedance the network presents to the line (lossless components), for checks. */
export function lNetworkInputOhm(zLoadOhm: readonly [number, number], d: LNetworkDesign): [number, number] {
  const zL = c(zLoadOhm[0], zLoadOhm[1]);
  const yShunt = c(0, d.susceptanceS);
  const zSeries = c(0, d.reactanceOhm);
  const z =
    d.nextToAntenna === 'series'
      ? inv(add(yShunt, inv(add(zL, zSeries))))
      : add(zSeries, inv(add(inv(zL), yShunt)));
  return [z.re, z.im];
}

/* ----------------------------------------------------------------------------------------------
 * Ground-mounted verticals: the common alternatives
 * -------------------------------------------------------------------------------------------- */

export interface ShuntCoilMatch {
  /**
   * The reactance to give the vertical at its feed (by making it longer than resonant or shorter:
   * negative, capacitive, is what a shunt coil needs): X' with R²+X'² = R·Z0, i.e. −√(R(Z0 − R)).
   * Assumes the feed resistance stays about R while the length changes (it rises a little).
   */
  targetReactanceOhm: number;
  coil: MatchComponent;
  lossDb: number;
}

/**
 * A coil across the base of a vertical whose resistance is below Z0: the vertical is shortened
 * until its feed reads R − jX' with X' = √(R(Z0 − R)); the coil's susceptance 1/(ωL) = X'/(R Z0)
 * cancels what remains, leaving Re = Z0 (the R_L < Z0 L-network with its series element made by
 * the antenna's own length; Pozar eq. (5.6) with X = −X').
 */
export function shuntCoilMatch(
  rOhm: number,
  freqHz: number,
  z0Ohm = 50,
  q: ComponentQ = DEFAULT_Q,
): ShuntCoilMatch | null {
  if (!(rOhm > 0 && rOhm < z0Ohm)) return null;
  const omega = 2 * Math.PI * freqHz;
  const xp = Math.sqrt(rOhm * (z0Ohm - rOhm));
  const xCoil = (rOhm * z0Ohm) / xp; // ωL
  const coil = component('shunt', xCoil, omega);
  // Loss: the coil's conductance beside the antenna's.
  const zA = c(rOhm, -xp);
  const yA = inv(zA);
  const yCoil = inv(lossyZ(xCoil, q.inductor));
  const lossDb = 10 * Math.log10((yA.re + yCoil.re) / yA.re);
  return { targetReactanceOhm: -xp, coil, lossDb };
}

/** Broadband transformer (unun) impedance ratios commonly sold (common practice, no source). */
export const UNUN_RATIOS = [1.5, 2, 4, 9] as const;
/** Typical loss of a well-made ferrite unun at these frequencies, dB (typical, from memory). */
export const UNUN_LOSS_DB = 0.2;

export interface TransformerMatch {
  /** Impedance ratio Z0 : R as sold, e.g. 2 for a 2:1 unun (50 Ω to 25 Ω). */
  ratio: number;
  /** The SWR left with the vertical trimmed to resonance at resistance R. */
  swrAfter: number;
  lossDb: number;
}

/** The commonly sold transformer ratio nearest to Z0/R (in SWR), for a vertical trimmed to resonance. */
export function transformerMatch(rOhm: number, z0Ohm = 50): TransformerMatch | null {
  if (!(rOhm > 0)) return null;
  const swrFor = (k: number): number => {
    const r = rOhm * k;
    return r >= z0Ohm ? r / z0Ohm : z0Ohm / r;
  };
  const ratios = rOhm < z0Ohm ? UNUN_RATIOS : UNUN_RATIOS.map((k) => 1 / k);
  let best = ratios[0];
  for (const k of ratios) if (swrFor(k) < swrFor(best)) best = k;
  return { ratio: best, swrAfter: swrFor(best), lossDb: UNUN_LOSS_DB };
}
