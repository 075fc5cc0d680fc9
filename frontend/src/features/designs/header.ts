/*
 * The header fields of a design version and the API's rules for them (VersionContentDto:
 * substrate thickness 0 < d ≤ 1000 mm, reference wavelength 100–20000 nm, notes ≤ 8000
 * characters, back surface one of BACK_SURFACE_TREATMENTS).
 */
import {
  BACK_SURFACE_TREATMENTS,
  type BackSurfaceTreatment,
  type DesignLayer,
  type DesignVersionContent,
} from '@quietglass/shared';
import type { RegisterOptions } from 'react-hook-form';
import { parseNumberInput } from '../../lib/format';

export interface HeaderValues {
  incidentMaterialId: string;
  substrateMaterialId: string;
  substrateThicknessMm: string;
  backSurface: BackSurfaceTreatment;
  referenceWavelengthNm: string;
  notes: string;
}

export const BACK_SURFACE_LABELS: Readonly<Record<BackSurfaceTreatment, string>> = {
  'front-only': 'Front surface only (substrate taken as semi-infinite)',
  bare: 'Uncoated back surface',
  'same-coating': 'Back coated with the same stack',
};

export const MAX_SUBSTRATE_MM = 1000;
export const MIN_REFERENCE_NM = 100;
export const MAX_REFERENCE_NM = 20_000;
export const MAX_VERSION_NOTES = 8000;

type Rule = (value: string) => true | string;

const materialRule =
  (what: string): Rule =>
  (value) =>
    (value !== '' && Number.isInteger(Number(value))) || `Choose the ${what}`;

const substrateThicknessRule: Rule = (value) => {
  const mm = parseNumberInput(value);
  if (mm === null) return 'Enter the substrate thickness in mm';
  if (!(mm > 0)) return 'Must be greater than 0 mm';
  if (mm > MAX_SUBSTRATE_MM) return `Must be at most ${MAX_SUBSTRATE_MM} mm`;
  return true;
};

const referenceRule: Rule = (value) => {
  const nm = parseNumberInput(value);
  if (nm === null) return 'Enter the reference wavelength in nm';
  if (nm < MIN_REFERENCE_NM || nm > MAX_REFERENCE_NM)
    return `Must be from ${MIN_REFERENCE_NM} to ${MAX_REFERENCE_NM} nm`;
  return true;
};

const notesRule: Rule = (value) =>
  value.length <= MAX_VERSION_NOTES || `At most ${MAX_VERSION_NOTES} characters`;

/** react-hook-form rules of each header field. */
export const HEADER_RULES = {
  incidentMaterialId: { validate: materialRule('incident medium') },
  substrateMaterialId: { validate: materialRule('substrate') },
  substrateThicknessMm: { validate: substrateThicknessRule },
  referenceWavelengthNm: { validate: referenceRule },
  notes: { validate: notesRule },
  backSurface: {
    validate: (value: string) =>
      (BACK_SURFACE_TREATMENTS as readonly string[]).includes(value) || 'Choose the back surface',
  },
} satisfies Record<keyof HeaderValues, RegisterOptions<HeaderValues, keyof HeaderValues>>;

const HEADER_LABELS: Readonly<Record<keyof HeaderValues, string>> = {
  incidentMaterialId: 'Incident medium',
  substrateMaterialId: 'Substrate',
  substrateThicknessMm: 'Substrate thickness',
  backSurface: 'Back surface',
  referenceWavelengthNm: 'Reference wavelength',
  notes: 'Notes',
};

/** Every header problem, "Substrate thickness: Must be greater than 0 mm". */
export function headerProblems(values: HeaderValues): string[] {
  return (Object.keys(HEADER_RULES) as (keyof HeaderValues)[]).flatMap((key) => {
    const verdict = HEADER_RULES[key].validate(String(values[key] ?? ''));
    return verdict === true ? [] : [`${HEADER_LABELS[key]}: ${verdict}`];
  });
}

export function headerValuesOf(content: DesignVersionContent): HeaderValues {
  return {
    incidentMaterialId: String(content.incidentMaterialId),
    substrateMaterialId: String(content.substrateMaterialId),
    substrateThicknessMm: String(content.substrateThicknessMm),
    backSurface: content.backSurface,
    referenceWavelengthNm: String(content.referenceWavelengthNm),
    notes: content.notes,
  };
}

/** The reference wavelength in nm, or null while the field is invalid. */
export function referenceOf(values: HeaderValues): number | null {
  return referenceRule(values.referenceWavelengthNm) === true
    ? parseNumberInput(values.referenceWavelengthNm)
    : null;
}

/** Version content from valid header values and layers. */
export function contentOf(values: HeaderValues, layers: DesignLayer[]): DesignVersionContent {
  return {
    incidentMaterialId: Number(values.incidentMaterialId),
    substrateMaterialId: Number(values.substrateMaterialId),
    substrateThicknessMm: parseNumberInput(values.substrateThicknessMm) ?? NaN,
    backSurface: values.backSurface,
    referenceWavelengthNm: parseNumberInput(values.referenceWavelengthNm) ?? NaN,
    notes: values.notes,
    layers,
  };
}
