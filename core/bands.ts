/**
 * The amateur low bands, the one place for them: each band's edges, its default design
 * frequency, and its segments (the CW end and the phone part). The planner designs for the part
 * of each band the user chooses (settings.operating; the default is the CW end's centre as
 * before), the SWR plot spans the band's edges and the build sheet states the part.
 *
 * Edges: the widest allocation among the three IARU regions (160 m 1.8–2.0, 80 m 3.5–4.0, 40 m
 * 7.0–7.3 MHz); segments: common band-plan practice (IARU Region 2 and the US), from memory; your
 * own licence and band plan may allow less.
 */
import type { Band } from './project/schema.ts';

export type BandPart = 'cw' | 'phone';

export interface BandInfo {
  band: Band;
  /** Band edges, MHz. */
  edgesMHz: [number, number];
  /** The design frequency used when the user has chosen nothing, MHz (the CW segment's centre). */
  defaultDesignMHz: number;
  /** Segments with the frequency a design for them is made at, MHz. */
  segments: Record<BandPart, { lowMHz: number; highMHz: number; designMHz: number; label: string }>;
}

/** A segment as [low edge, high edge, design frequency], MHz. */
type SegmentMHz = [number, number, number];

/** One band's entry; its default design frequency is the CW segment's. */
function bandInfo(band: Band, edgesMHz: [number, number], cw: SegmentMHz, phone: SegmentMHz): BandInfo {
  const segment = ([lowMHz, highMHz, designMHz]: SegmentMHz, label: string) => ({
    lowMHz,
    highMHz,
    designMHz,
    label,
  });
  return {
    band,
    edgesMHz,
    defaultDesignMHz: cw[2],
    segments: { cw: segment(cw, 'CW end'), phone: segment(phone, 'phone') },
  };
}

export const BAND_INFO: Record<Band, BandInfo> = {
  '160m': bandInfo('160m', [1.8, 2.0], [1.8, 1.86, 1.83], [1.84, 2.0, 1.9]),
  '80m': bandInfo('80m', [3.5, 4.0], [3.5, 3.6, 3.55], [3.6, 4.0, 3.8]),
  '40m': bandInfo('40m', [7.0, 7.3], [7.0, 7.1, 7.05], [7.1, 7.3, 7.2]),
};

/** The user's choice for one band: a segment, or their own frequency or span (MHz, inside the band). */
export type OperatingChoice = { part: BandPart } | { part: 'custom'; lowMHz: number; highMHz: number };

/** The span the user operates in on a band and the frequency designs are made at (its centre), MHz. */
export function operatingSpan(
  band: Band,
  choice: OperatingChoice | undefined,
): { lowMHz: number; highMHz: number; designMHz: number; label: string } {
  const info = BAND_INFO[band];
  if (!choice) return { ...info.segments.cw, designMHz: info.defaultDesignMHz };
  if (choice.part === 'custom') {
    const designMHz = (choice.lowMHz + choice.highMHz) / 2;
    return {
      lowMHz: choice.lowMHz,
      highMHz: choice.highMHz,
      designMHz,
      label:
        choice.lowMHz === choice.highMHz
          ? `${choice.lowMHz.toFixed(3)} MHz`
          : `${choice.lowMHz.toFixed(3)}–${choice.highMHz.toFixed(3)} MHz`,
    };
  }
  return info.segments[choice.part];
}

/** How a candidate's 2:1 band lies over the span the user operates in. */
export type OperatingFit = 'inside' | 'partly' | 'outside';

/**
 * Whether the user's span lies inside the candidate's 2:1 band (an edge beyond the sweep, null,
 * counts as reaching past the span), partly, or not at all (no 2:1 band without a match).
 */
export function operatingFit(
  c: {
    feed: { swr: number };
    bandwidth2to1: { lowMHz: number | null; highMHz: number | null; widthKHz: number };
  },
  span: { lowMHz: number; highMHz: number },
): OperatingFit {
  const bw = c.bandwidth2to1;
  if (c.feed.swr > 2 || !(bw.widthKHz > 0)) return 'outside';
  const lo = bw.lowMHz ?? -Infinity;
  const hi = bw.highMHz ?? Infinity;
  if (lo <= span.lowMHz && hi >= span.highMHz) return 'inside';
  return lo < span.highMHz && hi > span.lowMHz ? 'partly' : 'outside';
}
