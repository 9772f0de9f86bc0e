import { useState } from 'react';
import type { DishRecord } from '../../schema/records.ts';
import { teachColours } from '../analysis/teach.ts';
import { useServices } from '../app/services.ts';
import { useObjectUrl } from '../app/use-object-url.ts';
import { saving } from '../app/write-failure.ts';
import { type ClassLook, classLooks, otherClass } from '../bench/colours.ts';
import type { PlateData } from '../bench/plate-data.ts';
import { saveBlob } from '../exchange/download.ts';
import { annotatedPng } from '../review/annotated-png.ts';
import {
  colonyAt,
  correctedColonies,
  countsByClass,
  editForTap,
  type TapTool,
} from '../review/edits.ts';
import type { Tool } from '../review/tool.ts';
import { useCorrections } from '../review/use-corrections.ts';
import { revised } from '../storage/stamp.ts';
import { ReviewView } from './ReviewView.tsx';
import { TallyBar } from './TallyBar.tsx';

export function ReviewPanel({
  data,
  preview,
  busy,
  onReread,
}: {
  data: PlateData & { analysis: NonNullable<PlateData['analysis']> };
  preview: Blob;
  busy: boolean;
  onReread: (dish: DishRecord) => void;
}) {
  const { store, worker } = useServices();
  const { analysis, experiment, assay, plate } = data;
  const corr = useCorrections(store, analysis, data.corrections ?? undefined);
  const [tool, setTool] = useState<Tool>({ kind: 'add', cls: assay.testClass });
  const [movedDish, setMovedDish] = useState<DishRecord | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const url = useObjectUrl(preview);
  const looks: [ClassLook, ClassLook] = experiment.palette
    ? classLooks(experiment)
    : [analysis.classes[0], analysis.classes[1]];
  const colonies = correctedColonies(analysis.colonies, corr.stack.edits);
  const counts = countsByClass(colonies);

  const savePicture = () =>
    annotatedPng(preview, analysis.width, colonies, looks, counts)
      .then((b) =>
        saveBlob(
          b,
          `${assay.line}-g${assay.generation}-r${assay.replicate}-${data.sample.timepoint}-${plate.dilutionFold}.png`,
        ),
      )
      .catch((e: unknown) =>
        setMessage(`Picture not saved: ${e instanceof Error ? e.message : String(e)}`),
      );

  function tap(x: number, y: number, slack: number) {
    setMessage(null);
    if (tool.kind === 'teach') return teachTap(x, y, slack);
    const kind: TapTool = tool.kind;
    const edit = editForTap(colonies, kind, {
      x,
      y,
      slack,
      cls: tool.kind === 'add' ? tool.cls : 0,
      newId: `h${crypto.randomUUID()}`,
    });
    if (edit) corr.apply(edit);
  }

  function teachTap(x: number, y: number, slack: number) {
    if (tool.kind !== 'teach') return;
    const hit = colonyAt(colonies, x, y, slack);
    if (!hit) return setMessage('Tap right on a colony.');
    if (!tool.first) {
      setTool({ kind: 'teach', first: hit });
      return setMessage('Now tap a colony of the other colour.');
    }
    const first = tool.first;
    setTool({ kind: 'add', cls: assay.testClass });
    setMessage('Teaching the two colours and re-sorting every plate…');
    teachColours(store, worker, experiment, first, hit, [
      looks[first.cls].name,
      looks[otherClass(first.cls)].name,
    ])
      .then(() =>
        setMessage('Colours taught. Every plate of this experiment is sorted against them now.'),
      )
      .catch((e: unknown) =>
        setMessage(`Colours not taught: ${e instanceof Error ? e.message : String(e)}`),
      );
  }

  return (
    <>
      {analysis.flags.length > 0 && (
        <div className="banner">
          {analysis.flags.map((f) => (
            <div key={f.kind}>
              <span className="flag">{f.kind}</span> {f.detail}
            </div>
          ))}
        </div>
      )}
      {url && (
        <ReviewView
          previewUrl={url}
          width={analysis.width}
          height={analysis.height}
          colonies={colonies}
          looks={looks}
          dish={movedDish ?? analysis.dish}
          onTap={tap}
          onDishMove={setMovedDish}
        />
      )}
      {message && (
        <p className="banner" role="status">
          {message}
        </p>
      )}
      {corr.saveError && <p className="banner alarm">{corr.saveError}</p>}
      <TallyBar
        looks={looks}
        counts={counts}
        found={countsByClass(analysis.colonies)}
        testClass={assay.testClass}
        tool={tool}
        onTool={setTool}
        canUndo={corr.stack.edits.length > 0}
        canRedo={corr.stack.undone.length > 0}
        onUndo={corr.undo}
        onRedo={corr.redo}
      >
        <button
          type="button"
          className="btn primary"
          data-testid="mark-checked"
          disabled={plate.reviewed}
          onClick={() =>
            saving('the plate marked reviewed', () =>
              store.put('plates', revised(plate, { reviewed: true })),
            )
          }
        >
          {plate.reviewed ? 'Checked ✓' : 'Mark checked'}
        </button>
        {movedDish && (
          <button type="button" className="btn" disabled={busy} onClick={() => onReread(movedDish)}>
            Re-read inside the moved dish
          </button>
        )}
        <button type="button" className="btn quiet" onClick={savePicture}>
          Save picture
        </button>
      </TallyBar>
    </>
  );
}
