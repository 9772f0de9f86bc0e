import { useEffect, useState } from 'react';
import { useServices } from '../app/services.ts';
import {
  formatBytes,
  QUOTA_WARNING,
  requestPersistence,
  type StorageStatus,
  storageStatus,
} from '../storage/quota.ts';

export function StorageCard() {
  const { store } = useServices();
  const [status, setStatus] = useState<StorageStatus | null>(null);
  useEffect(() => {
    const refresh = () => void storageStatus().then(setStatus);
    refresh();
    return store.subscribe(refresh);
  }, [store]);
  if (!status) return null;
  const share =
    status.usedBytes !== null && status.quotaBytes ? status.usedBytes / status.quotaBytes : null;
  return (
    <section className="card" aria-label="Storage on this device">
      <h2>Storage on this device</h2>
      {share !== null && share > QUOTA_WARNING && (
        <p className="banner alarm">
          Space is running out ({Math.round(share * 100)}% used). Export a backup and remove old
          experiments before photographing more plates.
        </p>
      )}
      <p data-testid="storage-used">
        {status.usedBytes === null
          ? 'This browser does not say how much space is used.'
          : `${formatBytes(status.usedBytes)} used of ${status.quotaBytes ? formatBytes(status.quotaBytes) : 'an unknown amount'}.`}
      </p>
      <p className="muted">
        {status.persisted
          ? 'Kept safe: the browser will not clear this data to free space.'
          : 'The browser may clear this data when the device runs short of space.'}
      </p>
      {!status.persisted && (
        <button
          type="button"
          className="btn"
          onClick={() => void requestPersistence().then(() => storageStatus().then(setStatus))}
        >
          Ask to keep data safe
        </button>
      )}
    </section>
  );
}
