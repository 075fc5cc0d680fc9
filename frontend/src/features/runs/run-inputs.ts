import type { DesignVersionView } from '@quietglass/shared';

/*
 * What the run pages need of released recipes and chambers. The page loads them with the recipes'
 * and chambers' own queries and passes them in.
 */

/** A released recipe as the run dialog offers it: a design version cleared for the chamber. */
export interface ReleasedRecipeView {
  designId: number;
  number: number;
  name: string;
  customer: string;
  releasedAt: string;
}

/** A released recipe's content: its layers (incident side first) and the frozen material models. */
export type RecipeView = DesignVersionView & { name: string };

/** A coating chamber, as much of it as a run needs. */
export interface RunChamberView {
  id: number;
  name: string;
}
