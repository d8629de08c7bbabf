import { describe, expect, it } from 'vitest';
import { keywordOf } from '../../../src/lib/messaging/keywords.ts';
import { confirmationText } from '../../../src/lib/messaging/replies.ts';
import { countSegments } from '../../../src/lib/messaging/segments.ts';

// Outside values: CTIA Messaging Principles and Best Practices (2023) opt-out words STOP, STOPALL,
// UNSUBSCRIBE, CANCEL, END, QUIT and HELP; FCC 47 CFR 64.1200(a)(10) adds revoke and opt out;
// START/UNSTOP to opt back in is common practice (from memory, [M]).
describe('reply keywords', () => {
  it('reads every CTIA and FCC opt-out word as stop, in any case and with trailing punctuation', () => {
    for (const w of ['STOP', 'STOPALL', 'UNSUBSCRIBE', 'CANCEL', 'END', 'QUIT', 'REVOKE', 'OPT OUT', 'stop', ' Stop! ', 'quit.']) expect(keywordOf(w), w).toBe('stop');
  });

  it('reads START and UNSTOP as opting back in, HELP as help', () => {
    expect(keywordOf('START')).toBe('start');
    expect(keywordOf('unstop')).toBe('start');
    expect(keywordOf('Help')).toBe('help');
  });

  it('keeps ordinary replies as replies, even when they contain a keyword', () => {
    for (const w of ['Thanks, see you then', "please don't stop coming", 'STOP BY AT 10', 'ending soon?', '']) expect(keywordOf(w), w).toBeNull();
  });

  it('answers HELP with the practice name, a contact and how to opt out, in plain GSM-7', () => {
    const text = confirmationText('help', { name: 'Wrenmoor Hoof & Forge', contactPhone: '+18595550142', contactEmail: 'office@wrenmoor-hoof.test' });
    expect(text).toContain('Wrenmoor Hoof & Forge');
    expect(text).toContain('+18595550142');
    expect(text).toContain('STOP');
    expect(countSegments(text).encoding).toBe('gsm7');
  });
});
