import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { readImageHeader } from './image-header.ts';

// Reference: sharp (libvips) writes the files and reports their stored size and EXIF
// orientation through metadata(); the header reader must agree with it.
async function jpeg(width: number, height: number, orientation?: number): Promise<Buffer> {
  const img = sharp({ create: { width, height, channels: 3, background: '#d9c9a0' } }).jpeg();
  return (orientation ? img.withMetadata({ orientation }) : img).toBuffer();
}

describe('readImageHeader', () => {
  it.each([1, 3, 6, 8])('JPEG with EXIF orientation %i gives the upright size', async (o) => {
    const file = await jpeg(320, 200, o);
    const meta = await sharp(file).metadata();
    expect(meta.orientation).toBe(o);
    const swap = o >= 5;
    expect(readImageHeader(new Uint8Array(file))).toEqual({
      width: swap ? meta.height : meta.width,
      height: swap ? meta.width : meta.height,
      orientation: o,
    });
  });

  it('JPEG without EXIF is orientation 1', async () => {
    const file = await jpeg(64, 48);
    expect(readImageHeader(new Uint8Array(file))).toEqual({
      width: 64,
      height: 48,
      orientation: 1,
    });
  });

  it('PNG size from IHDR', async () => {
    const file = await sharp({ create: { width: 33, height: 21, channels: 4, background: '#fff' } })
      .png()
      .toBuffer();
    expect(readImageHeader(new Uint8Array(file))).toEqual({
      width: 33,
      height: 21,
      orientation: 1,
    });
  });

  it('not an image, an empty file and a cut-off JPEG give null, not an exception', () => {
    expect(readImageHeader(new TextEncoder().encode('plate,count\n1,2'))).toBeNull();
    expect(readImageHeader(new Uint8Array())).toBeNull();
    expect(readImageHeader(new Uint8Array([0xff, 0xd8, 0xff, 0xe1, 0x00]))).toBeNull();
  });
});
