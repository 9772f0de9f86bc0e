import type { LearningRecord } from '../../schema/records.ts';
import type { FitResult, ReadModel } from '../../worker/learning.ts';
import { counted } from './counted.ts';

/**
 * The words for learning from checked plates: which analysis read a plate, and what the
 * experiment has learned.
 */

/** What read a plate: "learned from 6 checked plates", or "the default analysis". */
export function readByWords(learnedFrom: number | null): string {
  return learnedFrom === null
    ? 'the default analysis'
    : `learned from ${counted(learnedFrom, 'checked plate', 'checked plates')}`;
}

/** The button that reads a plate again with what the experiment has learned now. */
export function rereadLabel(learnedFrom: number | null): string {
  return learnedFrom === null
    ? 'Re-read with the default analysis'
    : `Re-read with what ${counted(learnedFrom, 'checked plate', 'checked plates')} taught`;
}

/** The experiment's learning, in a sentence or two. */
export function learningSentence(learning: LearningRecord, read: ReadModel | null): string {
  if (!learning.enabled)
    return 'Learning is off: plates are read with the default analysis, and checked plates teach nothing.';
  if (!read)
    return 'Nothing learned yet: plates are read with the default analysis. Each plate you correct and mark checked teaches the readings of the next ones.';
  if (!read.ok)
    return `The learned model cannot be read (${read.error}). Plates are read with the default analysis; reset learning to start again.`;
  const m = read.model;
  const what = `Learned from ${counted(m.plates, 'checked plate', 'checked plates')} (${counted(m.examples.colonies, 'colony', 'colonies')} and ${counted(m.examples.other, 'other object', 'other objects')}); new readings use it.`;
  return read.decides
    ? `${what} It decides which objects are colonies and which colour each is.`
    : `${what} It sorts the colours; with ${read.coloniesNeeded} checked colonies it will also decide which objects are colonies.`;
}

/** Why a refit left the experiment with nothing learned. */
export function notLearnedSentence(reason: string): string {
  return `Nothing learned from the checked plates yet: ${reason}.`;
}

/** What a refit after a checked plate gave. */
export function refitSentence(fit: FitResult): string {
  return fit.ok
    ? `Checked. The experiment has now ${readByWords(fit.plates)}; the next plates are read with it.`
    : notLearnedSentence(fit.reason);
}
