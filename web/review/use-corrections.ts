import { useCallback, useEffect, useRef, useState } from 'react';
import type { Analysis, Corrections, Edit } from '../../schema/records.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { newStamp, revised } from '../storage/stamp.ts';
import { applyEdit, type EditStack, redo, undo } from './edits.ts';

/**
 * The person's corrections of one analysis, held for instant counts and saved after every step
 * (each save resolves when its transaction has completed; `saveError` says if one failed).
 * Mount it per analysis (a re-read starts a new, empty set of corrections).
 */
export function useCorrections(
  store: RecordStore,
  analysis: Analysis,
  stored: Corrections | undefined,
) {
  const [stack, setStack] = useState<EditStack>(() => stored ?? { edits: [], undone: [] });
  const [saveError, setSaveError] = useState<string | null>(null);
  const record = useRef<Corrections | undefined>(stored);
  const saving = useRef<Promise<void>>(Promise.resolve());

  // A later revision saved elsewhere (brought by sync, or both phones' taps merged) replaces
  // what is held here, so the next tap builds on it and never drops the other phone's taps.
  // This screen's own saves come back with the revision it holds, and are left alone.
  useEffect(() => {
    if (stored && stored.revision > (record.current?.revision ?? 0)) {
      record.current = stored;
      setStack(stored);
    }
  }, [stored]);

  const commit = useCallback(
    (next: EditStack) => {
      setStack(next);
      const rec: Corrections = record.current
        ? revised(record.current, next)
        : // The corrections of a reading take its id: two phones correcting the same reading
          // offline then edit one record, which sync sees as a conflict to merge, not as two.
          {
            ...newStamp(),
            id: analysis.id,
            plateId: analysis.plateId,
            analysisId: analysis.id,
            ...next,
          };
      record.current = rec;
      // Saves run in order, so an older state never overwrites a newer one.
      saving.current = saving.current
        .then(() => store.put('corrections', rec))
        .then(
          () => setSaveError(null),
          (e: unknown) =>
            setSaveError(`Correction not saved: ${e instanceof Error ? e.message : String(e)}`),
        );
    },
    [store, analysis.id, analysis.plateId],
  );

  return {
    stack,
    saveError,
    apply: (edit: Edit) => commit(applyEdit(stack, edit)),
    undo: () => commit(undo(stack)),
    redo: () => commit(redo(stack)),
  };
}
