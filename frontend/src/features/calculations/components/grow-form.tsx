import { OPTIMISE_LIMITS, pickableMaterials } from '@quietglass/shared';
import { zodResolver } from '@hookform/resolvers/zod';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControl from '@mui/material/FormControl';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormGroup from '@mui/material/FormGroup';
import FormHelperText from '@mui/material/FormHelperText';
import FormLabel from '@mui/material/FormLabel';
import { useMemo } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { growDefaults, growFormSchema, type GrowFormOutput, type GrowValues } from '../optimise-forms';
import { TargetMarginField, useShopMarginDefault } from './target-margin-field';
import { ThicknessBoundsFields } from './thickness-bounds-fields';

const GROWTH_MERIT_OPTIONS = [
  { value: 'smooth', label: 'R → 0, then fit to the mask' },
  { value: 'mask', label: 'The spec mask' },
];

interface GrowFormProps {
  materials: readonly { id: number; name: string }[];
  /** Materials ticked at first (those of the version's layers). */
  initialMaterialIds: number[];
  /** The version's layer count: the most layers may not be below it. */
  layerCount: number;
  pending: boolean;
  onRun: (body: GrowFormOutput) => void;
}

interface MaterialChecksProps {
  legend: string;
  materials: readonly { id: number; name: string }[];
  value: number[];
  onChange: (ids: number[]) => void;
  error?: string;
  help?: string;
}

/** A row of material checkboxes bound to a list of ids. */
function MaterialChecks({ legend, materials, value, onChange, error, help }: MaterialChecksProps) {
  return (
    <FormControl component="fieldset" error={Boolean(error)}>
      <FormLabel component="legend">{legend}</FormLabel>
      <FormGroup row>
        {materials.map((m) => (
          <FormControlLabel
            key={m.id}
            label={m.name}
            control={
              <Checkbox
                size="small"
                checked={value.includes(m.id)}
                onChange={(e) =>
                  onChange(e.target.checked ? [...value, m.id] : value.filter((id) => id !== m.id))
                }
              />
            }
          />
        ))}
      </FormGroup>
      {(error ?? help) && <FormHelperText>{error ?? help}</FormHelperText>}
    </FormControl>
  );
}

/** Allowed materials and limits of Grow layers (needle synthesis from the version's stack). */
export function GrowForm({ materials, initialMaterialIds, layerCount, pending, onRun }: GrowFormProps) {
  const resolver = useMemo(() => zodResolver(growFormSchema(layerCount)), [layerCount]);
  const form = useForm<GrowValues, unknown, GrowFormOutput>({
    defaultValues: growDefaults(initialMaterialIds.slice(0, OPTIMISE_LIMITS.allowedMaterials), layerCount),
    mode: 'onTouched',
    resolver,
  });
  const { control, handleSubmit } = form;
  useShopMarginDefault(form);
  const allowed = useWatch({ control, name: 'allowedMaterialIds' });
  const onSubmit = handleSubmit(onRun);
  return (
    <Box
      component="form"
      noValidate
      aria-label="Grow layers settings"
      onSubmit={onSubmit}
      sx={{ display: 'grid', gap: 1.5 }}
    >
      <Controller
        control={control}
        name="allowedMaterialIds"
        render={({ field, fieldState }) => (
          <MaterialChecks
            legend="Allowed materials"
            materials={pickableMaterials(materials, initialMaterialIds)}
            value={field.value}
            onChange={field.onChange}
            error={fieldState.error?.message}
          />
        )}
      />
      <Controller
        control={control}
        name="outermostOnlyMaterialIds"
        render={({ field }) => (
          <MaterialChecks
            legend="Only as the outermost layer"
            materials={materials.filter((m) => allowed.includes(m.id))}
            value={field.value.filter((id) => allowed.includes(id))}
            onChange={field.onChange}
            help="e.g. a soft fluoride on top: never placed inside the stack"
          />
        )}
      />
      <Controller
        control={control}
        name="nextToSubstrateMaterialIds"
        render={({ field }) => (
          <MaterialChecks
            legend="Allowed next to the substrate"
            materials={materials.filter((m) => allowed.includes(m.id))}
            value={field.value.filter((id) => allowed.includes(id))}
            onChange={field.onChange}
            help="None ticked: any allowed material"
          />
        )}
      />
      <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', alignItems: 'flex-start' }}>
        <FormTextField
          control={control}
          name="maxLayers"
          label="Max layers"
          size="small"
          sx={{ width: 130 }}
        />
        <FormTextField
          control={control}
          name="maxTotalThicknessNm"
          label="Max total thickness (nm)"
          size="small"
          sx={{ width: 200 }}
        />
        <ThicknessBoundsFields control={control} />
        <TargetMarginField control={control} />
        <FormTextField control={control} name="maxSteps" label="Max steps" size="small" sx={{ width: 120 }} />
      </Box>
      <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', alignItems: 'flex-start' }}>
        <FormSelectField
          control={control}
          name="growthMerit"
          label="Grow on"
          options={GROWTH_MERIT_OPTIONS}
          size="small"
          sx={{ width: 260 }}
          helperText="The spec mask may stall on wide bands"
        />
        <FormTextField
          control={control}
          name="needlesPerStep"
          label="Needles per step"
          size="small"
          sx={{ width: 150 }}
        />
      </Box>
      <Box>
        <Button type="submit" variant="contained" loading={pending}>
          Run Grow layers
        </Button>
      </Box>
    </Box>
  );
}
