import { fileTypeFromBuffer } from 'file-type';

/** The largest upload we keep: 15 MB (15 × 1024 × 1024 bytes). */
export const MAX_UPLOAD_BYTES = 15 * 1024 * 1024;

/** File types a horse's record accepts, by the type found in the bytes. */
export const ACCEPTED_TYPES = { 'image/jpeg': 'jpg', 'image/png': 'png', 'application/pdf': 'pdf' } as const;
export type AcceptedMime = keyof typeof ACCEPTED_TYPES;

/**
 * The type of an uploaded file, read from its first bytes (magic numbers) by the file-type package,
 * never from its name or the browser's claim: a renamed executable is refused. Null when not accepted.
 */
export async function detectAcceptedType(bytes: Uint8Array): Promise<{ mime: AcceptedMime; ext: string } | null> {
  const found = await fileTypeFromBuffer(bytes);
  if (!found || !(found.mime in ACCEPTED_TYPES)) return null;
  const mime = found.mime as AcceptedMime;
  return { mime, ext: ACCEPTED_TYPES[mime] };
}

/** Whether a type is an image we make a thumbnail of. */
export const isImage = (mime: string) => mime === 'image/jpeg' || mime === 'image/png';
