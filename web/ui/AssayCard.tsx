import type { Assay } from '../../schema/records.ts';
import { useServices } from '../app/services.ts';
import { saving } from '../app/write-failure.ts';
import { nextPlateOf } from '../bench/assays.ts';
import { type ClassLook, otherClass } from '../bench/colours.ts';
import { assayRecordIds } from '../bench/delete.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { revised } from '../storage/stamp.ts';
import { ConfirmButton } from './ConfirmButton.tsx';
import { PlateRow } from './PlateRow.tsx';

export function AssayCard({
  assay,
  data,
  looks,
}: {
  assay: Assay;
  data: ExperimentData;
  looks: [ClassLook, ClassLook];
}) {
  const { store } = useServices();
  const samples = data.samples
    .filter((s) => s.assayId === assay.id)
    .sort((a) => (a.timepoint === 'start' ? -1 : 1));
  const test = looks[assay.testClass];
  const ref = looks[otherClass(assay.testClass)];
  return (
    <article
      className="assay"
      data-testid={`assay-${assay.line}-g${assay.generation}-r${assay.replicate}`}
    >
      <div className="row spread">
        <h3 style={{ margin: 0 }}>
          {assay.line} · gen {assay.generation} · rep {assay.replicate}
        </h3>
        <button
          type="button"
          className="btn quiet"
          title="Swap which colour is the evolved line"
          onClick={() =>
            saving('the swapped test colour', () =>
              store.put('assays', revised(assay, { testClass: otherClass(assay.testClass) })),
            )
          }
        >
          test <span className="dot" style={{ background: test.hex }} /> {test.name} · ref{' '}
          <span className="dot" style={{ background: ref.hex }} />
        </button>
      </div>
      <p className="muted" style={{ margin: '4px 0 8px' }}>
        {assay.foldDilutionSinceStart}-fold between samples · {assay.days} day
        {assay.days === 1 ? '' : 's'} · group {assay.group}
        {assay.block && ` · block ${assay.block}`}
      </p>
      <div className="plates">
        {samples.map((s) => {
          const plates = data.plates
            .filter((p) => p.sampleId === s.id)
            .sort((a, b) => a.dilutionFold - b.dilutionFold);
          return (
            <div key={s.id} className="plates">
              {plates.map((p) => (
                <PlateRow
                  key={p.id}
                  plate={p}
                  sample={s}
                  assay={assay}
                  data={data}
                  deletable={plates.length > 1}
                />
              ))}
              <button
                type="button"
                className="btn quiet"
                onClick={() =>
                  saving(`another ${s.timepoint} plate`, () =>
                    store.put('plates', nextPlateOf(s, plates, data.experiment)),
                  )
                }
              >
                + another {s.timepoint} plate
              </button>
            </div>
          );
        })}
      </div>
      <div className="row" style={{ marginTop: 8 }}>
        <ConfirmButton
          label="Delete assay"
          armed="Tap again: the assay, its plates and photos go"
          onConfirm={() =>
            saving('the deletion of the assay', () =>
              assayRecordIds(store, assay).then((ids) => store.remove(ids)),
            )
          }
        />
      </div>
    </article>
  );
}
