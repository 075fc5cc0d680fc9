import TextField from '@mui/material/TextField';
import { zodResolver } from '@hookform/resolvers/zod';
import { startRunSchema } from '@quietglass/shared';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField, namedOptions } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { chosenId } from '../../../lib/validation';
import type { ReleasedRecipeView, RunChamberView } from '../run-inputs';
import type { RunView } from '../api/get-runs';
import { useStartRun, type StartRunRequest } from '../api/start-run';
import { parseRecipeKey, recipeKey } from '../run-labels';

export interface StartRunValues {
  recipe: string;
  chamberId: string;
  lotNumber: string;
  runDate: string;
}

const { shape } = startRunSchema;
const releasedRecipe = startRunSchema.pick({ designId: true, versionNumber: true });

/** The dialog's values checked by the API's start-run schema; the request body when they pass. */
const startRunFormSchema = z
  .object({
    recipe: z.string().transform((key, ctx) => {
      const chosen = releasedRecipe.safeParse(parseRecipeKey(key) ?? {});
      if (chosen.success) return chosen.data;
      const [first] = chosen.error.issues;
      if (first) ctx.addIssue({ code: 'custom', message: first.message });
      return z.NEVER;
    }),
    chamberId: chosenId.pipe(shape.chamberId),
    lotNumber: shape.lotNumber,
    runDate: shape.runDate,
  })
  .transform(({ recipe, ...rest }) => ({ ...recipe, ...rest }));

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
  const { control, handleSubmit, reset } = useForm<StartRunValues, unknown, StartRunRequest>({
    defaultValues: empty,
    resolver: zodResolver(startRunFormSchema),
    mode: 'onTouched',
  });

  const close = () => {
    reset(empty);
    start.reset();
    onClose();
  };

  const onSubmit = handleSubmit((input) =>
    start.mutate(input, {
      onSuccess: (run) => {
        close();
        onStarted(run);
      },
    }),
  );

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
        options={namedOptions(chambers)}
      />
      <FormTextField control={control} name="lotNumber" label="Lot number" />
      <FormTextField
        control={control}
        name="runDate"
        label="Run date"
        type="date"
        slotProps={{ inputLabel: { shrink: true } }}
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
