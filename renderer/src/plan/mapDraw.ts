/**
 * Drawing a shortlisted candidate on the lot map: its footprint, wires, ropes, radials, ends,
 * anchors and supports, the feed point, its broadside bearings and lines toward the target
 * regions. Everything comes in the site frame (metres) from the planning core and goes back to
 * [lon, lat] through the same frame (core/site/frame.ts) the core built it in.
 */
import { unitPreference } from '../state/unitPreference.svelte.ts';
import L from '../map/leaflet.ts';
import type { Candidate } from '../../../core/rank/plan.ts';
import type { Project } from '../../../core/project/schema.ts';
import { makeSiteFrame, ringReferencePoint, type SiteFrame, type XY } from '../../../core/site/frame.ts';
import { formatLength, type UnitSystem } from '../../../core/units/index.ts';
import { targetColour } from '../plots/colours.ts';
import type { CandidateDrawing } from '../workers/protocol.ts';

export const DRAW_COLOURS = {
  wire: '#173f5f',
  radial: '#9a6a33',
  rope: '#6f7a80',
  footprint: '#173f5f',
  feed: '#ffd45c',
  broadside: '#0f6b73',
  end: '#c2410c',
};

/** A shortlisted candidate with the drawing the planning worker made of it. */
export type DrawnCandidate = Candidate & { drawing?: CandidateDrawing };

/** The frame the core builds a project's site in: centred on the lot boundary's bounding box. */
export function frameOf(project: Project): SiteFrame | null {
  return project.boundary ? makeSiteFrame(ringReferencePoint(project.boundary.coordinates[0])) : null;
}

const ll = (frame: SiteFrame, p: readonly [number, number] | readonly number[]): L.LatLngTuple => {
  const q = frame.toLonLat([p[0]!, p[1]!]);
  return [q[1], q[0]];
};

/** The point lines fan out from: the feed point, else the middle of the wires. */
function hub(c: DrawnCandidate): XY {
  const f = c.drawing?.feedXYZ;
  if (f) return [f[0], f[1]];
  const pts = c.wires.flatMap((w) => [w.from, w.to]);
  const n = Math.max(1, pts.length);
  return [pts.reduce((s, p) => s + p[0], 0) / n, pts.reduce((s, p) => s + p[1], 0) / n];
}

function ray(frame: SiteFrame, from: XY, bearingDeg: number, lengthM: number): L.LatLngTuple[] {
  const r = (bearingDeg * Math.PI) / 180;
  return [ll(frame, from), ll(frame, [from[0] + lengthM * Math.sin(r), from[1] + lengthM * Math.cos(r)])];
}

/** Tooltip content as a text node: names typed by the user or imported are data, never markup. */
function textContent(text: string): HTMLElement {
  const el = document.createElement('span');
  el.textContent = text;
  return el;
}

function tip(layer: L.Layer, text: string, permanent = false): void {
  layer.bindTooltip(textContent(text), {
    className: 'yw-tip',
    permanent,
    direction: 'top',
    sticky: !permanent,
  });
}

/** Draw the candidate; returns the function that removes the drawing. */
export function drawCandidate(map: L.Map, candidate: DrawnCandidate, project: Project): () => void {
  const frame = frameOf(project);
  if (!frame) return () => {};
  const units: UnitSystem = unitPreference.units;
  const len = (m: number): string => formatLength(m, units);
  const g = L.layerGroup();
  const ring = candidate.footprint.ringXY;
  if (ring.length > 2) {
    L.polygon(
      ring.map((p) => ll(frame, p)),
      { color: DRAW_COLOURS.footprint, weight: 1, dashArray: '4 4', fillOpacity: 0.06, interactive: false },
    ).addTo(g);
  }
  const lot = project.boundary ? project.boundary.coordinates[0].map((p) => frame.toLocal(p)) : [];
  const span = Math.max(30, ...lot.map((p) => Math.hypot(p[0], p[1])));
  const centre = hub(candidate);

  // Lines toward the targets, then the broadside bearings, under the antenna itself.
  candidate.regions.forEach((r, i) => {
    const pts = ray(frame, centre, r.bearingDeg.center, span * 0.9);
    L.polyline(pts, {
      color: targetColour(i),
      weight: 2,
      opacity: 0.85,
      dashArray: '1 6',
      lineCap: 'round',
      interactive: false,
    }).addTo(g);
    // The label sits near the antenna, where it stays in view.
    const at = ray(frame, centre, r.bearingDeg.center, Math.min(45, span * 0.3))[1]!;
    L.tooltip({ permanent: true, direction: 'center', className: 'yw-tip' })
      .setLatLng(at)
      .setContent(textContent(`${r.name} ${Math.round(r.bearingDeg.center)}°`))
      .addTo(g);
  });
  candidate.broadsideDeg.forEach((b) => {
    const line = L.polyline(ray(frame, centre, b, span * 0.6), {
      color: DRAW_COLOURS.broadside,
      weight: 3,
      opacity: 0.7,
      dashArray: '8 5',
    }).addTo(g);
    tip(line, `broadside ${Math.round(b)}°`);
  });

  const elements =
    candidate.drawing?.elements ?? candidate.wires.map((w) => ({ kind: 'wire' as const, ...w }));
  for (const e of elements) {
    if (e.kind === 'wire' || e.kind === 'rope' || e.kind === 'radial') {
      const style: L.PolylineOptions =
        e.kind === 'wire'
          ? { color: DRAW_COLOURS.wire, weight: 4, opacity: 0.95 }
          : e.kind === 'radial'
            ? { color: DRAW_COLOURS.radial, weight: 1.2, opacity: 0.8 }
            : { color: DRAW_COLOURS.rope, weight: 1.5, dashArray: '3 3' };
      const line = L.polyline([ll(frame, e.from), ll(frame, e.to)], style).addTo(g);
      const h = e.from[2] === e.to[2] ? len(e.from[2]) : `${len(e.from[2])} to ${len(e.to[2])}`;
      const l = Math.hypot(e.to[0] - e.from[0], e.to[1] - e.from[1], e.to[2] - e.from[2]);
      tip(line, e.kind === 'radial' ? `${e.label}: ${len(l)}` : `${e.label}: ${len(l)}, ${h} above ground`);
    } else if (e.kind === 'end' || e.kind === 'anchor') {
      const m = L.circleMarker(ll(frame, e.at), {
        radius: e.kind === 'end' ? 4 : 3,
        color: e.kind === 'end' ? DRAW_COLOURS.end : DRAW_COLOURS.rope,
        fillColor: '#fff',
        fillOpacity: 1,
        weight: 2,
      }).addTo(g);
      tip(m, e.kind === 'end' ? `${e.label}: ${len(e.at[2])} up, high RF voltage` : `${e.label} at ground`);
    } else if (e.kind === 'mast') {
      const m = L.circleMarker(ll(frame, e.at), {
        radius: 6,
        color: DRAW_COLOURS.wire,
        fillColor: '#fff',
        weight: 3,
      });
      tip(m.addTo(g), `${e.label}, ${len(e.heightM)}`);
    }
  }
  const f = candidate.drawing?.feedXYZ;
  if (f) {
    const m = L.circleMarker(ll(frame, f), {
      radius: 6,
      color: '#1f2528',
      weight: 2,
      fillColor: DRAW_COLOURS.feed,
      fillOpacity: 1,
    }).addTo(g);
    tip(m, `feed point, ${len(f[2])} up`);
  }
  g.addTo(map);
  return () => g.remove();
}
