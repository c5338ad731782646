/**
 * The parts of a complete candidate that describe the antenna as placed on the lot: every element
 * with its role, the feed points in the site frame and on the map, the ground system and the
 * cautions. The planner calls these once per shortlisted candidate (core/rank/plan.ts); every view
 * (shortlist, map, detail, tuning note, exposure zones, build sheet, exports, command line) reads
 * the result and rebuilds none of it.
 */
import type { SupportConductor } from '../antennas/conductors.ts';
import type { Placement, WireModel } from '../antennas/types.ts';
import type { LonLat } from '../project/schema.ts';
import { cautionsFor, type Caution } from '../report/cautions.ts';
import type { SiteFrame, XY } from '../site/frame.ts';
import type { Element } from '../site/feasibility.ts';
import { placeXYZ, type XYZ } from '../site/geometry.ts';
import type { Site } from '../site/site.ts';

/** What a placed element is for. */
export type ElementRole =
  | 'radiator'
  | 'top-wire'
  | 'radial'
  | 'rope'
  | 'end'
  | 'anchor'
  | 'support'
  | 'mast'
  | 'feed-line'
  /** An array's coax between its elements and its relay box (the station's run is 'feed-line'). */
  | 'coax'
  | 'conducting-support';

/** One element of the candidate in the site frame (x east, y north, z up, metres). */
export type PlacedElement =
  | {
      role: 'radiator' | 'top-wire' | 'radial' | 'rope' | 'feed-line' | 'coax';
      label: string;
      from: XYZ;
      to: XYZ;
    }
  | { role: 'end' | 'anchor'; label: string; at: XYZ }
  | { role: 'support'; label: string; supportId: string; at: XY; heightM: number }
  | { role: 'mast'; label: string; at: XY; heightM: number }
  /** A metal support in the candidate's model: its axis as modelled (after any stand-off move). */
  | { role: 'conducting-support'; label: string; supportId: string; from: XYZ; to: XYZ };

export interface FeedPoint {
  /** Site frame, metres. */
  xyz: XYZ;
  /** On the map, [lon, lat] degrees. */
  lonLat: LonLat;
}

export type GroundSystem =
  | { kind: 'none' }
  | {
      kind: 'radials';
      count: number;
      /** One length per radial, metres, in bearing order. */
      lengthsM: number[];
      /** Compass bearing of each radial on the site, degrees. */
      bearingsDeg: number[];
      radiusM: number;
      baseXY: XY;
      baseLonLat: LonLat;
      /**
       * Each base's radials apart (an array of verticals has one field per vertical; the fields
       * above are their union, the base the first's): the wire's label, its base on the site,
       * and its radials' lengths and compass bearings. Absent in plans saved before it was added.
       */
      fields?: { label: string; baseXY: XY; lengthsM: number[]; bearingsDeg: number[] }[];
      /** The fields meet and are cut and bonded on the lines midway between the bases. */
      bonded?: boolean;
    };

const r2 = (v: number): number => Math.round(v * 100) / 100;

/**
 * The conducting supports of a candidate's model (core/antennas/conductors.ts) as placed
 * elements: each a vertical axis from its modelled base to its top, in the site frame.
 */
export function conductingSupportElements(
  conductors: readonly SupportConductor[],
  placement: Placement,
): PlacedElement[] {
  return conductors.map((c) => ({
    role: 'conducting-support',
    label: `${c.name} (${c.material}, ${c.grounded ? 'grounded' : 'insulated base'})`,
    supportId: c.supportId,
    from: placeXYZ([c.xy[0], c.xy[1], 0], placement.rotationDeg, placement.originXY),
    to: placeXYZ([c.xy[0], c.xy[1], c.heightM], placement.rotationDeg, placement.originXY),
  }));
}

/** Placed builder elements with their roles (the builder's element kinds carry them). */
export function elementsWithRoles(elements: readonly Element[]): PlacedElement[] {
  return elements.map((e): PlacedElement => {
    switch (e.kind) {
      case 'wire':
        return { role: e.role ?? 'radiator', label: e.label, from: e.from, to: e.to };
      case 'rope':
      case 'coax':
      case 'radial':
        return { role: e.kind, label: e.label, from: e.from, to: e.to };
      case 'end':
      case 'anchor':
        return { role: e.kind, label: e.label, at: e.at };
      case 'support':
        return { role: 'support', label: e.label, supportId: e.supportId, at: e.at, heightM: e.heightM };
      case 'mast':
        return { role: 'mast', label: e.label, at: e.at, heightM: e.heightM };
    }
  });
}

/** Feed points of the model, placed on the site. */
export function feedPointsOf(model: WireModel, placement: Placement, frame: SiteFrame): FeedPoint[] {
  return model.feeds.map((f) => {
    const w = model.wires[f.wire];
    const local: XYZ = [
      w.from[0] + (w.to[0] - w.from[0]) * f.position,
      w.from[1] + (w.to[1] - w.from[1]) * f.position,
      w.from[2] + (w.to[2] - w.from[2]) * f.position,
    ];
    const xyz = placeXYZ(local, placement.rotationDeg, placement.originXY).map(r2) as XYZ;
    return { xyz, lonLat: frame.toLonLat([xyz[0], xyz[1]]) };
  });
}

/** The straight feed-line run from the station point (at ground) to the first feed point. */
export function feedLineElement(station: XY, feed: FeedPoint | undefined): PlacedElement[] {
  if (!feed) return [];
  return [
    { role: 'feed-line', label: 'feed line (straight run)', from: [station[0], station[1], 0], to: feed.xyz },
  ];
}

/** The ground system of the model, placed on the site. */
export function groundSystemOf(model: WireModel, placement: Placement, frame: SiteFrame): GroundSystem {
  if (!model.radials.length) return { kind: 'none' };
  const r = model.radials[0];
  const w = model.wires[r.wire];
  const base = w.from[2] <= w.to[2] ? w.from : w.to;
  const q = placeXYZ(base, placement.rotationDeg, placement.originXY);
  const baseXY: XY = [r2(q[0]), r2(q[1])];
  // each field's radials are equally spaced from the design's canonical north, in order
  const fields = model.radials.map((x) => {
    const wx = model.wires[x.wire];
    const b = wx.from[2] <= wx.to[2] ? wx.from : wx.to;
    const p = placeXYZ(b, placement.rotationDeg, placement.originXY);
    const n = x.lengthsM.length;
    return {
      label: wx.label,
      baseXY: [r2(p[0]), r2(p[1])] as XY,
      lengthsM: x.lengthsM.map(r2),
      bearingsDeg: (x.bearingsDeg ?? x.lengthsM.map((_, k) => (k * 360) / n)).map((b) =>
        r2((((b + placement.rotationDeg) % 360) + 360) % 360),
      ),
    };
  });
  const lengthsM = fields.flatMap((f) => f.lengthsM);
  return {
    kind: 'radials',
    count: lengthsM.length,
    lengthsM,
    bearingsDeg: fields.flatMap((f) => f.bearingsDeg),
    fields,
    bonded: model.radialsBonded === true && fields.length > 1,
    radiusM: r.radiusM,
    baseXY,
    baseLonLat: frame.toLonLat(baseXY),
  };
}

/** The cautions of one candidate on this lot (core/report/cautions.ts decides; this gathers the facts). */
export function candidateCautions(
  type: string,
  supportIds: readonly string[],
  elements: readonly PlacedElement[],
  site: Pick<Site, 'supports' | 'keepOuts'>,
): Caution[] {
  const kinds = supportIds.map((id) => site.supports.find((s) => s.id === id)?.kind ?? 'tree');
  return cautionsFor({
    type,
    hasPowerLine: site.keepOuts.some((k) => k.kind === 'power-line'),
    supportKinds: kinds,
    selfSupporting: elements.some((e) => e.role === 'mast'),
  });
}
