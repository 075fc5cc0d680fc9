/*
 * Materials of the library and their earlier revisions, as the API and the client exchange them.
 */
import type { MaterialModel } from './optics/dispersion.js';

/** A material of the library: its dispersion model, valid range and where the data came from. */
export interface MaterialView {
  id: number;
  name: string;
  /**
   * Content revision (1 = as first entered). An edit of a material that submitted, approved or
   * released versions use makes the next revision; those versions keep the one they froze.
   */
  revision: number;
  model: MaterialModel;
  rangeNm: { from: number; to: number };
  /** A typical value, not measured on this shop's process. */
  typical: boolean;
  provenance: { source: string; date: string | null; notes: string };
  /** Optimistic-locking counter: send it back with an edit. */
  version: number;
  updatedAt: string;
}

/** What a material was before an edit moved it to its next revision. */
export interface MaterialRevisionView {
  revision: number;
  name: string;
  model: MaterialModel;
  rangeNm: { from: number; to: number };
  typical: boolean;
  provenance: { source: string; date: string | null; notes: string };
  /** When the next revision replaced it (ISO time), and by whom. */
  supersededAt: string;
  supersededBy: string | null;
}
