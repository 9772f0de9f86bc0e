import type { Assay, Plate, Sample } from '../../schema/records.ts';
import { assayPlace, platePlace } from '../bench/next-plate.ts';

/** The plate's place in the experiment, large, to match against the label on the dish. */
export function PlacePanel({
  assay,
  sample,
  plate,
}: {
  assay: Assay;
  sample: Sample;
  plate: Plate;
}) {
  return (
    <section className="card place" aria-label="This plate" data-testid="place">
      <div className="place-assay">{assayPlace(assay)}</div>
      <div className="place-plate">{platePlace(sample, plate)}</div>
    </section>
  );
}
