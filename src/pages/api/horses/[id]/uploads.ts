import { randomUUID } from 'node:crypto';
import { route } from '../../../../lib/server/route.ts';
import { badRequest, HttpError, idParam, json, notFound } from '../../../../lib/server/http.ts';
import { db } from '../../../../lib/server/db.ts';
import { audit } from '../../../../lib/db/audit.ts';
import { existsInPractice } from '../../../../lib/db/records-lock.ts';
import { getUpload, insertUpload, listUploads } from '../../../../lib/db/uploads.ts';
import { detectAcceptedType, isImage, MAX_UPLOAD_BYTES } from '../../../../lib/records/file-check.ts';
import { makeThumbnail } from '../../../../lib/records/thumbnail.ts';
import { removeStoredFile, storeFile } from '../../../../lib/records/storage.ts';
import { uploadKind } from '../../../../schemas/horses.ts';

async function horseOf(practiceId: number, raw: string | undefined): Promise<number> {
  const id = idParam(raw, 'Horse');
  if (!(await existsInPractice(db(), 'horses', practiceId, id))) throw notFound('Horse');
  return id;
}

/** The horse's photos, radiographs and documents (records only; files come from /api/uploads/:id). */
export const GET = route('signed-in', async (ctx, user) => {
  const horseId = await horseOf(user.practiceId, ctx.params.id);
  return json({ uploads: (await listUploads(db(), user.practiceId, horseId)).map(({ storageKey: _s, thumbKey, ...u }) => ({ ...u, hasThumb: thumbKey !== null })) });
});

/**
 * Stores one file sent as multipart form data (`file`, `kind`). JPEG, PNG or PDF only, told from the
 * bytes; at most 15 MB (413 above, 415 for other types). Images get a thumbnail.
 */
export const POST = route('dispatcher', async (ctx, user) => {
  const horseId = await horseOf(user.practiceId, ctx.params.id);
  const declared = Number(ctx.request.headers.get('content-length') ?? 0);
  // Multipart framing adds a little; anything far over the limit is refused before it is read.
  if (declared > MAX_UPLOAD_BYTES + 64 * 1024) throw new HttpError(413, 'payload_too_large', 'Files can be at most 15 MB');
  const type = ctx.request.headers.get('content-type') ?? '';
  if (!type.startsWith('multipart/form-data')) throw badRequest('Send the file as multipart/form-data with a "file" field', { file: 'Choose a file' });
  let form: FormData;
  try {
    form = await ctx.request.formData();
  } catch {
    throw badRequest('The form data could not be read', { file: 'Choose a file' });
  }
  const file = form.get('file');
  if (!(file instanceof File) || file.size === 0) throw badRequest('Invalid body: check file', { file: 'Choose a file' });
  const kind = uploadKind.safeParse(form.get('kind') ?? 'photo');
  if (!kind.success) throw badRequest('Invalid body: check kind', { kind: 'Choose photo, radiograph or document' });
  if (file.size > MAX_UPLOAD_BYTES) throw new HttpError(413, 'payload_too_large', 'Files can be at most 15 MB');
  const bytes = new Uint8Array(await file.arrayBuffer());
  const detected = await detectAcceptedType(bytes);
  if (!detected) throw new HttpError(415, 'unsupported_media_type', 'Only JPEG, PNG or PDF files are accepted (checked from the file itself, not its name)');

  const base = randomUUID();
  const storageKey = `${base}.${detected.ext}`;
  let thumbKey: string | null = null;
  await storeFile(user.practiceId, storageKey, bytes);
  try {
    if (isImage(detected.mime)) {
      let thumb: Buffer;
      try {
        thumb = await makeThumbnail(bytes);
      } catch {
        throw new HttpError(415, 'unsupported_media_type', 'The image could not be read: it may be damaged');
      }
      thumbKey = `${base}-thumb.jpg`;
      await storeFile(user.practiceId, thumbKey, thumb);
    }
    const fileName = (file.name || `upload.${detected.ext}`).replace(/[\\/\r\n"]/g, '_').slice(0, 200);
    const id = await db().transaction(async (trx) => {
      const newId = await insertUpload(trx, { practiceId: user.practiceId, horseId, kind: kind.data, fileName, mimeType: detected.mime, sizeBytes: bytes.length, storageKey, thumbKey, uploadedBy: user.id });
      await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'upload.create', entity: 'upload', entityId: newId, detail: { horseId, kind: kind.data, fileName, mime: detected.mime, sizeBytes: bytes.length } });
      return newId;
    });
    const upload = (await getUpload(db(), user.practiceId, id))!;
    const { storageKey: _s, thumbKey: t, ...rest } = upload;
    return json({ upload: { ...rest, hasThumb: t !== null } }, 201);
  } catch (error) {
    await removeStoredFile(user.practiceId, storageKey);
    if (thumbKey) await removeStoredFile(user.practiceId, thumbKey);
    throw error;
  }
});
