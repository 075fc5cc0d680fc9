import AttachFileOutlined from '@mui/icons-material/AttachFileOutlined';
import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { formatDateTime } from '../../../lib/format';
import { outboxAttachmentUrl } from '../api/get-outbox';
import { useOutboxMessage } from '../api/get-outbox-message';

/** Size in bytes, KiB or MiB, for people. */
export function formatSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KiB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MiB`;
}

/** One message: headers, plain-text body and its attachments to open or download. */
export function OutboxMessage({ id }: { id: number }) {
  const message = useOutboxMessage(id);
  if (message.isPending) return <LoadingBlock label="Loading the message" />;
  if (message.isError) return <ErrorAlert error={message.error} title="The message could not be loaded" />;
  const m = message.data;
  return (
    <Paper component="article" variant="outlined" aria-label={`Message: ${m.subject}`} sx={{ p: 2 }}>
      <Typography variant="h2" gutterBottom>
        {m.subject}
      </Typography>
      <Typography variant="body2" color="text.secondary">
        From {m.from} to {m.to}, {formatDateTime(m.receivedAt)}
      </Typography>
      <Box
        component="pre"
        sx={{ whiteSpace: 'pre-wrap', fontFamily: 'inherit', bgcolor: 'action.hover', p: 2, borderRadius: 1 }}
      >
        {m.text}
      </Box>
      {m.attachments.length === 0 ? (
        <Typography variant="body2" color="text.secondary">
          No attachments.
        </Typography>
      ) : (
        <Box
          component="ul"
          aria-label="Attachments"
          sx={{ m: 0, pl: 0, listStyle: 'none', display: 'grid', gap: 1 }}
        >
          {m.attachments.map((a) => (
            <Box component="li" key={a.id} sx={{ display: 'flex', alignItems: 'center', gap: 1 }}>
              <AttachFileOutlined fontSize="small" />
              <Link href={outboxAttachmentUrl(m.id, a.id)} download={a.filename}>
                {a.filename}
              </Link>
              <Typography variant="body2" color="text.secondary">
                {a.contentType}, {formatSize(a.size)}
              </Typography>
            </Box>
          ))}
        </Box>
      )}
    </Paper>
  );
}
