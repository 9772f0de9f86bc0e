import type { Reading } from '../analysis/use-reading.ts';

/**
 * Words for the stages the worker and the analysis core report (cv/analyze.ts names them); a
 * stage not listed here reads as plain "Working", never as its internal name.
 */
const STAGE_WORDS: Record<string, string> = {
  starting: 'Starting',
  fetch: 'Fetching the photo from the lab server',
  decode: 'Opening the photo',
  opencv: 'Loading the plate reader',
  dish: 'Finding the dish',
  'working-image': 'Preparing the picture',
  background: 'Evening out the light',
  foreground: 'Finding colonies',
  split: 'Separating touching colonies',
  measure: 'Measuring colours',
  classify: 'Sorting the colours',
  focus: 'Checking the focus',
};

export function ReadingStatus({ reading, onCancel }: { reading: Reading; onCancel: () => void }) {
  if (reading.state === 'idle') return null;
  if (reading.state === 'failed')
    return (
      <p className="banner alarm" role="alert">
        The plate could not be read: {reading.error}
      </p>
    );
  return (
    <section className="card stack" role="status" aria-live="polite" data-testid="reading">
      <div className="row spread">
        <b>Reading the plate… {STAGE_WORDS[reading.stage] ?? 'Working'}</b>
        <button type="button" className="btn quiet" onClick={onCancel}>
          Stop
        </button>
      </div>
      <div className="progress">
        <div style={{ width: `${Math.round(reading.fraction * 100)}%` }} />
      </div>
    </section>
  );
}
