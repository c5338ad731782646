/**
 * Words and marks for a candidate's soil range (core/rank/plan.ts Candidate.soilRange) and for
 * the metal supports in its model: the shortlist's mark, the range under the score, and the
 * sentence of the candidate detail.
 */
import type { Candidate } from '../../../core/rank/plan.ts';
import { soilById } from '../../../core/em/soils.ts';

/** Plain-words name of a soil of the range (`custom`: the project's own values). */
export function soilLabel(id: string): string {
  if (id === 'custom') return 'your soil values';
  return (soilById(id)?.label ?? id).toLowerCase() + ' soil';
}

const ord = (n: number): string => {
  const s = n % 100 >= 11 && n % 100 <= 13 ? 'th' : (['th', 'st', 'nd', 'rd'][n % 10] ?? 'th');
  return `${n}${s}`;
};

/** The ranks the candidate takes over the soil range, as "1–5"; null when it holds. */
export function rankSpan(c: Candidate): string | null {
  if (c.soilRange.rankHolds) return null;
  const ranks = c.soilRange.scores.map((s) => s.rank);
  return `${Math.min(...ranks)}–${Math.max(...ranks)}`;
}

/** Score range in dBi, "−6.6 to −0.2"; "range not computed" where it was not. */
export function scoreRangeText(c: Candidate): string {
  if (c.soilRange.notComputed) return 'range not computed';
  const f = (v: number): string => v.toFixed(1).replace('-', '−');
  return `${f(c.soilRange.lowDbi)} to ${f(c.soilRange.highDbi)}`;
}

/** One sentence on the soil range for the candidate detail. */
export function soilSentence(c: Candidate): string {
  const [own, ...others] = c.soilRange.scores;
  if (c.soilRange.notComputed)
    return `Scored over ${soilLabel(c.soilRange.soils[0] ?? 'custom')} only: not solved over the neighbouring soils.`;
  if (!own || others.length === 0)
    return `Scored over ${soilLabel(c.soilRange.soils[0] ?? 'custom')} only: no soil class lies next to it.`;
  const parts = others.map(
    (o) => `${o.scoreDbi.toFixed(1).replace('-', '−')} dBi (${ord(o.rank)}) over ${soilLabel(o.soil)}`,
  );
  const head = `Over ${soilLabel(own.soil)} it scores ${own.scoreDbi.toFixed(1).replace('-', '−')} dBi and ranks ${ord(own.rank)}; ${parts.join(', ')}.`;
  return c.soilRange.rankHolds
    ? `${head} Its rank holds across that range.`
    : `${head} Its rank does not hold if your soil is not what the project says.`;
}

/** One sentence on the metal supports in the candidate's model; null when there are none. */
export function metalSentence(c: Candidate): string | null {
  if (!c.conductingSupports.length) return null;
  const list = c.conductingSupports.map(
    (s) => `${s.name} (${s.heightM.toFixed(1)} m, ${s.grounded ? 'grounded' : 'not grounded'})`,
  );
  return `Modelled with the metal support${list.length > 1 ? 's' : ''} near it: ${list.join(', ')}.`;
}
