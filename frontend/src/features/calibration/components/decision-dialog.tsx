import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { calibrationDecisionSchema, formatToolingFactor } from '@quietglass/shared';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormTextField } from '../../../components/form-text-field';
import { useDecideCalibration } from '../api/decide-calibration';
import type { CalibrationSuggestionView } from '../api/get-chamber-calibration';

/** The comment as the API checks it (trimmed, required, limited). */
const commentSchema = calibrationDecisionSchema.pick({ comment: true });

/** Accept or reject one suggestion, exactly as shown, with a comment (kept on the audit trail). */
export function DecisionDialog({
  chamberId,
  suggestion,
  decision,
  onClose,
}: {
  chamberId: number;
  suggestion: CalibrationSuggestionView;
  decision: 'accepted' | 'rejected';
  onClose: () => void;
}) {
  const decide = useDecideCalibration();
  const { control, handleSubmit } = useForm<{ comment: string }>({
    defaultValues: { comment: '' },
    resolver: zodResolver(commentSchema),
  });
  const verb = decision === 'accepted' ? (suggestion.kind === 'common' ? 'Acknowledge' : 'Accept') : 'Reject';
  return (
    <FormDialog
      open
      title={`${verb} the suggestion`}
      submitLabel={verb}
      pending={decide.isPending}
      onClose={onClose}
      onSubmit={handleSubmit((v) =>
        decide.mutate(
          { chamberId, key: suggestion.key, decision, comment: v.comment },
          { onSuccess: onClose },
        ),
      )}
    >
      <Typography variant="body2">{suggestion.message}</Typography>
      {decision === 'accepted' && suggestion.proposedToolingFactor !== null && (
        <Typography variant="body2">
          The chamber’s tooling factor becomes {formatToolingFactor(suggestion.proposedToolingFactor)} (now{' '}
          {suggestion.currentToolingFactor === null
            ? '—'
            : formatToolingFactor(suggestion.currentToolingFactor)}
          ) for run sheets made from now on.
        </Typography>
      )}
      <FormTextField control={control} name="comment" label="Comment" multiline minRows={2} required />
      {decide.isError && <ErrorAlert error={decide.error} title="The decision was not saved" />}
    </FormDialog>
  );
}
