/**
 * The feed run of the build sheet: the coax from the station point along the user's route to the
 * candidate's feed point, its length to buy and its matched loss. Pure.
 */
import type { XY } from '../site/frame.ts';
import type { XYZ } from '../site/geometry.ts';
import { COAX_SOURCE, coaxLossDbPer100m, type CoaxType } from './materials.ts';

/** Slack added to the feed-line run (common practice, no source). */
export const FEED_SLACK = 0.1;

/**
 * The feed-line run: plan length along the route (station point, the user's bend points, the
 * point under the feed), plus the rise to the feed point, plus FEED_SLACK.
 */
export function feedRun(
  stationXY: XY,
  bendsXY: readonly XY[],
  feedXYZ: XYZ,
): { planM: number; routeXY: XY[]; lengthM: number } {
  const routeXY: XY[] = [stationXY, ...bendsXY, [feedXYZ[0], feedXYZ[1]]];
  let planM = 0;
  for (let i = 0; i + 1 < routeXY.length; i++)
    planM += Math.hypot(routeXY[i + 1][0] - routeXY[i][0], routeXY[i + 1][1] - routeXY[i][1]);
  return { planM, routeXY, lengthM: (planM + Math.max(0, feedXYZ[2])) * (1 + FEED_SLACK) };
}

export interface FeedLine {
  coax: CoaxType;
  stationXY: XY;
  feedXYZ: XYZ;
  planDistanceM: number;
  /** The route drawn: station point, bend points, the point under the feed (site frame). */
  routeXY: XY[];
  /** True when the user drew the route; false for the straight run. */
  routed: boolean;
  lengthM: number;
  lossDbPer100m: number;
  lossDb: number;
  freqMHz: number;
  source: string;
  note: string;
}

/** The feed line of one candidate: station point, the user's bends, the feed point, the cable. */
export function feedLineOf(
  stationXY: XY,
  bendsXY: readonly XY[],
  feedXYZ: XYZ,
  coax: CoaxType,
  freqMHz: number,
): FeedLine {
  const run = feedRun(stationXY, bendsXY, feedXYZ);
  const lossDbPer100m = coaxLossDbPer100m(coax, freqMHz);
  const n = bendsXY.length;
  return {
    coax,
    stationXY,
    feedXYZ,
    planDistanceM: run.planM,
    routeXY: run.routeXY,
    routed: n > 0,
    lengthM: run.lengthM,
    lossDbPer100m,
    lossDb: (lossDbPer100m * run.lengthM) / 100,
    freqMHz,
    source: COAX_SOURCE,
    note: n
      ? `along your route (${n} bend${n === 1 ? '' : 's'}) from the station point, plus the feed height, plus ${FEED_SLACK * 100} % slack (common practice, no source)`
      : `straight-line plan distance from the station point plus the feed height, plus ${FEED_SLACK * 100} % slack (common practice, no source); draw your real route in the app and the length follows`,
  };
}
