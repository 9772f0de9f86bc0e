import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';

const ROOT = resolve(import.meta.dirname, '../..');
mkdirSync(resolve(ROOT, 'tests/artifacts'), { recursive: true });

/** The frame the fake camera serves, and the demo plate it is made from. */
export const CAMERA_FRAME = resolve(ROOT, 'tests/artifacts/camera-plate.y4m');
export const DEMO_PLATE_FOR_CAMERA = resolve(ROOT, 'fixtures/demo/marrowfield-L2-day1.jpg');
