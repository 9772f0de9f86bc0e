import { useSyncExternalStore } from 'react';
import { dismissWriteFailure, subscribeWriteFailure, writeFailure } from '../app/write-failure.ts';

/** The last write that failed, on every screen until the person has read it. */
export function WriteFailureBanner() {
  const failure = useSyncExternalStore(subscribeWriteFailure, writeFailure);
  if (!failure) return null;
  return (
    <div className="banner alarm" role="alert">
      <span>
        Not saved: {failure.what} ({failure.reason}). Nothing else was changed; try again.
      </span>
      <button type="button" className="btn quiet" onClick={dismissWriteFailure}>
        OK
      </button>
    </div>
  );
}
