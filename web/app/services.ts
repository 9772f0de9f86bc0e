import { createContext, useContext } from 'react';
import type { PlateWorker } from '../analysis/plate-reading.ts';
import type { FitnessWorker } from '../results/experiment-fitness.ts';
import type { RecordStore } from '../storage/record-store.ts';
import type { SyncClient } from '../sync/sync-client.ts';

/**
 * What the screens need from outside React: the record store (writes through it are queued for
 * the lab's server when sync is on), the plate-analysis and fitness workers, and the sync client (null when
 * its own storage could not be opened: the app then works on its own).
 */
export interface Services {
  store: RecordStore;
  worker: PlateWorker;
  fitness: FitnessWorker;
  sync: SyncClient | null;
}

export const ServicesContext = createContext<Services | null>(null);

export function useServices(): Services {
  const s = useContext(ServicesContext);
  if (!s) throw new Error('useServices outside <ServicesContext.Provider>');
  return s;
}
