import TextField from '@mui/material/TextField';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField, namedOptions } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import type { ReleasedRecipeView, RunChamberView } from '../run-inputs';
import type { RunView } from '../api/get-runs';
import { useStartRun } from '../api/start-run';
import { parseRecipeKey, recipeKey } from '../run-labels';

export interface StartRunValues {
  recipe: string;
  chamberId: string;
  lotNumber: string;
  runDate: string;
}

// StartRunDto: lot number 1–60 characters, run date an ISO calendar date.
const MAX_LOT = 60;
const DATE_PATTERN = /^\d{4}-\d{2}-\d{2}$/;

function isCalendarDate(value: string): boolean {
  if (!DATE_PATTERN.test(value)) return false;
  const [y, m, d] = value.split('-').map(Number);
  if (y === undefined || m === undefined || d === undefined) return false;
  const date = new Date(Date.UTC(y, m - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === m - 1 && date.getUTCDate() === d;
}

/** Today in the reader's time zone, YYYY-MM-DD. */
export function todayIso(now = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

interface StartRunDialogProps {
  open: boolean;
  onClose: () => void;
  onStarted: (run: RunView) => void;
  recipes: readonly ReleasedRecipeView[];
  chambers: readonly RunChamberView[];
  /** The signed-in user, recorded as the run's operator. */
  operatorName: string;
  /** "designId:number" of a recipe to choose at once (from a run sheet's link). */
  initialRecipe?: string;
}

/** Starts a chamber run of a released recipe: the chamber, the lot and the date. */
export function StartRunDialog({
  open,
  onClose,
  onStarted,
  recipes,
  chambers,
  operatorName,
  initialRecipe,
}: StartRunDialogProps) {
  const start = useStartRun();
  const known = recipes.some((r) => recipeKey(r.designId, r.number) === initialRecipe);
  const empty: StartRunValues = {
    recipe: known && initialRecipe ? initialRecipe : '',
    chamberId: '',
    lotNumber: '',
    runDate: todayIso(),
  };
  const { control, handleSubmit, reset } = useForm<StartRunValues>({
    defaultValues: empty,
    mode: 'onTouched',
  });

  const close = () => {
    reset(empty);
    start.reset();
    onClose();
  };

  const onSubmit = handleSubmit((values) => {
    const recipe = parseRecipeKey(values.recipe);
    if (!recipe) return;
    start.mutate(
      {
        designId: recipe.designId,
        versionNumber: recipe.versionNumber,
        chamberId: Number(values.chamberId),
        lotNumber: values.lotNumber.trim(),
        runDate: values.runDate,
      },
      {
        onSuccess: (run) => {
          close();
          onStarted(run);
        },
      },
    );
  });

  return (
    <FormDialog
      open={open}
      title="Start a run"
      submitLabel="Start run"
      pending={start.isPending}
      onSubmit={onSubmit}
      onClose={close}
    >
      {start.error && <ErrorAlert error={start.error} title="The run was not started" />}
      <FormSelectField
        control={control}
        name="recipe"
        label="Released recipe"
        placeholder="Choose…"
        rules={{ validate: (v) => parseRecipeKey(v) !== null || 'Choose a released recipe' }}
        options={recipes.map((r) => ({
          value: recipeKey(r.designId, r.number),
          label: `${r.name} v${r.number} (${r.customer})`,
        }))}
        helperText={recipes.length === 0 ? 'No recipe is released yet' : undefined}
        sx={{ mt: 1 }}
      />
      <FormSelectField
        control={control}
        name="chamberId"
        label="Chamber"
        placeholder="Choose…"
        rules={{ validate: (v) => v !== '' || 'Choose the chamber' }}
        options={namedOptions(chambers)}
      />
      <FormTextField
        control={control}
        name="lotNumber"
        label="Lot number"
        rules={{
          validate: (v) => v.trim() !== '' || 'Enter the lot number',
          maxLength: { value: MAX_LOT, message: `At most ${MAX_LOT} characters` },
        }}
      />
      <FormTextField
        control={control}
        name="runDate"
        label="Run date"
        type="date"
        slotProps={{ inputLabel: { shrink: true } }}
        rules={{ validate: (v) => isCalendarDate(v) || 'Enter the date as YYYY-MM-DD' }}
      />
      <TextField
        label="Operator"
        value={operatorName}
        disabled
        helperText="The signed-in user is recorded as the run's operator."
      />
    </FormDialog>
  );
}
