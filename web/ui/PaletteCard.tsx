import { useState } from 'react';
import { learnColours } from '../analysis/teach.ts';
import { useServices } from '../app/services.ts';
import { classLooks } from '../bench/colours.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { renamedColours } from '../bench/media.ts';
import { revised } from '../storage/stamp.ts';

export function PaletteCard({ data }: { data: ExperimentData }) {
  const { store, worker } = useServices();
  const [note, setNote] = useState<string | null>(null);
  const [names, setNames] = useState<[string, string]>(['', '']);
  const p = data.experiment.palette;
  const looks = classLooks(data.experiment);
  const checked = data.plates.filter((pl) => pl.reviewed && data.analyses.has(pl.id)).length;
  return (
    <section className="card" aria-label="Marker colours">
      <div className="row spread">
        <h3 style={{ margin: 0 }}>Marker colours</h3>
        <div className="row">
          {looks.map((l) => (
            <span key={l.name} className="chip">
              <span className="dot" style={{ background: l.hex }} />
              {l.name}
            </span>
          ))}
        </div>
      </div>
      <p className="muted" style={{ marginBottom: 0 }}>
        {p
          ? p.source === 'taught'
            ? 'Taught by tapping one colony of each colour. Every plate is sorted against these two.'
            : 'Learned from checked plates. To teach them yourself, open a plate and use "Teach colours".'
          : 'How they look is learned from the first plates you mark checked (plates with a warning are left out), or taught by tapping one colony of each on a plate.'}
      </p>
      <details>
        <summary style={{ minHeight: 40 }}>Rename the colours</summary>
        <form
          className="stack"
          onSubmit={(ev) => {
            ev.preventDefault();
            const colours = renamedColours(data.experiment.markerColours, names);
            if (typeof colours === 'string') return setNote(colours);
            store.put('experiments', revised(data.experiment, { markerColours: colours })).then(
              () => {
                setNames(['', '']);
                setNote(
                  `Renamed: ${colours[0].name} and ${colours[1].name}; every count stays with its colour.`,
                );
              },
              (e: unknown) => setNote(`Not renamed: ${e instanceof Error ? e.message : String(e)}`),
            );
          }}
        >
          <div className="grid2">
            {looks.map((l, i) => (
              <label key={l.name} className="field">
                Colour {i + 1}
                <input
                  value={names[i]}
                  placeholder={l.name}
                  onChange={(e) =>
                    setNames((n) => (i === 0 ? [e.target.value, n[1]] : [n[0], e.target.value]))
                  }
                />
              </label>
            ))}
          </div>
          <button type="submit" className="btn">
            Save names
          </button>
        </form>
      </details>
      {checked > 1 && (
        <button
          type="button"
          className="btn quiet"
          style={{ marginTop: 8 }}
          onClick={() => {
            setNote('Learning from the checked plates…');
            learnColours(store, worker, data.experiment).then(
              (ok) =>
                setNote(
                  ok
                    ? 'Learned; the plates not yet checked are re-sorted, the checked ones keep their counts.'
                    : 'The checked plates without a warning do not show two colours to learn from.',
                ),
              (e: unknown) => setNote(`Not learned: ${e instanceof Error ? e.message : String(e)}`),
            );
          }}
        >
          Learn from the {checked} checked plates
        </button>
      )}
      {note && (
        <p className="muted" role="status">
          {note}
        </p>
      )}
    </section>
  );
}
