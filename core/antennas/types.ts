/**
 * The common shape of an antenna type. A builder proposes placements of its type on a site and
 * turns a design (a serialisable description: type, band, parameters, the trim dimension) into
 * wire geometry in metres in the design's own canonical frame. A placement puts that canonical
 * frame on the site by a compass rotation and a translation; over laterally uniform ground the
 * antenna's pattern rotates with it exactly, so one evaluation serves every orientation.
 */
import type { Band } from '../project/schema.ts';
import type { XY } from '../site/frame.ts';
import type { Element, FeasibilityResult, PreparedSite } from '../site/feasibility.ts';
import type { XYZ } from '../site/geometry.ts';
import type { SupportConductor } from './conductors.ts';
import type { NetworkSpec } from '../em/network.ts';
import type { LoadSpec } from '../em/types.ts';

export type AntennaTypeId =
  | 'dipole'
  | 'inverted-v'
  | 'half-square'
  | 'vertical'
  | 'inverted-l'
  | 'top-hat-vertical'
  | 't-top-vertical'
  | 'loaded-vertical'
  | 'sloper'
  | 'sloping-vertical'
  | 'vertical-pair'
  | 'four-square'
  | 'four-square-hung'
  | 'half-square-reflector'
  | 'half-square-switched'
  | 'half-square-l'
  | 'phased-pair'
  | 'vertical-pair-director'
  | 'loop-reflector'
  | (string & {});

/** One straight conductor of the model. */
export interface ModelWire {
  from: XYZ;
  to: XYZ;
  radiusM: number;
  segments?: number;
  material?: 'copper' | 'aluminium' | 'perfect' | 'steel';
  /** Plain-words name used in cut lists and reasons. */
  label: string;
}

export interface ModelFeed {
  wire: number;
  /** Fraction along the wire from its `from` end, 0..1; the segment holding it carries the source. */
  position: number;
}

export interface ModelRadials {
  /** Index of the wire whose end lies on the ground. */
  wire: number;
  count: number;
  /** One length per radial, metres, in order of bearing from the design's canonical north, equally spaced. */
  lengthsM: number[];
  radiusM: number;
  /**
   * Canonical bearing of each radial, degrees, when they are not equally spaced (radials the lot
   * clipped away were left out; core/antennas/radials.ts). The solver reads lengths only.
   */
  bearingsDeg?: number[];
}

/** Wire geometry in the canonical frame, in the solver's input form (less frequencies, ground and pattern). */
export interface WireModel {
  wires: ModelWire[];
  feeds: ModelFeed[];
  radials: ModelRadials[];
  /**
   * Lumped loads on the wires (a loading coil with its loss resistance from a stated Q): wire
   * index and fraction along it, as the solver takes them (core/em/types.ts). Their dissipation
   * is reported as `loadLossW`.
   */
  loads?: LoadSpec[];
  /** Arrays: the feed network between the feeds (core/em/network.ts); its first source is the feed the trim reads. */
  network?: NetworkSpec;
  /** Arrays of verticals: the radial fields meet and are bonded (core/em/bondedRadials.ts). */
  radialsBonded?: boolean;
  /**
   * Arrays with states of another phasing (Design.states[].variant): the network of each such
   * variant, in order (variant k is stateNetworks[k − 1]), in place of `network`.
   */
  stateNetworks?: NetworkSpec[];
  /** Arrays: the feed whose current the achieved current ratios refer to (default 0). */
  referenceFeed?: number;
}

export type DesignParams = Record<string, number | number[]>;

/** A serialisable antenna design. Its evaluation is a pure function of this, the soil and the frequency. */
export interface Design {
  type: AntennaTypeId;
  band: Band;
  designFreqHz: number;
  params: DesignParams;
  /** The dimension adjusted to bring the feed to resonance, with its nominal value and limits (metres). */
  trim: { name: string; nominalM: number; minM: number; maxM: number };
  /**
   * Conducting supports near this placement, in the canonical frame (core/antennas/conductors.ts);
   * set by the planner, not by a builder. They go into the solver's model after the antenna's wires.
   */
  conductors?: SupportConductor[];
  /**
   * Switchable directions of an array (relay states). Each state's pattern is the evaluated
   * (state 1) pattern, mirrored across the vertical plane at canonical bearing `mirrorAxisDeg`
   * when given (an array symmetric under that mirror, not under a turn), then turned by
   * `rotationDeg` in the canonical frame (core/rank/states.ts); a fixed antenna has none. State 1
   * beams toward canonical north.
   */
  states?: {
    name: string;
    rotationDeg: number;
    mirrorAxisDeg?: number;
    /**
     * A state whose pattern is not a turn or mirror of state 1's (other phasing): solved on its own
     * with the model's `stateNetworks[variant − 1]` at the same trim (EvaluationRecord.variants);
     * its mirror and rotation then apply to that pattern.
     */
    variant?: number;
    /** Canonical bearing of the state's beam before its rotation (default 0, or twice the mirror axis). */
    beamDeg?: number;
  }[];
  /**
   * A switched pair (core/antennas/switchedPair.ts, set by the planner): its two antennas, each
   * its own design as trimmed, placed in the pair's frame.
   */
  parts?: { design: Design; trimM: number; placement: Placement }[];
}

/** Canonical frame → site: rotate clockwise (compass sense) by rotationDeg about the origin, then translate. */
export interface Placement {
  originXY: XY;
  rotationDeg: number;
}

export interface Proposal {
  design: Design;
  placement: Placement;
  /** Ids of the supports used. */
  supports: string[];
  /** Distinct-placement key: proposals with the same key are variants of one placement (orientations). */
  groupKey: string;
  /** Short human description of where it goes. */
  where: string;
  /**
   * What was changed from the type's plain form to fit these supports, in plain words ("top
   * shortened to 34.0 m, drops lengthened"; "loading coil 2.0 m above the base"); absent when
   * nothing was. Every view shows it beside `where`.
   */
  adaptations?: string[];
  /** Bearings of strongest broadside radiation in plan, degrees (empty for an omnidirectional vertical). */
  broadsideDeg: number[];
}

/** A type-level or placement-level reason a proposal was not made (before any solver work). */
export interface Rejection {
  type: AntennaTypeId;
  band: Band;
  supports: string[];
  where: string;
  reasons: string[];
  /**
   * How far this placement is from working, as a fraction of what it needs (0 = just fits; "the
   * pair is 24 m apart, it needs 30 m" is 0.2). Builders set it on measurable misses so that the
   * planner can name the single closest miss per type and band; absent when the miss has no size.
   */
  shortfall?: number;
  /**
   * For a placement the builder proposed but the lot refused (set by the planner): its worst
   * violation of the site rules, metres (core/site/feasibility.ts). Absent otherwise.
   */
  missByM?: number;
}

export interface BandPlan {
  band: Band;
  designFreqHz: number;
  wavelengthM: number;
}

export interface BuildContext {
  site: PreparedSite;
  band: BandPlan;
  /**
   * The site check for a builder that checks placements itself (default checkPlacement; the
   * planner passes its own, which may be a memo of it kept across plans: core/site/feasibilityMemo.ts).
   */
  check?: (ps: PreparedSite, elements: readonly Element[]) => FeasibilityResult;
}

/** What a cut-list piece is, so that no consumer has to read it from the label. */
export type CutKind = 'wire' | 'radial' | 'rope' | 'coax';

export interface CutItem {
  kind: CutKind;
  label: string;
  count: number;
  /** Electrical length of one piece as modelled, metres. */
  lengthM: number;
  /** What to cut: lengthM plus the allowance for loops and connections. */
  cutLengthM: number;
}

export interface HeightItem {
  label: string;
  heightM: number;
}

export interface Builder {
  type: AntennaTypeId;
  label: string;
  /** An array (several elements): planned only when the caller asks for arrays. */
  array?: boolean;
  /** Radiating elements, driven and parasitic (1 when absent). */
  elementCount?: number;
  /** Proposals (before solver work) and the reasons some were not proposed. */
  propose(ctx: BuildContext): { proposals: Proposal[]; rejections: Rejection[] };
  /** Wire model at the trim value, canonical frame. */
  model(design: Design, trimM: number): WireModel;
  /** Everything that must fit on the site (wires, ropes, ends, anchors, supports, radials), canonical frame. */
  elements(design: Design, trimM: number): Element[];
  /**
   * Key heights for the sheet and detail. `supportNames` are the proposal's supports' names in
   * its order (Proposal.supports), for labels that name a support; a builder may ignore them.
   */
  heights(design: Design, trimM: number, supportNames?: readonly string[]): HeightItem[];
  cutList(design: Design, trimM: number): CutItem[];
}
