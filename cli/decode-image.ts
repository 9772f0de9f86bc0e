import { stat } from 'node:fs/promises';
import sharp from 'sharp';

/**
 * Decodes a photo file to upright RGBA pixels for cv/, in Node.
 *
 * The EXIF orientation is applied (sharp's rotate() with no angle), so `width` and `height` are
 * those of the upright picture at full resolution. A photo larger than MAX_DECODE_PIXELS is
 * reduced while it is decoded (JPEG shrink-on-load), so a 100 MP file costs no more memory than a
 * 16 MP one; `scale` says how many decoded pixels stand for one original pixel, and callers map
 * results back by dividing by it.
 */
export const MAX_DECODE_PIXELS = 16_000_000;

// One photo at a time: libvips' operation cache would only hold on to decoded pixels.
sharp.cache(false);
/** Files claiming more pixels than this are refused before decoding (sharp's own guard). */
const MAX_INPUT_PIXELS = 400_000_000;

export interface DecodedPhoto {
  width: number;
  height: number;
  scale: number;
  pixels: { width: number; height: number; data: Uint8Array };
}

export class PhotoError extends Error {
  override name = 'PhotoError';
}

export async function decodePhoto(path: string): Promise<DecodedPhoto> {
  const info = await stat(path).catch(() => null);
  if (!info) throw new PhotoError('no such file');
  if (info.isDirectory()) throw new PhotoError('is a folder, not a photo');
  if (info.size === 0) throw new PhotoError('the file is empty (0 bytes)');
  let meta: Awaited<ReturnType<ReturnType<typeof sharp>['metadata']>>;
  try {
    meta = await sharp(path, { limitInputPixels: MAX_INPUT_PIXELS }).metadata();
  } catch (e) {
    throw new PhotoError(`not a readable JPEG, PNG or WebP image (${reason(e)})`);
  }
  if (!meta.width || !meta.height) throw new PhotoError('the image has no size');
  const turned = (meta.orientation ?? 1) >= 5; // orientations 5–8 swap width and height
  const width = turned ? meta.height : meta.width;
  const height = turned ? meta.width : meta.height;
  const scale = Math.min(1, Math.sqrt(MAX_DECODE_PIXELS / (width * height)));
  try {
    let pipeline = sharp(path, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' }).rotate();
    if (scale < 1) {
      pipeline = pipeline.resize(Math.round(width * scale), Math.round(height * scale), {
        fit: 'fill',
      });
    }
    const { data, info: out } = await pipeline
      .removeAlpha()
      .ensureAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    const pixels = {
      width: out.width,
      height: out.height,
      data: new Uint8Array(data.buffer, data.byteOffset, data.byteLength),
    };
    return { width, height, scale: out.width / width, pixels };
  } catch (e) {
    throw new PhotoError(`the image data is damaged or cut short (${reason(e)})`);
  }
}

function reason(e: unknown): string {
  return (e instanceof Error ? e.message : String(e)).split('\n')[0]!.trim();
}
