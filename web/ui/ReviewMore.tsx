import { countableStatus, DEFAULT_COUNTABLE_RANGE } from '../../fitness/countable-range.ts';

/** What the review needs now and then: the countable range, redo, teaching colours, the picture. */
export function ReviewMore(p: {
  counts: [number, number];
  /** What the analysis found before any correction. */
  found: [number, number];
  canRedo: boolean;
  onRedo: () => void;
  onTeach: () => void;
  onSavePicture: () => void;
}) {
  const total = p.counts[0] + p.counts[1];
  const status = countableStatus(total, DEFAULT_COUNTABLE_RANGE);
  const changed = p.found[0] !== p.counts[0] || p.found[1] !== p.counts[1];
  return (
    <details className="card review-more">
      <summary>
        {total} colonies ·{' '}
        {status === 'countable' ? (
          `within ${DEFAULT_COUNTABLE_RANGE.source}`
        ) : (
          <span className="flag">
            {status === 'too-few' ? 'too few' : 'too many'} to count (
            {DEFAULT_COUNTABLE_RANGE.source})
          </span>
        )}
      </summary>
      <p className="muted" data-testid="range">
        The analysis found {p.found[0]} + {p.found[1]}
        {changed ? `, now ${p.counts[0]} + ${p.counts[1]}` : ''}. Broken rings: colour uncertain;
        dashed: added by hand.
      </p>
      <div className="row">
        <button
          type="button"
          className="btn quiet"
          onClick={p.onRedo}
          disabled={!p.canRedo}
          data-testid="redo"
        >
          Redo
        </button>
        <button type="button" className="btn quiet" data-testid="tool-teach" onClick={p.onTeach}>
          Teach colours
        </button>
        <button type="button" className="btn quiet" onClick={p.onSavePicture}>
          Save picture
        </button>
      </div>
    </details>
  );
}
