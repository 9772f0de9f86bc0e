import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import type { PlateWorkerApi } from '../worker/plate-worker.ts';
import { WorkerBridge } from './analysis/worker-bridge.ts';
import { ServicesContext } from './app/services.ts';
import { openIdbStore } from './storage/idb-store.ts';
import { requestPersistence } from './storage/quota.ts';
import { App } from './ui/App.tsx';
import './styles.css';

const root = createRoot(document.getElementById('root')!);

function createWorker(): Worker {
  return new Worker(new URL('../worker/plate-worker.ts', import.meta.url), { type: 'module' });
}

openIdbStore().then(
  (store) => {
    // Ask once per start: the browser decides silently (installed apps and engaged sites get it),
    // and the storage card shows the answer.
    void requestPersistence();
    const worker = new WorkerBridge<PlateWorkerApi>({
      create: createWorker,
      // opencv.js holds tens of MB; give it back after two quiet minutes.
      idleMs: 120_000,
      // A 12 MP photo takes a few seconds here; a minute means the worker is stuck.
      timeoutMs: 60_000,
    });
    root.render(
      <StrictMode>
        <ServicesContext.Provider value={{ store, worker }}>
          <App />
        </ServicesContext.Provider>
      </StrictMode>,
    );
  },
  (e: unknown) => {
    root.render(
      <p className="fatal">
        Rivalplate cannot open its storage on this device (
        {e instanceof Error ? e.message : String(e)}). A private window, or a browser setting that
        blocks site data, does this.
      </p>,
    );
  },
);
