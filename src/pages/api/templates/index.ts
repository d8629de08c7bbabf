import { route } from '../../../lib/server/route.ts';
import { json, readJson, badRequest } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { textSettingsSchema } from '../../../schemas/templates.ts';
import { getTextSettings, saveTextSettings, type TextSettings } from '../../../lib/messaging/text-settings.ts';
import { previewTemplate, unknownPlaceholders } from '../../../lib/messaging/template.ts';

function withPreview(settings: TextSettings, practiceName: string) {
  return {
    settings,
    preview: {
      arrival: previewTemplate(settings.arrivalTemplate, practiceName),
      update: previewTemplate(settings.updateTemplate, practiceName),
    },
  };
}

/** The practice's text templates and window settings, with a rendered preview and segment counts. */
export const GET = route('dispatcher', async (ctx, user) => {
  const settings = await getTextSettings(db(), user.practiceId);
  return json(withPreview(settings, ctx.locals.practice!.name));
});

/** Saves them (lead only: they are practice settings). */
export const PUT = route('lead', async (ctx, user) => {
  const input = await readJson(ctx.request, textSettingsSchema);
  const fields: Record<string, string> = {};
  for (const key of ['arrivalTemplate', 'updateTemplate'] as const) {
    const unknown = unknownPlaceholders(input[key]);
    if (unknown.length) fields[key] = `Unknown placeholder ${unknown.map((u) => `{${u}}`).join(', ')}`;
  }
  if (Object.keys(fields).length) throw badRequest('Invalid body: check the placeholders', fields);
  await db().transaction(async (trx) => {
    await saveTextSettings(trx, user.practiceId, user.id, input);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'texts.settings', entity: 'practice', entityId: user.practiceId, detail: input });
  });
  return json(withPreview(await getTextSettings(db(), user.practiceId), ctx.locals.practice!.name));
});
