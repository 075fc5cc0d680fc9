import { pickableMaterials } from '@quietglass/shared';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControl from '@mui/material/FormControl';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormGroup from '@mui/material/FormGroup';
import FormHelperText from '@mui/material/FormHelperText';
import FormLabel from '@mui/material/FormLabel';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';
import type { GrowRequest } from '../api/submit-optimisation';
import { numberIn, wholeIn } from '../form-rules';
import { DEFAULT_TARGET_MARGIN_TEXT, TargetMarginField, useShopMarginDefault } from './target-margin-field';
import { ThicknessBoundsFields } from './thickness-bounds-fields';

/** Most materials Grow layers may use (GrowDto). */
export const MAX_ALLOWED_MATERIALS = 8;

interface GrowValues {
  allowedMaterialIds: number[];
  outermostOnlyMaterialIds: number[];
  nextToSubstrateMaterialIds: number[];
  maxLayers: string;
  maxTotalThicknessNm: string;
  minThicknessNm: string;
  maxThicknessNm: string;
  maxSteps: string;
  targetMarginPercent: string;
}

interface GrowFormProps {
  materials: readonly { id: number; name: string }[];
  /** Materials ticked at first (those of the version's layers). */
  initialMaterialIds: number[];
  /** The version's layer count: the most layers may not be below it. */
  layerCount: number;
  pending: boolean;
  onRun: (body: GrowRequest) => void;
}

/** The placement rules of the form, only for materials still allowed; omitted when none is ticked. */
function placement(
  v: GrowValues,
): Pick<GrowRequest, 'outermostOnlyMaterialIds' | 'nextToSubstrateMaterialIds'> {
  const keep = (ids: number[]) => ids.filter((id) => v.allowedMaterialIds.includes(id));
  const outer = keep(v.outermostOnlyMaterialIds);
  const bottom = keep(v.nextToSubstrateMaterialIds);
  return {
    ...(outer.length > 0 ? { outermostOnlyMaterialIds: outer } : {}),
    ...(bottom.length > 0 ? { nextToSubstrateMaterialIds: bottom } : {}),
  };
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
  const form = useForm<GrowValues>({
    defaultValues: {
      allowedMaterialIds: initialMaterialIds.slice(0, MAX_ALLOWED_MATERIALS),
      outermostOnlyMaterialIds: [],
      nextToSubstrateMaterialIds: [],
      maxLayers: String(Math.max(30, layerCount)),
      maxTotalThicknessNm: '5000',
      minThicknessNm: '10',
      maxThicknessNm: '1000',
      maxSteps: '30',
      targetMarginPercent: DEFAULT_TARGET_MARGIN_TEXT,
    },
    mode: 'onTouched',
  });
  const { control, handleSubmit } = form;
  useShopMarginDefault(form);
  const allowed = useWatch({ control, name: 'allowedMaterialIds' });
  const onSubmit = handleSubmit((v) =>
    onRun({
      allowedMaterialIds: v.allowedMaterialIds,
      ...placement(v),
      maxLayers: Number(v.maxLayers),
      maxTotalThicknessNm: Number(v.maxTotalThicknessNm),
      minThicknessNm: Number(v.minThicknessNm),
      maxThicknessNm: Number(v.maxThicknessNm),
      maxSteps: Number(v.maxSteps),
      targetMarginPercent: Number(v.targetMarginPercent),
    }),
  );
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
        rules={{
          validate: (ids) =>
            ids.length === 0
              ? 'Choose at least one material'
              : ids.length > MAX_ALLOWED_MATERIALS
                ? `Choose at most ${MAX_ALLOWED_MATERIALS} materials`
                : true,
        }}
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
          rules={{ validate: wholeIn('Max layers', Math.max(1, layerCount), 200) }}
        />
        <FormTextField
          control={control}
          name="maxTotalThicknessNm"
          label="Max total thickness (nm)"
          size="small"
          sx={{ width: 200 }}
          rules={{ validate: numberIn('Max total thickness', 0, 1_000_000, ' nm', true) }}
        />
        <ThicknessBoundsFields control={control} />
        <TargetMarginField control={control} />
        <FormTextField
          control={control}
          name="maxSteps"
          label="Max steps"
          size="small"
          sx={{ width: 120 }}
          rules={{ validate: wholeIn('Max steps', 1, 200) }}
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
