import type { ColonyRecord } from '../../schema/records.ts';
import type { ClassLook } from '../bench/colours.ts';

/**
 * The plate preview with every colony ringed in its class colour and the counts written in a
 * corner, as a PNG for a lab notebook or a slide. Drawn at the preview's size (the photo itself
 * is never decoded on the main thread); coordinates come in original pixels.
 */
export async function annotatedPng(
  preview: Blob,
  originalWidth: number,
  colonies: readonly ColonyRecord[],
  looks: [ClassLook, ClassLook],
  counts: [number, number],
): Promise<Blob> {
  const bitmap = await createImageBitmap(preview);
  const canvas = document.createElement('canvas');
  canvas.width = bitmap.width;
  canvas.height = bitmap.height;
  const ctx = canvas.getContext('2d')!;
  ctx.drawImage(bitmap, 0, 0);
  bitmap.close();
  const k = bitmap.width / originalWidth;
  ctx.lineWidth = Math.max(1.5, canvas.width / 700);
  for (const c of colonies) {
    ctx.strokeStyle = looks[c.cls].hex;
    ctx.beginPath();
    ctx.arc(c.x * k, c.y * k, Math.max(3, c.r * 1.25 * k), 0, 2 * Math.PI);
    ctx.stroke();
  }
  const size = Math.round(canvas.width / 30);
  ctx.font = `700 ${size}px system-ui, sans-serif`;
  ctx.fillStyle = '#000a';
  ctx.fillRect(0, 0, size * 14, size * 1.6);
  ctx.fillStyle = '#fff';
  ctx.fillText(
    `${looks[0].name} ${counts[0]} · ${looks[1].name} ${counts[1]}`,
    size * 0.4,
    size * 1.15,
  );
  return new Promise((resolve, reject) =>
    canvas.toBlob(
      (b) => (b ? resolve(b) : reject(new Error('the PNG could not be made'))),
      'image/png',
    ),
  );
}
