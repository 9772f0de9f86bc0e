import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import type { PlateWorkerApi } from '../worker/plate-worker.ts';
import { WorkerBridge } from './analysis/worker-bridge.ts';
import { ServicesContext } from './app/services.ts';
import type { FitnessWorkerApi } from './results/fitness-worker.ts';
import { openIdbStore } from './storage/idb-store.ts';
import { requestPersistence } from './storage/quota.ts';
import { browserEnv, onBackgroundSynced, requestBackgroundSync } from './sync/browser-env.ts';
import { createSyncClient } from './sync/sync-client.ts';
import { openSyncState } from './sync/sync-state.ts';
import { App } from './ui/App.tsx';
import './styles.css';

const root = createRoot(document.getElementById('root')!);

function createPlateWorker(): Worker {
  return new Worker(new URL('../worker/plate-worker.ts', import.meta.url), { type: 'module' });
}

function createFitnessWorker(): Worker {
  return new Worker(new URL('./results/fitness-worker.ts', import.meta.url), { type: 'module' });
}

async function start(): Promise<void> {
  const local = await openIdbStore();
  // Sync is optional: if its own storage cannot be opened, the app still works on its own.
  const sync = await openSyncState()
    .then((state) =>
      createSyncClient({
        records: local,
        state,
        env: browserEnv(),
        onQueuedOffline: () => void requestBackgroundSync(),
      }),
    )
    .catch((e: unknown) => {
      console.warn('sync is unavailable on this device:', e);
      return null;
    });
  // Records the service worker brought in show by themselves (the record store hears of its
  // writes); the sync card is told here.
  if (sync) onBackgroundSynced(() => void sync.refresh());
  // Ask once per start: the browser decides silently (installed apps and engaged sites get it),
  // and the storage card shows the answer.
  void requestPersistence();
  const worker = new WorkerBridge<PlateWorkerApi>({
    create: createPlateWorker,
    // opencv.js holds tens of MB; give it back after two quiet minutes.
    idleMs: 120_000,
    // A 12 MP photo takes a few seconds here; a minute means the worker is stuck.
    timeoutMs: 60_000,
  });
  const fitness = new WorkerBridge<FitnessWorkerApi>({
    create: createFitnessWorker,
    idleMs: 120_000,
    // The largest experiments take under a second here.
    timeoutMs: 30_000,
  });
  root.render(
    <StrictMode>
      <ServicesContext.Provider value={{ store: sync?.records ?? local, worker, fitness, sync }}>
        <App />
      </ServicesContext.Provider>
    </StrictMode>,
  );
}

start().catch((e: unknown) => {
  root.render(
    <p className="fatal">
      Rivalplate cannot open its storage on this device (
      {e instanceof Error ? e.message : String(e)}). A private window, or a browser setting that
      blocks site data, does this.
    </p>,
  );
});
