/**
 * The selected candidate's RF-exposure zones and its feed-line route on the lot map. Zones come
 * from the core in the site frame (metres) and go back to [lon, lat] through the frame the
 * candidate was placed in (`candidateFrame` in mapDraw.ts); the
 * route is the station point, the user's bend points and the point under the feed, editable with
 * the map's drawing plug-in (drag a bend, drag a middle handle to add one, right-click to remove).
 */
import L from '../map/leaflet.ts';
import type { LonLat } from '../../../core/project/schema.ts';
import { PLACE_WORD, type ZoneOnLot } from '../../../core/report/exposureZones.ts';
import type { SiteFrame, XY } from '../../../core/site/frame.ts';
import type { XYZ } from '../../../core/site/geometry.ts';
import { formatLength, type UnitSystem } from '../../../core/units/index.ts';

export const SAFETY_COLOURS = {
  general: '#7c3aed',
  controlled: '#be185d',
  reach: '#b91c1c',
  coax: '#2d3436',
};

function textContent(text: string): HTMLElement {
  const el = document.createElement('span');
  el.textContent = text;
  return el;
}

/**
 * Draw the general-public zone (filled) and the controlled zone (outlined) of one rule, and a
 * warning mark where the general-public zone reaches a house, a path, the property line or the
 * operating position. Returns the function that removes them.
 */
export function drawExposure(
  map: L.Map,
  frame: SiteFrame,
  zones: readonly [ZoneOnLot, ZoneOnLot],
  units: UnitSystem,
): () => void {
  const ll = (p: XY): L.LatLngTuple => {
    const q = frame.toLonLat(p);
    return [q[1], q[0]];
  };
  const g = L.layerGroup();
  const [general, controlled] = zones;
  const styles: [ZoneOnLot, L.PolylineOptions][] = [
    [
      general,
      {
        color: SAFETY_COLOURS.general,
        weight: 2,
        fillColor: SAFETY_COLOURS.general,
        fillOpacity: 0.22,
        className: 'yw-zone yw-zone-general',
      },
    ],
    [
      controlled,
      {
        color: SAFETY_COLOURS.controlled,
        weight: 1.5,
        dashArray: '4 3',
        fill: false,
        className: 'yw-zone yw-zone-controlled',
      },
    ],
  ];
  for (const [z, style] of styles) {
    if (!z.rings.length) continue;
    const poly = L.polygon(
      z.rings.map((r) => r.slice(0, -1).map(ll)),
      style,
    ).addTo(g);
    poly.bindTooltip(
      textContent(
        `${z.label}: ${formatLength(z.radiusM, units)} from the wires (with ground reflection; a screening estimate)`,
      ),
      { className: 'yw-tip', sticky: true },
    );
  }
  for (const p of general.reached) {
    if (!Number.isFinite(p.placeXY[0])) continue;
    const m = L.marker(ll(p.placeXY), {
      icon: L.divIcon({ className: 'yw-reach', html: '!', iconSize: [18, 18] }),
      keyboard: false,
      interactive: true,
    }).addTo(g);
    m.bindTooltip(
      textContent(
        `Exposure zone reaches ${p.name} (${PLACE_WORD[p.kind]}): a person there could be ${formatLength(p.closestM, units)} from a wire, inside ${formatLength(general.radiusM, units)}`,
      ),
      { className: 'yw-tip yw-tip-danger', direction: 'top' },
    );
  }
  g.addTo(map);
  return () => g.remove();
}

export interface RouteDrawing {
  stationXY: XY;
  bends: readonly LonLat[];
  feedXYZ: XYZ;
  /** Shown on the route: its length and loss. */
  label: string;
  editable: boolean;
  /** Called with the new bend points after an edit. */
  onChange: (bends: LonLat[]) => void;
}

/** Draw the feed-line route; editable when asked. Returns the function that removes it. */
export function drawFeedRoute(map: L.Map, frame: SiteFrame, r: RouteDrawing): () => void {
  const toLL = (p: XY): L.LatLng => {
    const q = frame.toLonLat(p);
    return L.latLng(q[1], q[0]);
  };
  const pts = [
    toLL(r.stationXY),
    ...r.bends.map((b) => L.latLng(b[1], b[0])),
    toLL([r.feedXYZ[0], r.feedXYZ[1]]),
  ];
  const line = L.polyline(pts, {
    color: SAFETY_COLOURS.coax,
    weight: r.editable ? 3 : 2,
    dashArray: r.editable ? undefined : '6 4',
    opacity: 0.9,
    className: 'yw-feed-route',
  }).addTo(map);
  line.bindTooltip(textContent(r.label), { className: 'yw-tip', sticky: true });
  let cleanup = (): void => {};
  if (r.editable) {
    line.pm.enable({ allowSelfIntersection: true, snappable: false, draggable: false });
    // One user gesture, one edit (one undo step): a drag commits when it ends; a handle that is
    // clicked (a bend added without a drag) commits a moment later unless a drag follows.
    let pending: ReturnType<typeof setTimeout> | undefined;
    const commit = (): void => {
      clearTimeout(pending);
      pending = undefined;
      const all = line.getLatLngs() as L.LatLng[];
      // The ends stay at the station point and under the feed; what lies between is the route.
      r.onChange(all.slice(1, -1).map((p) => [p.lng, p.lat] as LonLat));
    };
    line.on('pm:vertexadded', () => {
      clearTimeout(pending);
      pending = setTimeout(commit, 400);
    });
    line.on('pm:markerdragstart', () => clearTimeout(pending));
    line.on('pm:markerdragend', commit);
    line.on('pm:vertexremoved', commit);
    cleanup = () => clearTimeout(pending);
  }
  return () => {
    cleanup();
    if (r.editable) line.pm.disable();
    line.remove();
  };
}
