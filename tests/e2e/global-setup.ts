import { existsSync, writeFileSync } from 'node:fs';
import sharp from 'sharp';
import { CAMERA_FRAME, DEMO_PLATE_FOR_CAMERA } from './camera-frame.ts';

/**
 * The fake camera's picture must exist before Chromium starts: a YUV4MPEG2 file (one 4:2:0 frame,
 * BT.601 full-range, as "C420jpeg" says) made from a demo plate, which Chromium loops as video.
 */
export default async function globalSetup(): Promise<void> {
  if (existsSync(CAMERA_FRAME)) return;
  const { data, info } = await sharp(DEMO_PLATE_FOR_CAMERA)
    .removeAlpha()
    .raw()
    .toBuffer({ resolveWithObject: true });
  const { width: w, height: h } = info;
  const y = Buffer.alloc(w * h);
  const u = Buffer.alloc((w / 2) * (h / 2));
  const v = Buffer.alloc((w / 2) * (h / 2));
  for (let row = 0; row < h; row++) {
    for (let col = 0; col < w; col++) {
      const i = (row * w + col) * 3;
      const [r, g, b] = [data[i]!, data[i + 1]!, data[i + 2]!];
      y[row * w + col] = Math.round(0.299 * r + 0.587 * g + 0.114 * b);
      if (row % 2 === 0 && col % 2 === 0) {
        const j = (row / 2) * (w / 2) + col / 2;
        u[j] = Math.max(0, Math.min(255, Math.round(128 - 0.168736 * r - 0.331264 * g + 0.5 * b)));
        v[j] = Math.max(0, Math.min(255, Math.round(128 + 0.5 * r - 0.418688 * g - 0.081312 * b)));
      }
    }
  }
  const header = Buffer.from(`YUV4MPEG2 W${w} H${h} F10:1 Ip A1:1 C420jpeg\nFRAME\n`);
  writeFileSync(CAMERA_FRAME, Buffer.concat([header, y, u, v]));
}
