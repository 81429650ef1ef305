import type { PhotoContentType } from '../../../shared/src';

/** File signatures: JPEG (SOI and the first marker), PNG (its eight-byte signature). */
const JPEG_SIGNATURE = Buffer.from([0xff, 0xd8, 0xff]);
const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
/** WebP is a RIFF container: "RIFF", four bytes of length, then "WEBP". */
const RIFF = Buffer.from('RIFF', 'ascii');
const WEBP = Buffer.from('WEBP', 'ascii');

/**
 * The photo type a file's first bytes announce, or null for anything else. Names and the
 * client's Content-Type are never trusted: a renamed text file must not pass as a JPEG.
 */
export function photoTypeOf(bytes: Uint8Array): PhotoContentType | null {
  const file = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (file.subarray(0, 3).equals(JPEG_SIGNATURE)) return 'image/jpeg';
  if (file.subarray(0, 8).equals(PNG_SIGNATURE)) return 'image/png';
  if (file.subarray(0, 4).equals(RIFF) && file.subarray(8, 12).equals(WEBP)) return 'image/webp';
  return null;
}

/** The file name extension an object key gets for each type. */
export const EXTENSION_OF: Readonly<Record<PhotoContentType, string>> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' };
