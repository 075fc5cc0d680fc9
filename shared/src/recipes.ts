/*
 * Released recipes as the API and the client exchange them.
 */
import type { DesignVersionView } from './designs.js';

/** A released version: what the chamber operators may build. */
export interface RecipeSummaryView {
  designId: number;
  number: number;
  /** The design's name. */
  name: string;
  customer: string;
  releasedAt: string;
  /** Display name of who released it, from the audit trail; null when the trail has no release step. */
  releasedBy: string | null;
}

/** A released version with its design's name. */
export type RecipeView = DesignVersionView & { name: string };
