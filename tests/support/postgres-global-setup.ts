/**
 * vitest globalSetup of the `postgres` project (vitest.config.ts): one throwaway cluster for the
 * whole run, its URL handed to the tests (`inject('postgresUrl')`); each test server makes a
 * database of its own on it (tests/sync/test-database.ts). PostgreSQL that cannot be started
 * fails the run with the reason; the suite is never skipped for it.
 */
import type { TestProject } from 'vitest/node';
import { startCluster } from './postgres-cluster.ts';

declare module 'vitest' {
  export interface ProvidedContext {
    postgresUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const cluster = await startCluster();
  project.provide('postgresUrl', cluster.url);
  return () => cluster.stop();
}
