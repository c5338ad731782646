/**
 * The one attach function for the map: it creates the Leaflet map on its element, keeps the
 * layers in step with the session through effects (the lot, and the planning overlays the
 * session's `mapOverlays` describes), turns the drawing tools on and off, and removes everything
 * when the element goes away. Nothing else reaches the map.
 */
import { untrack } from 'svelte';
import type { Attachment } from 'svelte/attachments';
import './geoman.ts';
import L from './leaflet.ts';
import { declutterLabels } from './declutter.ts';
import { COLOURS, buildLayers, toLatLng, toLonLat, type Shape } from './layers.ts';
import { drawOverlays } from './overlayLayers.svelte.ts';
import type { LonLat, Project } from '../../../core/project/schema.ts';
import { escapeHtml } from '../../../core/report/drawings.ts';
import { footprintOf } from '../lib/aerial.ts';
import { presetOfTemplate } from '../lib/imageryPresets.ts';
import type { Session } from '../state/session.svelte.ts';
import type { ToolId } from '../state/ui.svelte.ts';
import { withMove, type DragMove } from '../plan/liveMove.ts';

const DRAW_STYLE = { color: COLOURS.boundarySelected, weight: 2 };

function projectBounds(p: Project): L.LatLngBounds | null {
  const pts: LonLat[] = [
    ...(p.boundary?.coordinates[0] ?? []),
    ...p.supports.map((s) => s.position),
    ...(p.station ? [p.station] : []),
    ...p.keepOuts.flatMap((k) =>
      k.geometry.type === 'Polygon' ? (k.geometry.coordinates[0] ?? []) : k.geometry.coordinates,
    ),
  ];
  return pts.length ? L.latLngBounds(pts.map(toLatLng)) : null;
}

function cornersOf(layer: Shape): LonLat[] {
  const ll = layer.getLatLngs();
  const flat = (Array.isArray(ll[0]) ? ll[0] : ll) as L.LatLng[];
  return flat.map(toLonLat);
}

export function lotMap(session: Session): Attachment<HTMLElement> {
  return (el) => {
    const { doc, ui, overlay } = session;
    const map = L.map(el, { maxZoom: 22, zoomSnap: 0.25, doubleClickZoom: false, keyboard: true });
    map.setView([20, 0], 2);
    map.attributionControl.setPrefix('Leaflet');
    map.createPane('aerial').style.zIndex = '250';
    map.pm.setGlobalOptions({ snappable: true, snapDistance: 12, finishOnEnter: true });
    const resize = new ResizeObserver(() => map.invalidateSize());
    resize.observe(el);

    map.on('click', (e: L.LeafletMouseEvent) => {
      const at = toLonLat(e.latlng);
      const tool = untrack(() => ui.tool);
      if (tool === 'support') {
        if (doc.addSupport(at)) ui.setTool('select');
      } else if (tool === 'station') {
        if (doc.setStation(at)) {
          doc.select({ kind: 'station' });
          ui.setTool('select');
        }
      } else if (tool === 'select') doc.select(null);
    });
    map.on('mousemove', (e: L.LeafletMouseEvent) => (ui.cursor = toLonLat(e.latlng)));
    map.on('mouseout', () => (ui.cursor = null));
    map.on('zoomend resize', () => declutterLabels(el));
    map.on('pm:create', (e) => {
      const layer = e.layer as L.Polyline;
      const corners = cornersOf(layer);
      layer.remove();
      const tool = untrack(() => ui.tool);
      if (tool === 'boundary' && doc.setBoundary(corners)) doc.select({ kind: 'boundary' });
      else if (tool === 'building')
        doc.addKeepOut('building', { type: 'Polygon', coordinates: [[...corners, corners[0]!]] });
      else if (tool === 'power-line')
        doc.addKeepOut('power-line', { type: 'LineString', coordinates: corners });
      else if (tool === 'path') doc.addKeepOut('path', { type: 'LineString', coordinates: corners });
      ui.setTool('select');
    });

    // A drag with a plan shown re-ranks live: at most once per frame, the newest position.
    let frame: { p: Project; move: DragMove } | null = null;
    const live = (p: Project, move: DragMove): void => {
      if (!frame)
        requestAnimationFrame(() => {
          const f = frame;
          frame = null;
          if (f) session.planning.liveMove(withMove(f.p, f.move));
        });
      frame = { p, move };
    };

    const liveEnd = (): void => {
      frame = null;
      session.planning.liveEnd();
    };

    // Project layers, rebuilt on every change (a lot holds tens of items, not thousands).
    let current: L.LayerGroup | null = null;
    $effect(() => {
      const p = doc.project;
      const selection = doc.selection;
      const tool = ui.tool;
      const units = doc.units;
      current?.remove();
      current = null;
      if (!p) return;
      const selecting = tool === 'select';
      const built = buildLayers(
        p,
        { units, selection, draggable: selecting, interactive: selecting },
        {
          select: (s) => doc.select(s),
          moveSupport: (id, to) => doc.moveSupport(id, to),
          moveStation: (to) => doc.setStation(to),
          dragging: (move) => live(p, move),
          dragEnd: () => liveEnd(),
        },
      );
      current = built.group.addTo(map);
      declutterLabels(el);
      const key =
        selection?.kind === 'boundary'
          ? 'boundary'
          : selection?.kind === 'keepOut'
            ? `keepOut:${selection.id}`
            : '';
      const editable = built.editable.get(key);
      if (selecting && editable) {
        editable.pm.enable({ allowSelfIntersection: false, snappable: true, draggable: false });
        const moveOf = (corners: LonLat[]): DragMove | null => {
          if (key === 'boundary') return { kind: 'boundary', corners };
          const k = doc.selectedKeepOut;
          if (!k) return null;
          return {
            kind: 'keepOut',
            id: k.id,
            geometry:
              k.geometry.type === 'Polygon'
                ? { type: 'Polygon', coordinates: [[...corners, corners[0]!]] }
                : { type: 'LineString', coordinates: corners },
          };
        };
        editable.on('pm:markerdrag', () => {
          const move = moveOf(cornersOf(editable));
          if (move) live(p, move);
        });
        // pm:edit (the edit) comes with the end of a corner's drag; settle once both have run.
        editable.on('pm:markerdragend', () => setTimeout(liveEnd, 0));
        editable.on('pm:edit', () => {
          const corners = cornersOf(editable);
          if (key === 'boundary') doc.setBoundary(corners, 'move lot corner');
          else if (selection?.kind === 'keepOut') {
            const k = doc.selectedKeepOut;
            if (!k) return;
            const geometry =
              k.geometry.type === 'Polygon'
                ? { type: 'Polygon' as const, coordinates: [[...corners, corners[0]!]] }
                : { type: 'LineString' as const, coordinates: corners };
            doc.updateKeepOut(k.id, { geometry }, `reshape ${k.name}`);
          }
        });
      }
    });

    // The planning overlays: candidates, exposure zones, the feed route.
    drawOverlays(map, session.mapOverlays, () => declutterLabels(el));

    // Drawing tools.
    $effect(() => {
      const tool: ToolId = ui.tool;
      map.pm.disableDraw();
      el.dataset.tool = tool;
      const opts = {
        tooltips: false,
        finishOnEnter: true,
        allowSelfIntersection: false,
        templineStyle: DRAW_STYLE,
        hintlineStyle: { ...DRAW_STYLE, dashArray: '5 5' },
      };
      if (tool === 'boundary' || tool === 'building') map.pm.enableDraw('Polygon', opts);
      else if (tool === 'power-line')
        map.pm.enableDraw('Line', { ...opts, pathOptions: { color: COLOURS.powerLine } });
      else if (tool === 'path') map.pm.enableDraw('Line', { ...opts, pathOptions: { color: COLOURS.path } });
    });

    // Fit the project into view when one is opened (or asked to), and a control that does it.
    const fitLot = (): void => {
      const b = untrack(() => (doc.project ? projectBounds(doc.project) : null));
      if (b) map.fitBounds(b, { padding: [40, 40], maxZoom: 20, animate: false });
    };
    $effect(() => {
      void ui.fitRequest;
      fitLot();
    });
    const fitControl = new L.Control({ position: 'topleft' });
    fitControl.onAdd = () => {
      const bar = L.DomUtil.create('div', 'leaflet-bar yw-fit-lot');
      const a = L.DomUtil.create('a', '', bar);
      a.href = '#';
      a.role = 'button';
      a.title = 'Zoom to the lot';
      a.setAttribute('aria-label', 'Zoom to the lot');
      a.textContent = '⤢';
      L.DomEvent.disableClickPropagation(bar);
      L.DomEvent.on(a, 'click', (e) => {
        L.DomEvent.preventDefault(e);
        fitLot();
      });
      return bar;
    };
    fitControl.addTo(map);
    $effect(() => {
      const r = ui.reveal;
      if (r && !map.getBounds().pad(-0.05).contains(toLatLng(r.at))) map.panTo(toLatLng(r.at));
    });
    // Go to a place: centre there, close in, and mark it (offline the map is grey: the mark and
    // the scale show that it moved). The mark goes once the lot's drawing changes or a candidate
    // is drawn, so that it never covers the lot or an antenna.
    let goMark: L.CircleMarker | null = null;
    let goMarkFor = '';
    // By value: an edit of anything else (a setting, the station) copies these arrays too.
    const drawing = (): string => {
      const p = doc.project;
      return JSON.stringify([p?.id, p?.boundary, p?.supports, p?.keepOuts]);
    };
    $effect(() => {
      const now = drawing();
      const shown = session.mapOverlays.candidates.length > 0;
      if (goMark && (shown || now !== goMarkFor)) {
        goMark.remove();
        goMark = null;
      }
    });
    $effect(() => {
      const g = ui.goTo;
      if (!g) return;
      map.setView(toLatLng(g.at), Math.max(map.getZoom(), 18), { animate: false });
      // Centre the place in the part of the map no panel covers.
      const cover = untrack(() => ui.mapCoverLeftPx);
      if (cover > 0 && cover < map.getSize().x - 200) map.panBy([-cover / 2, 0], { animate: false });
      if (untrack(() => session.mapOverlays.candidates.length) > 0) return;
      const mark = L.circleMarker(toLatLng(g.at), {
        radius: 9,
        color: '#0f6b73',
        weight: 3,
        fill: false,
        className: 'yw-goto',
        interactive: false,
      })
        .bindTooltip(`You went to ${g.at[1].toFixed(5)}, ${g.at[0].toFixed(5)}`, {
          permanent: true,
          direction: 'top',
          className: 'yw-tip yw-goto-label',
        })
        .addTo(map);
      goMark = mark;
      goMarkFor = untrack(drawing);
      return () => {
        mark.remove();
        goMark = null;
      };
    });
    map.on('moveend', () => {
      const c = map.getCenter();
      ui.mapCentre = [c.lng, c.lat];
    });

    // Scale bar in the chosen units.
    $effect(() => {
      const metric = doc.units === 'metric';
      const scale = L.control
        .scale({ metric, imperial: !metric, position: 'bottomleft', maxWidth: 160 })
        .addTo(map);
      return () => scale.remove();
    });

    // Imagery tiles (the user's own server or a public service they chose), only when a template
    // is set (offline otherwise). The credit is plain text: Leaflet would read it as HTML.
    $effect(() => {
      const url = doc.project?.settings.tileUrlTemplate ?? '';
      const attribution = escapeHtml(doc.project?.settings.tileAttribution ?? '');
      if (!url) return;
      const maxNativeZoom = presetOfTemplate(url)?.maxNativeZoom ?? 19;
      const tiles = L.tileLayer(url, { attribution, maxZoom: 22, maxNativeZoom }).addTo(map);
      return () => tiles.remove();
    });

    // The imported aerial, under the drawing: an embedded image, or the part of a referenced
    // file that is in view, rendered again when the view changes.
    let image: L.ImageOverlay | null = null;
    $effect(() => {
      const d = overlay.display;
      if (!d) return;
      image = L.imageOverlay(d.url, d.bounds, {
        pane: 'aerial',
        opacity: untrack(() => overlay.opacity),
        interactive: false,
        className: 'yw-aerial',
      }).addTo(map);
      return () => {
        image?.remove();
        image = null;
      };
    });
    const renderView = (): void => {
      const src = untrack(() => overlay.live);
      if (!src) return;
      const view = map.getBounds();
      const s = Math.max(view.getSouth(), src.bounds[0][0]);
      const w = Math.max(view.getWest(), src.bounds[0][1]);
      const n = Math.min(view.getNorth(), src.bounds[1][0]);
      const e = Math.min(view.getEast(), src.bounds[1][1]);
      if (!(s < n && w < e)) return;
      const p1 = map.latLngToContainerPoint([s, w]);
      const p2 = map.latLngToContainerPoint([n, e]);
      void overlay.showView(
        [
          [s, w],
          [n, e],
        ],
        Math.abs(p2.x - p1.x),
        Math.abs(p1.y - p2.y),
      );
    };
    map.on('moveend', renderView);
    // A referenced image whose file is not open: its outline, so the user sees where it lies.
    $effect(() => {
      const ref = overlay.needsFile ? overlay.overlay?.source : undefined;
      if (!ref) return;
      let corners: LonLat[];
      try {
        corners = footprintOf({
          crs: ref.crs,
          widthPx: ref.widthPx,
          heightPx: ref.heightPx,
          transform: ref.transform,
        });
      } catch {
        return;
      }
      const outline = L.polygon(corners.map(toLatLng), {
        pane: 'aerial',
        color: '#6b6b6b',
        weight: 1.5,
        dashArray: '6 4',
        fill: false,
        interactive: false,
        className: 'yw-aerial-outline',
      }).addTo(map);
      return () => {
        outline.remove();
      };
    });
    $effect(() => {
      if (overlay.live) untrack(renderView);
    });
    $effect(() => {
      const opacity = overlay.opacity; // read first, so the effect tracks it even before an image exists
      image?.setOpacity(opacity);
    });

    return () => {
      resize.disconnect();
      map.pm.disableDraw();
      map.remove();
    };
  };
}
