import { type ComponentStats, elongationOf, type RegionStats } from './measure.ts';
import type { CandidateFeatures, CandidateVerdict } from './types.ts';

/**
 * The feature vector of every object the analysis considered, kept or rejected, so a lab's
 * corrections can teach a model without the photo (learned-model.ts).
 *
 * - contrast against the local agar in L*a*b*: ΔL, Δa, Δb of the region's mean colour and its
 *   mean ΔE*ab per pixel;
 * - size: the equivalent radius √(area/π) in mm;
 * - shape: elongation = area / (π·halfWidth²) (about 1 for any round colony, 2 for a fused pair,
 *   large for a stroke), and the ridge variation of its blob (measure.ts, candidates.ts);
 * - the distance from the dish wall in mm;
 * - how many objects the default rules kept on the plate (a stray object is a larger share of a
 *   sparse plate's colonies than of a crowded one's);
 * - what the default rules said (`colony` or `rejected`; an object of neither palette colour is a
 *   colony candidate here, the colour is decided apart).
 *
 * Regions smaller than a disc of FLOOR_RADIUS_MM are left out: nobody can tap anything that small,
 * and the watershed leaves thousands of such crumbs.
 */
const FLOOR_RADIUS_MM = 0.15;

export interface FeatureInput {
  regions: readonly RegionStats[];
  components: readonly ComponentStats[];
  /** The default rules' verdict on each region id (absent: rejected). */
  verdict: ReadonlyMap<number, CandidateVerdict>;
  mmPerPx: number;
  /** Working pixels per original pixel. */
  scale: number;
  /** Distance from the wall in mm of a working-pixel position. */
  wallMm: (x: number, y: number) => number;
  /** Working → original pixels. */
  toOriginal: (x: number, y: number) => [number, number];
  /** Region ids from this one up came from a learned model's wider search (absent: none did). */
  firstWiderId?: number;
}

export function candidateFeatures(input: FeatureInput): CandidateFeatures[] {
  const { mmPerPx } = input;
  const minArea = Math.PI * (FLOOR_RADIUS_MM / mmPerPx) ** 2;
  const byId = new Map(input.components.map((c) => [c.id, c]));
  return input.regions
    .filter((r) => r.area >= minArea)
    .map((r) => {
      const [x, y] = input.toOriginal(r.x, r.y);
      const d = [0, 1, 2].map((k) => r.lab[k]! - r.backgroundLab[k]!);
      return {
        id: r.id,
        x: round(x, 1),
        y: round(y, 1),
        r: round(Math.sqrt(r.area / Math.PI) / input.scale, 2),
        dL: round(d[0]!, 2),
        da: round(d[1]!, 2),
        db: round(d[2]!, 2),
        dE: round(r.contrast, 2),
        radiusMm: round(Math.sqrt(r.area / Math.PI) * mmPerPx, 3),
        elongation: round(elongationOf(r), 3),
        ridgeVariation: round(byId.get(r.component)?.ridgeVariation ?? 0, 3),
        wallMm: round(input.wallMm(r.x, r.y), 2),
        verdict: input.verdict.get(r.id) ?? 'rejected',
        plateColonies: input.verdict.size,
        ...(input.firstWiderId !== undefined && r.id >= input.firstWiderId
          ? { wider: true as const }
          : {}),
      };
    });
}

function round(v: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
