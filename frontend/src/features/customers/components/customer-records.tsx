import Link from '@mui/material/Link';
import List from '@mui/material/List';
import ListItem from '@mui/material/ListItem';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import Box from '@mui/material/Box';
import {
  SPEC_MASK_KINDS,
  SPEC_MASK_KIND_LABELS,
  type CustomerRecordLink,
  type SpecMaskKind,
} from '@quietglass/shared';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { formatDateTime } from '../../../lib/format';
import { useCustomerRecords } from '../api/get-customer-records';

const isKind = (s: string): s is SpecMaskKind => (SPEC_MASK_KINDS as readonly string[]).includes(s);

const SECTIONS: {
  key: 'masks' | 'designs' | 'reports' | 'quotes';
  title: string;
  href: (id: number) => string;
}[] = [
  { key: 'masks', title: 'Spec masks', href: () => '/spec-masks' },
  { key: 'designs', title: 'Stack designs', href: (id) => `/designs/${id}` },
  { key: 'reports', title: 'Compliance reports', href: (id) => `/reports/${id}` },
  { key: 'quotes', title: 'Quotes', href: (id) => `/quotes/${id}` },
];

/** What is on record for one customer: masks (with their kind), designs, reports and quotes. */
export function CustomerRecords({ customer }: { customer: { id: number; name: string } }) {
  const records = useCustomerRecords(customer.id);
  if (records.isPending) return <LoadingBlock label={`Loading the records of ${customer.name}`} />;
  if (records.isError) return <ErrorAlert error={records.error} title="The records could not be loaded" />;
  const status = (r: CustomerRecordLink) => (isKind(r.status) ? SPEC_MASK_KIND_LABELS[r.status] : r.status);
  return (
    <Paper variant="outlined" component="section" aria-label={`Records of ${customer.name}`} sx={{ p: 2 }}>
      <Typography variant="h2" component="h2" sx={{ mb: 1 }}>
        {customer.name}
      </Typography>
      <Box
        sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', md: 'repeat(4, minmax(0, 1fr))' } }}
      >
        {SECTIONS.map((s) => (
          <Box key={s.key} component="section" aria-label={s.title}>
            <Typography component="h3" variant="subtitle2">
              {s.title} ({records.data[s.key].length})
            </Typography>
            {records.data[s.key].length === 0 ? (
              <Typography variant="body2" color="text.secondary">
                None yet.
              </Typography>
            ) : (
              <List dense disablePadding>
                {records.data[s.key].map((r) => (
                  <ListItem key={r.id} disableGutters sx={{ display: 'block' }}>
                    <Link component={RouterLink} to={s.href(r.id)}>
                      {r.title}
                    </Link>
                    <Typography variant="caption" color="text.secondary" component="div">
                      {status(r)} · {formatDateTime(r.at)}
                    </Typography>
                  </ListItem>
                ))}
              </List>
            )}
          </Box>
        ))}
      </Box>
    </Paper>
  );
}
