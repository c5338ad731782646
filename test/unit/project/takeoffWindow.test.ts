/** A target's own take-off window (core/project/schema.ts): taken when sound, refused naming the field otherwise. */
import { describe, expect, it } from 'vitest';
import { parseProject } from '../../../core/project/schema.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';

function withWindow(win: unknown, index = 0): ReturnType<typeof parseProject> {
  const doc = JSON.parse(JSON.stringify(buildDemoProject())) as { targets: Record<string, unknown>[] };
  doc.targets[index].takeoffWindowDeg = win;
  return parseProject(doc);
}

describe('takeoffWindowDeg', () => {
  it('is optional and kept when sound, on a built-in region and on an own area', () => {
    const ok = withWindow([5, 20]);
    expect(ok.ok && ok.value.targets[0].takeoffWindowDeg).toEqual([5, 20]);
    const doc = buildDemoProject();
    doc.targets.push({ id: 'vk', name: 'Far away', weight: 1, area: { center: [150, -33], radiusKm: 500 } });
    const plain = parseProject(doc);
    expect(plain.ok && 'takeoffWindowDeg' in plain.value.targets[3]).toBe(false);
    doc.targets[3] = { ...doc.targets[3], takeoffWindowDeg: [3, 3] };
    const own = parseProject(doc);
    expect(own.ok && own.value.targets[3].takeoffWindowDeg).toEqual([3, 3]);
  });

  it.each([
    [[20, 5], 'targets[1].takeoffWindowDeg', /lowest angle must not be above the highest/],
    [[0, 10], 'targets[1].takeoffWindowDeg[0]', /lowest angle must be a number between 1 and 89/],
    [[10, 95], 'targets[1].takeoffWindowDeg[1]', /highest angle must be a number between 1 and 89/],
    [['a', 10], 'targets[1].takeoffWindowDeg[0]', /lowest angle/],
    [[5, null], 'targets[1].takeoffWindowDeg[1]', /highest angle/],
    [[5, Number.NaN], 'targets[1].takeoffWindowDeg[1]', /highest angle/],
    [[5], 'targets[1].takeoffWindowDeg', /two angles/],
    [[5, 10, 15], 'targets[1].takeoffWindowDeg', /two angles/],
    ['5-20', 'targets[1].takeoffWindowDeg', /two angles/],
    [{ lo: 5, hi: 20 }, 'targets[1].takeoffWindowDeg', /two angles/],
  ])('refuses %j, naming %s', (win, path, message) => {
    const r = withWindow(win, 1);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.map((e) => e.path)).toContain(path);
    expect(r.errors.find((e) => e.path === path)!.message).toMatch(message);
  });

  it('refuses a huge list quickly, without reading it all', () => {
    const t = performance.now();
    const r = withWindow(new Array(1_000_000).fill(5), 1);
    expect(r.ok).toBe(false);
    expect(performance.now() - t).toBeLessThan(2000);
  });
});
