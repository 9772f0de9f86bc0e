import { useEffect, useState } from 'react';
import { useServices } from '../app/services.ts';
import { useOnline } from '../app/use-online.ts';
import { syncNote } from '../sync/status.ts';

/**
 * The sharing state in a few words on every screen, linking to the Lab server card; without a
 * lab server, still a word when the phone is offline (the app works on, and keeps everything).
 */
export function SyncNote() {
  const { sync } = useServices();
  const online = useOnline();
  const [note, setNote] = useState(() => (sync ? syncNote(sync.status()) : null));
  useEffect(() => sync?.subscribe((s) => setNote(syncNote(s))), [sync]);
  const shown = note ?? (online ? null : 'offline');
  if (!shown) return null;
  return (
    <a className="sync-note" href="#/" data-testid="sync-note">
      {shown}
    </a>
  );
}
