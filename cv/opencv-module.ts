import cvModule from '@techstark/opencv-js';

/**
 * opencv.js's module object, boxed. It is loaded by a dynamic import of this file (opencv.ts): a
 * dynamic import of opencv.js itself would come back through the bundler's CommonJS interop as
 * a copy of the module, `then` included, and a promise resolved with that never settles.
 */
export const opencvBox: { mod: unknown } = { mod: cvModule };
