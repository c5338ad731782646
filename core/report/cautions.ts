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
    text: 'The ends of a dipole or inverted-V and the lower ends of a half-square carry high RF voltage when you transmit. Keep them out of reach of people and animals, and use insulators rated for it.',
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

export interface CautionContext {
  /** The lot has a power line keep-out. */
  hasPowerLine: boolean;
  /** The antenna has wire ends at high RF voltage (dipole, inverted-V, half-square ends). */
  highVoltageEnds: boolean;
  /** Something is hung in a tree or on a mast or tower. */
  usesSupports: boolean;
  /** A self-supporting or tall structure is put up. */
  newStructure: boolean;
}

/** The cautions that apply, most important first. Lightning and RF exposure always apply. */
export function cautionsFor(ctx: CautionContext): Caution[] {
  const out: Caution[] = [];
  if (ctx.hasPowerLine) out.push(CAUTIONS['power-lines']);
  if (ctx.highVoltageEnds) out.push(CAUTIONS['high-voltage-ends']);
  if (ctx.usesSupports) out.push(CAUTIONS.climbing);
  out.push(CAUTIONS.lightning);
  if (ctx.newStructure) out.push(CAUTIONS.permits);
  out.push(CAUTIONS['rf-exposure']);
  return out;
}
