import { describe, expect, it } from 'vitest';
import { renderTemplate, listNames, unknownPlaceholders, previewTemplate, DEFAULT_ARRIVAL_TEMPLATE, DEFAULT_UPDATE_TEMPLATE } from '../../../src/lib/messaging/template.ts';

// Our own template rules; segment figures from 3GPP TS 23.038 as in segments.test.ts.
describe('text templates', () => {
  it('fills placeholders and leaves unknown ones visible', () => {
    expect(renderTemplate('{practice} at {start}, {nope}', { practice: 'Wrenmoor', start: '9:15am' })).toBe('Wrenmoor at 9:15am, {nope}');
    expect(unknownPlaceholders('{start} {nope} {nope}')).toEqual(['nope']);
  });

  it('lists horse names as people write them', () => {
    expect(listNames(['Clover'])).toBe('Clover');
    expect(listNames(['Clover', 'Juno'])).toBe('Clover and Juno');
    expect(listNames(['Clover', 'Juno', 'Pip'])).toBe('Clover, Juno and Pip');
  });

  it('keeps the default texts in GSM-7 with an opt-out line, at most two segments for the demo practice', () => {
    for (const t of [DEFAULT_ARRIVAL_TEMPLATE, DEFAULT_UPDATE_TEMPLATE]) {
      const p = previewTemplate(t, 'Wrenmoor Hoof & Forge (fictional demo)');
      expect(p.encoding).toBe('gsm7');
      expect(p.body).toContain('Reply STOP to opt out');
      expect(p.segments).toBeLessThanOrEqual(2);
    }
  });
});
