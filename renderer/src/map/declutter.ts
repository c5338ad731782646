/**
 * Keeping the lot map's labels readable, measured on screen after every redraw, zoom and resize:
 *
 * 1. Support labels: one that would overlap a marker, a label already placed or the selected
 *    candidate's wires shows the height alone; if it still covers the antenna it moves to the left
 *    of its marker; if even that covers it, it is hidden while the candidate is shown (the name
 *    stays in the marker's title and the list). The selected support's label is placed first.
 * 2. Bearing labels (the target lines of the selected candidate) slide along their line to the
 *    first place clear of the lot's side lengths, the support labels, the station's label, the
 *    antenna and one another.
 */

/** Screen rectangles, as getBoundingClientRect gives them. */
type Box = Pick<DOMRect, 'left' | 'right' | 'top' | 'bottom'>;

const overlaps = (a: Box, b: Box): boolean =>
  a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;

/** Half the drawn width of a wire, pixels, added around each sample point. */
const WIRE_HALF_WIDTH_PX = 3;
/** Spacing of the points sampled along a wire, pixels. */
const WIRE_SAMPLE_PX = 3;
/** Gap between a support's marker and its label moved to the left, pixels. */
const LEFT_GAP_PX = 14;
/** Steps a bearing label may slide along its line, pixels from where it was put (nearer first). */
const BEARING_SLIDES_PX = [0, -36, 36, -72, 72, -108, 108, -144, 144, -180, 180];

/** Points along the selected candidate's drawn wires and masts, in screen pixels. */
export function antennaPoints(container: HTMLElement): [number, number][] {
  const out: [number, number][] = [];
  const wires = container.querySelectorAll<SVGGeometryElement>('.yw-cand-selected.yw-cand-wire');
  for (const w of wires) {
    const m = w.getScreenCTM?.();
    if (!m || typeof w.getTotalLength !== 'function') {
      const r = w.getBoundingClientRect();
      out.push([(r.left + r.right) / 2, (r.top + r.bottom) / 2]);
      continue;
    }
    const len = w.getTotalLength();
    const n = Math.max(1, Math.ceil(len / WIRE_SAMPLE_PX));
    for (let i = 0; i <= n; i++) {
      const p = w.getPointAtLength((len * i) / n);
      out.push([m.a * p.x + m.c * p.y + m.e, m.b * p.x + m.d * p.y + m.f]);
    }
  }
  return out;
}

/** True when the box covers any of the points (each widened by the wire's half width). */
export function coversAntenna(box: Box, points: readonly [number, number][]): boolean {
  const h = WIRE_HALF_WIDTH_PX;
  return points.some(
    ([x, y]) => x + h > box.left && x - h < box.right && y + h > box.top && y - h < box.bottom,
  );
}

const visible = (el: HTMLElement): boolean => el.style.opacity !== '0' && !el.classList.contains('is-hidden');

export function declutterLabels(container: HTMLElement): void {
  const antenna = antennaPoints(container);
  // Tooltips of a replaced layer fade out for a moment (opacity 0): they no longer count.
  const tips = [...container.querySelectorAll<HTMLElement>('.yw-support-tip')].filter(
    (t) => t.style.opacity !== '0',
  );
  tips.sort(
    (a, b) => Number(b.classList.contains('is-selected')) - Number(a.classList.contains('is-selected')),
  );
  for (const t of tips) {
    t.classList.remove('is-compact', 'is-hidden', 'is-left');
    t.style.marginLeft = '';
  }
  const markers = [...container.querySelectorAll<HTMLElement>('.yw-support, .yw-station')].map((m) => ({
    rect: m.getBoundingClientRect(),
    tip: m.getAttribute('aria-describedby'),
  }));
  const placed: Box[] = [];
  for (const t of tips) {
    const others = markers.filter((m) => m.tip !== t.id).map((m) => m.rect);
    const crowded = (b: Box): boolean => [...placed, ...others].some((r) => overlaps(b, r));
    const selected = t.classList.contains('is-selected');
    let box = t.getBoundingClientRect();
    if (!selected && (crowded(box) || coversAntenna(box, antenna))) {
      t.classList.add('is-compact');
      box = t.getBoundingClientRect();
    }
    if (coversAntenna(box, antenna)) {
      // To the left of the marker: the label's own width plus the marker and a gap.
      const own = markers.find((m) => m.tip === t.id)?.rect;
      const shift = box.right - box.left + (own ? own.right - own.left : 20) + LEFT_GAP_PX;
      t.style.marginLeft = `${-shift}px`;
      t.classList.add('is-left');
      box = t.getBoundingClientRect();
      if (coversAntenna(box, antenna)) {
        t.style.marginLeft = '';
        t.classList.remove('is-left');
        t.classList.add('is-hidden');
        continue;
      }
    }
    placed.push(box);
  }

  // Bearing labels along their lines.
  const fixed: Box[] = [
    ...[...container.querySelectorAll<HTMLElement>('.yw-side-label span')].map((s) =>
      s.getBoundingClientRect(),
    ),
    ...tips.filter(visible).map((t) => t.getBoundingClientRect()),
    ...[...container.querySelectorAll<HTMLElement>('.leaflet-tooltip.yw-tip')]
      .filter(
        (t) =>
          visible(t) &&
          !t.classList.contains('yw-support-tip') &&
          !t.classList.contains('yw-bearing-label') &&
          t.classList.contains('leaflet-tooltip-bottom'),
      )
      .map((t) => t.getBoundingClientRect()),
    ...markers.map((m) => m.rect),
  ];
  const bearings = [...container.querySelectorAll<HTMLElement>('.yw-bearing-label')].filter(
    (t) => t.style.opacity !== '0',
  );
  for (const b of bearings) {
    b.style.marginLeft = '';
    b.style.marginTop = '';
    const deg = Number(b.dataset.bearing);
    if (!Number.isFinite(deg)) continue;
    const dx = Math.sin((deg * Math.PI) / 180);
    const dy = -Math.cos((deg * Math.PI) / 180);
    const home = b.getBoundingClientRect();
    const clear = (box: Box): boolean => !fixed.some((r) => overlaps(box, r)) && !coversAntenna(box, antenna);
    for (const s of BEARING_SLIDES_PX) {
      const box = {
        left: home.left + s * dx,
        right: home.right + s * dx,
        top: home.top + s * dy,
        bottom: home.bottom + s * dy,
      };
      if (clear(box)) {
        b.style.marginLeft = `${(s * dx).toFixed(1)}px`;
        b.style.marginTop = `${(s * dy).toFixed(1)}px`;
        break;
      }
    }
    fixed.push(b.getBoundingClientRect());
  }
}
