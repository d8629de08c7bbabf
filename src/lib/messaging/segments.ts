/**
 * SMS segment counting after 3GPP TS 23.038 (the GSM 7-bit default alphabet and its extension table)
 * and TS 23.040 (concatenation headers). Owners pay nothing, but the practice pays per segment, and a
 * single curly quote turns a whole text into UCS-2 and more than doubles the segments: the template
 * editor shows the count so that people see the cost while they type.
 */

/** The GSM 7-bit default alphabet (one septet each), in table order. */
const GSM_BASIC =
  '@£$¥èéùìòÇ\nØø\rÅåΔ_ΦΓΛΩΠΨΣΘΞ\u001bÆæßÉ !"#¤%&\'()*+,-./0123456789:;<=>?' +
  '¡ABCDEFGHIJKLMNOPQRSTUVWXYZÄÖÑÜ§¿abcdefghijklmnopqrstuvwxyzäöñüà';
/** The extension table: each costs an escape septet plus its own (two septets). */
const GSM_EXTENSION = '\f^{}\\[~]|€';

const BASIC = new Set(Array.from(GSM_BASIC).filter((c) => c !== '\u001b'));
const EXTENSION = new Set(Array.from(GSM_EXTENSION));

export type SmsEncoding = 'gsm7' | 'ucs2';

export interface SegmentCount {
  encoding: SmsEncoding;
  /** Septets (GSM-7) or UTF-16 code units (UCS-2) of the whole text. */
  units: number;
  segments: number;
  /** Units one segment holds for this text: 160/153 (GSM-7) or 70/67 (UCS-2). */
  perSegment: number;
  /** Characters that forced UCS-2, for the editor to point at (empty for GSM-7). */
  nonGsm: string[];
}

/** Septets one character costs in GSM-7, or null when it is in neither table. */
export function gsmSeptets(char: string): 1 | 2 | null {
  if (BASIC.has(char)) return 1;
  if (EXTENSION.has(char)) return 2;
  return null;
}

/**
 * Greedy packing into segments of `capacity` units where an item never straddles two segments (an
 * escape pair in GSM-7, a surrogate pair in UCS-2).
 */
function pack(costs: number[], capacity: number): number {
  let segments = 1;
  let used = 0;
  for (const cost of costs) {
    if (used + cost > capacity) {
      segments += 1;
      used = 0;
    }
    used += cost;
  }
  return segments;
}

/**
 * Counts the segments of a text: GSM-7 when every character is in the default alphabet or its
 * extension table (160 septets in one segment, 153 each when concatenated), otherwise UCS-2 (70 code
 * units, 67 when concatenated). An empty text has no segments.
 */
export function countSegments(text: string): SegmentCount {
  const chars = Array.from(text);
  const septets: number[] = [];
  const nonGsm: string[] = [];
  for (const c of chars) {
    const cost = gsmSeptets(c);
    if (cost === null) {
      if (!nonGsm.includes(c)) nonGsm.push(c);
    } else septets.push(cost);
  }
  if (nonGsm.length === 0) {
    const units = septets.reduce((a, b) => a + b, 0);
    if (units === 0) return { encoding: 'gsm7', units: 0, segments: 0, perSegment: 160, nonGsm };
    if (units <= 160) return { encoding: 'gsm7', units, segments: 1, perSegment: 160, nonGsm };
    return { encoding: 'gsm7', units, segments: pack(septets, 153), perSegment: 153, nonGsm };
  }
  // UCS-2 counts UTF-16 code units; a character outside the BMP (most emoji) takes two.
  const codeUnits = chars.map((c) => c.length);
  const units = codeUnits.reduce((a, b) => a + b, 0);
  if (units <= 70) return { encoding: 'ucs2', units, segments: 1, perSegment: 70, nonGsm };
  return { encoding: 'ucs2', units, segments: pack(codeUnits, 67), perSegment: 67, nonGsm };
}
