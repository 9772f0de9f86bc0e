/**
 * The smallest colony radius the analysis counts, in mm: a colony 0.45 mm across. Colonies
 * smaller than about half a millimetre are not counted by eye either (common practice; the value
 * is a judgement, not a published limit). Specks, contrast bumps and the typical colony size are
 * all measured against this one value.
 */
export const SMALLEST_COLONY_RADIUS_MM = 0.22;
