import AddOutlined from '@mui/icons-material/AddOutlined';
import UploadFileOutlined from '@mui/icons-material/UploadFileOutlined';
import Button from '@mui/material/Button';
import TextField from '@mui/material/TextField';
import { useState } from 'react';
import { ErrorAlert } from '../../components/error-alert';
import { PageHeader } from '../../components/page-header';
import { useCustomers } from '../../features/customers/api/get-customers';
import { useNewCustomerPicker } from '../../features/customers/components/use-new-customer-picker';
import type { SpecMaskView } from '../../features/spec-masks/api/get-spec-masks';
import { SpecMaskCsvDialog } from '../../features/spec-masks/components/spec-mask-csv-dialog';
import { SpecMaskFormDialog } from '../../features/spec-masks/components/spec-mask-form-dialog';
import { SpecMasksList } from '../../features/spec-masks/components/spec-masks-list';

export function SpecMasksRoute() {
  const customers = useCustomers();
  const [customerId, setCustomerId] = useState<number | null>(null);
  const [selectedId, setSelectedId] = useState<number | null>(null);
  const [editing, setEditing] = useState<SpecMaskView | 'new' | null>(null);
  const [importing, setImporting] = useState(false);
  const customerList = customers.data ?? [];
  const newCustomer = useNewCustomerPicker();

  return (
    <>
      <PageHeader
        title="Spec masks"
        description="Customers' limits on reflectance and transmittance, one limit band at a time."
        actions={
          <>
            <Button variant="outlined" startIcon={<UploadFileOutlined />} onClick={() => setImporting(true)}>
              Import CSV
            </Button>
            <Button variant="contained" startIcon={<AddOutlined />} onClick={() => setEditing('new')}>
              New spec mask
            </Button>
          </>
        }
      />
      {customers.isError && (
        <ErrorAlert error={customers.error} title="The customers could not be loaded" sx={{ mb: 2 }} />
      )}
      <TextField
        select
        size="small"
        label="Customer"
        value={customerId === null ? '' : String(customerId)}
        onChange={(e) => {
          setCustomerId(e.target.value === '' ? null : Number(e.target.value));
          setSelectedId(null);
        }}
        slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
        sx={{ mb: 2, minWidth: 280 }}
      >
        <option value="">All customers</option>
        {customerList.map((c) => (
          <option key={c.id} value={String(c.id)}>
            {c.name}
          </option>
        ))}
      </TextField>
      <SpecMasksList
        customerId={customerId}
        selectedId={selectedId}
        onSelect={(m) => setSelectedId(m?.id ?? null)}
        canEdit
        onEdit={(m) => setEditing(m)}
      />
      {editing !== null && (
        <SpecMaskFormDialog
          key={editing === 'new' ? 'new' : `${editing.id}:${editing.version}`}
          open
          mask={editing === 'new' ? null : editing}
          customers={customerList}
          defaultCustomerId={customerId}
          onClose={() => setEditing(null)}
          onNewCustomer={newCustomer.open}
        />
      )}
      {importing && (
        <SpecMaskCsvDialog
          open
          customers={customerList}
          defaultCustomerId={customerId}
          onClose={() => setImporting(false)}
          onNewCustomer={newCustomer.open}
        />
      )}
      {newCustomer.dialog}
    </>
  );
}
