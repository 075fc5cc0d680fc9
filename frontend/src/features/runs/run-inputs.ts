import type { ChamberView, RecipeSummaryView } from '@quietglass/shared';

/*
 * What the run pages need of released recipes and chambers. The page loads them with the recipes'
 * and chambers' own queries and passes them in.
 */

/** A released recipe as the run dialog offers it: a design version cleared for the chamber. */
export type ReleasedRecipeView = RecipeSummaryView;

/** A released recipe's content: its layers (incident side first) and the frozen material models. */
export type { RecipeView } from '@quietglass/shared';

/** A coating chamber, as much of it as a run needs. */
export type RunChamberView = Pick<ChamberView, 'id' | 'name'>;
