import { crc32 } from 'node:zlib';
import sharp from 'sharp';
import { AppError } from '../http/app-error';
import { preparePhoto, THUMBNAIL_LONGEST_SIDE_PX } from './photo-image';

/** A drawn test picture (no photograph): a sky-grey field with a dark beam along its lower part. */
function picture(widthPx: number, heightPx: number) {
  const beam = Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${widthPx}" height="${heightPx}"><rect y="${Math.round(heightPx * 0.6)}" width="${widthPx}" height="${Math.round(heightPx * 0.2)}" fill="#3a3f44"/></svg>`,
  );
  return sharp({ create: { width: widthPx, height: heightPx, channels: 3, background: '#c9d1d8' } }).composite([{ input: beam }]);
}

async function refusal(action: Promise<unknown>): Promise<AppError> {
  const error = await action.then(
    () => null,
    (thrown: unknown) => thrown,
  );
  if (!(error instanceof AppError)) throw new Error(`expected an AppError, got ${String(error)}`);
  return error;
}

describe('preparePhoto', () => {
  it('makes a JPEG thumbnail whose longest side is 320 px and reports the photo size', async () => {
    const photo = await picture(1200, 800).jpeg().toBuffer();
    const prepared = await preparePhoto(photo, 'image/jpeg');
    expect(prepared).toMatchObject({ widthPx: 1200, heightPx: 800 });
    const thumbnail = await sharp(prepared.thumbnail).metadata();
    expect(thumbnail).toMatchObject({ format: 'jpeg', width: THUMBNAIL_LONGEST_SIDE_PX, height: 213 });
  });

  it('turns the thumbnail upright by the EXIF orientation and strips every piece of metadata', async () => {
    // Stored 400 × 200 with orientation 6: the camera was held upright, so people see 200 × 400.
    const photo = await picture(400, 200)
      .jpeg()
      .withMetadata({ orientation: 6, exif: { IFD0: { Make: 'Test camera', Software: 'drawn for a test' } } })
      .toBuffer();
    expect((await sharp(photo).metadata()).orientation).toBe(6);
    const prepared = await preparePhoto(photo, 'image/jpeg');
    expect(prepared).toMatchObject({ widthPx: 200, heightPx: 400 });
    const thumbnail = await sharp(prepared.thumbnail).metadata();
    expect(thumbnail).toMatchObject({ width: 160, height: 320 });
    expect(thumbnail.orientation).toBeUndefined();
    expect(thumbnail.exif).toBeUndefined();
    expect(thumbnail.icc).toBeUndefined();
  });

  it('never enlarges a small photo, and shows see-through parts of a PNG as white', async () => {
    const transparent = await sharp({ create: { width: 120, height: 90, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } })
      .png()
      .toBuffer();
    const prepared = await preparePhoto(transparent, 'image/png');
    const { data, info } = await sharp(prepared.thumbnail).raw().toBuffer({ resolveWithObject: true });
    expect(info).toMatchObject({ width: 120, height: 90, channels: 3 });
    expect(Math.min(...data)).toBeGreaterThan(245);
  });

  it('reads WebP', async () => {
    const prepared = await preparePhoto(await picture(640, 640).webp().toBuffer(), 'image/webp');
    expect(prepared).toMatchObject({ widthPx: 640, heightPx: 640 });
    expect(await sharp(prepared.thumbnail).metadata()).toMatchObject({ format: 'jpeg', width: 320, height: 320 });
  });

  it('refuses a JPEG cut short with 415 naming the field photo', async () => {
    const photo = await picture(600, 400).jpeg().toBuffer();
    const error = await refusal(preparePhoto(photo.subarray(0, Math.floor(photo.length / 2)), 'image/jpeg'));
    expect(error).toMatchObject({ status: 415, code: 'unsupported_media_type' });
    expect(error.details).toEqual({ fields: [{ field: 'photo', message: expect.stringMatching(/starts like a JPEG image but cannot be read/) }] });
  });

  it('refuses a file whose first bytes promise a type its content is not', async () => {
    const png = await picture(60, 40).png().toBuffer();
    expect(await refusal(preparePhoto(png, 'image/webp'))).toMatchObject({ status: 415, code: 'unsupported_media_type' });
    const signatureOnly = Buffer.concat([png.subarray(0, 8), Buffer.from('not the rest of a PNG file')]);
    expect(await refusal(preparePhoto(signatureOnly, 'image/png'))).toMatchObject({ status: 415 });
  });

  it('refuses a small file that claims a huge image before decoding it (413)', async () => {
    const png = await picture(16, 16).png().toBuffer();
    // The IHDR chunk follows the signature: length, type, width, height, …, then its CRC.
    const bomb = Buffer.from(png);
    bomb.writeUInt32BE(20_000, 16);
    bomb.writeUInt32BE(20_000, 20);
    bomb.writeUInt32BE(crc32(bomb.subarray(12, 29)), 29);
    const error = await refusal(preparePhoto(bomb, 'image/png'));
    expect(error).toMatchObject({ status: 413, code: 'payload_too_large' });
    expect(error.message).toMatch(/^photo: the photo has 400 megapixels; at most 100 are accepted$/);
  });
});
