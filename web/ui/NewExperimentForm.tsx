import { useState } from 'react';
import { useServices } from '../app/services.ts';
import { BLANK_EXPERIMENT, newExperiment, parseLines } from '../bench/experiments.ts';
import { NumberField } from './NumberField.tsx';

/** Calls `onDone` with the new experiment's id, or with null when cancelled. */
export function NewExperimentForm({ onDone }: { onDone: (id: string | null) => void }) {
  const { store } = useServices();
  const [name, setName] = useState('');
  const [lines, setLines] = useState(BLANK_EXPERIMENT.lines.join(', '));
  const [reference, setReference] = useState(BLANK_EXPERIMENT.referenceName);
  const [transfer, setTransfer] = useState<number | null>(BLANK_EXPERIMENT.transferDilution);
  const [dilution, setDilution] = useState<number | null>(BLANK_EXPERIMENT.defaultDilutionFold);
  const [volume, setVolume] = useState<number | null>(BLANK_EXPERIMENT.defaultVolumeUl);
  const [error, setError] = useState<string | null>(null);

  async function save() {
    const parsedLines = parseLines(lines);
    if (!name.trim()) return setError('Give the experiment a name.');
    if (parsedLines.length === 0) return setError('List at least one line (e.g. L1, L2).');
    if (!transfer || !dilution || !volume)
      return setError('Transfer dilution, plate dilution and volume must be numbers above 0.');
    const e = newExperiment({
      name: name.trim(),
      lines: parsedLines,
      referenceName: reference.trim() || 'reference',
      transferDilution: transfer,
      defaultDilutionFold: dilution,
      defaultVolumeUl: volume,
    });
    await store.put('experiments', e);
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
          onChange={(e) => setName(e.target.value)}
          placeholder="e.g. Pond isolate, spring run"
        />
      </label>
      <label className="field">
        Evolved lines
        <input value={lines} onChange={(e) => setLines(e.target.value)} />
      </label>
      <label className="field">
        Reference strain
        <input value={reference} onChange={(e) => setReference(e.target.value)} />
      </label>
      <div className="grid3">
        <NumberField label="Transfer dilution (fold)" value={transfer} onChange={setTransfer} />
        <NumberField label="Plate dilution (fold)" value={dilution} onChange={setDilution} />
        <NumberField label="Volume plated (µL)" value={volume} onChange={setVolume} />
      </div>
      <p className="muted">
        The two marker colours are learned from the first plate you photograph; you can teach them
        by tapping too.
      </p>
      {error && <p className="field-error">{error}</p>}
      <div className="row">
        <button type="submit" className="btn primary">
          Create experiment
        </button>
        <button type="button" className="btn quiet" onClick={() => onDone(null)}>
          Cancel
        </button>
      </div>
    </form>
  );
}
