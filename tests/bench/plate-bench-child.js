// Entry of one benchmark process, started the way bin/rivalplate.js starts the command line
// (tsx registered in-process), so the memory measured is what a user's batch run costs.
import { register } from 'tsx/esm/api';

register();
await import('./plate-bench-run.ts');
