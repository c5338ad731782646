/**
 * What the lot map draws over the lot for the planning views: the selected candidate (and the
 * compared one), the selected candidate's RF-exposure zones and its feed-line route, and whether
 * the plan is out of date. A pure view of the session's planning state and the open project; the
 * map's one attach function (map/lotMap.svelte.ts) draws it. Nothing here touches the map.
 */
import type { LonLat, StationSettings } from '../../../core/project/schema.ts';
import type { Candidate } from '../../../core/rank/plan.ts';
import type { ZoneOnLot } from '../../../core/report/exposureZones.ts';
import type { SiteFrame } from '../../../core/site/frame.ts';
import type { UnitSystem } from '../../../core/units/index.ts';
import { candidateExposure, candidateFeedRun, RULE_LIMITS } from '../plan/exposure.ts';
import { exposureView } from '../plan/exposureView.svelte.ts';
import { candidateFrame } from '../plan/mapDraw.ts';
import type { Planning } from '../plan/planning.svelte.ts';
import type { ProjectState } from './project.svelte.ts';
import { unitPreference } from './unitPreference.svelte.ts';

export interface CandidateOverlay {
  candidate: Candidate;
  role: 'selected' | 'compared';
  units: UnitSystem;
  lotRing: readonly LonLat[] | null;
  /** Why the plan is out of date, or ''. */
  stale: string;
}

export interface ExposureOverlay {
  frame: SiteFrame;
  zones: readonly [ZoneOnLot, ZoneOnLot];
  units: UnitSystem;
}

/** The feed route's inputs; `bends` is null while the route is being edited (see routeKey). */
export interface RouteOverlay {
  candidateId: string;
  editing: boolean;
  bends: LonLat[] | null;
  coax: StationSettings['coax'];
  units: UnitSystem;
}

export class MapOverlays {
  #doc: ProjectState;
  #planning: Planning;

  constructor(doc: ProjectState, planning: Planning) {
    this.#doc = doc;
    this.#planning = planning;
  }

  /** The candidates to draw: the selected one, then the compared one. */
  candidates: CandidateOverlay[] = $derived.by(() => {
    const p = this.#doc.project;
    const pl = this.#planning;
    if (!p) return [];
    const base = {
      units: unitPreference.units,
      lotRing: pl.madeFor?.boundary?.coordinates[0] ?? null,
      stale: pl.staleText,
    };
    const out: CandidateOverlay[] = [];
    if (pl.selected) out.push({ ...base, candidate: pl.selected, role: 'selected' });
    if (pl.selected && pl.compared) out.push({ ...base, candidate: pl.compared, role: 'compared' });
    return out;
  });

  /** The selected candidate's exposure zones under the rule chosen in the panel. */
  exposure: ExposureOverlay | null = $derived.by(() => {
    const c = this.#planning.selected;
    const madeFor = this.#planning.madeFor;
    const live = this.#doc.project;
    if (!c || !madeFor || !live) return null;
    const rule = exposureView.rule;
    const ex = candidateExposure(madeFor, live.settings.station, c, rule);
    if (!ex) return null;
    const [a, b] = RULE_LIMITS[rule];
    const za = ex.onLot.zones.find((z) => z.limitId === a);
    const zb = ex.onLot.zones.find((z) => z.limitId === b);
    if (!za || !zb) return null;
    return { frame: candidateFrame(c), zones: [za, zb], units: unitPreference.units };
  });

  /**
   * What the feed route's drawing depends on, as one string (a RouteOverlay in JSON; '' for no
   * route): while the route is being edited its own edits must not redraw it (that would drop the
   * handle being dragged), so the bends are left out then.
   */
  routeKey: string = $derived.by(() => {
    const c = this.#planning.selected;
    const live = this.#doc.project;
    if (!c || !live || !this.#planning.madeFor || !c.feedPoints[0]) return '';
    const editing = exposureView.editingRoute;
    const r: RouteOverlay = {
      candidateId: c.id,
      editing,
      bends: editing ? null : (live.feedRoutes[c.id] ?? []),
      coax: live.settings.station.coax,
      units: unitPreference.units,
    };
    return JSON.stringify(r);
  });

  /** The selected candidate (read without tracking by the map's route drawing). */
  get selected(): Candidate | null {
    return this.#planning.selected;
  }

  /** The bends of the selected candidate's feed route, as the open project holds them. */
  bendsOf(candidateId: string): LonLat[] {
    return this.#doc.project?.feedRoutes[candidateId] ?? [];
  }

  /** The feed run of the route, for its label. */
  feedRun(c: Candidate, bends: readonly LonLat[], coax: StationSettings['coax']) {
    const madeFor = this.#planning.madeFor;
    return madeFor ? candidateFeedRun(madeFor, bends, coax, c) : null;
  }

  setFeedRoute(candidateId: string, bends: LonLat[]): void {
    this.#doc.setFeedRoute(candidateId, bends);
  }
}
