import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import { layerReadingSchema, updateRunSchema } from '@quietglass/shared';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ErrorAlert } from '../../../components/error-alert';
import { FormTextField } from '../../../components/form-text-field';
import { notify } from '../../../lib/notifier';
import { typedOptionalNumber, typedOptionalText } from '../../../lib/validation';
import type { RecipeView } from '../run-inputs';
import type { LayerReading, RunView } from '../api/get-runs';
import { useUpdateRun } from '../api/update-run';

/** One deposition step of the recipe as the readings table lists it. */
export interface DepositionStep {
  /** 1 = first deposited (next to the substrate). */
  step: number;
  /** Position in the design, 1 = outermost. */
  designLayer: number;
  material: string;
  designNm: number;
}

/** The recipe's layers in deposition order: the reverse of the design's listing (incident side first). */
export function depositionSteps(recipe: RecipeView): DepositionStep[] {
  const names = recipe.materialsSnapshot ?? {};
  const n = recipe.layers.length;
  return recipe.layers
    .map((layer, i) => ({
      step: n - i,
      designLayer: i + 1,
      material: names[String(layer.materialId)]?.name ?? `Material ${layer.materialId}`,
      designNm: layer.thicknessNm,
    }))
    .reverse();
}

interface ReadingRow {
  monitorThicknessNm: string;
  rateNmPerS: string;
  notes: string;
}

interface ReadingsValues {
  rows: ReadingRow[];
  notes: string;
}

const { shape: reading } = layerReadingSchema;

/** One row's typed text, checked by the API's reading schema (empty fields are left out). */
const readingRowSchema = z.object({
  monitorThicknessNm: typedOptionalNumber.pipe(reading.monitorThicknessNm),
  rateNmPerS: typedOptionalNumber.pipe(reading.rateNmPerS),
  notes: typedOptionalText.pipe(reading.notes),
});

/**
 * The form's values checked by the API's schemas; when they pass, the readings worth sending (steps
 * with a value or a remark, empty fields left out) and the run's notes.
 */
export function readingsFormSchema(steps: readonly DepositionStep[]) {
  return z
    .object({ rows: z.array(readingRowSchema), notes: updateRunSchema.shape.notes.unwrap() })
    .transform(({ rows, notes }) => ({
      layerReadings: steps.flatMap(({ step }, i): LayerReading[] => {
        const row = rows[i];
        if (!row) return [];
        const { monitorThicknessNm, rateNmPerS, notes: remark } = row;
        if (monitorThicknessNm === undefined && rateNmPerS === undefined && remark === undefined) return [];
        return [
          {
            step,
            ...(monitorThicknessNm !== undefined ? { monitorThicknessNm } : {}),
            ...(rateNmPerS !== undefined ? { rateNmPerS } : {}),
            ...(remark !== undefined ? { notes: remark } : {}),
          },
        ];
      }),
      notes,
    }));
}

function valuesOf(run: RunView, steps: readonly DepositionStep[]): ReadingsValues {
  return {
    rows: steps.map(({ step }) => {
      const r = run.layerReadings.find((x) => x.step === step);
      return {
        monitorThicknessNm: r?.monitorThicknessNm !== undefined ? String(r.monitorThicknessNm) : '',
        rateNmPerS: r?.rateNmPerS !== undefined ? String(r.rateNmPerS) : '',
        notes: r?.notes ?? '',
      };
    }),
    notes: run.notes,
  };
}

interface LayerReadingsFormProps {
  run: RunView;
  steps: readonly DepositionStep[];
  canEdit: boolean;
}

/** What the monitor showed for each layer, remarks per layer and the run's notes, saved together. */
export function LayerReadingsForm({ run, steps, canEdit }: LayerReadingsFormProps) {
  const update = useUpdateRun(run.id);
  const schema = useMemo(() => readingsFormSchema(steps), [steps]);
  const { control, handleSubmit, reset } = useForm<ReadingsValues, unknown, z.output<typeof schema>>({
    defaultValues: valuesOf(run, steps),
    resolver: zodResolver(schema),
    mode: 'onTouched',
  });

  const onSubmit = handleSubmit((changes) =>
    update.mutate(
      { version: run.version, ...changes },
      {
        onSuccess: (saved) => {
          reset(valuesOf(saved, steps));
          notify('Layer readings saved.', 'success');
        },
      },
    ),
  );

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Layer readings">
      <Typography variant="h2" component="h2" gutterBottom>
        Layer readings
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
        In deposition order: step 1 is the layer next to the substrate. Enter what the monitor showed at the
        end of each layer.
      </Typography>
      <Box component="form" noValidate onSubmit={onSubmit} sx={{ display: 'grid', gap: 2 }}>
        {update.error && <ErrorAlert error={update.error} title="The readings were not saved" />}
        <Table size="small" aria-label="Layer readings table">
          <TableHead>
            <TableRow>
              <TableCell>Step</TableCell>
              <TableCell>Material</TableCell>
              <TableCell align="right">Design (nm)</TableCell>
              <TableCell>Monitor thickness (nm)</TableCell>
              <TableCell>Rate (nm/s)</TableCell>
              <TableCell>Remarks</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {steps.map((s, i) => (
              <TableRow key={s.step}>
                <TableCell>{s.step}</TableCell>
                <TableCell>{s.material}</TableCell>
                <TableCell align="right">{s.designNm.toFixed(1)}</TableCell>
                <TableCell>
                  <FormTextField
                    control={control}
                    name={`rows.${i}.monitorThicknessNm`}
                    size="small"
                    disabled={!canEdit}
                    slotProps={{
                      htmlInput: {
                        inputMode: 'decimal',
                        'aria-label': `Monitor thickness of step ${s.step}`,
                      },
                    }}
                  />
                </TableCell>
                <TableCell>
                  <FormTextField
                    control={control}
                    name={`rows.${i}.rateNmPerS`}
                    size="small"
                    disabled={!canEdit}
                    slotProps={{
                      htmlInput: { inputMode: 'decimal', 'aria-label': `Rate of step ${s.step}` },
                    }}
                  />
                </TableCell>
                <TableCell>
                  <FormTextField
                    control={control}
                    name={`rows.${i}.notes`}
                    size="small"
                    disabled={!canEdit}
                    slotProps={{ htmlInput: { 'aria-label': `Remarks on step ${s.step}` } }}
                  />
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
        <FormTextField
          control={control}
          name="notes"
          label="Run notes"
          multiline
          minRows={2}
          disabled={!canEdit}
        />
        {canEdit && (
          <Box>
            <Button type="submit" variant="contained" loading={update.isPending}>
              Save readings
            </Button>
          </Box>
        )}
      </Box>
    </Paper>
  );
}
