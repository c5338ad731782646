/**
 * A standalone report document (core/report/html.ts) shown inside a shadow root: its styles stay
 * in there and the app's stay out. The document is parsed with DOMParser (which runs nothing),
 * anything active is removed defensively (scripts, frames, plug-ins, links, event-handler
 * attributes, script URLs: our own report has none of them), and its stylesheet is rescoped:
 * `:root` and `html` become `:host`, `body` becomes the `.report-body` wrapper, `@page`,
 * `@font-face` and `@import` are dropped (a shadow tree applies none of them; the app's print
 * CSS holds the page margin).
 *
 * The CSS rewrite is a brace-matching pass meant for our own generated stylesheet: comments are
 * removed first; braces inside strings are not supported (the report has none).
 */

/** The class of the element that stands in for the report's <body>. */
export const REPORT_BODY_CLASS = 'report-body';

/** Elements that never enter the view. */
const DROPPED =
  'script, iframe, frame, frameset, object, embed, link, meta, base, noscript, template, portal, form';
/** At-rules whose blocks hold rules (rewritten inside); others keep their block as it is. */
const GROUPING = /^@(media|supports|layer|container|scope)\b/i;
/** At-rules a shadow tree does not apply, or that would load something. */
const DROPPED_AT = /^@(page|font-face|import|charset|namespace)\b/i;
const SCRIPT_URL = /^\s*(javascript|vbscript):/i;

/** Split at top-level commas (not inside parentheses or brackets). */
function splitSelectors(list: string): string[] {
  const out: string[] = [];
  let depth = 0;
  let start = 0;
  for (let i = 0; i < list.length; i++) {
    const ch = list[i];
    if (ch === '(' || ch === '[') depth++;
    else if (ch === ')' || ch === ']') depth--;
    else if (ch === ',' && depth === 0) {
      out.push(list.slice(start, i));
      start = i + 1;
    }
  }
  out.push(list.slice(start));
  return out.map((s) => s.trim()).filter((s) => s.length > 0);
}

/** One selector list with the document's root and body moved onto the shadow host and wrapper. */
export function scopeSelector(list: string): string {
  return splitSelectors(list)
    .map((s) =>
      s
        .replace(/:root(?![\w-])/g, ':host')
        .replace(/(^|[\s>+~(])html(?![\w-])/g, '$1:host')
        .replace(/(^|[\s>+~(])body(?![\w-])/g, `$1.${REPORT_BODY_CLASS}`),
    )
    .join(', ');
}

/** Index just past the `}` that closes the block whose `{` is at `open`. */
function blockEnd(css: string, open: number): number {
  let depth = 0;
  for (let i = open; i < css.length; i++) {
    if (css[i] === '{') depth++;
    else if (css[i] === '}' && --depth === 0) return i + 1;
  }
  return css.length;
}

/** Rewrite the rules from `start` up to the `}` that ends the enclosing block (or the end). */
function scopeRules(css: string, start: number, out: string[]): number {
  let i = start;
  while (i < css.length) {
    const open = css.indexOf('{', i);
    const close = css.indexOf('}', i);
    if (close !== -1 && (open === -1 || close < open)) return close + 1;
    if (open === -1) return css.length; // only statements (`@import …;`) or blanks are left: dropped
    // Statements before the block (`@import …;`, `@charset …;`) are dropped.
    const prelude = css.slice(i, open).split(';').pop()!.trim();
    if (GROUPING.test(prelude)) {
      out.push(`${prelude} {`);
      i = scopeRules(css, open + 1, out);
      out.push('}');
      continue;
    }
    const end = blockEnd(css, open);
    if (DROPPED_AT.test(prelude)) {
      i = end;
      continue;
    }
    const block = css.slice(open, end);
    out.push(prelude.startsWith('@') ? `${prelude} ${block}` : `${scopeSelector(prelude)} ${block}`);
    i = end;
  }
  return i;
}

/** The report's stylesheet rescoped for a shadow root (see the module comment). */
export function scopeReportCss(css: string): string {
  const out: string[] = [];
  scopeRules(css.replace(/\/\*[\s\S]*?\*\//g, ''), 0, out);
  return out.join('\n');
}

/** Reset at the host, so nothing the app sets (font, colour, line height) inherits into the report. */
const HOST_CSS = `:host { all: initial; display: block; }
.${REPORT_BODY_CLASS} { display: block; }`;

export interface RenderedReport {
  title: string;
  /** How many elements or attributes were removed as active content (0 for our own reports; metadata not counted). */
  removed: number;
}

/**
 * Put the report into `host`'s shadow root (attached open on first use; its content replaced on
 * every call). Returns the document's title.
 */
export function renderReport(host: HTMLElement, html: string): RenderedReport {
  const doc = new DOMParser().parseFromString(html, 'text/html');
  const css = [...doc.querySelectorAll('style')].map((s) => s.textContent ?? '').join('\n');
  let removed = 0;
  for (const el of doc.querySelectorAll(`${DROPPED}, style`)) {
    if (el.localName !== 'style' && el.localName !== 'meta') removed++;
    el.remove();
  }
  for (const el of doc.body.querySelectorAll('*')) {
    for (const a of [...el.attributes]) {
      const name = a.name.toLowerCase();
      const isUrl = /(^|:)(href|src|action|formaction|xlink:href)$/.test(name);
      if (name.startsWith('on') || (isUrl && SCRIPT_URL.test(a.value))) {
        el.removeAttribute(a.name);
        removed++;
      }
    }
  }
  const root = host.shadowRoot ?? host.attachShadow({ mode: 'open' });
  const base = document.createElement('style');
  base.textContent = HOST_CSS;
  const scoped = document.createElement('style');
  scoped.textContent = scopeReportCss(css);
  const body = document.createElement('div');
  body.className = REPORT_BODY_CLASS;
  body.append(...[...doc.body.childNodes].map((n) => document.importNode(n, true)));
  root.replaceChildren(base, scoped, body);
  return { title: doc.title.trim(), removed };
}
