import { useCallback, useRef, useState } from 'react';
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

  const commit = useCallback(
    (next: EditStack) => {
      setStack(next);
      const rec: Corrections = record.current
        ? revised(record.current, next)
        : { ...newStamp(), plateId: analysis.plateId, analysisId: analysis.id, ...next };
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
