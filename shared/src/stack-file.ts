/*
 * Stack files in and out of the design workspace: a version written as the JSON stack description
 * `npm run calc -- --stack FILE` reads, and such a file read back as the content of a new draft,
 * its materials matched by name to the shop's library.
 */
import type { BackSurfaceTreatment, DesignLayer, DesignVersionContent, NamedModel } from './designs.js';
import type { MaterialModel } from './optics/dispersion.js';
import { elementAt } from './checked.js';
import { OpticsInputError } from './optics/errors.js';
import { parseStack, type StackDescription } from './optics/stack.js';
import { layerThicknessNm } from './schemas/designs.js';

/** Largest stack file the workspace reads, bytes. */
export const MAX_STACK_FILE_BYTES = 1_000_000;

/**
 * A version as a stack file: materials named as in the library, with their dispersion models
 * inline, so the file computes the same spectrum on its own. Thicknesses are physical (nm).
 */
export function designStackFile(
  content: DesignVersionContent,
  materials: ReadonlyMap<number, NamedModel>,
  meta: { name: string; description?: string },
): StackDescription {
  const named: Record<string, MaterialModel> = {};
  const keyOf = new Map<number, string>();
  const ref = (id: number, where: string): string => {
    const known = keyOf.get(id);
    if (known !== undefined) return known;
    const found = materials.get(id);
    if (!found) throw new Error(`${where}: material ${id} is not in the materials library`);
    // Two library entries with one name stay apart in the file.
    const key = found.name in named ? `${found.name} (${id})` : found.name;
    named[key] = found.model;
    keyOf.set(id, key);
    return key;
  };
  const layers = content.layers.map((layer, i) => ({
    material: ref(layer.materialId, `layers[${i}]`),
    thickness_nm: layer.thicknessNm,
    ...(layer.notes.trim() === '' ? {} : { label: layer.notes }),
  }));
  const file: StackDescription = {
    name: meta.name,
    ...(meta.description === undefined ? {} : { description: meta.description }),
    reference_nm: content.referenceWavelengthNm,
    incident: { material: ref(content.incidentMaterialId, 'incident medium') },
    layers,
    substrate: {
      material: ref(content.substrateMaterialId, 'substrate'),
      thickness_mm: content.substrateThicknessMm,
    },
    materials: named,
  };
  if (content.backSurface === 'same-coating') file.back_layers = [...layers].reverse();
  return file;
}

/** A library material the import may match by name. */
export interface LibraryEntry {
  id: number;
  name: string;
  model: MaterialModel;
  /** Retired materials are not offered for new work. */
  retired?: boolean;
}

export type StackFileImport = { ok: true; content: DesignVersionContent } | { ok: false; problems: string[] };

const sameName = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();
const isAir = (m: MaterialModel) => m.model === 'constant' && m.n === 1 && (m.k ?? 0) === 0;

/**
 * Reads a stack file (already parsed from JSON) as a new draft's content. The file must be a
 * valid stack description (the engine's own checks, with the field at fault); every medium and
 * layer must name a material, which is matched case-insensitively to a library material of that
 * name (an omitted incident medium or `{"n": 1}` is the library's air). Layers given in QWOT are
 * converted with the file's models; a layer's label becomes its notes. Back-surface layers are accepted only as the front coating
 * reversed (the "same coating both sides" treatment); `fallback` supplies what a file does not
 * say (back surface, substrate thickness, reference wavelength, notes).
 */
export function draftFromStackFile(
  input: unknown,
  library: readonly LibraryEntry[],
  fallback: Pick<
    DesignVersionContent,
    'backSurface' | 'substrateThicknessMm' | 'referenceWavelengthNm' | 'notes'
  >,
): StackFileImport {
  const parse = (description: unknown): ReturnType<typeof parseStack> | string => {
    try {
      return parseStack(description);
    } catch (e) {
      if (e instanceof OpticsInputError) return e.message;
      throw e;
    }
  };
  if (typeof input !== 'object' || input === null || !Array.isArray((input as StackDescription).layers)) {
    const shape = parse(input);
    return { ok: false, problems: [typeof shape === 'string' ? shape : 'layers: must be a list'] };
  }
  const root = input as StackDescription;
  const problems: string[] = [];
  const active = library.filter((m) => !m.retired);
  const air = active.find((m) => isAir(m.model));
  /** Models of library materials the file names without defining them, for the engine's checks. */
  const fromLibrary: Record<string, MaterialModel> = {};

  const match = (medium: unknown, where: string): number | null => {
    const m = (typeof medium === 'object' && medium !== null ? medium : {}) as {
      material?: unknown;
      n?: unknown;
      k?: unknown;
    };
    if (medium === undefined || (m.material === undefined && m.n === 1 && !m.k)) {
      if (air) return air.id;
      problems.push(`${where}: air (n = 1) has no material in the library; add one first`);
      return null;
    }
    if (typeof m.material !== 'string') {
      problems.push(
        `${where}: give a material by name; an index or model written inline has no library material`,
      );
      return null;
    }
    const name = m.material;
    const found = active.find((x) => sameName(x.name, name));
    if (!found) {
      const retired = library.some((x) => x.retired && sameName(x.name, name));
      problems.push(
        retired
          ? `${where}: material "${name}" is retired in the library`
          : `${where}: material "${name}" is not in the library (match a library name, or add it first)`,
      );
      return null;
    }
    if (!(root.materials && name in root.materials)) fromLibrary[name] = found.model;
    return found.id;
  };

  const incidentId = match(root.incident, 'incident');
  const substrateId = match(root.substrate, 'substrate');
  const layerIds = root.layers.map((layer, i) => match(layer, `layers[${i}]`));
  if (root.exit !== undefined && incidentId !== null && match(root.exit, 'exit') !== incidentId)
    problems.push('exit: a design is surrounded by its incident medium on both sides; leave "exit" out');
  if (problems.length > 0 || incidentId === null || substrateId === null) return { ok: false, problems };

  const resolved = parse({ ...root, materials: { ...fromLibrary, ...(root.materials ?? {}) } });
  if (typeof resolved === 'string') return { ok: false, problems: [resolved] };
  const layers: DesignLayer[] = root.layers.map((layer, i) => ({
    materialId: layerIds[i] as number,
    thicknessNm: elementAt(resolved.layers, i, 'the resolved layers').thicknessNm,
    locked: false,
    notes: layer.label ?? '',
  }));
  // The engine allows a 0 nm layer; a design's Layer grid does not, nor one above its largest.
  resolved.layers.forEach((l, i) => {
    const checked = layerThicknessNm.safeParse(l.thicknessNm);
    if (!checked.success)
      problems.push(`layers[${i}]: ${checked.error.issues.map((issue) => issue.message).join('; ')}`);
  });

  let backSurface: BackSurfaceTreatment =
    fallback.backSurface === 'same-coating' ? 'bare' : fallback.backSurface;
  if (root.back_layers !== undefined && root.back_layers.length > 0) {
    const front = resolved.layers;
    const back = resolved.backLayers;
    const mirrored =
      back.length === front.length &&
      back.every((b, i) => {
        const f = elementAt(front, front.length - 1 - i, 'the front layers');
        return (
          Math.abs(b.thicknessNm - f.thicknessNm) < 1e-9 &&
          JSON.stringify(b.material) === JSON.stringify(f.material)
        );
      });
    if (mirrored) backSurface = 'same-coating';
    else
      problems.push(
        'back_layers: only the front coating reversed (the same coating on both sides) can be imported',
      );
  }
  if (problems.length > 0) return { ok: false, problems };
  return {
    ok: true,
    content: {
      incidentMaterialId: incidentId,
      substrateMaterialId: substrateId,
      substrateThicknessMm: resolved.substrateThicknessMm ?? fallback.substrateThicknessMm,
      backSurface,
      referenceWavelengthNm: root.reference_nm ?? fallback.referenceWavelengthNm,
      notes: fallback.notes,
      layers,
    },
  };
}
