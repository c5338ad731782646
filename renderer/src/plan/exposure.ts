/**
 * The RF-exposure estimate of the selected candidate, as the panel and the map show it: the
 * station's power, mode and on-time from the live project, the candidate's own peak gain, the
 * geometry of the project the plan was made for. Computed by the pure core
 * (core/report/exposure.ts and exposureZones.ts) and kept for the last few asks.
 */
import type { Project, StationSettings } from '../../../core/project/schema.ts';
import type { Candidate } from '../../../core/rank/plan.ts';
import {
  estimateExposure,
  type ExposureEstimate,
  type ExposureLimitId,
} from '../../../core/report/exposure.ts';
import { exposureOnLot, type ExposureOnLot } from '../../../core/report/exposureZones.ts';
import { buildSite } from '../../../core/site/site.ts';
import { stationLineEnd } from '../../../core/report/arrayWiring.ts';
import { coaxLossDbPer100m, feedRun } from '../../../core/report/buildSheet.ts';
import type { LonLat } from '../../../core/project/schema.ts';
import type { XY } from '../../../core/site/frame.ts';

export interface CandidateFeedRun {
  stationXY: XY;
  routeXY: XY[];
  lengthM: number;
  bends: number;
  lossDb: number;
  per100: number;
}

/**
 * The feed-line run of a candidate along the user's bends to its feed point (an array's relay
 * box), and its matched loss; null without a feed point.
 */
export function candidateFeedRun(
  madeFor: Project,
  bends: readonly LonLat[],
  coax: StationSettings['coax'],
  c: Candidate,
): CandidateFeedRun | null {
  // an array's station line ends at its relay box (core/report/arrayWiring.ts)
  const feed = stationLineEnd(c);
  if (!feed) return null;
  const site = buildSite(madeFor);
  const r = feedRun(
    site.station,
    bends.map((b) => site.frame.toLocal(b)),
    feed,
  );
  const per100 = coaxLossDbPer100m(coax, c.feed.freqMHz);
  return {
    stationXY: site.station,
    routeXY: r.routeXY,
    lengthM: r.lengthM,
    bends: bends.length,
    lossDb: (per100 * r.lengthM) / 100,
    per100,
  };
}

/** Which rule's two zones (general public and controlled/occupational) the map draws. */
export type ExposureRule = 'fcc' | 'icnirp';

export const RULE_LIMITS: Record<ExposureRule, readonly [ExposureLimitId, ExposureLimitId]> = {
  fcc: ['fcc-general', 'fcc-controlled'],
  icnirp: ['icnirp-public', 'icnirp-occupational'],
};

export const RULE_LABEL: Record<ExposureRule, string> = {
  fcc: 'FCC 47 CFR §1.1310',
  icnirp: 'ICNIRP 2020',
};

export interface CandidateExposure {
  estimate: ExposureEstimate;
  onLot: ExposureOnLot;
}

const cache = new WeakMap<Project, Map<string, CandidateExposure>>();

/** The estimate and its zones on the lot; null when the station settings cannot make one. */
export function candidateExposure(
  madeFor: Project,
  station: StationSettings,
  c: Candidate,
  rule: ExposureRule,
): CandidateExposure | null {
  const key = JSON.stringify([c.id, c.evaluationKey, station, rule]);
  let m = cache.get(madeFor);
  if (!m) cache.set(madeFor, (m = new Map()));
  const hit = m.get(key);
  if (hit) return hit;
  let out: CandidateExposure;
  try {
    const estimate = estimateExposure({
      peakEnvelopePowerW: station.powerW,
      mode: station.mode,
      onTimeFraction: station.onTimeFraction,
      feedLossDb: 0,
      gainDbi: c.peak.gainDbi,
      freqMhz: c.feed.freqMHz,
    });
    out = { estimate, onLot: exposureOnLot(c.wires, buildSite(madeFor), estimate, RULE_LIMITS[rule]) };
  } catch {
    return null;
  }
  if (m.size > 16) m.clear();
  m.set(key, out);
  return out;
}
