import type { RgbaImage } from '../cv/types.ts';
import { readImageHeader } from './image-header.ts';

/** Longest side of the copy the analysis works on; the cv core picks its own resolution below it. */
export const WORKING_MAX_SIDE = 2400;
/** Longest side of the preview the app shows on screen. */
const PREVIEW_MAX_SIDE = 1600;

export interface DecodedPhoto {
  image: RgbaImage;
  /** Upright size of the original photo. */
  width: number;
  height: number;
  /** Original pixels per decoded pixel. */
  k: number;
  preview: Blob;
}

/**
 * Decodes a photo straight to the working size (the browser's decoder scales while decoding,
 * so the full-size bitmap is never held), upright per its EXIF orientation. Throws an Error that
 * names the file when it is not a picture the browser can decode.
 */
export async function decodePhoto(photo: Blob, name: string): Promise<DecodedPhoto> {
  if (photo.size === 0) throw new Error(`${name}: the file is empty`);
  const header = readImageHeader(new Uint8Array(await photo.slice(0, 256 * 1024).arrayBuffer()));
  let bitmap: ImageBitmap;
  try {
    bitmap = header
      ? await createImageBitmap(photo, {
          imageOrientation: 'from-image',
          ...sizeWithin(header.width, header.height, WORKING_MAX_SIDE),
          resizeQuality: 'high',
        })
      : await createImageBitmap(photo, { imageOrientation: 'from-image' });
  } catch {
    throw new Error(`${name}: not a picture this browser can read (JPEG, PNG or WebP expected)`);
  }
  const width = header?.width ?? bitmap.width;
  const height = header?.height ?? bitmap.height;
  try {
    if (!header && Math.max(width, height) > WORKING_MAX_SIDE) {
      // No readable header (e.g. WebP): the full bitmap is already decoded; scale it down once.
      const small = await createImageBitmap(bitmap, {
        ...sizeWithin(width, height, WORKING_MAX_SIDE),
        resizeQuality: 'high',
      });
      bitmap.close();
      bitmap = small;
    }
    const canvas = new OffscreenCanvas(bitmap.width, bitmap.height);
    const ctx = canvas.getContext('2d', { willReadFrequently: true });
    if (!ctx) throw new Error(`${name}: this browser gave no 2D canvas in the worker`);
    ctx.drawImage(bitmap, 0, 0);
    const pixels = ctx.getImageData(0, 0, bitmap.width, bitmap.height);
    const preview = await previewOf(bitmap);
    return {
      image: { width: pixels.width, height: pixels.height, data: pixels.data },
      width,
      height,
      k: width / bitmap.width,
      preview,
    };
  } finally {
    bitmap.close();
  }
}

function sizeWithin(width: number, height: number, maxSide: number) {
  const s = Math.min(1, maxSide / Math.max(width, height));
  return {
    resizeWidth: Math.max(1, Math.round(width * s)),
    resizeHeight: Math.max(1, Math.round(height * s)),
  };
}

async function previewOf(bitmap: ImageBitmap): Promise<Blob> {
  const size = sizeWithin(bitmap.width, bitmap.height, PREVIEW_MAX_SIDE);
  const canvas = new OffscreenCanvas(size.resizeWidth, size.resizeHeight);
  canvas.getContext('2d')!.drawImage(bitmap, 0, 0, size.resizeWidth, size.resizeHeight);
  return canvas.convertToBlob({ type: 'image/jpeg', quality: 0.85 });
}
