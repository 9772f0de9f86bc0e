import type { CandidateLabel, LearnedModel } from '../cv/index.ts';
import { decodePhoto } from './decode-image.ts';
import type { loadCvCore } from './opencv-quiet.ts';

type CvCore = Awaited<ReturnType<typeof loadCvCore>>;

export interface CheckedPlate {
  photo: string;
  /** Where the plate was given, for messages (e.g. "corrected.jsonl: line 3"). */
  where: string;
  /** The final colonies, in the upright photo's full-resolution pixels. */
  colonies: readonly { x: number; y: number; cls: string }[];
}

export class CheckedPlateError extends Error {
  override name = 'CheckedPlateError';
}

/**
 * Reads each checked plate with the default analysis, labels every object it considered from the
 * final colonies (cv labels.ts) and learns the experiment's model from all of them. Where people
 * had to add colonies the search never considered, the plates are read once more with the search
 * widened as far as that asks (cv searchReach), and the model is learned from that reading, so it
 * has seen the fainter objects it will be shown. A photo that cannot be read, or a colony outside
 * its photo, is refused with the plate's place and field.
 */
export async function learnFromPlates(
  core: CvCore,
  plates: readonly CheckedPlate[],
  names: readonly string[],
  dishMm: number,
  onPlate?: (index: number, total: number, file: string) => void,
): Promise<LearnedModel> {
  const first = await labelPlates(core, plates, dishMm, 1, onPlate);
  const reach = core.searchReach(first);
  if (reach >= 1) return core.learnModel(first, plates.length, names);
  const wider = await labelPlates(core, plates, dishMm, reach, onPlate);
  return core.learnModel(wider, plates.length, names, reach);
}

async function labelPlates(
  core: CvCore,
  plates: readonly CheckedPlate[],
  dishMm: number,
  searchReach: number,
  onPlate?: (index: number, total: number, file: string) => void,
): Promise<CandidateLabel[]> {
  const labels: CandidateLabel[] = [];
  for (const [i, plate] of plates.entries()) {
    onPlate?.(i + 1, plates.length, plate.photo);
    let photo: Awaited<ReturnType<typeof decodePhoto>>;
    try {
      photo = await decodePhoto(plate.photo);
    } catch (e) {
      throw new CheckedPlateError(`${plate.where}: "file" ${plate.photo}: ${(e as Error).message}`);
    }
    plate.colonies.forEach((c, k) => {
      if (c.x > photo.width || c.y > photo.height) {
        throw new CheckedPlateError(
          `${plate.where}: "colonies[${k}]" at (${c.x}, ${c.y}) lies outside the ${photo.width} × ${photo.height} photo`,
        );
      }
    });
    const analysis = await core.analyzePlate(photo.pixels, {
      dishDiameterMm: dishMm,
      withCandidates: true,
      searchReach,
    });
    const final = plate.colonies.map((c) => core.pointToDecoded(c, 1 / photo.scale));
    labels.push(...core.labelsFromCorrections(analysis.candidates ?? [], final));
  }
  return labels;
}
