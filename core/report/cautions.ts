/**
 * Safety cautions, in plain words, shown with every candidate and in the report. They defer to
 * local codes and licensed practice throughout. Which ones apply depends on the antenna and the lot.
 */
export type CautionId =
  'power-lines' | 'high-voltage-ends' | 'climbing' | 'lightning' | 'permits' | 'rf-exposure';

export interface Caution {
  id: CautionId;
  title: string;
  text: string;
}

export const CAUTIONS: Record<CautionId, Caution> = {
  'power-lines': {
    id: 'power-lines',
    title: 'Power lines',
    text: 'Keep every wire, rope, support and ladder farther from any power line than it could fall or swing, with a margin. Never throw a line or raise a mast near one. If in doubt, ask the utility.',
  },
  'high-voltage-ends': {
    id: 'high-voltage-ends',
    title: 'High RF voltage at wire ends',
    // The text is made per type by cautionsFor (highVoltageEndsText); this is the generic form.
    text: 'The free ends of the wires carry high RF voltage when you transmit. Keep them out of reach of people and animals, and use insulators rated for it.',
  },
  climbing: {
    id: 'climbing',
    title: 'Trees and masts',
    text: 'Tree and mast work is dangerous: use fall protection, never work alone, keep people clear below, and hire a professional arborist for tall trees.',
  },
  lightning: {
    id: 'lightning',
    title: 'Lightning and static',
    text: 'Ground and bond the feed line, the supports and the station as your local electrical code requires, and disconnect the antenna when storms are near.',
  },
  permits: {
    id: 'permits',
    title: 'Permits and neighbours',
    text: "Towers, tall masts and wires over shared boundaries may need a permit and your neighbours' consent.",
  },
  'rf-exposure': {
    id: 'rf-exposure',
    title: 'RF exposure',
    text: 'Check your station against the exposure limits that apply to you (47 CFR §1.1310 in the USA, the ICNIRP guidelines or national rules elsewhere). Yardwire’s distances are screening estimates; local rules and a professional evaluation govern.',
  },
};

/** What decides which cautions apply to one placed antenna on one lot. */
export interface CautionContext {
  /** The antenna type (decides where its high-voltage ends are). */
  type: string;
  /** The lot has a power-line keep-out. */
  hasPowerLine: boolean;
  /** Kinds of the supports the antenna hangs from ('tree', 'mast', 'tower', …). */
  supportKinds: readonly string[];
  /** The antenna puts up its own structure (a self-supporting vertical). */
  selfSupporting: boolean;
}

/**
 * Where a type's wire ends carry high RF voltage, in plain words; null for a ground-fed vertical
 * (its top is high, out of reach, and its base is at low impedance).
 */
export function highVoltageEndsText(type: string): string | null {
  switch (type) {
    case 'vertical':
    case 'vertical-pair':
    case 'four-square':
    case 'four-square-hung':
    case 'phased-pair':
    case 'vertical-pair-director':
      return null;
    case 'half-square':
      return 'The lower ends of the two drops carry high RF voltage when you transmit.';
    case 'half-square-reflector':
    case 'half-square-switched':
    case 'half-square-l':
      return 'The lower ends of all four drops carry high RF voltage when you transmit, the idle or reflecting half-square’s too.';
    case 'switched-pair':
      return 'The free wire ends of both antennas carry high RF voltage when you transmit, the idle antenna’s too: it is open at its feed but coupled to the driven one.';
    case 'loop-reflector':
      return 'The top and bottom corners of both loops carry high RF voltage when you transmit, the reflector’s too; the bottom corners hang lowest.';
    case 'inverted-l':
      return 'The far end of the top part carries high RF voltage when you transmit.';
    case 'sloping-vertical':
      return null;
    case 'top-hat-vertical':
      return 'The outer ends of the top-hat wires carry high RF voltage when you transmit.';
    case 't-top-vertical':
      return 'The far ends of both top wires carry high RF voltage when you transmit.';
    case 'loaded-vertical':
      return 'The loading coil and the wire above it carry high RF voltage when you transmit; a coil at the base is within reach, so fence it or box it.';
    case 'sloper':
      return 'Both ends of the sloper carry high RF voltage when you transmit, and its lower end hangs low.';
    case 'inverted-v':
      return 'Both ends of the inverted-V carry high RF voltage when you transmit, and they hang lowest.';
    case 'dipole':
      return 'Both ends of the dipole carry high RF voltage when you transmit.';
    default:
      return 'The free ends of the wires carry high RF voltage when you transmit.';
  }
}

const HIGH_VOLTAGE_ADVICE = 'Keep them out of reach of people and animals, and use insulators rated for it.';

/**
 * The cautions that apply, most important first: the one list the candidate carries, and so the
 * one the panel, the map and the build sheet show. Lightning and RF exposure always apply.
 */
export function cautionsFor(ctx: CautionContext): Caution[] {
  const out: Caution[] = [];
  if (ctx.hasPowerLine) out.push(CAUTIONS['power-lines']);
  const hv = highVoltageEndsText(ctx.type);
  if (hv) out.push({ ...CAUTIONS['high-voltage-ends'], text: `${hv} ${HIGH_VOLTAGE_ADVICE}` });
  if (ctx.supportKinds.length > 0) out.push(CAUTIONS.climbing);
  out.push(CAUTIONS.lightning);
  if (ctx.selfSupporting || ctx.supportKinds.some((k) => k === 'mast' || k === 'tower'))
    out.push(CAUTIONS.permits);
  out.push(CAUTIONS['rf-exposure']);
  return out;
}
