import { parsePhoneNumberFromString, type CountryCode } from 'libphonenumber-js/min';

/**
 * Turns a phone number as people type it ("(859) 555-0142", "859.555.0142", "+44 20 …") into E.164,
 * or null when it cannot be a real number. Texts go out to E.164 numbers only, so every owner phone is
 * stored in that form; numbers without a country code are read as `defaultCountry` (US for the demo).
 * Uses libphonenumber-js's metadata rather than our own rules, so area codes and lengths are checked.
 */
export function toE164(input: string, defaultCountry: CountryCode = 'US'): string | null {
  const text = input.trim();
  if (!text || text.length > 40) return null;
  const parsed = parsePhoneNumberFromString(text, defaultCountry);
  if (!parsed || !parsed.isValid()) return null;
  return parsed.number;
}
