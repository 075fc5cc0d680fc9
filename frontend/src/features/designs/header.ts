/*
 * The header fields of a design version, checked with the API's own field schemas
 * (versionContentSchema in shared/src/schemas/designs.ts), so the limits and messages are its.
 */
import {
  versionContentSchema,
  type BackSurfaceTreatment,
  type DesignLayer,
  type DesignVersionContent,
} from '@quietglass/shared';
import type { RegisterOptions } from 'react-hook-form';
import { parseNumberInput } from '../../lib/format';
import { chosenId, schemaRule, typedNumber } from '../../lib/validation';

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

const { shape } = versionContentSchema;

/** react-hook-form rules of each header field: the API's own field schemas, run on the typed text. */
export const HEADER_RULES = {
  incidentMaterialId: schemaRule(chosenId.pipe(shape.incidentMaterialId)),
  substrateMaterialId: schemaRule(chosenId.pipe(shape.substrateMaterialId)),
  substrateThicknessMm: schemaRule(typedNumber.pipe(shape.substrateThicknessMm)),
  referenceWavelengthNm: schemaRule(typedNumber.pipe(shape.referenceWavelengthNm)),
  notes: schemaRule(shape.notes),
  backSurface: schemaRule(shape.backSurface),
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
  return HEADER_RULES.referenceWavelengthNm.validate(values.referenceWavelengthNm) === true
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
