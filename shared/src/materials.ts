/*
 * Materials of the library and their earlier revisions, as the API and the client exchange them.
 */
import type { MaterialModel } from './optics/dispersion.js';

/**
 * Where a material's data came from: a published reference, a measurement on the shop's own
 * process (with its date and run), or a typical value (not measured, not for release decisions).
 */
export const PROVENANCE_KINDS = ['published', 'measured', 'typical'] as const;
export type ProvenanceKind = (typeof PROVENANCE_KINDS)[number];

export const PROVENANCE_KIND_LABELS: Readonly<Record<ProvenanceKind, string>> = {
  published: 'Published reference',
  measured: 'Measured on our process',
  typical: 'Typical value',
};

/** Longest reference text a material keeps (characters). */
export const MAX_SOURCE_LENGTH = 2000;
/** Longest run identifier (characters). */
export const MAX_RUN_LENGTH = 120;

/** Largest n,k file the API takes, bytes (the client checks it before sending). */
export const MAX_NK_CSV_BYTES = 1_000_000;

export interface MaterialProvenance {
  kind: ProvenanceKind;
  /** The reference (published), or what was measured and how (measured); may be empty for typical. */
  source: string;
  /** Measurement date, YYYY-MM-DD (required for measured). */
  date: string | null;
  /** The run the measurement came from (required for measured), e.g. "B2-2026-118". */
  run: string;
  notes: string;
}

/** The original file a material was imported from, kept for download. */
export interface MaterialSourceFile {
  fileName: string;
  mediaType: string;
  sizeBytes: number;
}

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
  /** A typical value, not measured on this shop's process (provenance kind `typical`). */
  typical: boolean;
  provenance: MaterialProvenance;
  /** When it was retired (hidden from pickers, kept for the versions that use it), or null. */
  retiredAt: string | null;
  /** The file it was imported from, or null. */
  sourceFile: MaterialSourceFile | null;
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
  provenance: MaterialProvenance;
  /** When the next revision replaced it (ISO time), and by whom. */
  supersededAt: string;
  supersededBy: string | null;
}

/**
 * The materials a picker offers: those not retired, plus any retired ones already chosen (`keep`),
 * so a version that uses a retired material still shows and keeps it. Library order is kept.
 */
export function pickableMaterials<T extends { id: number; retiredAt?: string | null }>(
  library: readonly T[],
  keep: Iterable<number | null | undefined> = [],
): T[] {
  const kept = new Set<number>();
  for (const id of keep) if (typeof id === 'number') kept.add(id);
  return library.filter((m) => !m.retiredAt || kept.has(m.id));
}
