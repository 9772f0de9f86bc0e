import { useEffect, useState } from 'react';
import { useServices } from '../app/services.ts';
import { syncNote } from '../sync/status.ts';

/** The sharing state in a few words on every screen, linking to the Lab server card. */
export function SyncNote() {
  const { sync } = useServices();
  const [note, setNote] = useState(() => (sync ? syncNote(sync.status()) : null));
  useEffect(() => sync?.subscribe((s) => setNote(syncNote(s))), [sync]);
  if (!note) return null;
  return (
    <a className="sync-note" href="#/" data-testid="sync-note">
      {note}
    </a>
  );
}
