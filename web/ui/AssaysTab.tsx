import { useDraft } from '../app/use-draft.ts';
import { classLooks } from '../bench/colours.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { counted } from '../words/counted.ts';
import { AssayCard } from './AssayCard.tsx';
import { AssayForm } from './AssayForm.tsx';
import { LearningCard } from './LearningCard.tsx';
import { PaletteCard } from './PaletteCard.tsx';

export function AssaysTab({ data }: { data: ExperimentData }) {
  const [adding, setAdding] = useDraft(
    `assay-form-open.${data.experiment.id}`,
    () => data.assays.length === 0,
  );
  const looks = classLooks(data.experiment);
  const lines = [...new Set(data.assays.map((a) => a.line))];
  // Which lines are unfolded, kept so that coming back from a plate finds the same view.
  const [open, setOpen] = useDraft<string[] | null>(`lines-open.${data.experiment.id}`, () => null);
  return (
    <>
      <PaletteCard data={data} />
      <LearningCard data={data} />
      {adding ? (
        <AssayForm data={data} onClose={() => setAdding(false)} />
      ) : (
        <button
          type="button"
          className="btn primary"
          style={{ width: '100%', marginBottom: 12 }}
          onClick={() => setAdding(true)}
        >
          New assay
        </button>
      )}
      {lines.map((line, i) => (
        <details
          key={line}
          open={open === null ? i === 0 : open.includes(line)}
          onToggle={(e) => {
            const isOpen = e.currentTarget.open;
            setOpen((o) => {
              const now = o ?? lines.slice(0, 1);
              return isOpen ? [...new Set([...now, line])] : now.filter((l) => l !== line);
            });
          }}
          className="card"
        >
          <summary style={{ fontWeight: 700, minHeight: 40 }}>
            Line {line} ·{' '}
            {counted(data.assays.filter((a) => a.line === line).length, 'assay', 'assays')}
          </summary>
          {data.assays
            .filter((a) => a.line === line)
            .map((a) => (
              <AssayCard key={a.id} assay={a} data={data} looks={looks} />
            ))}
        </details>
      ))}
    </>
  );
}
