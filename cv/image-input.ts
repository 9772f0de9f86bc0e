import type { RgbaImage } from './types.ts';

/** Refuses pixel buffers that cannot be a picture, with the reason, before any WASM memory is used. */
export class PlateImageError extends Error {
  override name = 'PlateImageError';
}

/** Larger than this is refused: 100 MP of RGBA would need 400 MB before any work starts. */
export const MAX_PIXELS = 50_000_000;

export function checkImage(image: RgbaImage): void {
  const { width, height, data } = image;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 32 || height < 32) {
    throw new PlateImageError(
      `image is ${width}×${height} pixels; a plate photo needs at least 32×32`,
    );
  }
  if (width * height > MAX_PIXELS) {
    throw new PlateImageError(
      `image is ${((width * height) / 1e6).toFixed(0)} MP; decode it at a reduced size (at most ${MAX_PIXELS / 1e6} MP)`,
    );
  }
  if (!data || data.length !== width * height * 4) {
    throw new PlateImageError(
      `pixel buffer holds ${data?.length ?? 0} bytes; ${width}×${height} RGBA needs ${width * height * 4}`,
    );
  }
}
