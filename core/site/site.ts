/**
 * A project turned into a site: everything in the local frame (x east, y north, z up, metres,
 * origin at the centre of the lot boundary's bounding box), ready for feasibility checks.
 */
import {
  supportConducts,
  type Project,
  type Settings,
  type Soil,
  type SupportKind,
  type KeepOutKind,
  type LonLat,
} from '../project/schema.ts';
import { supportMetal, type SupportMetal } from '../antennas/supportMetal.ts';
import { makeSiteFrame, ringReferencePoint, type SiteFrame, type XY } from './frame.ts';

export class SiteError extends Error {
  override name = 'SiteError';
}

export interface SiteSupport {
  id: string;
  name: string;
  kind: SupportKind;
  xy: XY;
  heightM: number;
  /** Whether it conducts (core/project/schema.ts supportConducts; null: a mast of unknown material). */
  conducts?: boolean | null;
  /** Its metal as modelled, when it conducts (core/antennas/conductors.ts). */
  metal?: SupportMetal | null;
}

export interface SiteKeepOut {
  id: string;
  name: string;
  kind: KeepOutKind;
  /** Closed ring for polygons; open polyline for lines. */
  shape: { type: 'polygon'; ring: XY[] } | { type: 'line'; line: XY[] };
  clearanceM: number;
  heightM?: number;
}

export interface Site {
  frame: SiteFrame;
  /** Lot boundary, closed ring (first = last), site frame. */
  boundary: XY[];
  supports: SiteSupport[];
  keepOuts: SiteKeepOut[];
  station: XY;
  stationLonLat: LonLat;
  soil: Soil;
  settings: Settings;
}

/** Build the site from a validated project; throws SiteError when it has no boundary. */
export function buildSite(project: Project): Site {
  const boundary = project.boundary;
  if (!boundary) throw new SiteError('the project has no lot boundary: draw the lot first');
  const ringLL = boundary.coordinates[0];
  const frame = makeSiteFrame(ringReferencePoint(ringLL));
  const toXY = (p: LonLat): XY => frame.toLocal(p);
  const stationLonLat = project.station ?? frame.origin;
  return {
    frame,
    boundary: ringLL.map(toXY),
    supports: project.supports.map((s) => ({
      id: s.id,
      name: s.name,
      kind: s.kind,
      xy: toXY(s.position),
      heightM: s.usableHeightM,
      conducts: supportConducts(s),
      metal: supportMetal({ ...s, conducts: supportConducts(s) }),
    })),
    keepOuts: project.keepOuts.map((k) => ({
      id: k.id,
      name: k.name,
      kind: k.kind,
      shape:
        k.geometry.type === 'Polygon'
          ? { type: 'polygon', ring: k.geometry.coordinates[0].map(toXY) }
          : { type: 'line', line: k.geometry.coordinates.map(toXY) },
      clearanceM: k.clearanceM,
      ...(k.heightM !== undefined ? { heightM: k.heightM } : {}),
    })),
    station: toXY(stationLonLat),
    stationLonLat,
    soil: project.soil,
    settings: project.settings,
  };
}
