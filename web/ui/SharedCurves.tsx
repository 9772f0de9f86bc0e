import type { SharedCurveTest } from '../../fitness/nested-models.ts';
import type { ModelFailure } from '../../fitness/trajectories.ts';
import { pValue } from '../results/format.ts';
import { MODEL_NAMES } from '../results/model-trust.ts';

/**
 * Whether the lines follow one curve of each model: one fit with shared parameters against one
 * fit per line, by the extra-sum-of-squares F test (fitness/nested-models.ts).
 */
export function SharedCurves({ tests }: { tests: readonly (SharedCurveTest | ModelFailure)[] }) {
  if (tests.length === 0) return null;
  return (
    <section className="card" aria-label="Shared curve" data-testid="shared-curves">
      <h2>Do the lines share one curve?</h2>
      <ul>
        {tests.map((s) => {
          const name = MODEL_NAMES[s.model] ?? s.model;
          if ('reason' in s)
            return (
              <li key={s.model} className="muted">
                {name}: not tested ({s.reason})
              </li>
            );
          return (
            <li key={s.model}>
              {name}, one curve for {s.lines.join(', ')} against one per line:{' '}
              {s.test
                ? `F(${s.test.df1}, ${s.test.df2}) = ${s.test.f.toFixed(2)}, p ${pValue(s.test.p)}`
                : 'no test (the separate fits leave no residual)'}{' '}
              (residual sum of squares {s.shared.rss.toPrecision(3)} shared,{' '}
              {s.rssSeparate.toPrecision(3)} separate)
            </li>
          );
        })}
      </ul>
      <p className="muted">
        A small p says the lines do not follow one curve: read each line's own fit. A large p says
        one curve fits them all about as well.
      </p>
    </section>
  );
}
