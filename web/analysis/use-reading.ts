import { useCallback, useEffect, useRef, useState } from 'react';

export type Reading =
  | { state: 'idle' }
  | { state: 'running'; stage: string; fraction: number }
  | { state: 'failed'; error: string };

/** Runs one plate reading at a time with progress; a newer start or leaving the screen aborts it. */
export function useReading() {
  const [reading, setReading] = useState<Reading>({ state: 'idle' });
  const controller = useRef<AbortController | null>(null);
  useEffect(() => () => controller.current?.abort(), []);

  const start = useCallback(
    async (
      run: (
        signal: AbortSignal,
        onProgress: (stage: string, fraction: number) => void,
      ) => Promise<unknown>,
    ) => {
      controller.current?.abort();
      const c = new AbortController();
      controller.current = c;
      setReading({ state: 'running', stage: 'starting', fraction: 0 });
      try {
        await run(c.signal, (stage, fraction) => {
          if (!c.signal.aborted) setReading({ state: 'running', stage, fraction });
        });
        if (!c.signal.aborted) setReading({ state: 'idle' });
      } catch (e) {
        if (!c.signal.aborted)
          setReading({ state: 'failed', error: e instanceof Error ? e.message : String(e) });
      }
    },
    [],
  );
  const cancel = useCallback(() => {
    controller.current?.abort();
    setReading({ state: 'idle' });
  }, []);
  return { reading, start, cancel };
}
