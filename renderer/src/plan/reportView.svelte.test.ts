// @vitest-environment jsdom
// The print view: the report's stylesheet rescoped for a shadow root, active content removed, a
// real demo build sheet with every section inside the shadow root, and the dialog's keyboard
// and focus behaviour, Save HTML and Save as PDF in both shells.
import { afterEach, describe, expect, expectTypeOf, it, vi } from 'vitest';
import { flushSync, mount, unmount } from 'svelte';
import { REPORT_BODY_CLASS, renderReport, scopeReportCss, scopeSelector } from './reportHtml.ts';
import { closeReport, reportView, showBuildSheet } from './reportView.svelte.ts';
import ReportView from './ReportView.svelte';
import { REPORT_SECTIONS } from '../../../core/report/html.ts';
import { stationReport } from '../../../core/report/stationReport.ts';
import { demoPlanProject, demoShortlist } from './testShortlist.ts';
import type { DesktopBridge } from '../lib/api.ts';
import type { YardwireDesktop } from '../../../electron/desktopBridge.ts';

const B = `.${REPORT_BODY_CLASS}`;

function demoSheetHtml(): string {
  const project = demoPlanProject();
  const shortlist = demoShortlist();
  const c = shortlist.candidates[0]!;
  return stationReport({ project, shortlist, candidate: c, generatedAt: '2024-01-01' }).html;
}

describe('report stylesheet in a shadow root', () => {
  it('moves :root, html and body onto the host and the wrapper, and nothing else', () => {
    expect(scopeSelector(':root')).toBe(':host');
    expect(scopeSelector('html body h1')).toBe(`:host ${B} h1`);
    expect(scopeSelector('body')).toBe(B);
    expect(scopeSelector('th, td.n,body>p')).toBe(`th, td.n, ${B}>p`);
    // Look-alikes stay as they are.
    for (const s of [
      'tbody td',
      '.body',
      '#body',
      'tr.tbody',
      '[data-body]',
      'svg.lot .body-x',
      '.yw-support .body',
    ])
      expect(scopeSelector(s)).toBe(s);
    expect(scopeSelector(':is(body, p) a')).toBe(`:is(${B}, p) a`);
  });

  it('keeps media blocks (rewritten inside), drops @page, @font-face and @import, leaves declarations alone', () => {
    const css = `@import url(x.css);
/* a comment with body { } inside */
:root { color-scheme: light; }
body { font: 13px/1.45 system-ui; margin: 24px auto; }
@media print {
  body { margin: 0; }
  section { break-inside: avoid-page; }
  @page { size: A4; margin: 14mm; }
}
@font-face { font-family: x; src: url(x.woff); }
@keyframes spin { from { opacity: 0 } to { opacity: 1 } }
td.n { text-align: right; }`;
    const out = scopeReportCss(css);
    expect(out).toContain(':host { color-scheme: light; }');
    expect(out).toContain(`${B} { font: 13px/1.45 system-ui; margin: 24px auto; }`);
    expect(out).toMatch(
      new RegExp(`@media print \\{\\s*\\.${REPORT_BODY_CLASS} \\{ margin: 0; \\}\\s*section \\{`),
    );
    expect(out).toContain('@keyframes spin { from { opacity: 0 } to { opacity: 1 } }');
    expect(out).toContain('td.n { text-align: right; }');
    for (const gone of ['@page', '@import', '@font-face', 'comment', 'x.woff'])
      expect(out).not.toContain(gone);
    expect(out.split('{').length).toBe(out.split('}').length);
  });
});

describe('renderReport', () => {
  afterEach(() => document.body.replaceChildren());

  it('removes scripts, frames, handlers and script URLs, keeping the text', () => {
    const host = document.createElement('div');
    document.body.append(host);
    const hostile = `<!doctype html><html><head><title>T</title><script>window.__pwned = 1</script>
      <link rel="stylesheet" href="https://elsewhere.example/x.css"><style>body{color:red}</style></head>
      <body onload="window.__pwned=2"><h1>Sheet</h1><img src="x" onerror="window.__pwned=3">
      <a href="javascript:alert(1)">a</a><iframe src="https://elsewhere.example/"></iframe>
      <svg><script>window.__pwned=4</script><a href=" JavaScript:alert(2)"><text>t</text></a></svg>
      <p title="onclick">kept</p></body></html>`;
    const r = renderReport(host, hostile);
    const root = host.shadowRoot!;
    expect(r.title).toBe('T');
    expect(root.querySelectorAll('script, iframe, link')).toHaveLength(0);
    expect(root.innerHTML).not.toMatch(/onerror|onload|javascript:/i);
    expect(root.querySelector('p')!.getAttribute('title')).toBe('onclick');
    expect(root.querySelector('h1')!.textContent).toBe('Sheet');
    expect(r.removed).toBeGreaterThanOrEqual(6);
    expect((window as unknown as { __pwned?: number }).__pwned).toBeUndefined();
    // The report's styles live in the shadow root only, rescoped.
    expect(document.head.querySelectorAll('style')).toHaveLength(0);
    expect([...root.querySelectorAll('style')].map((s) => s.textContent).join('')).toContain(
      `${B} {color:red}`,
    );
  });

  it('shows every section of a real demo build sheet, and a second report replaces the first', () => {
    const host = document.createElement('div');
    document.body.append(host);
    const html = demoSheetHtml();
    const r = renderReport(host, html);
    expect(r.removed).toBe(0);
    expect(r.title).toMatch(/^Build sheet/);
    const root = host.shadowRoot!;
    const h2 = [...root.querySelectorAll('h2')].map((h) => h.textContent);
    expect(h2).toEqual([...REPORT_SECTIONS]);
    expect(root.querySelector('svg.lot .wire')).not.toBeNull();
    expect(document.querySelectorAll('h2')).toHaveLength(0);
    renderReport(host, '<html><head><title>Other</title></head><body><h2>Only</h2></body></html>');
    expect([...root.querySelectorAll('h2')].map((h) => h.textContent)).toEqual(['Only']);
  });
});

describe('ReportView', () => {
  let app: ReturnType<typeof mount> | null = null;
  afterEach(() => {
    closeReport();
    flushSync();
    if (app) unmount(app);
    app = null;
    delete window.yardwireDesktop;
    document.body.replaceChildren();
  });

  function setup(): HTMLButtonElement {
    const opener = document.createElement('button');
    opener.textContent = 'Build sheet';
    const target = document.createElement('div');
    document.body.append(opener, target);
    app = mount(ReportView, { target });
    opener.focus();
    return opener;
  }

  const sample = '<html><head><title>Build sheet #1</title></head><body><h2>Summary</h2></body></html>';

  it('opens as a labelled modal dialog with focus in the toolbar; Escape closes and focus returns', () => {
    const opener = setup();
    const shortcuts = vi.fn();
    window.addEventListener('keydown', shortcuts);
    showBuildSheet(sample, 'build-sheet-1');
    flushSync();
    const dialog = document.querySelector('[role="dialog"]')!;
    expect(dialog.getAttribute('aria-modal')).toBe('true');
    const label = document.getElementById(dialog.getAttribute('aria-labelledby')!)!;
    expect(label.textContent).toContain('Build sheet #1');
    expect(document.activeElement?.textContent).toBe('Print…');
    expect(document.documentElement.classList.contains('yw-report-open')).toBe(true);
    const host = document.querySelector('[data-testid="report-host"]') as HTMLElement;
    expect(host.shadowRoot!.querySelector('h2')!.textContent).toBe('Summary');

    // Keys go nowhere else while the view is open (Delete must not reach the map's selection).
    document.activeElement!.dispatchEvent(new KeyboardEvent('keydown', { key: 'Delete', bubbles: true }));
    expect(shortcuts).not.toHaveBeenCalled();
    document.activeElement!.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape', bubbles: true }));
    flushSync();
    expect(document.querySelector('[role="dialog"]')).toBeNull();
    expect(reportView.html).toBeNull();
    expect(document.activeElement).toBe(opener);
    expect(document.documentElement.classList.contains('yw-report-open')).toBe(false);
    window.removeEventListener('keydown', shortcuts);
  });

  it('in browser mode prints with window.print, saves HTML, and explains why PDF needs the desktop app', () => {
    setup();
    const print = vi.spyOn(window, 'print').mockImplementation(() => {});
    const urls: Blob[] = [];
    URL.createObjectURL = (b: Blob) => (urls.push(b), 'blob:x');
    URL.revokeObjectURL = () => {};
    const clicked: string[] = [];
    HTMLAnchorElement.prototype.click = function (this: HTMLAnchorElement) {
      clicked.push(this.download);
    };
    showBuildSheet(sample, 'build-sheet-1');
    flushSync();
    const button = (name: string) =>
      [...document.querySelectorAll('button')].find((b) => b.textContent === name) as HTMLButtonElement;
    button('Print…').click();
    expect(print).toHaveBeenCalledOnce();
    button('Save HTML').click();
    expect(clicked).toEqual(['build-sheet-1.html']);
    expect(urls[0]!.type).toBe('text/html');
    const pdf = button('Save as PDF…');
    expect(pdf.getAttribute('aria-disabled')).toBe('true');
    expect(pdf.title).toMatch(/desktop app/);
    pdf.click();
    flushSync();
    expect(document.querySelector('[role="status"]')!.textContent).toMatch(/saved by the desktop app/);
    button('Close').click();
    flushSync();
    expect(document.querySelector('[role="dialog"]')).toBeNull();
    print.mockRestore();
  });

  it('in the desktop app saves as PDF through the bridge and says where', async () => {
    const savePdf = vi.fn<DesktopBridge['savePdf']>(() =>
      Promise.resolve({ ok: true, path: '/home/u/sheet.pdf' }),
    );
    window.yardwireDesktop = { savePdf };
    setup();
    showBuildSheet(sample, 'build-sheet-1');
    flushSync();
    const pdf = [...document.querySelectorAll('button')].find((b) => b.textContent === 'Save as PDF…')!;
    expect(pdf.getAttribute('aria-disabled')).toBe('false');
    pdf.click();
    await vi.waitFor(() =>
      expect(document.querySelector('[role="status"]')!.textContent).toBe('Saved /home/u/sheet.pdf'),
    );
    expect(savePdf).toHaveBeenCalledWith({ fileBase: 'build-sheet-1' });
    savePdf.mockResolvedValueOnce({ ok: false, error: { code: 'cancelled', message: 'cancelled' } });
    pdf.click();
    await vi.waitFor(() => expect(document.querySelector('[role="status"]')!.textContent).toBe(''));
    savePdf.mockResolvedValueOnce({ ok: false, error: { code: 'write-failed', message: 'disk full' } });
    pdf.click();
    await vi.waitFor(() =>
      expect(document.querySelector('[role="status"]')!.textContent).toBe('Not saved: disk full'),
    );
  });

  it('the renderer and the preload agree on the desktop bridge', () => {
    expectTypeOf<YardwireDesktop>().toExtend<DesktopBridge>();
  });
});
