import Box from '@mui/material/Box';
import { BACK_SURFACE_TREATMENTS, pickableMaterials } from '@quietglass/shared';
import {
  useWatch,
  type Control,
  type FieldPath,
  type FieldValues,
  type RegisterOptions,
} from 'react-hook-form';
import { FormSelectField, namedOptions } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { BACK_SURFACE_LABELS, HEADER_RULES, type HeaderValues } from '../header';
import type { LibraryMaterial } from '../layers';

interface VersionHeaderFieldsProps<T extends HeaderValues & FieldValues> {
  /** A form holding the header values (the version editor's, or the new-design dialog's). */
  control: Control<T>;
  materials: readonly LibraryMaterial[];
  disabled: boolean;
  size?: 'small' | 'medium';
}

const BACK_SURFACE_OPTIONS = BACK_SURFACE_TREATMENTS.map((t) => ({
  value: t,
  label: BACK_SURFACE_LABELS[t],
}));

/** Incident medium, substrate and its thickness, back surface, reference wavelength and notes. */
export function VersionHeaderFields<T extends HeaderValues & FieldValues>({
  control,
  materials,
  disabled,
  size = 'small',
}: VersionHeaderFieldsProps<T>) {
  // T extends HeaderValues, so each header key is a field of T with the header rule's value type.
  const field = (key: keyof HeaderValues) => ({
    control,
    name: key as FieldPath<T>,
    rules: HEADER_RULES[key] as RegisterOptions<T, FieldPath<T>>,
    size,
    disabled,
  });
  // A retired material stays on offer only while it is the one chosen.
  const chosen = useWatch({
    control,
    name: ['incidentMaterialId', 'substrateMaterialId'] as FieldPath<T>[],
  }) as unknown[];
  const materialOptions = namedOptions(
    pickableMaterials(
      materials,
      chosen.map((v) => (v === '' || v === null || v === undefined ? null : Number(v))),
    ),
  );
  return (
    <Box
      sx={{
        display: 'grid',
        gap: 2,
        gridTemplateColumns: { xs: '1fr', sm: 'repeat(2, minmax(0, 1fr))', md: 'repeat(3, minmax(0, 1fr))' },
      }}
    >
      <FormSelectField
        {...field('incidentMaterialId')}
        label="Incident medium"
        placeholder="Choose…"
        options={materialOptions}
      />
      <FormSelectField
        {...field('substrateMaterialId')}
        label="Substrate"
        placeholder="Choose…"
        options={materialOptions}
      />
      <FormTextField
        {...field('substrateThicknessMm')}
        label="Substrate thickness (mm)"
        slotProps={{ htmlInput: { inputMode: 'decimal' } }}
      />
      <FormSelectField {...field('backSurface')} label="Back surface" options={BACK_SURFACE_OPTIONS} />
      <FormTextField
        {...field('referenceWavelengthNm')}
        label="Reference wavelength (nm)"
        helperText="QWOT is taken at this wavelength"
        slotProps={{ htmlInput: { inputMode: 'decimal' } }}
      />
      <FormTextField {...field('notes')} label="Version notes" multiline maxRows={3} />
    </Box>
  );
}
