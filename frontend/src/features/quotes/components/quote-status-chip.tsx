import Chip from '@mui/material/Chip';
import type { QuoteStatus } from '../api/get-quotes';

const COLOURS: Record<QuoteStatus, 'default' | 'info' | 'success' | 'error' | 'warning'> = {
  draft: 'default',
  sent: 'info',
  accepted: 'success',
  declined: 'error',
  expired: 'warning',
};

export function QuoteStatusChip({ status }: { status: QuoteStatus }) {
  return <Chip size="small" color={COLOURS[status]} label={status} />;
}
