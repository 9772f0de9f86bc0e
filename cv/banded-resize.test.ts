import { describe, expect, it } from 'vitest';
import { generatePlate } from '../fixtures/plate-generator.ts';
import { resizeRegion, SCALE_STEPS, steppedScale } from './banded-resize.ts';
import { withMats } from './mat-scope.ts';
import { loadOpenCv } from './opencv.ts';

describe('banded resize', () => {
  it('steps scales by 1/64, never above 1 or below one step', () => {
    expect(steppedScale(0.4)).toBe(26 / SCALE_STEPS);
    expect(steppedScale(1.7)).toBe(1);
    expect(steppedScale(0)).toBe(1 / SCALE_STEPS);
  });

  // Reference: opencv's own INTER_AREA resize of the whole region, copied into the heap at once.
  it('gives what one opencv resize of the whole region gives, up to the last band', async () => {
    const { cv } = await loadOpenCv();
    const { image } = generatePlate({ seed: 5, width: 1400, height: 1100, colonies: 60 });
    const region = { x: 101, y: 37, width: 1203, height: 1000 };
    const scale = steppedScale(0.37);
    const width = Math.round(region.width * scale);
    const height = Math.round(region.height * scale);
    withMats((keep) => {
      const banded = keep(resizeRegion(cv, image, region, scale, width, height));
      const whole = keep(cv.matFromImageData(image));
      const crop = keep(whole.roi(new cv.Rect(region.x, region.y, region.width, region.height)));
      const reference = keep(new cv.Mat());
      cv.resize(crop, reference, new cv.Size(width, height), 0, 0, cv.INTER_AREA);
      expect([banded.cols, banded.rows]).toEqual([reference.cols, reference.rows]);
      // Every full band (256 source rows → 256 × scale rows) matches to the byte.
      const fullRows = Math.floor(region.height / 256) * 256 * scale;
      const rowBytes = width * 4;
      const a = banded.data.subarray(0, fullRows * rowBytes);
      const b = reference.data.subarray(0, fullRows * rowBytes);
      let differing = 0;
      for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) differing++;
      expect(differing).toBe(0);
    });
  });
});
