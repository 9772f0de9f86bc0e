import { useState } from 'react';
import { tidyCsv, tidyTables } from '../../fitness/tidy-tables.ts';
import { go } from '../app/route.ts';
import { useServices } from '../app/services.ts';
import { experimentRecordIds } from '../bench/delete.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { backupJson, newerOnly, readBackup } from '../exchange/backup.ts';
import { platesCsv, resultsCsv } from '../exchange/competition-csv.ts';
import { saveBlob } from '../exchange/download.ts';
import { assaysFromCsv } from '../exchange/import-csv.ts';
import { checkedPlatesExport } from '../exchange/learning-export.ts';
import { zipStore } from '../exchange/zip.ts';
import { fitnessInputs } from '../results/assay-inputs.ts';
import { ALL_UNCORRECTED, experimentFitness } from '../results/experiment-fitness.ts';
import { counted } from '../words/counted.ts';
import { ConfirmButton } from './ConfirmButton.tsx';
import { StorageCard } from './StorageCard.tsx';
import { UnreadableCard } from './UnreadableCard.tsx';

const slug = (s: string) =>
  s
    .replace(/[^\w-]+/g, '-')
    .replace(/^-|-$/g, '')
    .toLowerCase() || 'experiment';

export function DataTab({ data }: { data: ExperimentData }) {
  const { store, fitness } = useServices();
  const [note, setNote] = useState<{ ok: boolean; text: string; on: 'export' | 'import' } | null>(
    null,
  );
  const name = slug(data.experiment.name);
  const say = (ok: boolean, text: string, on: 'export' | 'import' = 'import') =>
    setNote({ ok, text, on });
  const failed = (e: unknown) => say(false, e instanceof Error ? e.message : String(e));
  const saved = (blob: Blob, file: string, what: string) => {
    saveBlob(blob, file);
    say(true, `Saved ${file} (${what}) to the phone's downloads.`, 'export');
  };
  const noteOn = (on: 'export' | 'import') =>
    note?.on === on && (
      <p
        className={note.ok ? 'banner' : 'banner alarm'}
        role="status"
        style={{ whiteSpace: 'pre-line' }}
      >
        {note.text}
      </p>
    );

  async function importFile(file: File, kind: 'csv' | 'backup') {
    const text = await file.text();
    if (kind === 'csv') {
      const { batch, assays, notes } = assaysFromCsv(text, file.name, data.experiment);
      await store.putBatch(batch);
      say(
        true,
        [
          `${file.name}: ${counted(assays, 'assay', 'assays')} added with their typed counts.`,
          ...notes,
        ].join(' '),
      );
    } else {
      const { batch, count } = readBackup(text, file.name);
      await store.putBatch(await newerOnly(store, batch));
      say(
        true,
        `${file.name}: ${counted(count, 'record', 'records')} read; newer copies on this device were kept.`,
      );
    }
  }
  const picker = (kind: 'csv' | 'backup', label: string, accept: string) => (
    <label className="btn">
      {label}
      <input
        type="file"
        accept={accept}
        hidden
        data-testid={`import-${kind}`}
        onChange={(e) => {
          const file = e.target.files?.[0];
          e.target.value = '';
          if (file) importFile(file, kind).catch(failed);
        }}
      />
    </label>
  );

  return (
    <>
      <section className="card stack" aria-label="Export">
        <h2>Take the data with you</h2>
        <p className="muted">
          The plate table has the columns the <code>rivalplate fitness</code> command reads, so it
          goes back and forth.
        </p>
        <div className="row">
          <button
            type="button"
            className="btn primary"
            data-testid="export-plates"
            onClick={() => {
              const inputs = fitnessInputs(data).inputs;
              saved(
                new Blob([platesCsv(inputs)], { type: 'text/csv' }),
                `${name}-plates.csv`,
                counted(inputs.length, 'assay', 'assays'),
              );
            }}
          >
            Save plate counts (CSV)
          </button>
          <button
            type="button"
            className="btn"
            data-testid="export-results"
            onClick={() =>
              experimentFitness(fitness, data, ALL_UNCORRECTED)
                .then((fit) => {
                  if (!fit.analysis)
                    return say(false, 'No assay has counted start and end plates yet.', 'export');
                  saved(
                    new Blob([resultsCsv(fit.analysis)], { type: 'text/csv' }),
                    `${name}-fitness.csv`,
                    counted(fit.analysis.assays.length, 'assay', 'assays'),
                  );
                })
                .catch(failed)
            }
          >
            Save fitness results (CSV)
          </button>
          <button
            type="button"
            className="btn"
            data-testid="export-tables"
            onClick={() =>
              experimentFitness(fitness, data, ALL_UNCORRECTED)
                .then((fit) => {
                  if (!fit.analysis)
                    return say(false, 'No assay has counted start and end plates yet.');
                  const files = tidyTables(fit.analysis).map((t) => ({
                    name: `${t.name}.csv`,
                    text: tidyCsv(t),
                  }));
                  saveBlob(
                    new Blob([zipStore(files)], { type: 'application/zip' }),
                    `${name}-tables.zip`,
                  );
                })
                .catch(failed)
            }
          >
            Tables for R or a spreadsheet (zip)
          </button>
          <button
            type="button"
            className="btn"
            data-testid="export-checked"
            onClick={() =>
              checkedPlatesExport(store, data.experiment)
                .then(({ files, plates, skipped }) => {
                  if (plates === 0)
                    return say(
                      false,
                      ['No checked plate with its photo on this phone yet.', ...skipped].join('\n'),
                      'export',
                    );
                  saveBlob(
                    new Blob([zipStore(files)], { type: 'application/zip' }),
                    `${name}-checked-plates.zip`,
                  );
                  say(
                    true,
                    [
                      `Saved ${name}-checked-plates.zip (${counted(plates, 'checked plate', 'checked plates')} with their photos): unzip it and run rivalplate learn corrected.jsonl --out model.json.`,
                      ...skipped.map((s) => `Left out ${s}.`),
                    ].join('\n'),
                    'export',
                  );
                })
                .catch(failed)
            }
          >
            Checked plates for learning (zip)
          </button>
          <button
            type="button"
            className="btn"
            data-testid="export-backup"
            onClick={() =>
              backupJson(store)
                .then((json) =>
                  saved(
                    new Blob([json], { type: 'application/json' }),
                    `rivalplate-backup-${new Date().toISOString().slice(0, 10)}.json`,
                    'every experiment, with photos',
                  ),
                )
                .catch(failed)
            }
          >
            Save a full backup (JSON, with photos)
          </button>
        </div>
        {noteOn('export')}
      </section>
      <section className="card stack" aria-label="Import">
        <h2>Bring data in</h2>
        <div className="row">
          {picker('csv', 'Add plate counts from a CSV', '.csv,text/csv')}
          {picker('backup', 'Restore from a backup (JSON)', '.json,application/json')}
        </div>
        {noteOn('import')}
      </section>
      <section className="card stack" aria-label="Delete">
        <h2>Delete this experiment</h2>
        <p className="muted">
          Everything of it goes from this phone: assays, plates, photos and corrections. Export a
          backup first to keep a copy.
        </p>
        <ConfirmButton
          label="Delete experiment"
          armed="Tap again to delete it all"
          onConfirm={() =>
            void experimentRecordIds(store, data.experiment.id)
              .then((ids) => store.remove(ids))
              .then(() => go({ screen: 'home' }), failed)
          }
        />
      </section>
      <StorageCard />
      <UnreadableCard />
    </>
  );
}
