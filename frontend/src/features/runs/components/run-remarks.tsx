import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import List from '@mui/material/List';
import ListItem from '@mui/material/ListItem';
import ListItemText from '@mui/material/ListItemText';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import { runRemarkSchema, type RunRemarkInput } from '@quietglass/shared';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormTextField } from '../../../components/form-text-field';
import { formatDateTime } from '../../../lib/format';
import { notify } from '../../../lib/notifier';
import { useAddRunRemark } from '../api/add-run-remark';
import type { RunView } from '../api/get-runs';

/** Remarks on a run by anyone who reads it, oldest first, and a field to add one. */
export function RunRemarks({ run }: { run: RunView }) {
  const add = useAddRunRemark(run.id);
  const { control, handleSubmit, reset, watch } = useForm<{ text: string }, unknown, RunRemarkInput>({
    defaultValues: { text: '' },
    resolver: zodResolver(runRemarkSchema),
    mode: 'onChange',
  });
  const empty = watch('text').trim() === '';

  const submit = handleSubmit(({ text }) =>
    add.mutate(text, {
      onSuccess: () => {
        reset({ text: '' });
        notify('Remark added.', 'success');
      },
    }),
  );

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Remarks">
      <Typography variant="h2" component="h2" gutterBottom>
        Remarks
      </Typography>
      {run.remarks.length === 0 ? (
        <Typography variant="body2" color="text.secondary">
          No remarks yet.
        </Typography>
      ) : (
        <List dense aria-label="Remarks on this run">
          {run.remarks.map((r, i) => (
            <ListItem key={`${r.at}-${i}`} disableGutters>
              <ListItemText
                primary={r.text}
                secondary={`${r.by.displayName} · ${formatDateTime(r.at)}`}
                slotProps={{ primary: { sx: { whiteSpace: 'pre-wrap' } } }}
              />
            </ListItem>
          ))}
        </List>
      )}
      <Box component="form" noValidate onSubmit={submit} sx={{ display: 'grid', gap: 1, mt: 1 }}>
        {add.error && <ErrorAlert error={add.error} title="The remark was not added" />}
        <FormTextField
          control={control}
          name="text"
          label="New remark"
          multiline
          minRows={2}
          size="small"
          helperText="Remarks are kept with the run and cannot be edited."
        />
        <Box>
          <Button type="submit" variant="outlined" disabled={empty || add.isPending}>
            Add remark
          </Button>
        </Box>
      </Box>
    </Paper>
  );
}
