/**
 * Text templates the practice edits: plain text with {placeholders}. Pure, so that the template
 * editor's live preview and the server's real texts come from the same code.
 */
import { countSegments, type SegmentCount } from './segments.ts';

export const PLACEHOLDERS = ['practice', 'farrier', 'barn', 'date', 'start', 'end', 'horses', 'previous'] as const;
export type Placeholder = (typeof PLACEHOLDERS)[number];
export type TemplateValues = Record<Placeholder, string>;

export const DEFAULT_ARRIVAL_TEMPLATE =
  '{practice}: {farrier} plans to reach {barn} on {date} between {start} and {end} for {horses}. Reply STOP to opt out.';
export const DEFAULT_UPDATE_TEMPLATE =
  '{practice}: new time. {farrier} now plans to reach {barn} on {date} between {start} and {end} (was {previous}). Reply STOP to opt out.';

/** Values for a preview: an invented stop, so the editor shows a realistic length. */
export const SAMPLE_VALUES: Omit<TemplateValues, 'practice'> = {
  farrier: 'Tamsin',
  barn: 'Larkspur Hollow Farm',
  date: 'Tue 5 Jan',
  start: '9:15am',
  end: '10:15am',
  horses: 'Clover, Juno and Pip',
  previous: '8:30am-9:30am',
};

/** Fills a template; unknown {words} stay as typed so a typo is visible in the preview. */
export function renderTemplate(template: string, values: Partial<TemplateValues>): string {
  return template.replace(/\{([a-z]+)\}/g, (whole, name: string) =>
    (PLACEHOLDERS as readonly string[]).includes(name) && values[name as Placeholder] !== undefined ? values[name as Placeholder]! : whole,
  );
}

/** "Clover", "Clover and Juno", "Clover, Juno and Pip". */
export function listNames(names: string[]): string {
  if (names.length <= 1) return names[0] ?? '';
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/** Placeholders a template uses that do not exist. */
export function unknownPlaceholders(template: string): string[] {
  const found = [...template.matchAll(/\{([a-z]+)\}/g)].map((m) => m[1]!);
  return [...new Set(found.filter((n) => !(PLACEHOLDERS as readonly string[]).includes(n)))];
}

/** A template rendered with sample values and its segment count: what the editor shows. */
export function previewTemplate(template: string, practiceName: string): { body: string } & SegmentCount {
  const body = renderTemplate(template, { ...SAMPLE_VALUES, practice: practiceName });
  return { body, ...countSegments(body) };
}
