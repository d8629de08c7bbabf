import { route } from '../../../lib/server/route.ts';
import { json, readJson } from '../../../lib/server/http.ts';
import { previewSchema } from '../../../schemas/templates.ts';
import { previewTemplate, unknownPlaceholders } from '../../../lib/messaging/template.ts';

/** Renders a template without saving it (the editor also previews in the browser with the same code). */
export const POST = route('dispatcher', async (ctx) => {
  const { template } = await readJson(ctx.request, previewSchema);
  return json({ ...previewTemplate(template, ctx.locals.practice!.name), unknownPlaceholders: unknownPlaceholders(template) });
});
