/**
 * Shared pieces of the antenna builders: band design frequencies, wire size, segmenting, the cut
 * allowance and rope limits; collecting proposals and rejections, and the frame across two supports.
 */
import type { Band } from '../project/schema.ts';
import { mhzToHz, wavelengthM } from '../units/index.ts';
import { BAND_INFO, operatingSpan, type OperatingChoice } from '../bands.ts';
import type { Element } from '../site/feasibility.ts';
import type { SiteSupport } from '../site/site.ts';
import { bearingOf, placeXY, placeXYZ, type XYZ } from '../site/geometry.ts';
import type {
  AntennaTypeId,
  BandPlan,
  CutItem,
  CutKind,
  Design,
  DesignParams,
  ModelWire,
  Placement,
  Proposal,
  Rejection,
} from './types.ts';

/**
 * Default design frequencies, Hz (core/bands.ts): 160 m 1.83 MHz, 80 m 3.55 MHz, 40 m 7.05 MHz,
 * the centres of the CW segments where low-band long-distance contacts are mostly made.
 */
export const DESIGN_FREQ_HZ: Record<Band, number> = {
  '160m': mhzToHz(BAND_INFO['160m'].defaultDesignMHz),
  '80m': mhzToHz(BAND_INFO['80m'].defaultDesignMHz),
  '40m': mhzToHz(BAND_INFO['40m'].defaultDesignMHz),
};

/** The band as designed for: the centre of the part the user operates in (default: the CW end). */
export function bandPlan(band: Band, choice?: OperatingChoice): BandPlan {
  const f = choice ? mhzToHz(operatingSpan(band, choice).designMHz) : DESIGN_FREQ_HZ[band];
  return { band, designFreqHz: f, wavelengthM: wavelengthM(f) };
}

/** Wire radius of the model: 2 mm diameter copper, a usual antenna wire (common practice, no source). */
export const WIRE_RADIUS_M = 0.001;
/** Cut allowance per end for the loop through an insulator or the connection, metres (common practice, no source). */
export const CUT_ALLOWANCE_PER_END_M = 0.2;
/** Default of settings.maxRopeM: longest rope between a wire end and its support, metres (common practice, no source). */
export const MAX_ROPE_M = 40;
/** Target segment length as a fraction of the wavelength (solver convergence aside, about 20 per half wave). */
export const SEGMENT_FRACTION = 1 / 40;

/**
 * Segments for a wire of `lengthM` at wavelength `lambdaM`: at least 1, even when `even` (the
 * solver puts a feed on the nearest segment end, so a centre feed needs a node at the middle).
 */
export function segmentsFor(lengthM: number, lambdaM: number, even = false): number {
  let n = Math.max(1, Math.ceil(lengthM / (lambdaM * SEGMENT_FRACTION)));
  if (even && n % 2 === 1) n += 1;
  return n;
}

export function wire(from: XYZ, to: XYZ, lambdaM: number, label: string, even = false): ModelWire {
  const len = Math.hypot(to[0] - from[0], to[1] - from[1], to[2] - from[2]);
  return {
    from,
    to,
    radiusM: WIRE_RADIUS_M,
    segments: segmentsFor(len, lambdaM, even),
    material: 'copper',
    label,
  };
}

export function wireLength(w: { from: XYZ; to: XYZ }): number {
  return Math.hypot(w.to[0] - w.from[0], w.to[1] - w.from[1], w.to[2] - w.from[2]);
}

export function lambdaOf(design: Design): number {
  return wavelengthM(design.designFreqHz);
}

export function num(design: Design, key: string): number {
  const v = design.params[key];
  if (typeof v !== 'number') throw new Error(`design ${design.type}: parameter ${key} missing`);
  return v;
}

export function arr(design: Design, key: string): number[] {
  const v = design.params[key];
  if (!Array.isArray(v)) throw new Error(`design ${design.type}: parameter ${key} missing`);
  return v;
}

export function cut(
  label: string,
  count: number,
  lengthM: number,
  ends = 2,
  kind: CutKind = 'wire',
): CutItem {
  return { kind, label, count, lengthM, cutLengthM: lengthM + ends * CUT_ALLOWANCE_PER_END_M };
}

/** A piece of coax for the cut list: a connector allowance at both ends. */
export function coaxCut(label: string, count: number, lengthM: number): CutItem {
  return cut(label, count, lengthM, 2, 'coax');
}

/** Move canonical-frame elements onto the site. */
export function placeElements(elements: readonly Element[], p: Placement): Element[] {
  return elements.map((e): Element => {
    switch (e.kind) {
      case 'wire':
      case 'rope':
      case 'coax':
      case 'radial':
        return {
          ...e,
          from: placeXYZ(e.from, p.rotationDeg, p.originXY),
          to: placeXYZ(e.to, p.rotationDeg, p.originXY),
        };
      case 'end':
      case 'anchor':
        return { ...e, at: placeXYZ(e.at, p.rotationDeg, p.originXY) };
      case 'support':
      case 'mast':
        return { ...e, at: placeXY(e.at, p.rotationDeg, p.originXY) };
    }
  });
}

export const round = (v: number, digits = 2): number => Math.round(v * 10 ** digits) / 10 ** digits;

/** One builder's proposals and rejections on one band, and the designs it proposes. */
export interface ProposalList {
  proposals: Proposal[];
  rejections: Rejection[];
  /** Record that a placement (or the type) was not proposed, with the reasons in plain words. */
  reject(supports: string[], where: string, ...reasons: string[]): void;
  /** A measurable miss: `shortfall` as in Rejection (what it lacks over what it needs, ≥ 0). */
  rejectBy(shortfall: number, supports: string[], where: string, ...reasons: string[]): void;
  /** A design of this type on this band. */
  design(params: DesignParams, trim: Design['trim'], states?: Design['states']): Design;
  /** What `Builder.propose` returns. */
  result(): { proposals: Proposal[]; rejections: Rejection[] };
}

export function proposalList(type: AntennaTypeId, band: BandPlan): ProposalList {
  const proposals: Proposal[] = [];
  const rejections: Rejection[] = [];
  return {
    proposals,
    rejections,
    reject(supports, where, ...reasons) {
      rejections.push({ type, band: band.band, supports, where, reasons });
    },
    rejectBy(shortfall, supports, where, ...reasons) {
      rejections.push({ type, band: band.band, supports, where, reasons, shortfall: Math.max(0, shortfall) });
    },
    design(params, trim, states) {
      const d: Design = { type, band: band.band, designFreqHz: band.designFreqHz, params, trim };
      if (states) d.states = states;
      return d;
    },
    result: () => ({ proposals, rejections }),
  };
}

/** Every unordered pair of supports, in list order. */
export function supportPairs(supports: readonly SiteSupport[]): [SiteSupport, SiteSupport][] {
  return supports.flatMap((a, i) => supports.slice(i + 1).map((b): [SiteSupport, SiteSupport] => [a, b]));
}

/**
 * The canonical frame of a wire across supports a and b (a at −x, b at +x, origin midway) and its
 * broadside bearings in plan, both ways.
 */
export function acrossSupports(
  a: SiteSupport,
  b: SiteSupport,
): { placement: Placement; broadsideDeg: number[] } {
  const bearing = bearingOf(a.xy, b.xy);
  return {
    placement: {
      originXY: [(a.xy[0] + b.xy[0]) / 2, (a.xy[1] + b.xy[1]) / 2],
      rotationDeg: bearing - 90,
    },
    broadsideDeg: [(bearing + 90) % 360, (bearing + 270) % 360],
  };
}

/** The two supports of a design across supports, at (∓spanM/2, 0), as elements. */
export function supportPairElements(spanM: number, heightAM: number, heightBM: number): Element[] {
  return [
    { kind: 'support', label: 'support A', supportId: 'A', at: [-spanM / 2, 0], heightM: heightAM },
    { kind: 'support', label: 'support B', supportId: 'B', at: [spanM / 2, 0], heightM: heightBM },
  ];
}
