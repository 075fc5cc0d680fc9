import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormSelectField } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { notify } from '../../../lib/notifier';
import type { DurabilityResult, RunView } from '../api/get-runs';
import { useUpdateRun } from '../api/update-run';
import { fieldText } from '../../../lib/format';

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

// DurabilityDto: method 1–200 characters, notes up to 500.
const MAX_METHOD = 200;
const MAX_NOTES = 500;

function valuesOf(run: RunView): DurabilityValues {
  const row = (test: string): TestRow => {
    const r = run.durability.find((d) => d.test === test);
    return { result: r?.result ?? '', method: r?.method ?? '', notes: r?.notes ?? '' };
  };
  return { adhesion: row('adhesion'), abrasion: row('abrasion'), humidity: row('humidity') };
}

/** The durability results to send: the tests with a result, then any others the run already had. */
export function durabilityOf(
  values: DurabilityValues,
  previous: readonly DurabilityResult[],
): DurabilityResult[] {
  const recorded = TESTS.flatMap(({ test }): DurabilityResult[] => {
    const row = values[test];
    if (row.result === '') return [];
    const notes = row.notes.trim();
    return [{ test, method: row.method.trim(), result: row.result, ...(notes ? { notes } : {}) }];
  });
  return [...recorded, ...previous.filter((d) => !TESTS.some((t) => t.test === d.test))];
}

/** Adhesion, abrasion and humidity results of the run's witness or part, each with the procedure followed. */
export function DurabilityForm({ run, canEdit }: { run: RunView; canEdit: boolean }) {
  const update = useUpdateRun(run.id);
  const { control, handleSubmit, reset } = useForm<DurabilityValues>({
    defaultValues: valuesOf(run),
    mode: 'onTouched',
  });

  const onSubmit = handleSubmit((values) =>
    update.mutate(
      { version: run.version, durability: durabilityOf(values, run.durability) },
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
              rules={{
                validate: (v, all) =>
                  all[test].result === '' ||
                  fieldText(v).trim() !== '' ||
                  'Name the test procedure followed (e.g. ISO 9211-4, tape adhesion)',
                maxLength: { value: MAX_METHOD, message: `At most ${MAX_METHOD} characters` },
              }}
            />
            <FormTextField
              control={control}
              name={`${test}.notes`}
              label={`${label} notes`}
              size="small"
              disabled={!canEdit}
              rules={{ maxLength: { value: MAX_NOTES, message: `At most ${MAX_NOTES} characters` } }}
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
