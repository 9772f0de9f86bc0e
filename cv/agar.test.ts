import { describe, expect, it } from 'vitest';
import { generatePlate } from '../fixtures/plate-generator.ts';
import { lab8ToLab, modelAgar } from './agar.ts';
import { deltaE76 } from './colour.ts';
import { frameForDish } from './frame.ts';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';

describe('agar model', () => {
  // Reference: ΔE*ab (CIE 1976) computed pixel by pixel from the two 8-bit Lab images with
  // deltaE76, which colour.test.ts checks against published values.
  it('gives each pixel ΔE*ab from the local agar colour', async () => {
    const { cv } = await loadOpenCv();
    const { image, truth } = generatePlate({ seed: 3, width: 900, height: 700, colonies: 40 });
    const d = truth.dish;
    const frame = frameForDish(d, 900, 700, 90);
    withMats((keep) => {
      const rgb = keep(new cv.Mat());
      cv.cvtColor(keep(cv.matFromImageData(image)), rgb, cv.COLOR_RGBA2RGB);
      const dish = { ...d, rx: d.agarRx, ry: d.agarRy, agarFraction: 1 };
      const agar = modelAgar(cv, keep, rgb, dish, frame);
      const lab = agar.lab8.data;
      const bg = agar.background8.data;
      const de = new Float32Array(
        agar.deltaE.data.buffer,
        agar.deltaE.data.byteOffset,
        rgb.rows * rgb.cols,
      );
      let worst = 0;
      for (let i = 0; i < rgb.rows * rgb.cols; i += 97) {
        const j = i * 3;
        const ref = deltaE76(
          lab8ToLab(lab[j]!, lab[j + 1]!, lab[j + 2]!),
          lab8ToLab(bg[j]!, bg[j + 1]!, bg[j + 2]!),
        );
        worst = Math.max(worst, Math.abs(de[i]! - ref));
      }
      expect(worst).toBeLessThan(1e-4);
    });
  });
});
