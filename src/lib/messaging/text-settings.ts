/**
 * Reads and writes a practice's text settings (practice_text_settings); a practice that never saved
 * any gets the defaults, so texts work from the first publish.
 */
import type { Knex } from 'knex';
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

interface Row {
  arrival_template: string;
  update_template: string;
  window_min_minutes: number;
  window_growth_minutes: number;
  window_max_minutes: number;
  update_threshold_minutes: number;
  quiet_start_minute: number;
  quiet_end_minute: number;
}

export async function getTextSettings(db: Knex | Knex.Transaction, practiceId: number): Promise<TextSettings> {
  const row = (await db('practice_text_settings').where({ practice_id: practiceId }).first()) as Row | undefined;
  if (!row) return { ...DEFAULT_TEXT_SETTINGS };
  return {
    arrivalTemplate: row.arrival_template,
    updateTemplate: row.update_template,
    windowMinMinutes: row.window_min_minutes,
    windowGrowthMinutes: row.window_growth_minutes,
    windowMaxMinutes: row.window_max_minutes,
    updateThresholdMinutes: row.update_threshold_minutes,
    quietStartMinute: row.quiet_start_minute,
    quietEndMinute: row.quiet_end_minute,
  };
}

/** Saves the whole settings row (insert or replace). */
export async function saveTextSettings(db: Knex | Knex.Transaction, practiceId: number, userId: number | null, s: TextSettings): Promise<void> {
  const row = {
    practice_id: practiceId,
    arrival_template: s.arrivalTemplate,
    update_template: s.updateTemplate,
    window_min_minutes: s.windowMinMinutes,
    window_growth_minutes: s.windowGrowthMinutes,
    window_max_minutes: s.windowMaxMinutes,
    update_threshold_minutes: s.updateThresholdMinutes,
    quiet_start_minute: s.quietStartMinute,
    quiet_end_minute: s.quietEndMinute,
    updated_by: userId,
    updated_at: db.fn.now(3),
  };
  await db('practice_text_settings').insert(row).onConflict('practice_id').merge();
}

export function windowSettingsOf(s: TextSettings): WindowSettings {
  return { minMinutes: s.windowMinMinutes, growthMinutes: s.windowGrowthMinutes, maxMinutes: s.windowMaxMinutes };
}

export function quietHoursOf(s: TextSettings): QuietHours {
  return { startMinute: s.quietStartMinute, endMinute: s.quietEndMinute };
}
