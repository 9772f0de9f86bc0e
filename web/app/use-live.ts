import { useEffect, useState } from 'react';
import { useServices } from './services.ts';

export type Live<T> =
  | { state: 'loading' }
  | { state: 'ready'; value: T }
  | { state: 'failed'; error: string };

/**
 * The value of `read` over the record store, read again after every completed write, so every
 * screen shows what is stored (never a copy that might differ from it).
 */
export function useLive<T>(
  read: (s: ReturnType<typeof useServices>) => Promise<T>,
  deps: unknown[],
): Live<T> {
  const services = useServices();
  const [live, setLive] = useState<Live<T>>({ state: 'loading' });
  // biome-ignore lint/correctness/useExhaustiveDependencies: `read` is re-created each render; deps name what it reads.
  useEffect(() => {
    let current = true;
    const load = () =>
      read(services).then(
        (value) => current && setLive({ state: 'ready', value }),
        (e: unknown) =>
          current &&
          setLive({ state: 'failed', error: e instanceof Error ? e.message : String(e) }),
      );
    load();
    const stop = services.store.subscribe(load);
    return () => {
      current = false;
      stop();
    };
  }, [services, ...deps]);
  return live;
}
