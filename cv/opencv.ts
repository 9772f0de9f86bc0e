import cvModule from '@techstark/opencv-js';
import type { OpenCv } from './opencv-slice.ts';

export type { Mat, MatVector, OpenCv } from './opencv-slice.ts';

/**
 * The emscripten module object has a `then` of its own that resolves to itself, so awaiting it
 * (or resolving a promise with it) loops forever. We resolve a wrapper `{ cv }` instead, once per
 * realm, and hand out the same promise to every caller.
 */
interface EmscriptenModule {
  then?: (resolve: (m: unknown) => void) => void;
  calledRun?: boolean;
  Mat?: unknown;
  onRuntimeInitialized?: () => void;
}

let ready: Promise<{ cv: OpenCv }> | undefined;

export function loadOpenCv(): Promise<{ cv: OpenCv }> {
  ready ??= new Promise((resolve, reject) => {
    const mod = cvModule as unknown as EmscriptenModule;
    const done = () => resolve({ cv: mod as unknown as OpenCv });
    if (mod.calledRun && mod.Mat) done();
    else if (typeof mod.then === 'function') mod.then(() => done());
    else if (mod.Mat) done();
    else
      reject(new Error('opencv.js did not expose its runtime; is @techstark/opencv-js installed?'));
  });
  return ready;
}
