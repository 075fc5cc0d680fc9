import AddOutlined from '@mui/icons-material/AddOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import FormControlLabel from '@mui/material/FormControlLabel';
import Switch from '@mui/material/Switch';
import { useState } from 'react';
import { ConfirmDialog } from '../../components/confirm-dialog';
import { ErrorAlert } from '../../components/error-alert';
import { LoadingBlock } from '../../components/loading-block';
import { PageHeader } from '../../components/page-header';
import { notify } from '../../lib/notifier';
import { useCustomers, type CustomerView } from '../../features/customers/api/get-customers';
import { useArchiveCustomer } from '../../features/customers/api/save-customer';
import { CustomerFormDialog } from '../../features/customers/components/customer-form-dialog';
import { CustomerRecords } from '../../features/customers/components/customer-records';
import { CustomersTable } from '../../features/customers/components/customers-table';

export function CustomersRoute() {
  const [showArchived, setShowArchived] = useState(false);
  const customers = useCustomers({ includeArchived: showArchived });
  // undefined: no dialog; null: a new customer.
  const [editing, setEditing] = useState<CustomerView | null | undefined>(undefined);
  const [archiving, setArchiving] = useState<CustomerView | null>(null);
  const [selectedId, setSelectedId] = useState<number | null>(null);
  const archive = useArchiveCustomer();
  const selected = customers.data?.find((c) => c.id === selectedId) ?? null;

  const confirmArchive = () => {
    if (!archiving) return;
    const archived = archiving.archivedAt === null;
    archive.mutate(
      { id: archiving.id, version: archiving.version, archived },
      {
        onSuccess: (saved) => {
          notify(`${saved.name} ${archived ? 'archived' : 'restored'}.`, 'success');
          setArchiving(null);
        },
      },
    );
  };

  return (
    <>
      <PageHeader
        title="Customers"
        description="The shop's customers, their contacts, and their spec masks, designs, reports and quotes."
        actions={
          <Button variant="contained" startIcon={<AddOutlined />} onClick={() => setEditing(null)}>
            New customer
          </Button>
        }
      />
      <FormControlLabel
        control={<Switch checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} />}
        label="Show archived customers"
        sx={{ mb: 1 }}
      />
      {customers.isPending && <LoadingBlock label="Loading the customers" />}
      {customers.isError && <ErrorAlert error={customers.error} title="The customers could not be loaded" />}
      <Box sx={{ display: 'grid', gap: 2 }}>
        {customers.data && (
          <CustomersTable
            customers={customers.data}
            selectedId={selectedId}
            onSelect={(c) => setSelectedId(c.id)}
            onEdit={(c) => setEditing(c)}
            onArchive={(c) => {
              archive.reset();
              setArchiving(c);
            }}
          />
        )}
        {selected && <CustomerRecords customer={selected} />}
      </Box>
      {editing !== undefined && (
        <CustomerFormDialog
          key={editing ? `${editing.id}:${editing.version}` : 'new'}
          open
          customer={editing}
          onClose={() => setEditing(undefined)}
        />
      )}
      {archiving && (
        <ConfirmDialog
          open
          title={archiving.archivedAt ? `Restore ${archiving.name}?` : `Archive ${archiving.name}?`}
          confirmLabel={archiving.archivedAt ? 'Restore' : 'Archive'}
          pending={archive.isPending}
          onConfirm={confirmArchive}
          onCancel={() => setArchiving(null)}
        >
          {archiving.archivedAt
            ? 'The customer appears in the pickers again and can get new spec masks and quotes.'
            : 'The customer is hidden from every picker and gets no new spec masks or quotes. Its masks, designs, reports and quotes stay as they are.'}
          {archive.error && <ErrorAlert error={archive.error} title="Not changed" sx={{ mt: 2 }} />}
        </ConfirmDialog>
      )}
    </>
  );
}
