import { hrefOf } from '../app/route.ts';
import type { PlatePlace } from '../bench/next-plate.ts';

/** The plate the experiment needs next, one tap away, so a stack is photographed in one run. */
export function NextPlateButton({ next }: { next: PlatePlace }) {
  const { assay, sample, plate } = next;
  return (
    <a
      className="btn primary"
      data-testid="next-plate"
      href={hrefOf({ screen: 'plate', experimentId: plate.experimentId, plateId: plate.id })}
    >
      Next: {assay.line} g{assay.generation} r{assay.replicate} {sample.timepoint} ›
    </a>
  );
}
