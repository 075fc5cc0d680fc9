import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { ConflictAlert } from '../../../components/conflict-alert';
import { ErrorAlert } from '../../../components/error-alert';
import { FormTextField } from '../../../components/form-text-field';
import { LoadingBlock } from '../../../components/loading-block';
import { ApiError } from '../../../lib/api-client';
import { notify } from '../../../lib/notifier';
import type { ChamberView } from '../api/get-chambers';
import { getProcessSettingsQueryOptions, useProcessSettings } from '../api/get-process-settings';
import { useSaveProcessSettings } from '../api/save-process-settings';
import {
  PROCESS_FIELDS,
  processFormSchema,
  valuesOfSettings,
  type ProcessFormOutput,
  type ProcessFormValues,
} from '../process-settings-form';

interface ProcessSettingsDialogProps {
  chamber: ChamberView;
  materials: readonly { id: number; name: string }[];
  /** Readers see the values without fields to change them. */
  readOnly: boolean;
  onClose: () => void;
}

/**
 * How each of the chamber's materials is deposited: substrate temperature, base pressure, gases and
 * ion assist. A row left empty keeps no setting; run sheets print each layer's row.
 */
export function ProcessSettingsDialog({ chamber, materials, readOnly, onClose }: ProcessSettingsDialogProps) {
  const queryClient = useQueryClient();
  const current = useProcessSettings(chamber.id);
  const save = useSaveProcessSettings();
  const materialIds = chamber.materials.map((m) => m.materialId);
  const nameOf = (id: number) => materials.find((m) => m.id === id)?.name ?? `Material ${id}`;
  const { control, handleSubmit, reset } = useForm<ProcessFormValues, unknown, ProcessFormOutput>({
    defaultValues: valuesOfSettings(materialIds, []),
    mode: 'onTouched',
    resolver: zodResolver(processFormSchema),
  });
  const loaded = current.data;
  useEffect(() => {
    if (loaded) reset(valuesOfSettings(materialIds, loaded.settings));
    // Only a newly loaded set refills the form, not a re-render.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [loaded?.version, reset]);
  const conflict = save.error instanceof ApiError && save.error.status === 409 ? save.error : null;

  const onSubmit = handleSubmit(({ settings }) => {
    if (!loaded) return;
    save.mutate(
      { chamberId: chamber.id, version: loaded.version, settings },
      {
        onSuccess: () => {
          notify(`Process settings of ${chamber.name} saved.`, 'success');
          onClose();
        },
      },
    );
  });
  const reload = async () => {
    await queryClient.invalidateQueries({ queryKey: getProcessSettingsQueryOptions(chamber.id).queryKey });
    save.reset();
  };

  return (
    <Dialog open onClose={onClose} fullWidth maxWidth="lg">
      <form noValidate onSubmit={(e) => void onSubmit(e)} aria-label={`Process settings of ${chamber.name}`}>
        <DialogTitle>Process settings: {chamber.name}</DialogTitle>
        <DialogContent sx={{ display: 'grid', gap: 2 }}>
          <Typography variant="body2" color="text.secondary">
            Per material, as this chamber deposits it. Leave O₂, Ar or ion-source fields empty when they are
            not used; leave a whole row empty to keep no setting. Tooling factors and rates stay in the
            chamber's material list.
          </Typography>
          {current.isPending && <LoadingBlock label="Loading the process settings" />}
          {current.isError && (
            <ErrorAlert error={current.error} title="The process settings could not be loaded" />
          )}
          {conflict && <ConflictAlert message={conflict.message} onReload={() => void reload()} />}
          {save.error && !conflict && <ErrorAlert error={save.error} title="Not saved" />}
          {materialIds.length === 0 && (
            <Alert severity="info">This chamber has no materials yet: add them with Edit first.</Alert>
          )}
          {loaded &&
            materialIds.map((id, index) => (
              <Box
                key={id}
                component="fieldset"
                aria-label={nameOf(id)}
                sx={{ border: 1, borderColor: 'divider', borderRadius: 1, p: 1.5, m: 0 }}
              >
                <Typography component="legend" variant="subtitle2" sx={{ px: 0.5 }}>
                  {nameOf(id)}
                </Typography>
                <Box
                  sx={{
                    display: 'grid',
                    gap: 1.5,
                    gridTemplateColumns: { xs: '1fr 1fr', md: 'repeat(4, 1fr)' },
                  }}
                >
                  {PROCESS_FIELDS.map((f) => (
                    <FormTextField
                      key={f.key}
                      control={control}
                      name={`rows.${index}.${f.key}`}
                      label={f.label}
                      size="small"
                      disabled={readOnly}
                      slotProps={{ htmlInput: { inputMode: 'decimal' } }}
                    />
                  ))}
                  <FormTextField
                    control={control}
                    name={`rows.${index}.notes`}
                    label="Note"
                    size="small"
                    disabled={readOnly}
                    sx={{ gridColumn: '1 / -1' }}
                  />
                </Box>
              </Box>
            ))}
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose}>{readOnly ? 'Close' : 'Cancel'}</Button>
          {!readOnly && (
            <Button type="submit" variant="contained" loading={save.isPending} disabled={!loaded}>
              Save process settings
            </Button>
          )}
        </DialogActions>
      </form>
    </Dialog>
  );
}
