import { classLooks } from '../bench/colours.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';

export function PaletteCard({ data }: { data: ExperimentData }) {
  const p = data.experiment.palette;
  const looks = classLooks(data.experiment);
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
            : 'Learned from the first plate with both colours. To teach them yourself, open a plate and use "Teach colours".'
          : 'Not known yet: they are learned from the first plate you photograph that shows both colours.'}
      </p>
    </section>
  );
}
