/**
 * Builds the Leaflet layers that show a project: the lot boundary with its side lengths, the
 * keep-outs with their clearance bands, the supports with name and usable height, and the
 * station. Pure construction: the caller adds the group to the map and wires the handlers.
 */
import type * as GeoJSON from 'geojson';
import L from './leaflet.ts';
import type { KeepOut, LonLat, Project, Support } from '../../../core/project/schema.ts';
import { formatLength, type UnitSystem } from '../../../core/units/index.ts';
import { clearanceBand, ringSides, supportInDanger } from '../lib/geo.ts';
import type { Selection } from '../state/project.svelte.ts';
import type { DragMove } from '../plan/liveMove.ts';

export interface LayerHandlers {
  select(s: Selection): void;
  moveSupport(id: string, to: LonLat): void;
  moveStation(to: LonLat): void;
  /** A support or the station is being dragged and is now here (live re-ranking). */
  dragging?(move: DragMove): void;
  /** A drag ended (called after its move). */
  dragEnd?(): void;
}

export interface LayerOptions {
  units: UnitSystem;
  selection: Selection;
  /** Supports and the station can be dragged (select tool only). */
  draggable: boolean;
  /** Layers react to clicks (off while a drawing tool is active, so clicks reach the map). */
  interactive: boolean;
}

export const COLOURS = {
  boundary: '#2b6f77',
  boundarySelected: '#0f4c55',
  building: '#7b5e4b',
  powerLine: '#c2410c',
  path: '#8a6d1f',
  band: '#e07b39',
} as const;

export const toLatLng = (p: LonLat): L.LatLngTuple => [p[1], p[0]];
export const toLonLat = (ll: L.LatLng): LonLat => [ll.lng, ll.lat];

const stop = (e: L.LeafletEvent): void => {
  L.DomEvent.stopPropagation(e as L.LeafletMouseEvent);
};

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** Pixels between a side and its length label. */
const SIDE_LABEL_OFFSET_PX = 15;
/** About half the width of a length label, added for sides that face east or west. */
const SIDE_LABEL_HALF_WIDTH_PX = 22;

/** A text label centred on its point, shifted by (dx, dy) screen pixels. */
function label(text: string, className: string, dx = 0, dy = 0): L.DivIcon {
  const style = `transform: translate(calc(-50% + ${dx.toFixed(1)}px), calc(-50% + ${dy.toFixed(1)}px))`;
  return L.divIcon({
    className: `yw-label ${className}`,
    html: `<span style="${style}">${escapeHtml(text)}</span>`,
    iconSize: undefined,
  });
}

/** One L.Polygon / L.Polyline per editable geometry, keyed so the caller can enable vertex editing. */
export type Shape = L.Polyline<
  GeoJSON.LineString | GeoJSON.MultiLineString | GeoJSON.Polygon | GeoJSON.MultiPolygon
>;

export interface BuiltLayers {
  group: L.LayerGroup;
  editable: Map<string, Shape>;
}

export function buildLayers(p: Project, o: LayerOptions, h: LayerHandlers): BuiltLayers {
  const group = L.layerGroup();
  const editable = new Map<string, Shape>();
  const sel = o.selection;

  for (const k of p.keepOuts) {
    const selected = sel?.kind === 'keepOut' && sel.id === k.id;
    const layer = keepOutLayer(k, selected, o, group);
    if (o.interactive) layer.on('click', (e) => (stop(e), h.select({ kind: 'keepOut', id: k.id })));
    editable.set(`keepOut:${k.id}`, layer);
  }

  if (p.boundary) {
    const selected = sel?.kind === 'boundary';
    const ring = p.boundary.coordinates[0] ?? [];
    const poly = L.polygon(ring.slice(0, -1).map(toLatLng), {
      color: selected ? COLOURS.boundarySelected : COLOURS.boundary,
      weight: selected ? 4 : 3,
      fillOpacity: 0.05,
      interactive: o.interactive,
      className: 'yw-boundary',
    }).addTo(group);
    if (o.interactive) poly.on('click', (e) => (stop(e), h.select({ kind: 'boundary' })));
    editable.set('boundary', poly);
    for (const side of ringSides(ring)) {
      L.marker(toLatLng(side.mid), {
        // Outside the lot, clear of the corner handles and of what is drawn inside.
        icon: label(
          formatLength(side.lengthM, o.units),
          'yw-side-label',
          side.outward[0] * (SIDE_LABEL_OFFSET_PX + SIDE_LABEL_HALF_WIDTH_PX * Math.abs(side.outward[0])),
          -side.outward[1] * SIDE_LABEL_OFFSET_PX,
        ),
        interactive: false,
        keyboard: false,
        pmIgnore: true,
        snapIgnore: true,
      }).addTo(group);
    }
  }

  for (const s of p.supports) {
    const hazard = supportInDanger(s, p, o.units);
    supportMarker(s, sel?.kind === 'support' && sel.id === s.id, hazard, o, h).addTo(group);
  }

  if (p.station) {
    const m = L.marker(toLatLng(p.station), {
      icon: L.divIcon({
        className: `yw-station${sel?.kind === 'station' ? ' is-selected' : ''}`,
        html: '<span></span>',
        iconSize: [22, 22],
      }),
      draggable: o.draggable,
      interactive: o.interactive,
      pmIgnore: true,
      snapIgnore: true,
      title: 'Station (drag to move)',
    }).addTo(group);
    m.bindTooltip('Station', { permanent: true, direction: 'bottom', offset: [0, 10], className: 'yw-tip' });
    m.on('click', (e) => (stop(e), h.select({ kind: 'station' })));
    m.on('drag', () => h.dragging?.({ kind: 'station', to: toLonLat(m.getLatLng()) }));
    m.on('dragend', () => (h.moveStation(toLonLat(m.getLatLng())), h.dragEnd?.()));
  }
  return { group, editable };
}

/** Marker shapes, one per support kind (20 × 20 px), drawn with a white edge to read on any ground. */
const SHAPES: Record<Support['kind'], string> = {
  tree: '<circle cx="10" cy="10" r="7" />',
  mast: '<path d="M10 2.5 L17.5 16.5 H2.5 Z" />',
  tower: '<path d="M10 2 L18 10 L10 18 L2 10 Z" />',
  building: '<rect x="3.5" y="3.5" width="13" height="13" rx="1.5" />',
};

export function supportIconHtml(kind: Support['kind']): string {
  const shape = SHAPES[kind];
  return `<svg viewBox="0 0 20 20" width="20" height="20" aria-hidden="true"><g class="halo">${shape}</g><g class="body">${shape}</g></svg>`;
}

function supportMarker(
  s: Support,
  selected: boolean,
  hazard: boolean,
  o: LayerOptions,
  h: LayerHandlers,
): L.Marker {
  const m = L.marker(toLatLng(s.position), {
    icon: L.divIcon({
      className: `yw-support yw-kind-${s.kind}${selected ? ' is-selected' : ''}${hazard ? ' is-hazard' : ''}`,
      html: supportIconHtml(s.kind),
      iconSize: [20, 20],
    }),
    draggable: o.draggable,
    interactive: o.interactive,
    pmIgnore: true,
    snapIgnore: true,
    title: `${s.name} (${s.kind})${hazard ? ', near a power line' : ''}; drag to move`,
    alt: s.name,
  });
  // Name and height; where labels crowd, the map shows the height alone (see declutter.ts).
  const html = `<span class="n">${escapeHtml(s.name)} · </span><span class="h">${formatLength(s.usableHeightM, o.units)}</span>`;
  m.bindTooltip(html, {
    permanent: true,
    direction: 'right',
    offset: [10, 0],
    className: `yw-tip yw-support-tip${selected ? ' is-selected' : ''}`,
  });
  m.on('click', (e) => (stop(e), h.select({ kind: 'support', id: s.id })));
  m.on('drag', () => h.dragging?.({ kind: 'support', id: s.id, to: toLonLat(m.getLatLng()) }));
  m.on('dragend', () => (h.moveSupport(s.id, toLonLat(m.getLatLng())), h.dragEnd?.()));
  return m;
}

function keepOutLayer(k: KeepOut, selected: boolean, o: LayerOptions, group: L.LayerGroup): Shape {
  const power = k.kind === 'power-line';
  const walk = k.kind === 'path';
  const colour = power ? COLOURS.powerLine : walk ? COLOURS.path : COLOURS.building;
  const band = clearanceBand(k);
  if (band) {
    L.geoJSON(band, {
      interactive: false,
      pmIgnore: true,
      snapIgnore: true,
      style: {
        color: power ? COLOURS.band : colour,
        weight: 1.5,
        dashArray: '6 4',
        fillColor: power ? COLOURS.band : colour,
        fillOpacity: power ? 0.16 : 0.04,
      },
    }).addTo(group);
  }
  const style: L.PolylineOptions = {
    color: colour,
    weight: selected ? 5 : power || walk ? 3 : 2,
    ...(walk ? { dashArray: '2 6', lineCap: 'round' as const } : {}),
    interactive: o.interactive,
    className: `yw-keepout yw-keepout-${k.kind}`,
  };
  let layer: Shape;
  if (k.geometry.type === 'LineString') layer = L.polyline(k.geometry.coordinates.map(toLatLng), style);
  else {
    const corners = (k.geometry.coordinates[0] ?? []).slice(0, -1).map(toLatLng);
    layer = L.polygon(corners, { ...style, fillColor: colour, fillOpacity: walk ? 0.15 : 0.35 });
  }
  layer.addTo(group);
  const clear = k.clearanceM > 0 ? ` · keep ${formatLength(k.clearanceM, o.units)} clear` : '';
  layer.bindTooltip(`${escapeHtml(k.name)}${clear}`, {
    permanent: power,
    sticky: !power,
    direction: power ? 'bottom' : 'top',
    className: `yw-tip${power ? ' yw-tip-danger' : ''}`,
  });
  return layer;
}
