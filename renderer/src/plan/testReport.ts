/**
 * The print view's hook for end-to-end tests, while the candidate detail's Build sheet button
 * still downloads the sheet instead of opening the view. A test (and only a test: nothing in the
 * interface sends it) dispatches TEST_REPORT_EVENT on the window with `{ html, fileBase }`; the
 * view then opens exactly as `showBuildSheet(html, fileBase)` would. It grants nothing a script
 * of the page could not already do (only the app's own scripts run here), and the view strips
 * active content from whatever it shows. Remove it once the button opens the view.
 */
export const TEST_REPORT_EVENT = 'yardwire-test:show-report';

/** Longest document the hook accepts (a demo build sheet is about 60 kB). */
const MAX_HTML_CHARS = 4_000_000;

/** Listen for the test event; returns the function that stops listening. */
export function listenForTestReport(
  scope: Pick<Window, 'addEventListener' | 'removeEventListener'>,
  show: (html: string, fileBase: string) => void,
): () => void {
  const onEvent = (e: Event): void => {
    const d = (e as CustomEvent<unknown>).detail as Record<string, unknown> | null;
    if (typeof d !== 'object' || d === null) return;
    const { html, fileBase } = d;
    if (typeof html !== 'string' || html.length > MAX_HTML_CHARS) return;
    if (typeof fileBase !== 'string' || !/^[\w.-]{1,120}$/.test(fileBase)) return;
    show(html, fileBase);
  };
  scope.addEventListener(TEST_REPORT_EVENT, onEvent);
  return () => scope.removeEventListener(TEST_REPORT_EVENT, onEvent);
}
