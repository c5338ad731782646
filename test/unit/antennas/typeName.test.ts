import { describe, expect, it } from 'vitest';
import { typeName } from '../../../core/antennas/typeName.ts';
import { BUILDERS } from '../../../core/antennas/registry.ts';

describe('typeName', () => {
  it('names every type the planner builds in proper case, never as its id', () => {
    for (const b of BUILDERS) {
      const n = typeName(b.type);
      expect(n).not.toBe(b.type);
      expect(n[0]).toBe(n[0]!.toUpperCase());
    }
    expect(typeName('inverted-l')).toBe('Inverted-L');
    expect(typeName('inverted-v')).toBe('Inverted-V');
  });
  it('reads an unknown id as capitalised words', () => {
    expect(typeName('loop_on_ground')).toBe('Loop on ground');
  });
});
