// The imagery presets a user may opt into: each one is a tile address the project schema accepts
// (so choosing it is stored like the user's own), with its host, credit and terms to show first.
import { describe, expect, it } from 'vitest';
import { SettingsSchema } from '../../../core/project/schema.ts';
import { IMAGERY_PRESETS, presetOfTemplate, templateHost } from './imageryPresets.ts';

describe('imagery presets', () => {
  it('are https tile addresses the settings accept, each with its credit and terms', () => {
    expect(IMAGERY_PRESETS.length).toBeGreaterThanOrEqual(2);
    for (const p of IMAGERY_PRESETS) {
      const parsed = SettingsSchema.safeParse({
        tileUrlTemplate: p.urlTemplate,
        tileAttribution: p.attribution,
      });
      expect(parsed.success, p.id).toBe(true);
      expect(p.urlTemplate).toMatch(/^https:\/\//);
      for (const k of ['{z}', '{x}', '{y}']) expect(p.urlTemplate).toContain(k);
      expect(p.termsUrl).toMatch(/^https:\/\//);
      expect(p.attribution.trim()).not.toBe('');
      expect(p.terms.length).toBeGreaterThan(0);
      expect(templateHost(p.urlTemplate)).not.toBe('');
      expect(presetOfTemplate(p.urlTemplate)).toBe(p);
    }
    expect(new Set(IMAGERY_PRESETS.map((p) => p.id)).size).toBe(IMAGERY_PRESETS.length);
  });

  it("knows a user's own address is none of them, and names its host", () => {
    expect(presetOfTemplate('https://tiles.example.invalid/{z}/{x}/{y}.png')).toBeUndefined();
    expect(templateHost('https://tiles.example.invalid/{z}/{x}/{y}.png')).toBe('tiles.example.invalid');
    expect(templateHost('')).toBe('');
  });
});
