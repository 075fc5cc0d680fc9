import { pickableMaterials } from '@quietglass/shared';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControl from '@mui/material/FormControl';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormGroup from '@mui/material/FormGroup';
import FormHelperText from '@mui/material/FormHelperText';
import FormLabel from '@mui/material/FormLabel';
import { Controller, useForm } from 'react-hook-form';
import { FormTextField } from '../../../components/form-text-field';
import type { GrowRequest } from '../api/submit-optimisation';
import { numberIn, wholeIn } from '../form-rules';
import { ThicknessBoundsFields } from './thickness-bounds-fields';

/** Most materials Grow layers may use (GrowDto). */
export const MAX_ALLOWED_MATERIALS = 8;

interface GrowValues {
  allowedMaterialIds: number[];
  maxLayers: string;
  maxTotalThicknessNm: string;
  minThicknessNm: string;
  maxThicknessNm: string;
  maxSteps: string;
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

/** Allowed materials and limits of Grow layers (needle synthesis from the version's stack). */
export function GrowForm({ materials, initialMaterialIds, layerCount, pending, onRun }: GrowFormProps) {
  const { control, handleSubmit } = useForm<GrowValues>({
    defaultValues: {
      allowedMaterialIds: initialMaterialIds.slice(0, MAX_ALLOWED_MATERIALS),
      maxLayers: String(Math.max(30, layerCount)),
      maxTotalThicknessNm: '5000',
      minThicknessNm: '10',
      maxThicknessNm: '1000',
      maxSteps: '30',
    },
    mode: 'onTouched',
  });
  const onSubmit = handleSubmit((v) =>
    onRun({
      allowedMaterialIds: v.allowedMaterialIds,
      maxLayers: Number(v.maxLayers),
      maxTotalThicknessNm: Number(v.maxTotalThicknessNm),
      minThicknessNm: Number(v.minThicknessNm),
      maxThicknessNm: Number(v.maxThicknessNm),
      maxSteps: Number(v.maxSteps),
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
          <FormControl component="fieldset" error={Boolean(fieldState.error)}>
            <FormLabel component="legend">Allowed materials</FormLabel>
            <FormGroup row>
              {pickableMaterials(materials, initialMaterialIds).map((m) => (
                <FormControlLabel
                  key={m.id}
                  label={m.name}
                  control={
                    <Checkbox
                      size="small"
                      checked={field.value.includes(m.id)}
                      onChange={(e) =>
                        field.onChange(
                          e.target.checked ? [...field.value, m.id] : field.value.filter((id) => id !== m.id),
                        )
                      }
                    />
                  }
                />
              ))}
            </FormGroup>
            {fieldState.error && <FormHelperText>{fieldState.error.message}</FormHelperText>}
          </FormControl>
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
