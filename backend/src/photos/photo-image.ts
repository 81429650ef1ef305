import sharp from 'sharp';
import type { PhotoContentType } from '../../../shared/src';
import { photoTooLarge, unsupportedPhoto } from './photo-errors';

/** Thumbnails fit in a square of this side, which is what the inspection pages show. */
export const THUMBNAIL_LONGEST_SIDE_PX = 320;
/** Decoding more than this would take hundreds of megabytes of memory; camera photos stay well under it. */
export const MAX_PHOTO_PIXELS = 100_000_000;

const SHARP_FORMAT_OF: Readonly<Record<PhotoContentType, string>> = { 'image/jpeg': 'jpeg', 'image/png': 'png', 'image/webp': 'webp' };
const TYPE_NAME: Readonly<Record<PhotoContentType, string>> = { 'image/jpeg': 'JPEG', 'image/png': 'PNG', 'image/webp': 'WebP' };

export interface PreparedPhoto {
  /** Size as the photo is seen, with its EXIF orientation applied (as browsers show it). */
  readonly widthPx: number;
  readonly heightPx: number;
  /** JPEG, upright, longest side at most 320 px, no metadata (no camera details, no location). */
  readonly thumbnail: Buffer;
}

const unreadable = (contentType: PhotoContentType) =>
  unsupportedPhoto(`the file starts like a ${TYPE_NAME[contentType]} image but cannot be read as one; it may be damaged or cut short`);

/**
 * Reads a photo whose type its first bytes announced: its upright size, and its thumbnail. Making
 * the thumbnail decodes the whole image, so a damaged file is refused here (415), not shown later.
 */
export async function preparePhoto(bytes: Buffer, contentType: PhotoContentType): Promise<PreparedPhoto> {
  // Only the header is read here; the pixel limit is checked below, to say how big the image is.
  const metadata = await sharp(bytes, { limitInputPixels: false })
    .metadata()
    .catch(() => null);
  if (!metadata || metadata.format !== SHARP_FORMAT_OF[contentType]) throw unreadable(contentType);
  const pixels = metadata.width * metadata.height;
  if (pixels > MAX_PHOTO_PIXELS) {
    throw photoTooLarge(`the photo has ${Math.round(pixels / 1e6)} megapixels; at most ${MAX_PHOTO_PIXELS / 1e6} are accepted`);
  }
  const thumbnail = await sharp(bytes, { autoOrient: true, limitInputPixels: MAX_PHOTO_PIXELS })
    .resize({ width: THUMBNAIL_LONGEST_SIDE_PX, height: THUMBNAIL_LONGEST_SIDE_PX, fit: 'inside', withoutEnlargement: true })
    // JPEG has no transparency: see-through parts of a PNG or WebP show white, as on the page.
    .flatten({ background: '#ffffff' })
    .jpeg({ quality: 80 })
    .toBuffer()
    .catch(() => {
      throw unreadable(contentType);
    });
  return { widthPx: metadata.autoOrient.width, heightPx: metadata.autoOrient.height, thumbnail };
}
