import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { DesignVersionView, VersionStatus } from '@quietglass/shared';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState } from 'react';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { notify } from '../../../lib/notifier';
import { getDesignHistoryQueryOptions, useDesignHistory } from '../api/get-design-history';
import { useTransitionVersion, type ReviewAction } from '../api/transition-version';
import { HistoryList } from './history-list';
import { ReviewDialog } from './review-dialog';

const STATUS_COLOURS: Record<VersionStatus, 'default' | 'info' | 'warning' | 'success' | 'primary'> = {
  draft: 'default',
  submitted: 'info',
  returned: 'warning',
  approved: 'primary',
  released: 'success',
  retired: 'default',
};

const DONE: Record<ReviewAction, string> = {
  approve: 'approved',
  return: 'returned to its author',
  release: 'released as a recipe',
  retire: 'retired',
};

/** What the status means for the next step, in a line. */
const NEXT_STEP: Record<VersionStatus, string> = {
  draft: 'Being edited. Save it and use Submit for approval below when it is ready.',
  returned: 'Sent back with a comment (see History). Edit it and submit it again.',
  submitted: 'Waiting for review by an engineer who did not write or submit it.',
  approved: 'Approved; release it to make it a recipe the chamber operators can build.',
  released: 'Released: operators build it from Released recipes.',
  retired: 'Retired: no longer offered as a recipe.',
};

interface ApprovalPanelProps {
  version: Pick<DesignVersionView, 'designId' | 'number' | 'status' | 'createdBy'>;
  /** Id of the signed-in user, for the four-eyes rule. */
  userId: number;
  /** The signed-in user's role may review, release and retire versions. */
  canAct: boolean;
  /** Called with the version as the API returns it after a step. */
  onTransitioned: (view: DesignVersionView) => void | Promise<void>;
}

/**
 * The open version's status and the steps the signed-in user may take next, and the design's audit
 * trail. Four-eyes: whoever wrote or submitted a version cannot approve or return it; the buttons
 * say so, and the API's own refusal is shown if it comes anyway.
 */
export function ApprovalPanel({ version, userId, canAct, onTransitioned }: ApprovalPanelProps) {
  const queryClient = useQueryClient();
  const history = useDesignHistory(version.designId);
  const transition = useTransitionVersion();
  const [action, setAction] = useState<ReviewAction | null>(null);
  const reasonId = useId();

  // The editor's Submit changes the status too: refresh the trail whenever the status moves.
  const seenStatus = useRef(version.status);
  useEffect(() => {
    if (seenStatus.current === version.status) return;
    seenStatus.current = version.status;
    void queryClient.invalidateQueries({ queryKey: getDesignHistoryQueryOptions(version.designId).queryKey });
  }, [queryClient, version.designId, version.status]);

  const submitter = [...(history.data ?? [])]
    .reverse()
    .find((e) => e.versionNumber === version.number && e.to === 'submitted')?.actor;
  const fourEyesReason =
    version.createdBy.id === userId
      ? 'You wrote this version; another engineer approves it'
      : submitter?.id === userId
        ? 'You submitted this version; another engineer approves it'
        : null;

  const open = (next: ReviewAction) => {
    transition.reset();
    setAction(next);
  };
  const close = () => {
    transition.reset();
    setAction(null);
  };
  const run = (comment: string) => {
    if (!action) return;
    transition.mutate(
      { designId: version.designId, number: version.number, action, comment },
      {
        onSuccess: (view) => {
          notify(`Version ${view.number} ${DONE[action]}.`, 'success');
          setAction(null);
          void onTransitioned(view);
        },
      },
    );
  };

  return (
    <Paper
      variant="outlined"
      sx={{ p: 2, display: 'grid', gap: 1.5 }}
      component="section"
      aria-label="Approval"
    >
      <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }}>
        <Typography variant="h2" component="h2">
          Approval
        </Typography>
        <Chip
          size="small"
          label={`Version ${version.number}: ${version.status}`}
          color={STATUS_COLOURS[version.status]}
          aria-label="Version status"
        />
      </Box>
      <Typography variant="body2" color="text.secondary">
        {NEXT_STEP[version.status]}
      </Typography>
      {canAct && version.status === 'submitted' && (
        <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }}>
          <Button
            variant="contained"
            disabled={fourEyesReason !== null}
            aria-describedby={fourEyesReason ? reasonId : undefined}
            onClick={() => open('approve')}
          >
            Approve
          </Button>
          <Button
            variant="outlined"
            disabled={fourEyesReason !== null}
            aria-describedby={fourEyesReason ? reasonId : undefined}
            onClick={() => open('return')}
          >
            Return…
          </Button>
          {fourEyesReason && (
            <Typography id={reasonId} variant="body2" color="text.secondary">
              {fourEyesReason}
            </Typography>
          )}
        </Box>
      )}
      {canAct && version.status === 'approved' && (
        <Box>
          <Button variant="contained" color="success" onClick={() => open('release')}>
            Release
          </Button>
        </Box>
      )}
      {canAct && version.status === 'released' && (
        <Box>
          <Button variant="outlined" color="warning" onClick={() => open('retire')}>
            Retire
          </Button>
        </Box>
      )}
      {!canAct && version.status !== 'draft' && (
        <Alert severity="info">Engineers and administrators review and release versions.</Alert>
      )}
      <Typography variant="h3" component="h3" sx={{ mt: 1 }}>
        History
      </Typography>
      {history.isPending && <LoadingBlock label="Loading the history" />}
      {history.isError && <ErrorAlert error={history.error} title="The history could not be loaded" />}
      {history.data && <HistoryList events={history.data} />}
      {action && (
        <ReviewDialog
          open
          action={action}
          versionNumber={version.number}
          pending={transition.isPending}
          error={transition.error}
          onSubmit={run}
          onClose={close}
        />
      )}
    </Paper>
  );
}
