#!/usr/bin/env node
// Entry for `npx rivalplate`: runs the TypeScript command line through tsx, so a checkout needs
// no build step before its commands work.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
