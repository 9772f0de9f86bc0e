import { useEffect, useState } from 'react';
import type { RecordKind } from '../../schema/records.ts';
import { type ConflictPlace, conflictPlace } from '../app/conflict-place.ts';
import { type ConflictChoice, conflictChoices, keepVersion, mergeTaps } from '../app/conflicts.ts';
import { useServices } from '../app/services.ts';
import type { SyncClient } from '../sync/sync-client.ts';

const WHAT: Record<RecordKind, string> = {
  experiments: 'An experiment was',
  assays: 'An assay was',
  samples: 'A sample was',
  plates: 'A plate was',
  photos: 'A photo was',
  analyses: 'A plate reading was',
  corrections: 'The colony taps on a plate were',
};

/**
 * A record edited on two phones: the person keeps one phone's version, or, for colony taps,
 * merges both. Shown until they choose; nothing is lost meanwhile (the server keeps both).
 */
export function ConflictRow({
  sync,
  kind,
  id,
  heads,
  onSettled,
}: {
  sync: SyncClient;
  kind: RecordKind;
  id: string;
  heads: number;
  onSettled: (work: () => Promise<string>) => void;
}) {
  const { store } = useServices();
  const [choices, setChoices] = useState<ConflictChoice[]>([]);
  const [place, setPlace] = useState<ConflictPlace | null>(null);
  // biome-ignore lint/correctness/useExhaustiveDependencies: a new head means new choices.
  useEffect(() => {
    let current = true;
    void conflictChoices(sync, kind, id).then((c) => current && setChoices(c));
    void conflictPlace(store, kind, id).then((p) => current && setPlace(p));
    return () => {
      current = false;
    };
  }, [sync, store, kind, id, heads]);

  return (
    <div className="banner stack" data-testid={`conflict-${kind}`}>
      <span>
        {WHAT[kind]} changed on {heads} phones
        {place && <> ({place.href ? <a href={place.href}>{place.label}</a> : place.label})</>}.
      </span>
      <div className="row">
        {kind === 'corrections' && (
          <button
            type="button"
            className="btn"
            onClick={() => onSettled(() => mergeTaps(sync, id))}
          >
            Merge the taps
          </button>
        )}
        {choices.map((c) => (
          <button
            key={c.hash}
            type="button"
            className="btn quiet"
            onClick={() => onSettled(() => keepVersion(sync, kind, id, c.hash))}
          >
            Keep {c.mine ? 'this phone’s' : 'the other phone’s'}
            {c.deleted ? ' deletion' : ' version'} ({new Date(c.updatedAt).toLocaleTimeString()})
          </button>
        ))}
      </div>
    </div>
  );
}
