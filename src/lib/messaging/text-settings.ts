/**
 * A practice's text settings (templates, window widths, update threshold, quiet hours); a practice that
 * never saved any gets the defaults, so texts work from the first publish.
 */
import type { Knex } from 'knex';
import { findTextSettings, upsertTextSettings } from '../db/text-settings.ts';
import { DEFAULT_WINDOW, type WindowSettings } from './arrival-window.ts';
import { DEFAULT_QUIET_HOURS, type QuietHours } from './quiet-hours.ts';
import { DEFAULT_ARRIVAL_TEMPLATE, DEFAULT_UPDATE_TEMPLATE } from './template.ts';

export interface TextSettings {
  arrivalTemplate: string;
  updateTemplate: string;
  windowMinMinutes: number;
  windowGrowthMinutes: number;
  windowMaxMinutes: number;
  updateThresholdMinutes: number;
  quietStartMinute: number;
  quietEndMinute: number;
}

export const DEFAULT_TEXT_SETTINGS: TextSettings = {
  arrivalTemplate: DEFAULT_ARRIVAL_TEMPLATE,
  updateTemplate: DEFAULT_UPDATE_TEMPLATE,
  windowMinMinutes: DEFAULT_WINDOW.minMinutes,
  windowGrowthMinutes: DEFAULT_WINDOW.growthMinutes,
  windowMaxMinutes: DEFAULT_WINDOW.maxMinutes,
  updateThresholdMinutes: 30,
  quietStartMinute: DEFAULT_QUIET_HOURS.startMinute,
  quietEndMinute: DEFAULT_QUIET_HOURS.endMinute,
};

/** The practice's settings, or the defaults when it never saved any. */
export async function getTextSettings(db: Knex | Knex.Transaction, practiceId: number): Promise<TextSettings> {
  return (await findTextSettings(db, practiceId)) ?? { ...DEFAULT_TEXT_SETTINGS };
}

/** Saves the whole settings row (insert or replace). */
export async function saveTextSettings(db: Knex | Knex.Transaction, practiceId: number, userId: number | null, s: TextSettings): Promise<void> {
  await upsertTextSettings(db, practiceId, userId, s);
}

export function windowSettingsOf(s: TextSettings): WindowSettings {
  return { minMinutes: s.windowMinMinutes, growthMinutes: s.windowGrowthMinutes, maxMinutes: s.windowMaxMinutes };
}

export function quietHoursOf(s: TextSettings): QuietHours {
  return { startMinute: s.quietStartMinute, endMinute: s.quietEndMinute };
}
