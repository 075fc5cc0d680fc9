import CloseOutlined from '@mui/icons-material/CloseOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Snackbar from '@mui/material/Snackbar';
import { useSyncExternalStore } from 'react';
import { currentNotice, dismissNotice, subscribeToNotices } from '../lib/notifier';

/** How long a message stays: one with an action (e.g. Undo) longer, so there is time to press it. */
const SHOWN_MS = 5000;
const SHOWN_WITH_ACTION_MS = 10_000;

/** Shows the notifier's messages one at a time; errors stay until closed. */
export function NotifierSnackbar() {
  const notice = useSyncExternalStore(subscribeToNotices, currentNotice, currentNotice);
  if (!notice) return null;
  const close = () => dismissNotice(notice.id);
  const { action } = notice;
  return (
    <Snackbar
      key={notice.id}
      open
      anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
      autoHideDuration={notice.severity === 'error' ? null : action ? SHOWN_WITH_ACTION_MS : SHOWN_MS}
      onClose={(_event, reason) => {
        if (reason !== 'clickaway') close();
      }}
    >
      <Alert
        severity={notice.severity}
        variant="filled"
        onClose={close}
        sx={{ width: '100%' }}
        action={
          action && (
            <>
              <Button
                color="inherit"
                size="small"
                onClick={() => {
                  close();
                  action.onAction();
                }}
              >
                {action.label}
              </Button>
              <IconButton color="inherit" size="small" aria-label="Close" onClick={close}>
                <CloseOutlined fontSize="small" />
              </IconButton>
            </>
          )
        }
      >
        {notice.message}
      </Alert>
    </Snackbar>
  );
}
