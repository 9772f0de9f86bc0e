import sharp from 'sharp';
import { analyzePlate } from '../../cv/index.ts';

/**
 * The cv core run in Node on the same file, decoded by libvips (sharp) with its EXIF orientation
 * applied: what the app must show, up to the small differences between two JPEG decoders and
 * the worker's bounded decode.
 */
export async function nodeReading(file: string) {
  const { data, info } = await sharp(file)
    .rotate()
    .ensureAlpha()
    .raw()
    .toBuffer({ resolveWithObject: true });
  const a = await analyzePlate({
    width: info.width,
    height: info.height,
    data: new Uint8Array(data),
  });
  return {
    width: info.width,
    height: info.height,
    total: a.colonies.reduce((s, c) => s + c.count, 0),
    dish: a.dish,
  };
}
