import { useLive } from '../app/use-live.ts';
import { saveBlob } from '../exchange/download.ts';
import { unreadableJson } from '../exchange/unreadable-file.ts';

/**
 * Records kept on this phone that fail the checks on reading (an older or damaged copy): left out
 * of every screen, so they are listed here, which and why, with a way to take them out as they are.
 */
export function UnreadableCard() {
  const live = useLive((s) => s.store.unreadable(), []);
  if (live.state !== 'ready' || live.value.length === 0) return null;
  const records = live.value;
  return (
    <section className="card stack" aria-label="Unreadable records">
      <h2>Records this phone cannot read</h2>
      <p className="muted">
        They are kept as they are, but no screen shows them. Export them to keep a copy or to have
        them repaired.
      </p>
      <ul>
        {records.map((r) => (
          <li key={`${r.kind}/${r.id}`}>{r.reason}</li>
        ))}
      </ul>
      <button
        type="button"
        className="btn"
        onClick={() =>
          saveBlob(
            new Blob([unreadableJson(records)], { type: 'application/json' }),
            'rivalplate-unreadable.json',
          )
        }
      >
        Export them as they are
      </button>
    </section>
  );
}
