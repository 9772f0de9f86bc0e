/**
 * A whole sync round, as the app and its service worker both run it: the records pushed and
 * pulled (sync-round.ts), then, when the lab takes photos, the photos the server lacks.
 */
import type { LabInfo } from '../../schema/sync-protocol.ts';
import { oneRoundAtATime } from './one-at-a-time.ts';
import { sendNewPhotos } from './photo-upload.ts';
import { type RoundDeps, type RoundResult, syncRound } from './sync-round.ts';

export interface LabRound {
  result: RoundResult;
  /** The lab's settings, learnt from the server when they were not known before the round. */
  lab: LabInfo | null;
}

export function labRound(deps: RoundDeps, known: LabInfo | null): Promise<LabRound> {
  return oneRoundAtATime(async () => {
    const result = await syncRound(deps);
    if (!result.ok) return { result, lab: known };
    let lab = known;
    if (!lab) {
      const info = await deps.transport.lab();
      if (info.ok) lab = info.value;
    }
    if (lab?.photos.enabled) await sendNewPhotos(deps, lab.photos.maxBytes);
    return { result, lab };
  });
}
