/*
 * Stacks: the documented JSON stack description (what users, files and the API exchange) and the
 * resolved OpticalStack the engine computes with. Layers are listed from the incident side to the
 * substrate; back-surface layers from the substrate outwards.
 */
import { arrayValue, nonNegativeNumber, onlyKeys, plainObject, positiveNumber } from './checks.js';
import { validateMaterialModel, type MaterialModel } from './dispersion.js';
import { OpticsInputError, fieldPath } from './errors.js';
import { MATERIAL_LIBRARY } from './library.js';
import { materialQwotToNm } from './thickness.js';

/** A layer of the resolved stack. */
export interface Layer {
  material: MaterialModel;
  /** Physical thickness in nm, ≥ 0. */
  thicknessNm: number;
  /** Optional name shown to users (e.g. "H1"). */
  label?: string;
}

/** A resolved, validated stack: what the engine's entry points take. */
export interface OpticalStack {
  /** Incident medium; must be lossless (k = 0) at every wavelength computed. */
  incident: MaterialModel;
  /** Front coating, incident side first. */
  layers: readonly Layer[];
  substrate: MaterialModel;
  /** Substrate thickness in mm; needed for the incoherent model when the substrate absorbs. */
  substrateThicknessMm?: number;
  /** Back-surface coating, listed from the substrate outwards (empty: bare back surface). */
  backLayers: readonly Layer[];
  /** Medium behind the part (the incident medium when omitted). */
  exit: MaterialModel;
}

/**
 * A medium or layer material in the stack description: either a constant index `{ "n": 1.52,
 * "k": 0 }` or `{ "material": … }` naming an entry of the description's `materials`, a built-in
 * material (see MATERIAL_LIBRARY), or giving a dispersion model inline.
 */
export interface MediumDescription {
  n?: number;
  k?: number;
  material?: string | MaterialModel;
}

/** A layer: a medium plus exactly one of `thickness_nm` or `qwot` (QWOT at `reference_nm`). */
export interface LayerDescription extends MediumDescription {
  thickness_nm?: number;
  qwot?: number;
  /** Reference wavelength for `qwot`, nm (else the stack's `reference_nm`). */
  reference_nm?: number;
  label?: string;
}

export interface SubstrateDescription extends MediumDescription {
  /** Substrate thickness in mm (for the incoherent thick-substrate model). */
  thickness_mm?: number;
}

/** The JSON stack description (the stack file format). */
export interface StackDescription {
  /** Incident medium; air (n = 1) when omitted. */
  incident?: MediumDescription;
  substrate: SubstrateDescription;
  /** Front coating, from the incident side to the substrate. */
  layers: LayerDescription[];
  /** Back-surface coating, from the substrate outwards. */
  back_layers?: LayerDescription[];
  /** Medium behind the part; the incident medium when omitted. */
  exit?: MediumDescription;
  /** Reference wavelength (nm) for layers given in QWOT. */
  reference_nm?: number;
  /** Named dispersion models that layers can refer to by name. */
  materials?: Record<string, MaterialModel>;
  /** Free text, ignored by the engine. */
  name?: string;
  description?: string;
}

const AIR: MaterialModel = { model: 'constant', n: 1, k: 0 };
const MEDIUM_KEYS = ['n', 'k', 'material'];
const LAYER_KEYS = [...MEDIUM_KEYS, 'thickness_nm', 'qwot', 'reference_nm', 'label'];
const STACK_KEYS = [
  'incident',
  'substrate',
  'layers',
  'back_layers',
  'exit',
  'reference_nm',
  'materials',
  'name',
  'description',
];

/**
 * Validates a stack description (e.g. a parsed stack file) and resolves it: materials looked up,
 * QWOT converted to nm. Throws {@link OpticsInputError} whose `field` names the offending entry
 * (`layers[1].thickness_nm`, `substrate.k`, …).
 */
export function parseStack(input: unknown): OpticalStack {
  const root = plainObject(input, '');
  onlyKeys(root, STACK_KEYS, '');
  const named = parseMaterialMap(root.materials);
  const referenceNm =
    root.reference_nm === undefined ? undefined : positiveNumber(root.reference_nm, 'reference_nm');

  const incident =
    root.incident === undefined ? AIR : parseMedium(root.incident, 'incident', named, MEDIUM_KEYS);
  if (root.substrate === undefined) throw new OpticsInputError('substrate', 'is required');
  const substrateObj = plainObject(root.substrate, 'substrate');
  const substrate = parseMedium(substrateObj, 'substrate', named, [...MEDIUM_KEYS, 'thickness_mm']);
  const substrateThicknessMm =
    substrateObj.thickness_mm === undefined
      ? undefined
      : positiveNumber(substrateObj.thickness_mm, 'substrate.thickness_mm');
  if (root.layers === undefined)
    throw new OpticsInputError('layers', 'is required (use [] for a bare substrate)');
  const layers = parseLayers(root.layers, 'layers', named, referenceNm);
  const backLayers =
    root.back_layers === undefined ? [] : parseLayers(root.back_layers, 'back_layers', named, referenceNm);
  const exit = root.exit === undefined ? incident : parseMedium(root.exit, 'exit', named, MEDIUM_KEYS);

  for (const key of ['name', 'description'] as const) {
    if (root[key] !== undefined && typeof root[key] !== 'string')
      throw new OpticsInputError(key, 'must be text');
  }
  const stack: OpticalStack = { incident, layers, substrate, backLayers, exit };
  if (substrateThicknessMm !== undefined) stack.substrateThicknessMm = substrateThicknessMm;
  checkIncidentLossless(incident, 'incident');
  return stack;
}

/**
 * Checks an OpticalStack built in code (not from a description) and returns a normalised copy.
 * Field paths use the OpticalStack's own names (`layers[0].thicknessNm`). `checkMaterial` checks
 * each medium and layer material (validateMaterialModel unless given, e.g. by a plan that reuses
 * materials it has checked before).
 */
export function validateOpticalStack(
  stack: OpticalStack,
  checkMaterial: (value: unknown, field: string) => MaterialModel = validateMaterialModel,
): OpticalStack {
  const obj = plainObject(stack, '');
  const layers = (list: unknown, field: string): Layer[] =>
    arrayValue(list, field).map((item, i) => {
      const at = fieldPath(field, i);
      const layer = plainObject(item, at);
      const out: Layer = {
        material: checkMaterial(layer.material, fieldPath(at, 'material')),
        thicknessNm: nonNegativeNumber(layer.thicknessNm, fieldPath(at, 'thicknessNm')),
      };
      if (typeof layer.label === 'string') out.label = layer.label;
      return out;
    });
  const incident = checkMaterial(obj.incident, 'incident');
  checkIncidentLossless(incident, 'incident');
  const out: OpticalStack = {
    incident,
    layers: layers(obj.layers, 'layers'),
    substrate: checkMaterial(obj.substrate, 'substrate'),
    backLayers: obj.backLayers === undefined ? [] : layers(obj.backLayers, 'backLayers'),
    exit: obj.exit === undefined ? incident : checkMaterial(obj.exit, 'exit'),
  };
  if (obj.substrateThicknessMm !== undefined) {
    out.substrateThicknessMm = positiveNumber(obj.substrateThicknessMm, 'substrateThicknessMm');
  }
  return out;
}

/** Sum of the front layers' physical thicknesses, nm. */
export function stackThicknessNm(stack: OpticalStack): number {
  let total = 0;
  for (const layer of stack.layers) total += layer.thicknessNm;
  return total;
}

function checkIncidentLossless(model: MaterialModel, field: string): void {
  let lossy: boolean;
  switch (model.model) {
    case 'constant':
    case 'sellmeier':
      lossy = (model.k ?? 0) > 0;
      break;
    case 'cauchy':
      lossy = (model.k ?? 0) > 0 || (model.absorption?.k ?? 0) > 0;
      break;
    case 'table':
      lossy = (model.k ?? []).some((k) => k > 0);
      break;
  }
  if (lossy) {
    throw new OpticsInputError(
      field,
      'the incident medium must be lossless (k = 0): reflectance is not defined inside an absorber',
    );
  }
}

function parseMaterialMap(value: unknown): Map<string, MaterialModel> {
  const named = new Map<string, MaterialModel>();
  if (value === undefined) return named;
  const obj = plainObject(value, 'materials');
  for (const [name, model] of Object.entries(obj)) {
    named.set(name, validateMaterialModel(model, fieldPath('materials', name)));
  }
  return named;
}

function parseMedium(
  value: unknown,
  field: string,
  named: Map<string, MaterialModel>,
  allowedKeys: readonly string[],
): MaterialModel {
  const obj = plainObject(value, field);
  onlyKeys(obj, allowedKeys, field);
  if (obj.material !== undefined) {
    if (obj.n !== undefined || obj.k !== undefined) {
      throw new OpticsInputError(field, 'give either "n"/"k" or "material", not both');
    }
    const at = fieldPath(field, 'material');
    if (typeof obj.material === 'string') {
      const found = named.get(obj.material) ?? MATERIAL_LIBRARY[obj.material];
      if (!found) {
        const known = [...named.keys(), ...Object.keys(MATERIAL_LIBRARY)];
        throw new OpticsInputError(at, `unknown material "${obj.material}" (known: ${known.join(', ')})`);
      }
      return found;
    }
    return validateMaterialModel(obj.material, at);
  }
  if (obj.n === undefined) {
    throw new OpticsInputError(field, 'give the index as "n" (and optionally "k"), or a "material"');
  }
  return validateMaterialModel({ model: 'constant', n: obj.n, k: obj.k ?? 0 }, field);
}

function parseLayers(
  value: unknown,
  field: string,
  named: Map<string, MaterialModel>,
  stackReferenceNm: number | undefined,
): Layer[] {
  return arrayValue(value, field).map((item, i) => {
    const at = fieldPath(field, i);
    const obj = plainObject(item, at);
    const material = parseMedium(obj, at, named, LAYER_KEYS);
    let thicknessNm: number;
    if (obj.thickness_nm !== undefined && obj.qwot !== undefined) {
      throw new OpticsInputError(at, 'give either "thickness_nm" or "qwot", not both');
    }
    if (obj.thickness_nm !== undefined) {
      thicknessNm = nonNegativeNumber(obj.thickness_nm, fieldPath(at, 'thickness_nm'));
    } else if (obj.qwot !== undefined) {
      const qwot = nonNegativeNumber(obj.qwot, fieldPath(at, 'qwot'));
      const ref =
        obj.reference_nm !== undefined
          ? positiveNumber(obj.reference_nm, fieldPath(at, 'reference_nm'))
          : stackReferenceNm;
      if (ref === undefined) {
        throw new OpticsInputError(
          fieldPath(at, 'qwot'),
          'needs a reference wavelength: set "reference_nm" on the layer or the stack',
        );
      }
      try {
        thicknessNm = materialQwotToNm(material, qwot, ref);
      } catch (error) {
        if (error instanceof OpticsInputError)
          throw new OpticsInputError(fieldPath(at, 'qwot'), error.problem);
        throw error;
      }
    } else {
      throw new OpticsInputError(at, 'needs a thickness: "thickness_nm" (physical, nm) or "qwot"');
    }
    const layer: Layer = { material, thicknessNm };
    if (obj.label !== undefined) {
      if (typeof obj.label !== 'string') throw new OpticsInputError(fieldPath(at, 'label'), 'must be text');
      layer.label = obj.label;
    }
    return layer;
  });
}
