import { parseNumberInput, parseNumberList } from '../../lib/format';
import type { ChamberInput } from './api/create-chamber';
import type { ChamberView } from './api/get-chambers';

/** Limits of the API's ChamberDto. */
export const CHAMBER_LIMITS = {
  nameLength: 120,
  notesLength: 4000,
  wavelengths: { min: 200, max: 3000, count: 8 },
  toolingFactorMax: 10,
  rateMax: 100,
} as const;

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

/** Each rule returns true or the message shown under the field. */
export const chamberRules = {
  name(value: string): true | string {
    const name = value.trim();
    if (name === '') return 'Enter a chamber name';
    return name.length <= CHAMBER_LIMITS.nameLength || `At most ${CHAMBER_LIMITS.nameLength} characters`;
  },
  monitorWavelengths(value: string): true | string {
    const list = parseNumberList(value);
    const { min, max, count } = CHAMBER_LIMITS.wavelengths;
    if (list === null) return 'Enter wavelengths in nm as numbers separated by commas, e.g. 550, 632.8';
    if (list.length === 0) return 'Enter at least one monitor wavelength';
    if (list.length > count) return `At most ${count} monitor wavelengths`;
    if (list.some((w) => w < min || w > max))
      return `Monitor wavelengths must be between ${min} and ${max} nm`;
    return true;
  },
  monitorChip(value: string): true | string {
    return value !== '' || 'Choose the material of the monitor chip';
  },
  material(value: string, rows: readonly MaterialRowValues[], index: number, nameOf: (id: number) => string) {
    if (value === '') return 'Choose a material';
    const first = rows.findIndex((r) => r.materialId === value);
    return first === index || `${nameOf(Number(value))} is already listed in row ${first + 1}`;
  },
  toolingFactor(value: string): true | string {
    const tf = parseNumberInput(value);
    if (tf === null) return 'Enter the tooling factor as a number, e.g. 1.04';
    if (tf <= 0) return 'Tooling factor must be greater than 0';
    return (
      tf <= CHAMBER_LIMITS.toolingFactorMax ||
      `Tooling factor must be at most ${CHAMBER_LIMITS.toolingFactorMax}`
    );
  },
  rate(value: string): true | string {
    const rate = parseNumberInput(value);
    if (rate === null) return 'Enter the rate in nm/s as a number, e.g. 0.8';
    if (rate <= 0) return 'Rate must be greater than 0 nm/s';
    return rate <= CHAMBER_LIMITS.rateMax || `Rate must be at most ${CHAMBER_LIMITS.rateMax} nm/s`;
  },
  notes(value: string): true | string {
    return value.length <= CHAMBER_LIMITS.notesLength || `At most ${CHAMBER_LIMITS.notesLength} characters`;
  },
};

/** The request body of valid form values (the rules above have passed). */
export function chamberInputOf(values: ChamberFormValues): ChamberInput {
  return {
    name: values.name.trim(),
    monitorWavelengthsNm: parseNumberList(values.monitorWavelengths) ?? [],
    monitorChipMaterialId: Number(values.monitorChipMaterialId),
    materials: values.materials.map((m) => ({
      materialId: Number(m.materialId),
      toolingFactor: parseNumberInput(m.toolingFactor) ?? Number.NaN,
      rateNmPerS: parseNumberInput(m.rateNmPerS) ?? Number.NaN,
    })),
    notes: values.notes,
  };
}
