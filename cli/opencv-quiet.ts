import { createRequire } from 'node:module';

export type CvCore = typeof import('../cv/index.ts');

/**
 * Loads the cv core in a Node process without opencv.js's process hooks. When its emscripten
 * runtime is evaluated it installs an uncaughtException handler that re-throws (printing the
 * whole 10 MB script) and an unhandledRejection handler that aborts the runtime; a command line
 * tool reports its own errors, so those two handlers are taken off again. opencv.js is loaded
 * with require(), past tsx's import hooks (see provideOpenCvModule).
 */
export async function loadCvCore(): Promise<CvCore> {
  const before = {
    uncaught: new Set(process.listeners('uncaughtException')),
    rejection: new Set(process.listeners('unhandledRejection')),
  };
  const core = await import('../cv/index.ts');
  core.provideOpenCvModule(createRequire(import.meta.url)('@techstark/opencv-js'));
  await core.loadOpenCv();
  for (const l of process.listeners('uncaughtException')) {
    if (!before.uncaught.has(l)) process.removeListener('uncaughtException', l);
  }
  for (const l of process.listeners('unhandledRejection')) {
    if (!before.rejection.has(l)) process.removeListener('unhandledRejection', l);
  }
  return core;
}
