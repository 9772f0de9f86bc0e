// A count worker that fails on purpose (count-pool.test.ts): registers tsx, as count-worker.js does.
import { register } from 'tsx/esm/api';

register();
await import('./failing-count-worker.ts');
