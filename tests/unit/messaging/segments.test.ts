import { describe, expect, it } from 'vitest';
import { countSegments, gsmSeptets } from '../../../src/lib/messaging/segments.ts';

// Outside values: 3GPP TS 23.038 (GSM 7-bit default alphabet and extension table) and TS 23.040
// (a concatenated segment carries a 6-octet header, leaving 153 septets or 67 UCS-2 units); boundary
// counts are computed from those capacities ([C]).
describe('SMS segment counting (3GPP TS 23.038 / 23.040)', () => {
  it('counts a plain GSM-7 text as one segment up to 160 septets, then 153 per segment', () => {
    expect(countSegments('A'.repeat(160))).toMatchObject({ encoding: 'gsm7', units: 160, segments: 1 });
    // 161 > 160 → concatenated: ceil(161 / 153) = 2
    expect(countSegments('A'.repeat(161))).toMatchObject({ encoding: 'gsm7', segments: 2, perSegment: 153 });
    // 306 = 2 × 153 → 2; 307 → 3
    expect(countSegments('A'.repeat(306)).segments).toBe(2);
    expect(countSegments('A'.repeat(307)).segments).toBe(3);
  });

  it('counts extension-table characters (€ [ ] { } ~ | ^ \\ and form feed) as two septets each', () => {
    for (const c of ['€', '[', ']', '{', '}', '~', '|', '^', '\\', '\f']) expect(gsmSeptets(c), c).toBe(2);
    // 80 × € = 160 septets → 1 segment; 81 × € = 162 → 2
    expect(countSegments('€'.repeat(80))).toMatchObject({ encoding: 'gsm7', units: 160, segments: 1 });
    expect(countSegments('€'.repeat(81))).toMatchObject({ encoding: 'gsm7', units: 162, segments: 2 });
    // 159 × a + € = 161 septets → 2
    expect(countSegments(`${'a'.repeat(159)}€`)).toMatchObject({ units: 161, segments: 2 });
  });

  it('never splits an escape pair across segments', () => {
    // 152 × a then €: the pair cannot fit in the first segment's last septet (152 + 2 > 153), so it
    // moves to segment 2; then 153 more a's fill segment 2 to 155 > 153 → segment 3. 152+2+153 = 307
    // septets, which plain counting would also call 3; the split rule matters at 152 + € + 151 a:
    // naive ceil(305/153) = 2, packed = 153-capacity segments [152][€ + 151 = 153] → 2 as well, and
    // 152 + € + 152 a = 306 septets: naive 2, packed [152][€+151][a] = 3.
    expect(countSegments(`${'a'.repeat(152)}€${'a'.repeat(151)}`).segments).toBe(2);
    expect(countSegments(`${'a'.repeat(152)}€${'a'.repeat(152)}`).segments).toBe(3);
  });

  it('keeps é è à ä ñ ü in the basic table (GSM-7), but â, á, curly quotes, en dash and emoji switch the whole text to UCS-2', () => {
    expect(countSegments('éèàäñü').encoding).toBe('gsm7');
    for (const c of ['â', 'á', '’', '–', '🐴']) expect(countSegments(`Farrier at 9${c}`).encoding, c).toBe('ucs2');
  });

  it('counts UCS-2 texts as 70 units in one segment, then 67 per segment', () => {
    // [C] from the UCS-2 capacities above: 70 × â → 1; 71 → 2; 134 = 2 × 67 → 2; 135 → 3
    expect(countSegments('â'.repeat(70))).toMatchObject({ encoding: 'ucs2', units: 70, segments: 1 });
    expect(countSegments('â'.repeat(71))).toMatchObject({ segments: 2, perSegment: 67 });
    expect(countSegments('â'.repeat(134)).segments).toBe(2);
    expect(countSegments('â'.repeat(135)).segments).toBe(3);
  });

  it('counts an emoji as two UTF-16 units and never splits the surrogate pair', () => {
    // 35 horses = 70 units → 1 segment; 36 = 72 units → 2
    expect(countSegments('🐴'.repeat(35))).toMatchObject({ units: 70, segments: 1 });
    expect(countSegments('🐴'.repeat(36))).toMatchObject({ units: 72, segments: 2 });
    // 66 × â + 🐴 + 66 × â = 134 units: naive ceil(134/67) = 2, but the pair cannot take units 67–68,
    // so segments are [66 â][🐴 + 65 â = 67][1 â] → 3
    expect(countSegments(`${'â'.repeat(66)}🐴${'â'.repeat(66)}`).segments).toBe(3);
  });

  it('has no segments for an empty text', () => {
    expect(countSegments('').segments).toBe(0);
  });
});
