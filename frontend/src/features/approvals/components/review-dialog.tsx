import { returnComment, stepComment } from '@quietglass/shared';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormTextField } from '../../../components/form-text-field';
import { schemaRule } from '../../../lib/validation';
import type { ReviewAction } from '../api/transition-version';

// The API's own comment rules: a return must say what to change, the other steps may.
const RETURN_COMMENT_RULES = schemaRule(returnComment);
const STEP_COMMENT_RULES = schemaRule(stepComment);

const WORDING: Record<ReviewAction, { title: (n: number) => string; submit: string; help: string }> = {
  approve: {
    title: (n) => `Approve version ${n}`,
    submit: 'Approve',
    help: 'Optional: what you checked.',
  },
  return: {
    title: (n) => `Return version ${n} to its author`,
    submit: 'Return',
    help: 'Required: say what to change.',
  },
  release: {
    title: (n) => `Release version ${n} as a recipe`,
    submit: 'Release',
    help: 'Optional. Operators can then build it from Released recipes.',
  },
  retire: {
    title: (n) => `Retire version ${n}`,
    submit: 'Retire',
    help: 'Optional: why it is withdrawn. It leaves Released recipes.',
  },
};

interface ReviewDialogProps {
  action: ReviewAction;
  versionNumber: number;
  open: boolean;
  pending: boolean;
  /** The API's refusal (four-eyes, out of order, missing comment), shown in its own words. */
  error: unknown;
  onSubmit: (comment: string) => void;
  onClose: () => void;
}

/** Confirms a lifecycle step, with a comment that a return must have. */
export function ReviewDialog({
  action,
  versionNumber,
  open,
  pending,
  error,
  onSubmit,
  onClose,
}: ReviewDialogProps) {
  const wording = WORDING[action];
  const { control, handleSubmit, reset } = useForm<{ comment: string }>({
    defaultValues: { comment: '' },
    mode: 'onTouched',
  });
  useEffect(() => {
    if (open) reset({ comment: '' });
  }, [open, reset]);

  return (
    <FormDialog
      open={open}
      title={wording.title(versionNumber)}
      submitLabel={wording.submit}
      pending={pending}
      onSubmit={handleSubmit((values) => onSubmit(values.comment.trim()))}
      onClose={onClose}
    >
      {Boolean(error) && <ErrorAlert error={error} title="Not done" />}
      <FormTextField
        control={control}
        name="comment"
        label="Comment"
        multiline
        minRows={3}
        helperText={wording.help}
        rules={action === 'return' ? RETURN_COMMENT_RULES : STEP_COMMENT_RULES}
      />
    </FormDialog>
  );
}
