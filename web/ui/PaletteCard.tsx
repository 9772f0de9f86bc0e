import { useState } from 'react';
import { learnColours } from '../analysis/teach.ts';
import { useServices } from '../app/services.ts';
import { classLooks } from '../bench/colours.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';

export function PaletteCard({ data }: { data: ExperimentData }) {
  const { store, worker } = useServices();
  const [note, setNote] = useState<string | null>(null);
  const p = data.experiment.palette;
  const looks = classLooks(data.experiment);
  const read = data.analyses.size;
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
            : 'Learned from the plates read. To teach them yourself, open a plate and use "Teach colours".'
          : 'Not known yet: they are learned from the first plate you photograph that shows both colours.'}
      </p>
      {read > 1 && (
        <button
          type="button"
          className="btn quiet"
          style={{ marginTop: 8 }}
          onClick={() => {
            setNote('Learning from every plate read so far…');
            learnColours(store, worker, data.experiment).then(
              (ok) =>
                setNote(
                  ok
                    ? `Learned from ${read} plates; every plate re-sorted.`
                    : 'These plates do not show two colours to learn from.',
                ),
              (e: unknown) => setNote(`Not learned: ${e instanceof Error ? e.message : String(e)}`),
            );
          }}
        >
          Learn from all {read} plates read
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
