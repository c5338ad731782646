/**
 * The planning overlays on the lot map (state/mapOverlays.svelte.ts): the selected and compared
 * candidates, the exposure zones and the feed-line route, each kept in step by an effect. Called
 * once by the map's attach function (lotMap.svelte.ts) with the map it made; the effects end with
 * that attachment.
 */
import { untrack } from 'svelte';
import type L from './leaflet.ts';
import type { LonLat } from '../../../core/project/schema.ts';
import { formatLength } from '../../../core/units/index.ts';
import { stationLineEnd } from '../../../core/report/arrayWiring.ts';
import { candidateFrame, drawCandidate } from '../plan/mapDraw.ts';
import { drawExposure, drawFeedRoute } from '../plan/mapSafety.ts';
import type { MapOverlays, RouteOverlay } from '../state/mapOverlays.svelte.ts';

export function drawOverlays(map: L.Map, overlays: MapOverlays, afterDraw: () => void): void {
  $effect(() => {
    const list = overlays.candidates;
    const undo = list.map((o) =>
      drawCandidate(map, o.candidate, { units: o.units, lotRing: o.lotRing, role: o.role, stale: o.stale }),
    );
    afterDraw();
    return () => {
      for (const u of undo) u();
    };
  });

  $effect(() => {
    const ex = overlays.exposure;
    if (!ex) return;
    return drawExposure(map, ex.frame, ex.zones, ex.units);
  });

  $effect(() => {
    const key = overlays.routeKey;
    if (!key) return;
    const r = JSON.parse(key) as RouteOverlay;
    const c = untrack(() => overlays.selected);
    if (!c || c.id !== r.candidateId) return;
    const feed = stationLineEnd(c);
    if (!feed) return;
    const bends: LonLat[] = r.bends ?? untrack(() => overlays.bendsOf(r.candidateId));
    const run = untrack(() => overlays.feedRun(c, bends, r.coax));
    if (!run) return;
    return drawFeedRoute(map, candidateFrame(c), {
      stationXY: run.stationXY,
      bends,
      feedXYZ: feed,
      label: r.editing
        ? 'Feed line: drag a middle handle to add a bend, drag a bend to move it, right-click a bend to remove it'
        : `Feed line: ${formatLength(run.lengthM, r.units)} of ${r.coax}, ${run.lossDb.toFixed(2)} dB at ${c.feed.freqMHz.toFixed(3)} MHz`,
      editable: r.editing,
      onChange: (next) => overlays.setFeedRoute(r.candidateId, next),
    });
  });
}
