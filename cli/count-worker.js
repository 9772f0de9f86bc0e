// Entry of a `count --jobs N` worker thread: registers tsx in this thread (module hooks do not
// carry over from the main thread), then runs the TypeScript worker.
import { register } from 'tsx/esm/api';

register();
await import('./count-worker.ts');
