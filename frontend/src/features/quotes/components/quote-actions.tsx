import CheckOutlined from '@mui/icons-material/CheckOutlined';
import CloseOutlined from '@mui/icons-material/CloseOutlined';
import EditOutlined from '@mui/icons-material/EditOutlined';
import NoteAddOutlined from '@mui/icons-material/NoteAddOutlined';
import SendOutlined from '@mui/icons-material/SendOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { ErrorAlert } from '../../../components/error-alert';
import { useDecideQuote } from '../api/decide-quote';
import type { QuoteView } from '../api/get-quotes';
import { useSendQuote } from '../api/send-quote';

interface QuoteActionsProps {
  quote: QuoteView;
  onEdit: () => void;
  onAttach: () => void;
  /** False while what the edit form offers is still loading. */
  editReady?: boolean;
}

/**
 * What sales do with a quote: edit a draft, attach reports, send it (once), then record the
 * customer's answer. Shown only to roles that may write quotes.
 */
export function QuoteActions({ quote, onEdit, onAttach, editReady = true }: QuoteActionsProps) {
  const sendQuote = useSendQuote();
  const decideQuote = useDecideQuote();
  const [confirming, setConfirming] = useState(false);
  const draft = quote.status === 'draft';

  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap' }}>
        {draft && (
          <>
            <Button variant="outlined" startIcon={<EditOutlined />} disabled={!editReady} onClick={onEdit}>
              Edit
            </Button>
            <Button variant="outlined" startIcon={<NoteAddOutlined />} onClick={onAttach}>
              Attach reports
            </Button>
            <Button variant="contained" startIcon={<SendOutlined />} onClick={() => setConfirming(true)}>
              Send
            </Button>
          </>
        )}
        {quote.status === 'sent' && (
          <>
            <Button
              variant="contained"
              color="success"
              startIcon={<CheckOutlined />}
              loading={decideQuote.isPending && decideQuote.variables.status === 'accepted'}
              onClick={() => decideQuote.mutate({ id: quote.id, status: 'accepted' })}
            >
              Mark accepted
            </Button>
            <Button
              variant="outlined"
              color="error"
              startIcon={<CloseOutlined />}
              loading={decideQuote.isPending && decideQuote.variables.status === 'declined'}
              onClick={() => decideQuote.mutate({ id: quote.id, status: 'declined' })}
            >
              Mark declined
            </Button>
          </>
        )}
      </Box>
      {sendQuote.error && <ErrorAlert error={sendQuote.error} title="The quote was not sent" />}
      {decideQuote.error && <ErrorAlert error={decideQuote.error} title="The answer was not recorded" />}
      <ConfirmDialog
        open={confirming}
        title={`Send quote Q-${quote.id}?`}
        confirmLabel="Send quote"
        pending={sendQuote.isPending}
        onCancel={() => setConfirming(false)}
        onConfirm={() =>
          sendQuote.mutate(quote.id, {
            onSettled: () => setConfirming(false),
          })
        }
      >
        It goes by e-mail to {quote.contactEmail} with{' '}
        {quote.reportIds.length === 1
          ? '1 compliance report'
          : `${quote.reportIds.length} compliance reports`}{' '}
        attached. A sent quote can no longer be edited.
      </ConfirmDialog>
    </Box>
  );
}
