import type { CountAccuracy } from '../review/accuracy.ts';
import type { LabAccuracy } from '../review/lab-accuracy.ts';
import { counted } from '../words/counted.ts';

const percent = (fraction: number) => `${(fraction * 100).toFixed(1)}%`;

/** The lab's own figure for the automatic count, and apart before and after learning. */
export function AccuracyCard({ accuracy }: { accuracy: LabAccuracy | null }) {
  return (
    <section className="card" aria-label="Counting accuracy">
      <h2>How good is the automatic count?</h2>
      {accuracy ? (
        <>
          <p data-testid="accuracy">
            On <b>{counted(accuracy.all.plates, 'checked plate', 'checked plates')}</b> of your own,
            you corrected <b>{percent(accuracy.all.correctionFraction)}</b> of the colonies (
            {counted(accuracy.all.corrections, 'colony', 'colonies')} added, removed or switched, of{' '}
            {counted(accuracy.all.correctedTotal, 'colony', 'colonies')}); median error of a plate's
            total: {percent(accuracy.all.medianTotalError)}.
          </p>
          {accuracy.learned && (
            <p data-testid="accuracy-learning">
              Corrections per colony {part('read by the default analysis', accuracy.byDefault)};{' '}
              {part('read with what the experiment had learned', accuracy.learned)}.
            </p>
          )}
        </>
      ) : (
        <p className="muted">
          Mark plates as checked after correcting them, and the figure for your lab's plates appears
          here.
        </p>
      )}
    </section>
  );
}

function part(what: string, a: CountAccuracy | null): string {
  return a
    ? `on the ${counted(a.plates, 'plate', 'plates')} ${what}: ${percent(a.correctionFraction)}`
    : `no checked plate ${what}`;
}
