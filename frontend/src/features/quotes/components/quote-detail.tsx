import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { formatDateTime } from '../../../lib/format';
import type { QuoteView } from '../api/get-quotes';
import { QuoteStatusChip } from './quote-status-chip';

interface QuoteDetailProps {
  quote: QuoteView;
  designLabel: string;
  maskLabel: string;
}

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <>
      <Typography component="dt" variant="body2" color="text.secondary">
        {label}
      </Typography>
      <Typography component="dd" variant="body2" sx={{ m: 0 }}>
        {children}
      </Typography>
    </>
  );
}

/** What a quote offers, which reports go with it, and what happened to it. */
export function QuoteDetail({ quote, designLabel, maskLabel }: QuoteDetailProps) {
  return (
    <Box sx={{ display: 'grid', gap: 3 }}>
      {quote.status === 'draft' && quote.lastSendError && (
        <Alert severity="warning">The last send failed: {quote.lastSendError}</Alert>
      )}
      <Paper variant="outlined" sx={{ p: 2 }}>
        <Box
          component="dl"
          aria-label="Quote details"
          sx={{ display: 'grid', gridTemplateColumns: 'max-content 1fr', columnGap: 3, rowGap: 1, m: 0 }}
        >
          <Fact label="Status">
            <QuoteStatusChip status={quote.status} />
          </Fact>
          <Fact label="Customer">{quote.customer.name}</Fact>
          <Fact label="Contact e-mail">{quote.contactEmail}</Fact>
          <Fact label="Design">
            <Link component={RouterLink} to={`/designs/${quote.designId}?version=${quote.versionNumber}`}>
              {designLabel}, version {quote.versionNumber}
            </Link>
          </Fact>
          <Fact label="Spec mask">{maskLabel}</Fact>
          <Fact label="Part">{quote.partDescription}</Fact>
          <Fact label="Lead time">{quote.leadTimeDays} days</Fact>
          <Fact label="Valid until">{quote.validUntil}</Fact>
          <Fact label="Terms">{quote.terms || '—'}</Fact>
          <Fact label="Written by">
            {quote.createdBy}, {formatDateTime(quote.createdAt)}
          </Fact>
        </Box>
      </Paper>

      <Box component="section" aria-labelledby="quote-breaks-title">
        <Typography id="quote-breaks-title" variant="h2" gutterBottom>
          Quantity breaks
        </Typography>
        <Table size="small" aria-labelledby="quote-breaks-title" sx={{ maxWidth: 480 }}>
          <TableHead>
            <TableRow>
              <TableCell>From quantity</TableCell>
              <TableCell align="right">Unit price ({quote.currency})</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {quote.quantityBreaks.map((b) => (
              <TableRow key={b.minQuantity}>
                <TableCell>{b.minQuantity} pcs</TableCell>
                <TableCell align="right">{b.unitPrice.toFixed(2)}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>

      <Box component="section" aria-labelledby="quote-reports-title">
        <Typography id="quote-reports-title" variant="h2" gutterBottom>
          Attached compliance reports
        </Typography>
        {quote.reportIds.length === 0 ? (
          <Typography variant="body2" color="text.secondary">
            No reports attached.
          </Typography>
        ) : (
          <Box component="ul" aria-labelledby="quote-reports-title" sx={{ m: 0, pl: 3 }}>
            {quote.reportIds.map((id) => (
              <li key={id}>
                <Link component={RouterLink} to={`/reports/${id}`}>
                  {`R-${id}`}
                </Link>
              </li>
            ))}
          </Box>
        )}
      </Box>

      <Box component="section" aria-labelledby="quote-history-title">
        <Typography id="quote-history-title" variant="h2" gutterBottom>
          History
        </Typography>
        <Table size="small" aria-labelledby="quote-history-title">
          <TableHead>
            <TableRow>
              <TableCell>When</TableCell>
              <TableCell>Who</TableCell>
              <TableCell>What</TableCell>
              <TableCell>Detail</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {quote.history.map((e, i) => (
              <TableRow key={`${e.at}-${i}`}>
                <TableCell>{formatDateTime(e.at)}</TableCell>
                <TableCell>{e.actor}</TableCell>
                <TableCell>{e.action}</TableCell>
                <TableCell>{e.detail ?? ''}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>
    </Box>
  );
}
