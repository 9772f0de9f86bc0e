import { useState } from 'react';
import { useServices } from '../app/services.ts';
import { useDraft } from '../app/use-draft.ts';
import { BLANK_EXPERIMENT, newExperiment, parseLines } from '../bench/experiments.ts';
import { INDICATOR_MEDIA, markerColours, mediumById } from '../bench/media.ts';
import { NumberField } from './NumberField.tsx';

/** Calls `onDone` with the new experiment's id, or with null when cancelled. */
export function NewExperimentForm({ onDone }: { onDone: (id: string | null) => void }) {
  const { store } = useServices();
  const [form, setForm, clearForm] = useDraft('new-experiment', () => ({
    name: '',
    lines: BLANK_EXPERIMENT.lines.join(', '),
    reference: BLANK_EXPERIMENT.referenceName,
    transfer: BLANK_EXPERIMENT.transferDilution as number | null,
    dilution: BLANK_EXPERIMENT.defaultDilutionFold as number | null,
    volume: BLANK_EXPERIMENT.defaultVolumeUl as number | null,
    medium: INDICATOR_MEDIA[0]!.id,
    colour1: '',
    colour2: '',
  }));
  const field =
    <K extends keyof typeof form>(key: K) =>
    (v: (typeof form)[K]) =>
      setForm((f) => ({ ...f, [key]: v }));
  const { name, lines, reference, transfer, dilution, volume } = form;
  const medium = mediumById(form.medium);
  const [error, setError] = useState<string | null>(null);

  async function save() {
    const parsedLines = parseLines(lines);
    if (!name.trim()) return setError('Give the experiment a name.');
    if (parsedLines.length === 0) return setError('List at least one line (e.g. L1, L2).');
    if (!transfer || !dilution || !volume)
      return setError('Transfer dilution, plate dilution and volume must be numbers above 0.');
    const colours = markerColours(medium, [form.colour1, form.colour2]);
    if (typeof colours === 'string') return setError(colours);
    const e = newExperiment({
      name: name.trim(),
      lines: parsedLines,
      referenceName: reference.trim() || 'reference',
      transferDilution: transfer,
      defaultDilutionFold: dilution,
      defaultVolumeUl: volume,
      markerColours: colours,
    });
    await store.put('experiments', e);
    clearForm();
    onDone(e.id);
  }

  return (
    <form
      className="stack"
      onSubmit={(ev) => {
        ev.preventDefault();
        save().catch((e: unknown) =>
          setError(`Not saved: ${e instanceof Error ? e.message : String(e)}`),
        );
      }}
    >
      <label className="field">
        Experiment name
        <input
          value={name}
          onChange={(e) => field('name')(e.target.value)}
          placeholder="e.g. Pond isolate, spring run"
        />
      </label>
      <label className="field">
        Evolved lines
        <input value={lines} onChange={(e) => field('lines')(e.target.value)} />
      </label>
      <label className="field">
        Reference strain
        <input value={reference} onChange={(e) => field('reference')(e.target.value)} />
      </label>
      <div className="grid3">
        <NumberField
          label="Transfer dilution (fold)"
          value={transfer}
          onChange={field('transfer')}
        />
        <NumberField label="Plate dilution (fold)" value={dilution} onChange={field('dilution')} />
        <NumberField label="Volume plated (µL)" value={volume} onChange={field('volume')} />
      </div>
      <label className="field">
        Indicator medium
        <select value={form.medium} onChange={(e) => field('medium')(e.target.value)}>
          {INDICATOR_MEDIA.map((m) => (
            <option key={m.id} value={m.id}>
              {m.label}
            </option>
          ))}
        </select>
      </label>
      <div className="grid2">
        <label className="field">
          Colour 1 is called
          <input
            value={form.colour1}
            placeholder={medium.colours[0].name}
            onChange={(e) => field('colour1')(e.target.value)}
          />
        </label>
        <label className="field">
          Colour 2 is called
          <input
            value={form.colour2}
            placeholder={medium.colours[1].name}
            onChange={(e) => field('colour2')(e.target.value)}
          />
        </label>
      </div>
      <p className="muted">
        These names go on every screen and every file. How the two colours look on your plates is
        learned from the plates you mark checked, or taught by tapping one colony of each.
      </p>
      {error && <p className="field-error">{error}</p>}
      <div className="row">
        <button type="submit" className="btn primary">
          Create experiment
        </button>
        <button
          type="button"
          className="btn quiet"
          onClick={() => {
            clearForm();
            onDone(null);
          }}
        >
          Cancel
        </button>
      </div>
    </form>
  );
}
