import { useState } from 'react';
import { countableStatus, DEFAULT_COUNTABLE_RANGE } from '../../fitness/countable-range.ts';
import type { Assay, Plate, Sample } from '../../schema/records.ts';
import { hrefOf } from '../app/route.ts';
import { useServices } from '../app/services.ts';
import { useDraft } from '../app/use-draft.ts';
import { saving } from '../app/write-failure.ts';
import { plateRecordIds } from '../bench/delete.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { plateCount } from '../bench/plate-counts.ts';
import { revised } from '../storage/stamp.ts';
import { plateFlagLabel, storedFlagSentence } from '../words/flag-words.ts';
import { ConfirmButton } from './ConfirmButton.tsx';
import { NumberField } from './NumberField.tsx';

export function PlateRow({
  plate,
  sample,
  assay,
  data,
  deletable,
}: {
  plate: Plate;
  sample: Sample;
  assay: Assay;
  data: ExperimentData;
  /** The sample has other plates: this one may go (a sample keeps at least one). */
  deletable: boolean;
}) {
  const { store } = useServices();
  const [editing, setEditing, clearEditing] = useDraft(`plate-editing.${plate.id}`, () => false);
  const analysis = data.analyses.get(plate.id);
  const count = plateCount(plate, assay, analysis, data.corrections.get(plate.id));
  const status = count
    ? countableStatus(count.test + count.reference, DEFAULT_COUNTABLE_RANGE)
    : null;
  const testId = `plate-${assay.line}-g${assay.generation}-r${assay.replicate}-${sample.timepoint}-${plate.dilutionFold}`;
  return (
    <div data-testid={testId}>
      <div className="plate-row">
        <span className="when">{sample.timepoint}</span>
        <div>
          <div className="num">
            1:{plate.dilutionFold.toLocaleString('en')} · {plate.volumeUl} µL
          </div>
          {count ? (
            <div className="num" data-testid="plate-count">
              <b>{count.test}</b> test · <b>{count.reference}</b> ref{' '}
              <span className="muted">
                ({count.source === 'typed' ? 'typed' : plate.reviewed ? 'photo, checked' : 'photo'})
              </span>
            </div>
          ) : (
            <div className="muted">{plate.photoId ? 'photo not read yet' : 'no count yet'}</div>
          )}
          {status && status !== 'countable' && (
            <span className="flag">
              {status === 'too-few' ? 'too few' : 'too many'} to count (
              {DEFAULT_COUNTABLE_RANGE.source})
            </span>
          )}
          {analysis?.flags.map((f) => (
            <span key={f.kind} className="flag" title={storedFlagSentence(f)}>
              {plateFlagLabel(f.kind)}
            </span>
          ))}
        </div>
        <div className="actions">
          <a
            className="btn"
            href={hrefOf({ screen: 'plate', experimentId: assay.experimentId, plateId: plate.id })}
            aria-label={`Photo of ${sample.timepoint} plate`}
          >
            Photo
          </a>
          <button
            type="button"
            className="btn quiet"
            onClick={() => setEditing((v) => !v)}
            aria-expanded={editing}
          >
            Type
          </button>
        </div>
      </div>
      {editing && (
        <PlateEditor
          plate={plate}
          onSave={async (change) => {
            await store.put('plates', revised(plate, change));
            clearEditing();
          }}
        />
      )}
      {editing && deletable && (
        <ConfirmButton
          label="Delete this plate"
          armed="Tap again: the plate and its photo go"
          onConfirm={() =>
            saving('the deletion of the plate', () =>
              plateRecordIds(store, plate).then((ids) => store.remove(ids)),
            )
          }
        />
      )}
    </div>
  );
}

function PlateEditor({
  plate,
  onSave,
}: {
  plate: Plate;
  onSave: (change: Partial<Plate>) => Promise<void>;
}) {
  const [form, setForm, clearForm] = useDraft(`plate-edit.${plate.id}`, () => ({
    dilution: plate.dilutionFold as number | null,
    volume: plate.volumeUl as number | null,
    test: plate.typedCounts?.test ?? (null as number | null),
    ref: plate.typedCounts?.reference ?? (null as number | null),
  }));
  const field = (key: keyof typeof form) => (v: number | null) =>
    setForm((f) => ({ ...f, [key]: v }));
  const { dilution, volume, test, ref } = form;
  const [error, setError] = useState<string | null>(null);
  const typed = test !== null || ref !== null;
  return (
    <form
      className="card stack"
      style={{ marginTop: 6 }}
      onSubmit={(e) => {
        e.preventDefault();
        if (dilution === null || volume === null)
          return setError('Dilution and volume must be numbers above 0.');
        if (typed && (test === null || ref === null))
          return setError('Type both counts, or leave both empty.');
        onSave({
          dilutionFold: dilution,
          volumeUl: volume,
          typedCounts: typed ? { test: test!, reference: ref! } : null,
        })
          .then(clearForm)
          .catch((err: unknown) =>
            setError(`Not saved: ${err instanceof Error ? err.message : String(err)}`),
          );
      }}
    >
      <div className="grid2">
        <NumberField label="Dilution (fold)" value={dilution} onChange={field('dilution')} />
        <NumberField label="Volume (µL)" value={volume} onChange={field('volume')} />
        <NumberField label="Test colonies" value={test} onChange={field('test')} whole optional />
        <NumberField
          label="Reference colonies"
          value={ref}
          onChange={field('ref')}
          whole
          optional
        />
      </div>
      {plate.photoId && (
        <p className="muted">
          Typed counts take the place of the photo's count; clear both to use the photo again.
        </p>
      )}
      {error && <p className="field-error">{error}</p>}
      <button type="submit" className="btn primary">
        Save plate
      </button>
    </form>
  );
}
