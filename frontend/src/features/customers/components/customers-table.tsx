import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import type { CustomerView } from '../api/get-customers';

interface CustomersTableProps {
  customers: readonly CustomerView[];
  selectedId: number | null;
  onSelect: (customer: CustomerView) => void;
  onEdit: (customer: CustomerView) => void;
  onArchive: (customer: CustomerView) => void;
}

/** Customers with their quote e-mail and contacts; archived ones marked as such. */
export function CustomersTable({ customers, selectedId, onSelect, onEdit, onArchive }: CustomersTableProps) {
  return (
    <Table size="small" aria-label="Customers">
      <TableHead>
        <TableRow>
          <TableCell>Name</TableCell>
          <TableCell>Quote e-mail</TableCell>
          <TableCell>Contacts</TableCell>
          <TableCell>State</TableCell>
          <TableCell align="right">Actions</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {customers.map((c) => (
          <TableRow key={c.id} hover selected={c.id === selectedId}>
            <TableCell>
              <Button size="small" onClick={() => onSelect(c)} aria-label={`Show records of ${c.name}`}>
                {c.name}
              </Button>
            </TableCell>
            <TableCell>{c.contactEmail ?? '—'}</TableCell>
            <TableCell>
              {c.contacts.length === 0 ? '—' : c.contacts.map((p) => `${p.name} <${p.email}>`).join(', ')}
            </TableCell>
            <TableCell>
              {c.archivedAt ? (
                <Chip size="small" label="Archived" />
              ) : (
                <Chip size="small" color="success" variant="outlined" label="Active" />
              )}
            </TableCell>
            <TableCell align="right" sx={{ whiteSpace: 'nowrap' }}>
              <Button size="small" onClick={() => onEdit(c)} aria-label={`Edit ${c.name}`}>
                Edit
              </Button>
              <Button
                size="small"
                onClick={() => onArchive(c)}
                aria-label={`${c.archivedAt ? 'Restore' : 'Archive'} ${c.name}`}
              >
                {c.archivedAt ? 'Restore' : 'Archive'}
              </Button>
            </TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}
