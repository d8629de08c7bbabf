import { route } from '../../../lib/server/route.ts';
import { idParam, json, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { deleteUpload, getUpload } from '../../../lib/db/uploads.ts';
import { readStoredFile, removeStoredFile } from '../../../lib/records/storage.ts';

/**
 * Serves an upload's bytes (or its thumbnail with ?size=thumb) to signed-in users of the same practice
 * only; another practice's id is a 404. Sent with the type found at upload and nosniff.
 */
export const GET = route('signed-in', async (ctx, user) => {
  const upload = await getUpload(db(), user.practiceId, idParam(ctx.params.id, 'Upload'));
  if (!upload) throw notFound('Upload');
  const thumb = ctx.url.searchParams.get('size') === 'thumb' && upload.thumbKey !== null;
  let bytes: Buffer;
  try {
    bytes = await readStoredFile(user.practiceId, thumb ? upload.thumbKey! : upload.storageKey);
  } catch {
    throw notFound('Upload file');
  }
  return new Response(new Uint8Array(bytes), {
    status: 200,
    headers: {
      'content-type': thumb ? 'image/jpeg' : upload.mimeType,
      'content-length': String(bytes.length),
      'content-disposition': `inline; filename="${upload.fileName.replace(/[^\x20-\x7e]|["\\]/g, '_')}"`,
      'x-content-type-options': 'nosniff',
      'cache-control': 'private, max-age=3600',
    },
  });
});

/** Removes an upload and its files. */
export const DELETE = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Upload');
  const upload = await db().transaction(async (trx) => {
    const found = await getUpload(trx, user.practiceId, id);
    if (!found) throw notFound('Upload');
    await deleteUpload(trx, user.practiceId, id);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'upload.delete', entity: 'upload', entityId: id, detail: { horseId: found.horseId, fileName: found.fileName } });
    return found;
  });
  await removeStoredFile(user.practiceId, upload.storageKey);
  if (upload.thumbKey) await removeStoredFile(user.practiceId, upload.thumbKey);
  return json({ deleted: true });
});
