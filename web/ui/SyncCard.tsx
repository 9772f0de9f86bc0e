import { useEffect, useState } from 'react';
import { useServices } from '../app/services.ts';
import type { SyncStatus } from '../sync/status.ts';
import { ConflictRow } from './ConflictRow.tsx';

const PHASE_WORDS: Record<SyncStatus['phase'], string> = {
  off: 'Not shared: everything stays on this phone.',
  idle: 'Shared with the lab server.',
  syncing: 'Sending and fetching…',
  offline: 'No network: changes wait on this phone and go out when it is back.',
  retrying: 'The last attempt failed; trying again by itself.',
  refused: 'The server refused this phone: see below.',
};

/** Sharing with the lab's sync server: connect, status, and records edited on two phones. */
export function SyncCard() {
  const { sync } = useServices();
  const [status, setStatus] = useState<SyncStatus | null>(() => sync?.status() ?? null);
  const [url, setUrl] = useState('');
  const [token, setToken] = useState('');
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  useEffect(() => sync?.subscribe(setStatus), [sync]);
  if (!sync || !status) return null;
  const act = (work: () => Promise<string | null>) =>
    work().then(
      (text) => setNote(text ? { ok: true, text } : null),
      (e: unknown) => setNote({ ok: false, text: e instanceof Error ? e.message : String(e) }),
    );

  return (
    <section className="card stack" aria-label="Lab server">
      <h2>Lab server</h2>
      <p data-testid="sync-phase">{PHASE_WORDS[status.phase]}</p>
      {status.phase !== 'off' && (
        <p className="muted">
          {status.waiting} changes waiting
          {status.lastSuccessAt
            ? ` · last shared ${new Date(status.lastSuccessAt).toLocaleString()}`
            : ''}
        </p>
      )}
      {status.problem && <p className="banner alarm">{status.problem.message}</p>}
      {status.unreadable.length > 0 && (
        <p className="banner alarm" style={{ whiteSpace: 'pre-line' }}>
          {status.unreadable.join('\n')}
        </p>
      )}
      {status.conflicts.map((c) => (
        <ConflictRow
          key={`${c.kind}/${c.id}`}
          sync={sync}
          kind={c.kind}
          id={c.id}
          heads={c.heads}
          onSettled={(work) => act(work)}
        />
      ))}
      {status.phase === 'off' ? (
        <details>
          <summary>Share this phone's plates with the lab server</summary>
          <form
            className="stack"
            onSubmit={(e) => {
              e.preventDefault();
              act(async () => {
                const problem = await sync.connect({ serverUrl: url.trim(), token: token.trim() });
                return problem ? Promise.reject(new Error(problem.message)) : 'Connected.';
              });
            }}
          >
            <label className="field">
              Server address
              <input
                type="url"
                value={url}
                onChange={(e) => setUrl(e.target.value)}
                placeholder="https://rivalplate.lab.example"
              />
            </label>
            <label className="field">
              Token
              <input value={token} onChange={(e) => setToken(e.target.value)} autoComplete="off" />
            </label>
            <button type="submit" className="btn" disabled={!url.trim() || !token.trim()}>
              Connect
            </button>
          </form>
        </details>
      ) : (
        <div className="row">
          <button
            type="button"
            className="btn"
            onClick={() =>
              act(async () => {
                await sync.syncNow();
                return null;
              })
            }
          >
            Share now
          </button>
          <button
            type="button"
            className="btn quiet"
            onClick={() =>
              act(async () => {
                await sync.disconnect();
                return 'Sharing turned off.';
              })
            }
          >
            Stop sharing
          </button>
        </div>
      )}
      {note && <p className={note.ok ? 'muted' : 'field-error'}>{note.text}</p>}
    </section>
  );
}
