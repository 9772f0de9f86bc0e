import type { ClassIndex, ColonyRecord } from '../../schema/records.ts';
import type { ClassLook } from '../bench/colours.ts';
import type { UnsureAnswer } from '../review/unsure.ts';
import type { Frame } from '../review/view.ts';

/**
 * One colony the analysis was unsure of, shown large with the agar around it, and the three
 * answers a person can give with one tap.
 */
export function UnsureStep({
  previewUrl,
  frame,
  colony,
  looks,
  position,
  total,
  onAnswer,
  onStop,
}: {
  previewUrl: string;
  frame: Frame;
  colony: ColonyRecord;
  looks: [ClassLook, ClassLook];
  position: number;
  total: number;
  onAnswer: (answer: UnsureAnswer) => void;
  onStop: () => void;
}) {
  const half = Math.max(colony.r * 5, frame.size / 24);
  return (
    <section className="card stack unsure-step" aria-label="Unsure colonies" data-testid="unsure">
      <div className="row spread">
        <b>
          Unsure colony {position} of {total}
        </b>
        <button type="button" className="btn quiet" onClick={onStop}>
          Done
        </button>
      </div>
      <svg
        viewBox={`${colony.x - half} ${colony.y - half} ${2 * half} ${2 * half}`}
        role="img"
        aria-label="The colony, enlarged"
      >
        <image href={previewUrl} width={frame.width} height={frame.height} />
        <circle cx={colony.x} cy={colony.y} r={colony.r * 1.5} className="unsure-ring" />
      </svg>
      <div className="answers">
        {([0, 1] as ClassIndex[]).map((i) => (
          <button
            key={i}
            type="button"
            className="btn"
            data-testid={`answer-${i}`}
            aria-pressed={colony.cls === i}
            onClick={() => onAnswer(i)}
          >
            <span className="dot" style={{ background: looks[i].hex }} /> {looks[i].name}
          </button>
        ))}
        <button
          type="button"
          className="btn"
          data-testid="answer-none"
          onClick={() => onAnswer('not-a-colony')}
        >
          Not a colony
        </button>
      </div>
    </section>
  );
}
