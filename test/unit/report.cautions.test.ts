import { describe, expect, it } from 'vitest';
import { cautionsFor, highVoltageEndsText } from '../../core/report/cautions.ts';

describe('cautions', () => {
  it('puts power lines first where the lot has one, and always lightning and exposure', () => {
    const c = cautionsFor({
      type: 'dipole',
      hasPowerLine: true,
      supportKinds: ['tree'],
      selfSupporting: false,
    });
    expect(c.map((x) => x.id)).toEqual([
      'power-lines',
      'high-voltage-ends',
      'climbing',
      'lightning',
      'rf-exposure',
    ]);
    const v = cautionsFor({ type: 'vertical', hasPowerLine: false, supportKinds: [], selfSupporting: true });
    expect(v.map((x) => x.id)).toEqual(['lightning', 'permits', 'rf-exposure']);
  });

  it('asks about permits for a mast or tower, not for a tree', () => {
    const mast = cautionsFor({
      type: 'dipole',
      hasPowerLine: false,
      supportKinds: ['tree', 'mast'],
      selfSupporting: false,
    });
    expect(mast.map((x) => x.id)).toContain('permits');
    const trees = cautionsFor({
      type: 'dipole',
      hasPowerLine: false,
      supportKinds: ['tree', 'tree'],
      selfSupporting: false,
    });
    expect(trees.map((x) => x.id)).not.toContain('permits');
  });

  it('speaks of each type its own high-voltage ends', () => {
    expect(highVoltageEndsText('vertical')).toBeNull();
    const l = cautionsFor({
      type: 'inverted-l',
      hasPowerLine: false,
      supportKinds: ['tree'],
      selfSupporting: false,
    });
    const hv = l.find((x) => x.id === 'high-voltage-ends')!;
    expect(hv.text).toMatch(/far end of the top part/);
    expect(hv.text).not.toMatch(/dipole|inverted-V/);
    expect(highVoltageEndsText('half-square')).toMatch(/lower ends/);
  });
});
