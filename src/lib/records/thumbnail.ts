import sharp from 'sharp';

/** Longest side of a thumbnail, in pixels. */
export const THUMB_PX = 320;

/**
 * A small JPEG for lists and the horse page, so a phone in the truck does not pull a 12 MB photo to
 * show a 100-pixel tile. EXIF orientation is applied first, so portrait photos stand upright.
 */
export async function makeThumbnail(bytes: Uint8Array): Promise<Buffer> {
  return sharp(bytes, { failOn: 'error' }).rotate().resize(THUMB_PX, THUMB_PX, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 78 }).toBuffer();
}
