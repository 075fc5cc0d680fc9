import Alert from '@mui/material/Alert';
import Snackbar from '@mui/material/Snackbar';
import { useSyncExternalStore } from 'react';
import { currentNotice, dismissNotice, subscribeToNotices } from '../lib/notifier';

/** Shows the notifier's messages one at a time; errors stay until closed. */
export function NotifierSnackbar() {
  const notice = useSyncExternalStore(subscribeToNotices, currentNotice, currentNotice);
  if (!notice) return null;
  const close = () => dismissNotice(notice.id);
  return (
    <Snackbar
      key={notice.id}
      open
      anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
      autoHideDuration={notice.severity === 'error' ? null : 5000}
      onClose={(_event, reason) => {
        if (reason !== 'clickaway') close();
      }}
    >
      <Alert severity={notice.severity} variant="filled" onClose={close} sx={{ width: '100%' }}>
        {notice.message}
      </Alert>
    </Snackbar>
  );
}
