/**
 * The station report of one candidate: the one function the app's detail panel, the print view
 * and the `report` command call. A pure function of the candidate, the project (its lot, station
 * settings and feed routes), the shortlist's pattern of the candidate and the tuning rate the
 * caller measured; nothing is found again.
 */
import { buildSheet, type BuildSheet, type BuildSheetInput } from './buildSheet.ts';
import { renderBuildSheetHtml } from './html.ts';

export interface StationReportInput extends BuildSheetInput {
  /** Date printed in the header (YYYY-MM-DD); none when not given. */
  generatedAt?: string;
}

export interface StationReport {
  sheet: BuildSheet;
  /** The standalone printable HTML document. */
  html: string;
}

export function stationReport(input: StationReportInput): StationReport {
  const sheet = buildSheet(input);
  return { sheet, html: renderBuildSheetHtml(sheet, input.generatedAt) };
}
