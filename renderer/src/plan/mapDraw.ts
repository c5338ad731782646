/**
 * Drawing a shortlisted candidate on the lot map: its footprint, wires, ropes, radials, ends,
 * anchors and masts, the feed point, its broadside bearings and lines toward the target regions.
 * Everything is the candidate's own (its `elements` with their roles and its `feedPoints`, in the
 * site frame, metres) and goes back to [lon, lat] through the frame whose origin the candidate
 * carries (`placement.frameOriginLonLat`; core/site/frame.ts).
 */
import L from '../map/leaflet.ts';
import type { Candidate } from '../../../core/rank/plan.ts';
import { makeSiteFrame, type SiteFrame, type XY } from '../../../core/site/frame.ts';
import { formatLength, type UnitSystem } from '../../../core/units/index.ts';
import { targetColour } from '../plots/colours.ts';

export const DRAW_COLOURS = {
  wire: '#173f5f',
  radial: '#9a6a33',
  rope: '#6f7a80',
  footprint: '#173f5f',
  feed: '#ffd45c',
  broadside: '#0f6b73',
  end: '#c2410c',
  coax: '#1f2528',
};

/** The site frame the candidate's metres are in (the frame the planner placed it in). */
export function candidateFrame(c: Pick<Candidate, 'placement'>): SiteFrame {
  return makeSiteFrame(c.placement.frameOriginLonLat);
}

const ll = (frame: SiteFrame, p: readonly [number, number] | readonly number[]): L.LatLngTuple => {
  const q = frame.toLonLat([p[0]!, p[1]!]);
  return [q[1], q[0]];
};

/** The point lines fan out from: the feed point, else the middle of the wires. */
function hub(c: Candidate): XY {
  const f = c.feedPoints[0]?.xyz;
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

export interface DrawOptions {
  units: UnitSystem;
  /** The lot boundary's corners, [lon, lat] (how far the target lines reach); null without one. */
  lotRing: readonly (readonly [number, number])[] | null;
  /**
   * 'selected' draws everything (target lines, broadside, labels); 'compared' draws the antenna
   * alone in the compare colour, so that two candidates can be read on one map.
   */
  role?: 'selected' | 'compared';
  /** The plan is out of date: the antenna is drawn faded and dashed, with the reason on it. */
  stale?: string;
}

const COMPARE_COLOUR = '#b4387a';

/** Draw the candidate; returns the function that removes the drawing. */
export function drawCandidate(map: L.Map, candidate: Candidate, o: DrawOptions): () => void {
  const frame = candidateFrame(candidate);
  const compared = o.role === 'compared';
  const len = (m: number): string => formatLength(m, o.units);
  const g = L.layerGroup();
  const cls = compared ? 'yw-cand yw-cand-compared' : 'yw-cand yw-cand-selected';
  const ring = candidate.footprint.ringXY;
  if (ring.length > 2) {
    L.polygon(
      ring.map((p) => ll(frame, p)),
      {
        color: compared ? COMPARE_COLOUR : DRAW_COLOURS.footprint,
        weight: 1,
        dashArray: '4 4',
        fillOpacity: 0.06,
        interactive: false,
      },
    ).addTo(g);
  }
  const lot = o.lotRing ? o.lotRing.map((p) => frame.toLocal([p[0], p[1]])) : [];
  const span = Math.max(30, ...lot.map((p) => Math.hypot(p[0], p[1])));
  const centre = hub(candidate);

  // Lines toward the targets, then the broadside bearings, under the antenna itself.
  const bearingTips: [L.Tooltip, number][] = [];
  if (!compared) {
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
      // The label sits out on the line, past the lot's labels and the antenna (see declutter).
      const at = ray(frame, centre, r.bearingDeg.center, span * 0.75)[1]!;
      bearingTips.push([
        L.tooltip({ permanent: true, direction: 'center', className: 'yw-tip yw-bearing-label' })
          .setLatLng(at)
          .setContent(textContent(`${r.name} ${Math.round(r.bearingDeg.center)}°`))
          .addTo(g),
        r.bearingDeg.center,
      ]);
    });
    // A switched array: one line per direction (its beam), numbered as in the shortlist.
    const beams =
      candidate.states.length > 1
        ? candidate.states.map((s, i) => ({ deg: s.beamDeg, text: `direction ${i + 1}: ${s.name}, beam` }))
        : candidate.broadsideDeg.map((deg) => ({ deg, text: 'broadside' }));
    beams.forEach((b) => {
      const line = L.polyline(ray(frame, centre, b.deg, span * 0.6), {
        color: DRAW_COLOURS.broadside,
        weight: 3,
        opacity: 0.7,
        dashArray: '8 5',
      }).addTo(g);
      tip(line, `${b.text} ${Math.round(b.deg)}°`);
    });
  }

  const faded = o.stale ? { opacity: 0.55, dashArray: '10 6' } : {};
  const boxes = new Set<string>();
  for (const e of candidate.elements) {
    if (e.role === 'support' || e.role === 'feed-line') continue; // drawn by the lot and the feed route
    if (e.role === 'coax') {
      // An array's coax from a feed point to its relay box, and the box where it meets the ground.
      const line = L.polyline([ll(frame, e.from), ll(frame, e.to)], {
        color: DRAW_COLOURS.coax,
        weight: 2,
        dashArray: '6 3',
        className: `${cls} yw-cand-coax`,
      }).addTo(g);
      const l = Math.hypot(e.to[0] - e.from[0], e.to[1] - e.from[1], e.to[2] - e.from[2]);
      tip(line, `${e.label}: ${len(l)} straight (cut it to the length on the build sheet)`);
      const boxKey = `${e.to[0].toFixed(1)}:${e.to[1].toFixed(1)}`;
      if (e.to[2] === 0 && !boxes.has(boxKey)) {
        boxes.add(boxKey);
        const box = L.rectangle(
          [ll(frame, [e.to[0] - 0.6, e.to[1] - 0.6]), ll(frame, [e.to[0] + 0.6, e.to[1] + 0.6])],
          {
            color: DRAW_COLOURS.coax,
            weight: 2,
            fillColor: '#fff',
            fillOpacity: 1,
            className: `${cls} yw-cand-box`,
          },
        ).addTo(g);
        tip(box, 'relay box (on the ground)');
      }
      continue;
    }
    if (e.role === 'radiator' || e.role === 'top-wire' || e.role === 'rope' || e.role === 'radial') {
      const wire = e.role === 'radiator' || e.role === 'top-wire';
      const style: L.PolylineOptions = wire
        ? {
            color: compared ? COMPARE_COLOUR : DRAW_COLOURS.wire,
            weight: 4,
            opacity: 0.95,
            className: `${cls} yw-cand-wire`,
            ...faded,
          }
        : e.role === 'radial'
          ? { color: DRAW_COLOURS.radial, weight: 1.2, opacity: 0.8, className: cls }
          : { color: DRAW_COLOURS.rope, weight: 1.5, dashArray: '3 3', className: cls };
      const line = L.polyline([ll(frame, e.from), ll(frame, e.to)], style).addTo(g);
      const h = e.from[2] === e.to[2] ? len(e.from[2]) : `${len(e.from[2])} to ${len(e.to[2])}`;
      const l = Math.hypot(e.to[0] - e.from[0], e.to[1] - e.from[1], e.to[2] - e.from[2]);
      const head = compared ? `#${candidate.rank} ` : '';
      tip(
        line,
        e.role === 'radial' ? `${e.label}: ${len(l)}` : `${head}${e.label}: ${len(l)}, ${h} above ground`,
      );
    } else if (e.role === 'end' || e.role === 'anchor') {
      const m = L.circleMarker(ll(frame, e.at), {
        radius: e.role === 'end' ? 4 : 3,
        color: e.role === 'end' ? DRAW_COLOURS.end : DRAW_COLOURS.rope,
        fillColor: '#fff',
        fillOpacity: 1,
        weight: 2,
        className: cls,
      }).addTo(g);
      tip(m, e.role === 'end' ? `${e.label}: ${len(e.at[2])} up, high RF voltage` : `${e.label} at ground`);
    } else if (e.role === 'mast') {
      const m = L.circleMarker(ll(frame, e.at), {
        radius: 6,
        color: compared ? COMPARE_COLOUR : DRAW_COLOURS.wire,
        fillColor: '#fff',
        weight: 3,
        className: `${cls} yw-cand-wire`,
      });
      tip(m.addTo(g), `${e.label}, ${len(e.heightM)}`);
    }
  }
  // Every feed point (an array has one per element; the first is driven in direction 1).
  candidate.feedPoints.forEach((fp, i) => {
    const f = fp.xyz;
    const m = L.circleMarker(ll(frame, f), {
      radius: 6,
      color: '#1f2528',
      weight: 2,
      fillColor: compared ? COMPARE_COLOUR : DRAW_COLOURS.feed,
      fillOpacity: 1,
      className: `${cls} yw-cand-feed`,
    }).addTo(g);
    const which =
      candidate.feedPoints.length > 1
        ? ` ${i + 1} of ${candidate.feedPoints.length} (${candidate.arrayFeed?.elements[i]?.label ?? 'element'})`
        : '';
    tip(m, `${compared ? `#${candidate.rank} ` : ''}feed point${which}, ${len(f[2])} up`);
  });
  if (o.stale && !compared) {
    L.tooltip({ permanent: true, direction: 'top', className: 'yw-tip yw-stale-label' })
      .setLatLng(ll(frame, centre))
      .setContent(textContent(`Out of date: ${o.stale}`))
      .addTo(g);
  }
  g.addTo(map);
  // The map's declutter slides each bearing label along its own line (map/declutter.ts).
  for (const [t, deg] of bearingTips) {
    const el = t.getElement();
    if (el) el.dataset.bearing = String(deg);
  }
  return () => g.remove();
}
