/*
 * Stack designs as the API and the client exchange them, and how a design version becomes the
 * optics engine's stack description.
 */
import type { MaterialModel } from './optics/dispersion.js';
import type { StackDescription } from './optics/stack.js';

/** Lifecycle of a design version. Only a draft can be edited. */
export const VERSION_STATUSES = [
  'draft',
  'submitted',
  'approved',
  'returned',
  'released',
  'retired',
] as const;
export type VersionStatus = (typeof VERSION_STATUSES)[number];

/**
 * True for the statuses a customer may be shown (in quotes and compliance reports): approved by a
 * second engineer, or released to the chamber. Never drafts or versions under review.
 */
export function isApprovedForCustomers(status: VersionStatus): boolean {
  return status === 'approved' || status === 'released';
}

/**
 * What is behind the coated front surface: `front-only` treats the substrate as semi-infinite;
 * `bare` adds the uncoated back surface incoherently; `same-coating` coats the back with the front
 * design too (a part coated on both sides).
 */
export const BACK_SURFACE_TREATMENTS = ['front-only', 'bare', 'same-coating'] as const;
export type BackSurfaceTreatment = (typeof BACK_SURFACE_TREATMENTS)[number];

/** One row of the Layer grid, incident side first. */
export interface DesignLayer {
  materialId: number;
  /** Physical thickness in nm, > 0. */
  thicknessNm: number;
  /** Locked layers keep their thickness during Fit to mask. */
  locked: boolean;
  notes: string;
}

/** The editable content of a design version. */
export interface DesignVersionContent {
  incidentMaterialId: number;
  substrateMaterialId: number;
  substrateThicknessMm: number;
  backSurface: BackSurfaceTreatment;
  referenceWavelengthNm: number;
  notes: string;
  layers: DesignLayer[];
}

export interface DesignVersionView extends DesignVersionContent {
  designId: number;
  number: number;
  status: VersionStatus;
  /** Optimistic-locking counter: send it back with a save; a stale one gets 409. */
  rowVersion: number;
  createdBy: { id: number; displayName: string };
  /** Everyone who saved this version, in the order of their first save (none may approve or release it). */
  editors: { id: number; displayName: string }[];
  createdAt: string;
  updatedAt: string;
  /** The material models used, frozen when the version was submitted (null while a draft). */
  materialsSnapshot: Record<string, { name: string; model: MaterialModel }> | null;
}

export interface DesignSummaryView {
  id: number;
  name: string;
  customer: { id: number; name: string };
  specMaskId: number | null;
  latestVersion: { number: number; status: VersionStatus; updatedAt: string };
  createdBy: { id: number; displayName: string };
  createdAt: string;
  /** Optimistic-locking counter of the name and spec mask: send it back with a change. */
  version: number;
}

export interface DesignView extends Omit<DesignSummaryView, 'latestVersion'> {
  versions: { number: number; status: VersionStatus; updatedAt: string; createdBy: string }[];
}

/** A material as a design needs it: a name and a dispersion model. */
export interface NamedModel {
  name: string;
  model: MaterialModel;
  /** Wavelength range over which the material's data are valid, nm. */
  rangeNm?: { from: number; to: number };
  /** The material's revision when a version froze it (1 = as first entered). */
  revision?: number;
}

/**
 * The engine's stack description of a design version. Materials are looked up in `materials`
 * (by material id); a missing one is an error naming the layer.
 */
export function designStackDescription(
  content: DesignVersionContent,
  materials: ReadonlyMap<number, NamedModel> | Record<string, NamedModel>,
): StackDescription {
  const lookup = (id: number, where: string): NamedModel => {
    const found =
      materials instanceof Map
        ? (materials as ReadonlyMap<number, NamedModel>).get(id)
        : (materials as Record<string, NamedModel>)[String(id)];
    if (!found) throw new Error(`${where}: material ${id} is not in the materials library`);
    return found;
  };
  const named: Record<string, MaterialModel> = {};
  const ref = (id: number, where: string): string => {
    const key = `material-${id}`;
    named[key] = lookup(id, where).model;
    return key;
  };
  const layers = content.layers.map((layer, i) => ({
    material: ref(layer.materialId, `layers[${i}]`),
    thickness_nm: layer.thicknessNm,
    label: `${i + 1} ${lookup(layer.materialId, `layers[${i}]`).name}`,
  }));
  const description: StackDescription = {
    incident: { material: ref(content.incidentMaterialId, 'incident medium') },
    substrate: {
      material: ref(content.substrateMaterialId, 'substrate'),
      thickness_mm: content.substrateThicknessMm,
    },
    layers,
    reference_nm: content.referenceWavelengthNm,
    materials: named,
  };
  if (content.backSurface === 'same-coating') description.back_layers = [...layers].reverse();
  return description;
}

/** The engine's back-surface model for a treatment. */
export function engineBackSurface(treatment: BackSurfaceTreatment): 'none' | 'incoherent' {
  return treatment === 'front-only' ? 'none' : 'incoherent';
}

/** One step of a version's lifecycle as the audit trail records it. */
export interface VersionEventView {
  id: number;
  designId: number;
  versionNumber: number;
  from: VersionStatus;
  to: VersionStatus;
  actor: { id: number; displayName: string; role: string };
  comment: string;
  at: string;
  /** A status change, or a save of the version's content by `actor` (then from = to). */
  kind: 'status' | 'saved';
}
