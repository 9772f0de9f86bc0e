import { useState } from 'react';
import type { ClassIndex } from '../../schema/records.ts';
import { useServices } from '../app/services.ts';
import { useDraft } from '../app/use-draft.ts';
import {
  type AssayDraft,
  defaultGroup,
  groupProblem,
  newAssay,
  nextAssayDraft,
  nextReplicate,
} from '../bench/assays.ts';
import { classLooks } from '../bench/colours.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { NumberField } from './NumberField.tsx';

type DraftFields = { [K in keyof AssayDraft]: AssayDraft[K] | null };

export function AssayForm({ data, onClose }: { data: ExperimentData; onClose: () => void }) {
  const { store } = useServices();
  const [draft, setDraft, clearDraft] = useDraft<DraftFields>(
    `assay-form.${data.experiment.id}`,
    () => nextAssayDraft(data.experiment, data.assays, data.plates, data.samples),
  );
  const [error, setError] = useState<string | null>(null);
  const looks = classLooks(data.experiment);
  const set =
    <K extends keyof AssayDraft>(key: K) =>
    (v: AssayDraft[K] | null) =>
      setDraft((d) => ({ ...d, [key]: v }));
  /** Line, generation and group choose the group: the replicate number follows it. */
  const setPlace =
    <K extends 'line' | 'generation' | 'group'>(key: K) =>
    (v: AssayDraft[K] | null) =>
      setDraft((d) => {
        const next = { ...d, [key]: v };
        const place = {
          line: next.line ?? '',
          generation: next.generation ?? 0,
          group: next.group ?? '',
        };
        return { ...next, replicate: nextReplicate(data.assays, place) };
      });

  async function save(keepOpen: boolean) {
    const missing = (Object.keys(draft) as (keyof AssayDraft)[]).filter((k) => draft[k] === null);
    if (missing.length) return setError(`Check the fields marked in red (${missing.join(', ')}).`);
    const complete = draft as AssayDraft;
    const problem = groupProblem(data.assays, complete);
    if (problem) return setError(problem);
    const made = newAssay(data.experiment, complete);
    await store.putBatch({ assays: [made.assay], samples: made.samples, plates: made.plates });
    setError(null);
    // What was typed while the assay was being stored stays; the replicate moves on.
    if (keepOpen)
      setDraft((d) => ({
        ...d,
        replicate: nextReplicate([...data.assays, made.assay], {
          line: d.line ?? '',
          generation: d.generation ?? 0,
          group: d.group ?? '',
        }),
      }));
    else {
      clearDraft();
      onClose();
    }
  }
  const onSave = (keepOpen: boolean) =>
    save(keepOpen).catch((e: unknown) =>
      setError(`Not saved: ${e instanceof Error ? e.message : String(e)}`),
    );

  return (
    <section className="card stack" aria-label="New assay">
      <h2>New assay</h2>
      <div className="grid3">
        <label className="field">
          Line
          <select value={draft.line ?? ''} onChange={(e) => setPlace('line')(e.target.value)}>
            {data.experiment.lines.map((l) => (
              <option key={l}>{l}</option>
            ))}
          </select>
        </label>
        <NumberField
          label="Generation"
          value={draft.generation}
          onChange={setPlace('generation')}
          whole
        />
        <NumberField label="Replicate" value={draft.replicate} onChange={set('replicate')} whole />
      </div>
      <fieldset className="field" style={{ border: 0, padding: 0, margin: 0 }}>
        <legend className="muted" style={{ fontWeight: 600 }}>
          The evolved line's colonies are
        </legend>
        <div className="row">
          {looks.map((l, i) => (
            <button
              key={l.name}
              type="button"
              className="btn"
              aria-pressed={draft.testClass === i}
              onClick={() => set('testClass')(i as ClassIndex)}
            >
              <span className="dot" style={{ background: l.hex }} /> {l.name}
            </button>
          ))}
        </div>
      </fieldset>
      <div className="grid3">
        <NumberField
          label="Start plate dilution"
          value={draft.startDilutionFold}
          onChange={set('startDilutionFold')}
        />
        <NumberField
          label="End plate dilution"
          value={draft.endDilutionFold}
          onChange={set('endDilutionFold')}
        />
        <NumberField label="Volume (µL)" value={draft.volumeUl} onChange={set('volumeUl')} />
      </div>
      <div className="grid2">
        <NumberField
          label="Dilution between samples (fold)"
          value={draft.foldDilutionSinceStart}
          onChange={set('foldDilutionSinceStart')}
        />
        <NumberField label="Days" value={draft.days} onChange={set('days')} />
      </div>
      <label className="field">
        Block: the day or batch it is run in (optional)
        <input
          value={draft.block ?? ''}
          data-testid="assay-block"
          placeholder="e.g. day 1"
          onChange={(e) => set('block')(e.target.value)}
        />
      </label>
      <label className="field">
        Group (blank: line and generation)
        <input
          value={draft.group ?? ''}
          placeholder={defaultGroup(draft.line ?? '', draft.generation ?? 0)}
          onChange={(e) => setPlace('group')(e.target.value)}
        />
      </label>
      {error && <p className="field-error">{error}</p>}
      <div className="row">
        <button type="button" className="btn primary" onClick={() => onSave(false)}>
          Save assay
        </button>
        <button type="button" className="btn" onClick={() => onSave(true)}>
          Save, next replicate
        </button>
        <button
          type="button"
          className="btn quiet"
          onClick={() => {
            clearDraft();
            onClose();
          }}
        >
          Close
        </button>
      </div>
    </section>
  );
}
