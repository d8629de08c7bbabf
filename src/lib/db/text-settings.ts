import type { Knex } from 'knex';
import type { TextSettings } from '../messaging/text-settings.ts';

interface TextSettingsRow {
  arrival_template: string;
  update_template: string;
  window_min_minutes: number;
  window_growth_minutes: number;
  window_max_minutes: number;
  update_threshold_minutes: number;
  quiet_start_minute: number;
  quiet_end_minute: number;
}

/** The practice's saved text settings, or null when it never saved any (the caller falls back to the defaults). */
export async function findTextSettings(db: Knex | Knex.Transaction, practiceId: number): Promise<TextSettings | null> {
  const row = (await db('practice_text_settings').where({ practice_id: practiceId }).first()) as TextSettingsRow | undefined;
  if (!row) return null;
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

/** Writes the whole settings row: inserted on the first save, replaced on every later one (one row per practice). */
export async function upsertTextSettings(db: Knex | Knex.Transaction, practiceId: number, userId: number | null, s: TextSettings): Promise<void> {
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
