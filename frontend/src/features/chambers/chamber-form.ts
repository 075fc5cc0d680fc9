import { chamberInputSchema, chamberMaterialSchema, type ChamberInput } from '@quietglass/shared';
import { z } from 'zod';
import { parseNumberList } from '../../lib/format';
import { chosenId, typedNumber } from '../../lib/validation';
import type { ChamberView } from './api/get-chambers';

export interface MaterialRowValues {
  materialId: string;
  toolingFactor: string;
  rateNmPerS: string;
}

export interface ChamberFormValues {
  name: string;
  /** Typed as a list, e.g. "550, 632.8". */
  monitorWavelengths: string;
  monitorChipMaterialId: string;
  materials: MaterialRowValues[];
  notes: string;
}

export const EMPTY_MATERIAL_ROW: MaterialRowValues = { materialId: '', toolingFactor: '1', rateNmPerS: '' };

export function valuesOfChamber(chamber: ChamberView | null): ChamberFormValues {
  if (!chamber) {
    return {
      name: '',
      monitorWavelengths: '',
      monitorChipMaterialId: '',
      materials: [{ ...EMPTY_MATERIAL_ROW }],
      notes: '',
    };
  }
  return {
    name: chamber.name,
    monitorWavelengths: chamber.monitorWavelengthsNm.join(', '),
    monitorChipMaterialId: String(chamber.monitorChipMaterialId),
    materials: chamber.materials.map((m) => ({
      materialId: String(m.materialId),
      toolingFactor: String(m.toolingFactor),
      rateNmPerS: String(m.rateNmPerS),
    })),
    notes: chamber.notes,
  };
}

const { shape } = chamberInputSchema;
const { shape: row } = chamberMaterialSchema;

/**
 * The form's values checked by the API's own schema: the fields are typed text, parsed here
 * and then held to the same limits and messages as the API.
 */
export const chamberFormSchema = z
  .object({
    name: shape.name,
    monitorWavelengths: z
      .string()
      .transform((text, ctx) => {
        const list = parseNumberList(text);
        if (list === null) {
          ctx.addIssue({
            code: 'custom',
            message: 'Enter wavelengths in nm as numbers separated by commas, e.g. 550, 632.8',
          });
          return z.NEVER;
        }
        return list;
      })
      .pipe(shape.monitorWavelengthsNm),
    monitorChipMaterialId: chosenId.pipe(shape.monitorChipMaterialId),
    materials: z
      .array(
        z.object({
          materialId: chosenId.pipe(row.materialId),
          toolingFactor: typedNumber.pipe(row.toolingFactor),
          rateNmPerS: typedNumber.pipe(row.rateNmPerS),
        }),
      )
      .pipe(shape.materials),
    notes: shape.notes.unwrap(),
  })
  .transform(({ monitorWavelengths, ...rest }): ChamberInput => ({
    ...rest,
    monitorWavelengthsNm: monitorWavelengths,
  }));

/** The request body of valid form values. */
export type ChamberFormOutput = z.output<typeof chamberFormSchema>;
