/**
 * Where the input power goes, in the terms a ham reads (issue 13 point 5).
 *
 * The solver splits the input power of a candidate into
 *  - radiated power (what reaches the sky, after the soil's reflection);
 *  - conductor loss (wire resistance, skin effect);
 *  - ground-system loss: the soil loss under the radial field near the base, the Wait–Pope
 *    loss resistance of the ground connection in series with the feed (core/em/radials.ts, over
 *    the near-field disc). This is what "radial efficiency" means in the trade: the share of the
 *    power that gets past the ground system, Rr/(Rr + Rg) for a vertical (common practice, no
 *    source);
 *  - bare-contact loss: where a wire without radials meets the soil (a grounded metal support in
 *    the model, a bare stake), the same surface-impedance loss with no screen;
 *  - the rest of the ground loss: lost in the soil beyond the radial field, mostly in the
 *    reflection of the far field. Every antenna over this soil loses it, with or without radials,
 *    and no radial field can remove it (the solver counts it through the soil's reflection
 *    coefficients and, for wires near the soil, the exact half-space).
 *
 * Decibels are each 10·log10(input / (input − loss)) of one mechanism alone, as before, except the
 * reflection loss, which is taken on the power that got past the ground system (a property of the
 * soil and the antenna's pattern, so that more radials do not appear to raise it).
 */
export interface PowerSplitIn {
  inputW: number;
  radiatedW: number;
  conductorLossW: number;
  groundLossW: number;
  /** Loss in the radial field(s) in the near-field disc; absent when no wire with radials touches the soil. */
  groundSystemLossW?: number;
  /** Loss where wires without radials meet the soil (grounded supports, bare stakes); absent when none do. */
  bareContactLossW?: number;
  /** Loss in lumped loads (loading coils, from their stated Q); absent when the model has none. */
  loadLossW?: number;
  /** Loss in an array's feed network (lines, stubs, the hybrid's load resistor); absent without one. */
  networkLossW?: number;
}

export interface EfficiencySplit {
  /** radiated / input, percent. */
  percent: number;
  radiatedW: number;
  inputW: number;
  conductorLossW: number;
  /** All soil loss: ground system plus reflection loss. */
  groundLossW: number;
  conductorLossDb: number;
  groundLossDb: number;
  /** Loss in the radial field (or at a bare ground stake) near the base; 0 when nothing touches the soil. */
  groundSystemLossW: number;
  groundSystemLossDb: number;
  /**
   * Share of the input power not lost in the ground system (radial efficiency), percent; null when
   * the antenna has no ground connection.
   */
  groundSystemEfficiencyPercent: number | null;
  /** Lost where wires without radials (a grounded tower, a bare stake) meet the soil. */
  bareContactLossW: number;
  bareContactLossDb: number;
  /** Lost in the soil beyond the radial field (far-field reflection): every antenna over this soil. */
  reflectionLossW: number;
  reflectionLossDb: number;
  /** Lost in loading coils (their stated Q); 0 when the antenna has none. */
  loadLossW: number;
  loadLossDb: number;
  /** Lost in an array's feed network (lines, stubs, the hybrid's load resistor); 0 without one. */
  networkLossW: number;
  networkLossDb: number;
}

/** dB lost to one mechanism: 10·log10(input / (input − loss)). */
export function lossDb(lossW: number, inputW: number): number {
  return inputW > 0 && lossW < inputW ? 10 * Math.log10(inputW / (inputW - lossW)) : Infinity;
}

export function efficiencySplit(p: PowerSplitIn): EfficiencySplit {
  const gs = Math.max(0, Math.min(p.groundSystemLossW ?? 0, p.groundLossW));
  const bare = Math.max(0, Math.min(p.bareContactLossW ?? 0, p.groundLossW - gs));
  const refl = Math.max(0, p.groundLossW - gs - bare);
  return {
    percent: p.inputW > 0 ? (100 * p.radiatedW) / p.inputW : 0,
    radiatedW: p.radiatedW,
    inputW: p.inputW,
    conductorLossW: p.conductorLossW,
    groundLossW: p.groundLossW,
    conductorLossDb: lossDb(p.conductorLossW, p.inputW),
    groundLossDb: lossDb(p.groundLossW, p.inputW),
    groundSystemLossW: gs,
    groundSystemLossDb: lossDb(gs, p.inputW),
    loadLossW: p.loadLossW ?? 0,
    loadLossDb: lossDb(p.loadLossW ?? 0, p.inputW),
    networkLossW: p.networkLossW ?? 0,
    networkLossDb: lossDb(p.networkLossW ?? 0, p.inputW),
    groundSystemEfficiencyPercent:
      p.groundSystemLossW === undefined || !(p.inputW > 0) ? null : 100 * (1 - gs / p.inputW),
    bareContactLossW: bare,
    bareContactLossDb: lossDb(bare, p.inputW),
    reflectionLossW: refl,
    reflectionLossDb: lossDb(refl, p.inputW - gs - bare),
  };
}

export interface LossPart {
  key: 'radiated' | 'ground-system' | 'bare-contact' | 'soil-beyond' | 'conductor' | 'loading' | 'network';
  label: string;
  /** Share of the input power, percent. */
  pct: number;
  /** dB lost to this mechanism alone; null for the radiated part. */
  db: number | null;
}

/** The parts of the loss bar with their plain labels (every view uses these words). */
export function lossParts(e: EfficiencySplit): LossPart[] {
  const share = (w: number): number => (e.inputW > 0 ? (100 * w) / e.inputW : 0);
  const radials = e.groundSystemEfficiencyPercent !== null;
  return [
    { key: 'radiated', label: 'radiated', pct: share(e.radiatedW), db: null },
    ...(radials
      ? [
          {
            key: 'ground-system' as const,
            label: 'lost in the radial field',
            pct: share(e.groundSystemLossW),
            db: e.groundSystemLossDb,
          },
        ]
      : []),
    ...(e.bareContactLossW > 0
      ? [
          {
            key: 'bare-contact' as const,
            label: 'lost where grounded supports meet bare soil',
            pct: share(e.bareContactLossW),
            db: e.bareContactLossDb,
          },
        ]
      : []),
    {
      key: 'soil-beyond',
      label: radials
        ? 'lost in the soil beyond, every antenna over this soil'
        : 'lost in the soil, every antenna over this soil',
      pct: share(e.reflectionLossW),
      db: e.reflectionLossDb,
    },
    { key: 'conductor', label: 'conductor loss', pct: share(e.conductorLossW), db: e.conductorLossDb },
    ...(e.loadLossW > 0
      ? [{ key: 'loading' as const, label: 'loading coil loss', pct: share(e.loadLossW), db: e.loadLossDb }]
      : []),
    ...(e.networkLossW > 0
      ? [
          {
            key: 'network' as const,
            label: 'lost in the feed network (lines, stubs, the hybrid’s load)',
            pct: share(e.networkLossW),
            db: e.networkLossDb,
          },
        ]
      : []),
  ];
}

const pct0 = (v: number): string => `${v.toFixed(0)} %`;
const db2 = (v: number): string => (Number.isFinite(v) ? `${v.toFixed(2)} dB` : 'all');

/** One line for text views: "radial field efficiency 91 %; 4.02 dB lost in the soil beyond, …". */
export function efficiencySummary(e: EfficiencySplit): string {
  const parts: string[] = [];
  if (e.groundSystemEfficiencyPercent !== null)
    parts.push(
      `radial field efficiency ${pct0(e.groundSystemEfficiencyPercent)} (${db2(e.groundSystemLossDb)})`,
    );
  if (e.bareContactLossW > 0)
    parts.push(`${db2(e.bareContactLossDb)} lost where grounded supports meet bare soil`);
  parts.push(
    `${db2(e.reflectionLossDb)} lost in the soil${e.groundSystemEfficiencyPercent !== null ? ' beyond' : ''}, as for every antenna over this soil`,
  );
  parts.push(`conductor loss ${db2(e.conductorLossDb)}`);
  if (e.loadLossW > 0) parts.push(`loading coil loss ${db2(e.loadLossDb)}`);
  if (e.networkLossW > 0) parts.push(`feed network loss ${db2(e.networkLossDb)}`);
  return parts.join('; ');
}
