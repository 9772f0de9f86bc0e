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
let provided: unknown;

/**
 * Hands over opencv.js loaded by other means, before the first loadOpenCv. The command line
 * loads it with require(): imported, its 10 MB script goes through tsx's module hooks, which
 * costs about 80 MB of memory and a second of start-up.
 */
export function provideOpenCvModule(mod: unknown): void {
  provided = mod;
}

export function loadOpenCv(): Promise<{ cv: OpenCv }> {
  // Loaded on first use (its own chunk in the app's worker); wrapped at once, never resolved bare.
  ready ??= (
    provided !== undefined
      ? Promise.resolve({ mod: provided })
      : import('./opencv-module.ts').then((ns) => ns.opencvBox)
  ).then(({ mod }) => whenReady(mod as EmscriptenModule));
  return ready;
}

function whenReady(mod: EmscriptenModule): Promise<{ cv: OpenCv }> {
  return new Promise((resolve, reject) => {
    const done = () => resolve({ cv: mod as unknown as OpenCv });
    if (mod.calledRun && mod.Mat) done();
    else if (typeof mod.then === 'function') mod.then(() => done());
    else if (mod.Mat) done();
    else
      reject(new Error('opencv.js did not expose its runtime; is @techstark/opencv-js installed?'));
  });
}
