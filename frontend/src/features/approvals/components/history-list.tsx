import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { formatDateTime } from '../../../lib/format';
import type { VersionEventView } from '../api/get-design-history';

interface HistoryListProps {
  events: readonly VersionEventView[];
}

/** The design's history: every save and lifecycle step of its versions, with who, oldest first. */
export function HistoryList({ events }: HistoryListProps) {
  if (events.length === 0) {
    return (
      <Typography variant="body2" color="text.secondary">
        No version of this design has been saved or submitted yet.
      </Typography>
    );
  }
  return (
    <Table size="small" aria-label="Design history">
      <TableHead>
        <TableRow>
          <TableCell>When</TableCell>
          <TableCell>Who</TableCell>
          <TableCell>Version</TableCell>
          <TableCell>Change</TableCell>
          <TableCell>Comment</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {events.map((e) => (
          <TableRow key={e.id}>
            <TableCell>{formatDateTime(e.at)}</TableCell>
            <TableCell>{e.actor.displayName}</TableCell>
            <TableCell>{e.versionNumber}</TableCell>
            <TableCell>{e.kind === 'saved' ? `saved (${e.to})` : `${e.from} → ${e.to}`}</TableCell>
            <TableCell sx={{ whiteSpace: 'pre-wrap' }}>{e.comment || '—'}</TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}
