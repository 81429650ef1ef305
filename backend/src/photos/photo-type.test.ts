import sharp from 'sharp';
import { photoTypeOf } from './photo-type';

/** A small drawn image: a grey field with a darker band, in the given format. */
function drawn(format: 'jpeg' | 'png' | 'webp' | 'gif'): Promise<Buffer> {
  const band = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="40" height="20"><rect width="40" height="8" fill="#445"/></svg>');
  return sharp({ create: { width: 40, height: 20, channels: 3, background: '#b0b4b8' } })
    .composite([{ input: band, top: 6, left: 0 }])
    .toFormat(format)
    .toBuffer();
}

describe('photoTypeOf', () => {
  it.each([
    ['jpeg', 'image/jpeg'],
    ['png', 'image/png'],
    ['webp', 'image/webp'],
  ] as const)('recognises a %s by its first bytes', async (format, type) => {
    expect(photoTypeOf(await drawn(format))).toBe(type);
  });

  it('refuses other images and files that only look close', async () => {
    expect(photoTypeOf(await drawn('gif'))).toBeNull();
    expect(photoTypeOf(Buffer.from('Girder 3: spall at midspan\n', 'utf8'))).toBeNull();
    expect(photoTypeOf(Buffer.from('RIFF\x24\x00\x00\x00WAVEfmt ', 'latin1'))).toBeNull();
    expect(photoTypeOf(Buffer.from([0x89, 0x50, 0x4e, 0x47]))).toBeNull();
    expect(photoTypeOf(Buffer.from([0xff, 0xd8]))).toBeNull();
    expect(photoTypeOf(Buffer.alloc(0))).toBeNull();
  });

  it('reads a view into a larger buffer from its own start', async () => {
    const jpeg = await drawn('jpeg');
    const padded = Buffer.concat([Buffer.from('padding'), jpeg]);
    expect(photoTypeOf(padded.subarray(7))).toBe('image/jpeg');
    expect(photoTypeOf(padded)).toBeNull();
  });
});
