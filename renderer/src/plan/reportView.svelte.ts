/**
 * The print view's state: which report is open (its standalone HTML and the file name to offer
 * when saving it) and where focus goes back when it closes. One per window; `ReportView.svelte`
 * (mounted once in App.svelte) shows it.
 */
class ReportViewState {
  /** The open report's standalone HTML document, or null while the view is closed. */
  html = $state<string | null>(null);
  /** File name without extension for "Save HTML" and "Save as PDF…". */
  fileBase = $state('report');
  /** The element that opened the view (focus returns there on close). */
  opener: HTMLElement | null = null;
}

export const reportView = new ReportViewState();

/**
 * Open the print view on a standalone report document. `opener` is the element focus returns to
 * on close; by default the element focused now (the button just clicked).
 */
export function openReport(html: string, fileBase: string, opener?: HTMLElement | null): void {
  if (reportView.html === null) {
    const active = typeof document === 'undefined' ? null : document.activeElement;
    reportView.opener = opener ?? (active instanceof HTMLElement && active !== document.body ? active : null);
  }
  reportView.fileBase = fileBase;
  reportView.html = html;
}

/** Close the print view and give focus back to what opened it, if it is still on the page. */
export function closeReport(): void {
  if (reportView.html === null) return;
  const back = reportView.opener;
  reportView.html = null;
  reportView.opener = null;
  if (back?.isConnected) back.focus();
}

/**
 * Show a build sheet (the HTML from `renderBuildSheetHtml`) in the print view, where it can be
 * printed, saved as PDF (desktop app) or saved as an HTML file named `<fileBase>.html`.
 */
export function showBuildSheet(html: string, fileBase: string, opener?: HTMLElement | null): void {
  openReport(html, fileBase, opener);
}
