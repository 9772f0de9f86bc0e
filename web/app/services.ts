import { createContext, useContext } from 'react';
import type { PlateWorker } from '../analysis/plate-reading.ts';
import type { RecordStore } from '../storage/record-store.ts';

/** What the screens need from outside React: the record store and the plate-analysis worker. */
export interface Services {
  store: RecordStore;
  worker: PlateWorker;
}

export const ServicesContext = createContext<Services | null>(null);

export function useServices(): Services {
  const s = useContext(ServicesContext);
  if (!s) throw new Error('useServices outside <ServicesContext.Provider>');
  return s;
}
