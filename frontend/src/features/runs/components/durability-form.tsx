import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import { durabilityResultSchema } from '@quietglass/shared';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ErrorAlert } from '../../../components/error-alert';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { notify } from '../../../lib/notifier';
import { typedOptionalText } from '../../../lib/validation';
import type { DurabilityResult, RunView } from '../api/get-runs';
import { useUpdateRun } from '../api/update-run';

/**
 * The tests this form records; results of other tests the run holds are kept as they are. The
 * example procedures are the usual standards for coated optics (ISO 9211-4 specific coating tests,
 * ISO 9022-2 cold, heat and humidity), named from memory as hints only.
 */
const TESTS = [
  { test: 'adhesion', label: 'Adhesion', example: 'e.g. ISO 9211-4, tape adhesion' },
  { test: 'abrasion', label: 'Abrasion', example: 'e.g. ISO 9211-4, eraser abrasion' },
  { test: 'humidity', label: 'Humidity', example: 'e.g. ISO 9022-2, damp heat' },
] as const;

type Outcome = '' | 'pass' | 'fail';

interface TestRow {
  result: Outcome;
  method: string;
  notes: string;
}

type DurabilityValues = Record<(typeof TESTS)[number]['test'], TestRow>;

const { shape: result } = durabilityResultSchema;

/** A test not run is sent as nothing; a result is checked by the API's durability schema. */
const testRowSchema = z.discriminatedUnion('result', [
  z.object({ result: z.literal(''), method: z.string(), notes: z.string() }),
  z.object({
    result: result.result,
    method: result.method,
    notes: typedOptionalText.pipe(result.notes),
  }),
]);

/** The form's values checked by the API's schema; when they pass, the results of the tests run. */
export const durabilityFormSchema = z
  .object({ adhesion: testRowSchema, abrasion: testRowSchema, humidity: testRowSchema })
  .transform((values) => ({
    recorded: TESTS.flatMap(({ test }): DurabilityResult[] => {
      const row = values[test];
      if (row.result === '') return [];
      return [{ test, method: row.method, result: row.result, ...(row.notes ? { notes: row.notes } : {}) }];
    }),
  }));

function valuesOf(run: RunView): DurabilityValues {
  const row = (test: string): TestRow => {
    const r = run.durability.find((d) => d.test === test);
    return { result: r?.result ?? '', method: r?.method ?? '', notes: r?.notes ?? '' };
  };
  return { adhesion: row('adhesion'), abrasion: row('abrasion'), humidity: row('humidity') };
}

/** The durability results to send: the tests with a result, then any others the run already had. */
export function durabilityOf(
  recorded: readonly DurabilityResult[],
  previous: readonly DurabilityResult[],
): DurabilityResult[] {
  return [...recorded, ...previous.filter((d) => !TESTS.some((t) => t.test === d.test))];
}

/** Adhesion, abrasion and humidity results of the run's witness or part, each with the procedure followed. */
export function DurabilityForm({ run, canEdit }: { run: RunView; canEdit: boolean }) {
  const update = useUpdateRun(run.id);
  const { control, handleSubmit, reset } = useForm<
    DurabilityValues,
    unknown,
    z.output<typeof durabilityFormSchema>
  >({
    defaultValues: valuesOf(run),
    resolver: zodResolver(durabilityFormSchema),
    mode: 'onTouched',
  });

  const onSubmit = handleSubmit(({ recorded }) =>
    update.mutate(
      { version: run.version, durability: durabilityOf(recorded, run.durability) },
      {
        onSuccess: (saved) => {
          reset(valuesOf(saved));
          notify('Durability results saved.', 'success');
        },
      },
    ),
  );

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Durability results">
      <Typography variant="h2" component="h2" gutterBottom>
        Durability results
      </Typography>
      <Box component="form" noValidate onSubmit={onSubmit} sx={{ display: 'grid', gap: 2 }}>
        {update.error && <ErrorAlert error={update.error} title="The results were not saved" />}
        {TESTS.map(({ test, label, example }) => (
          <Box
            key={test}
            sx={{ display: 'grid', gap: 1.5, gridTemplateColumns: { xs: '1fr', md: '160px 2fr 2fr' } }}
          >
            <FormSelectField
              control={control}
              name={`${test}.result`}
              label={label}
              size="small"
              disabled={!canEdit}
              options={[
                { value: '', label: 'Not tested' },
                { value: 'pass', label: 'Pass' },
                { value: 'fail', label: 'Fail' },
              ]}
            />
            <FormTextField
              control={control}
              name={`${test}.method`}
              label={`${label} method`}
              size="small"
              disabled={!canEdit}
              helperText={example}
            />
            <FormTextField
              control={control}
              name={`${test}.notes`}
              label={`${label} notes`}
              size="small"
              disabled={!canEdit}
            />
          </Box>
        ))}
        {canEdit && (
          <Box>
            <Button type="submit" variant="contained" loading={update.isPending}>
              Save durability results
            </Button>
          </Box>
        )}
      </Box>
    </Paper>
  );
}
