import { useRef, useState } from 'react';
import type { DishRecord } from '../../schema/records.ts';
import { teachColours } from '../analysis/teach.ts';
import { useServices } from '../app/services.ts';
import { useObjectUrl } from '../app/use-object-url.ts';
import { type ClassLook, classLooks } from '../bench/colours.ts';
import type { PlatePlace } from '../bench/next-plate.ts';
import type { PlateData } from '../bench/plate-data.ts';
import { plateWarnings } from '../bench/plate-warnings.ts';
import { saveBlob } from '../exchange/download.ts';
import { annotatedPng } from '../review/annotated-png.ts';
import { colonyAt, correctedColonies, countsByClass, editForTap } from '../review/edits.ts';
import { markChecked } from '../review/mark-checked.ts';
import { LOOK, type Tool } from '../review/tool.ts';
import {
  currentUnsure,
  editForAnswer,
  type UnsureAnswer,
  type UnsureWalk,
  unsureQueue,
} from '../review/unsure.ts';
import { useCorrections } from '../review/use-corrections.ts';
import { frameFor } from '../review/view.ts';
import { counted } from '../words/counted.ts';
import { refitSentence } from '../words/learning-words.ts';
import { ConfirmButton } from './ConfirmButton.tsx';
import { NextPlateButton } from './NextPlateButton.tsx';
import { PlateFlags } from './PlateFlags.tsx';
import { ReadByRow } from './ReadByRow.tsx';
import { ReviewMore } from './ReviewMore.tsx';
import { ReviewView } from './ReviewView.tsx';
import { TallyBar } from './TallyBar.tsx';
import { UnsureStep } from './UnsureStep.tsx';

export function ReviewPanel({
  data,
  preview,
  busy,
  next,
  onReread,
  onNextPhoto,
}: {
  data: PlateData & { analysis: NonNullable<PlateData['analysis']> };
  preview: Blob;
  busy: boolean;
  /** The plate the experiment needs after this one, offered once this one is checked. */
  next: PlatePlace | null;
  /** Reads the photo again: inside a dish the person moved, or as found. */
  onReread: (dish?: DishRecord) => void;
  /** A photo taken for the next plate straight from this plate's check. */
  onNextPhoto: (next: PlatePlace, photo: Blob, name: string) => void;
}) {
  const { store, worker } = useServices();
  const { analysis, experiment, assay, plate } = data;
  const corr = useCorrections(store, analysis, data.corrections ?? undefined);
  const [tool, setTool] = useState<Tool>(LOOK);
  const [walk, setWalk] = useState<UnsureWalk | null>(null);
  const [movedDish, setMovedDish] = useState<DishRecord | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const url = useObjectUrl(preview);
  const looks: [ClassLook, ClassLook] = classLooks(experiment);
  const frame = frameFor(analysis.dish, analysis.width, analysis.height);
  const colonies = correctedColonies(analysis.colonies, corr.stack.edits);
  const counts = countsByClass(colonies);
  const unsure = unsureQueue(colonies);
  const step = walk && currentUnsure(walk, colonies);
  const warnings = plateWarnings(analysis.flags, counts[0] + counts[1]);
  const failed = (what: string) => (e: unknown) =>
    setMessage(`${what}: ${e instanceof Error ? e.message : String(e)}`);

  const savePicture = () =>
    annotatedPng(preview, analysis.width, colonies, looks, counts)
      .then((b) =>
        saveBlob(
          b,
          `${assay.line}-g${assay.generation}-r${assay.replicate}-${data.sample.timepoint}-${plate.dilutionFold}.png`,
        ),
      )
      .catch(failed('Picture not saved'));

  const check = () =>
    void markChecked(store, worker, experiment, plate)
      .then((fit) => fit && setMessage(refitSentence(fit)))
      .catch(failed('Not marked checked'));
  // In a run of plates one tap checks this plate and opens the camera for the next (the
  // camera may only be opened from the tap itself); cancelling the camera stays here.
  const nextCamera = useRef<HTMLInputElement>(null);
  const checkThenNext = () => {
    check();
    nextCamera.current?.click();
  };
  const photoNext = next && !next.plate.photoId ? next : null;
  const checkLabel = photoNext ? 'Checked · next photo' : 'Mark checked';
  const onCheck = photoNext ? checkThenNext : check;

  function tap(x: number, y: number, slack: number) {
    setMessage(null);
    if (tool.kind === 'teach') return teachTap(x, y, slack);
    if (tool.kind === 'look') return;
    const edit = editForTap(colonies, tool.kind, {
      x,
      y,
      slack,
      cls: tool.kind === 'add' ? tool.cls : 0,
      newId: `h${crypto.randomUUID()}`,
    });
    if (edit) corr.apply(edit);
    else if (tool.kind === 'add') setMessage(`This colony is ${looks[tool.cls].name} already.`);
  }

  function answer(a: UnsureAnswer) {
    if (!walk || !step) return;
    const edit = editForAnswer(step.colony, a);
    if (edit) corr.apply(edit);
    setWalk({ ...walk, at: step.index + 1 });
  }

  function teachTap(x: number, y: number, slack: number) {
    if (tool.kind !== 'teach') return;
    const hit = colonyAt(colonies, x, y, slack);
    if (!hit) return setMessage('Tap right on a colony.');
    if (!tool.first) {
      setTool({ kind: 'teach', first: hit });
      return setMessage(`Now tap one ${looks[1].name} colony.`);
    }
    const first = tool.first;
    setTool(LOOK);
    setMessage('Teaching the two colours and re-sorting the plates not yet checked…');
    teachColours(store, worker, experiment, first, hit, [looks[0].name, looks[1].name])
      .then((kept) =>
        setMessage(
          `Colours taught. The plates not yet checked are sorted against them now${kept ? `; ${counted(kept, 'checked plate keeps its', 'checked plates keep their')} counts` : ''}.`,
        ),
      )
      .catch(failed('Colours not taught'));
  }

  return (
    <>
      <PlateFlags flags={analysis.flags} />
      {url && (
        <ReviewView
          previewUrl={url}
          frame={frame}
          colonies={colonies}
          looks={looks}
          dish={movedDish ?? analysis.dish}
          onTap={tap}
          onDishMove={setMovedDish}
        />
      )}
      {url && step && walk && (
        <UnsureStep
          previewUrl={url}
          frame={frame}
          colony={step.colony}
          looks={looks}
          position={step.index + 1}
          total={walk.queue.length}
          onAnswer={answer}
          onStop={() => setWalk(null)}
        />
      )}
      {message && (
        <p className="banner" role="status">
          {message}
        </p>
      )}
      {corr.saveError && <p className="banner alarm">{corr.saveError}</p>}
      {movedDish && (
        <button type="button" className="btn" disabled={busy} onClick={() => onReread(movedDish)}>
          Re-read inside the moved dish
        </button>
      )}
      <TallyBar
        looks={looks}
        counts={counts}
        testClass={assay.testClass}
        tool={tool}
        onTool={setTool}
        canUndo={corr.stack.edits.length > 0}
        onUndo={corr.undo}
      >
        <div className="check-actions">
          {unsure.length > 0 && !step && (
            <button
              type="button"
              className="btn"
              data-testid="step-unsure"
              onClick={() => setWalk({ queue: unsure, at: 0 })}
            >
              Unsure: {unsure.length}
            </button>
          )}
          {plate.reviewed ? (
            <button type="button" className="btn" data-testid="mark-checked" disabled>
              Checked ✓
            </button>
          ) : warnings.length > 0 ? (
            <ConfirmButton
              className="btn primary"
              testId="mark-checked"
              label={checkLabel}
              armed={`Looked at ${warnings.join(', ')}: ${checkLabel.toLowerCase()}`}
              onConfirm={onCheck}
            />
          ) : (
            <button
              type="button"
              className="btn primary"
              data-testid="mark-checked"
              onClick={onCheck}
            >
              {checkLabel}
            </button>
          )}
          {plate.reviewed && next && <NextPlateButton next={next} />}
          {photoNext && (
            <input
              ref={nextCamera}
              type="file"
              accept="image/*"
              capture="environment"
              hidden
              data-testid="next-camera-input"
              onChange={(e) => {
                const file = e.target.files?.[0];
                e.target.value = '';
                if (file) onNextPhoto(photoNext, file, file.name);
              }}
            />
          )}
        </div>
      </TallyBar>
      <ReadByRow
        analysis={analysis}
        experiment={experiment}
        touched={plate.reviewed || corr.stack.edits.length > 0}
        busy={busy}
        onReread={() => onReread()}
      />
      <ReviewMore
        counts={counts}
        found={countsByClass(analysis.colonies)}
        canRedo={corr.stack.undone.length > 0}
        onRedo={corr.redo}
        onTeach={() => {
          setTool({ kind: 'teach', first: null });
          setMessage(`Tap one ${looks[0].name} colony, then one ${looks[1].name}.`);
        }}
        onSavePicture={savePicture}
      />
    </>
  );
}
