import { describe, expect, it } from 'vitest';
import { cautionsFor } from '../../core/report/cautions.ts';

describe('cautions', () => {
  it('puts power lines first where the lot has one, and always lightning and exposure', () => {
    const c = cautionsFor({
      hasPowerLine: true,
      highVoltageEnds: true,
      usesSupports: true,
      newStructure: false,
    });
    expect(c[0]!.id).toBe('power-lines');
    expect(c.map((x) => x.id)).toEqual([
      'power-lines',
      'high-voltage-ends',
      'climbing',
      'lightning',
      'rf-exposure',
    ]);
    const v = cautionsFor({
      hasPowerLine: false,
      highVoltageEnds: false,
      usesSupports: false,
      newStructure: true,
    });
    expect(v.map((x) => x.id)).toEqual(['lightning', 'permits', 'rf-exposure']);
  });
});
