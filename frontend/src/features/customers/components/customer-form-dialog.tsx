import AddOutlined from '@mui/icons-material/AddOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { zodResolver } from '@hookform/resolvers/zod';
import { useFieldArray, useForm } from 'react-hook-form';
import { z } from 'zod';
import { CUSTOMER_LIMITS as L, customerInputSchema, type CustomerInput } from '@quietglass/shared';
import { ConflictAlert } from '../../../components/conflict-alert';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormTextField } from '../../../components/form-text-field';
import { ApiError } from '../../../lib/api-client';
import { notify } from '../../../lib/notifier';
import { requestFormSchema } from '../../../lib/validation';
import { getCustomersQueryOptions, type CustomerView } from '../api/get-customers';
import { useSaveCustomer } from '../api/save-customer';

interface ContactValues {
  name: string;
  email: string;
  role: string;
  phone: string;
}

interface CustomerFormValues {
  name: string;
  contactEmail: string;
  notes: string;
  contacts: ContactValues[];
}

/**
 * The API's own schema checks the form: its text fields are what the API accepts as they stand,
 * so the form shows the API's messages and its submit handler receives the request body.
 */
const customerFormSchema = requestFormSchema(z.custom<CustomerFormValues>(), customerInputSchema);

const EMPTY_CONTACT: ContactValues = { name: '', email: '', role: '', phone: '' };

function valuesOf(c: CustomerView | null): CustomerFormValues {
  return {
    name: c?.name ?? '',
    contactEmail: c?.contactEmail ?? '',
    notes: c?.notes ?? '',
    contacts: (c?.contacts ?? []).map((x) => ({
      name: x.name,
      email: x.email,
      role: x.role ?? '',
      phone: x.phone ?? '',
    })),
  };
}

interface CustomerFormDialogProps {
  open: boolean;
  /** The customer to edit, or null for a new one. */
  customer: CustomerView | null;
  onClose: () => void;
  /** Called with the saved customer (e.g. so a picker selects a new one). */
  onSaved?: (saved: CustomerView) => void;
}

/** A customer's name, quote e-mail, notes and contact people. */
export function CustomerFormDialog({ open, customer, onClose, onSaved }: CustomerFormDialogProps) {
  const queryClient = useQueryClient();
  const save = useSaveCustomer();
  const [base, setBase] = useState<CustomerView | null>(customer);
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, reset } = useForm<CustomerFormValues, unknown, CustomerInput>({
    defaultValues: valuesOf(customer),
    resolver: zodResolver(customerFormSchema),
    mode: 'onTouched',
  });
  const { fields, append, remove } = useFieldArray({ control, name: 'contacts' });
  const conflict = save.error instanceof ApiError && save.error.status === 409 ? save.error : null;
  const badRequest = save.error instanceof ApiError && save.error.status === 400 ? save.error : null;
  const otherError = save.error && !conflict && !badRequest ? save.error : null;

  const close = () => {
    save.reset();
    onClose();
  };

  const onSubmit = handleSubmit((input) => {
    setFormError(null);
    save.mutate(
      { id: base?.id ?? null, version: base?.version ?? 1, customer: input },
      {
        onSuccess: (saved) => {
          notify(`Customer ${saved.name} saved.`, 'success');
          onSaved?.(saved);
          close();
        },
        onError: (error) => {
          if (error instanceof ApiError && error.status === 400)
            setFormError((error.details.length > 0 ? error.details : [error.message]).join('; '));
        },
      },
    );
  });

  const reload = async () => {
    if (!base) return;
    const list = await queryClient.fetchQuery({
      ...getCustomersQueryOptions({ includeArchived: true }),
      staleTime: 0,
    });
    const fresh = list.find((c) => c.id === base.id) ?? null;
    setBase(fresh);
    reset(valuesOf(fresh));
    save.reset();
  };

  return (
    <FormDialog
      open={open}
      title={customer ? `Edit ${customer.name}` : 'New customer'}
      submitLabel="Save customer"
      pending={save.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="md"
    >
      {conflict && base && <ConflictAlert message={conflict.message} onReload={() => void reload()} />}
      {conflict && !base && <Alert severity="error">{conflict.message}</Alert>}
      {otherError && <ErrorAlert error={otherError} title="Not saved" />}
      {formError && (
        <Alert severity="error" role="alert">
          Not saved: {formError}
        </Alert>
      )}
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr' }, mt: 1 }}>
        <FormTextField control={control} name="name" label="Name" size="small" autoFocus />
        <FormTextField
          control={control}
          name="contactEmail"
          label="Quote e-mail"
          size="small"
          helperText="Where quotes go unless a contact is chosen (optional)"
        />
      </Box>
      <FormTextField control={control} name="notes" label="Notes" size="small" multiline maxRows={4} />
      <Typography component="h3" variant="subtitle2">
        Contacts
      </Typography>
      {fields.length === 0 && (
        <Typography variant="body2" color="text.secondary">
          No contacts yet.
        </Typography>
      )}
      {fields.map((f, i) => (
        <Box
          key={f.id}
          role="group"
          aria-label={`Contact ${i + 1}`}
          sx={{
            display: 'grid',
            gap: 1.5,
            gridTemplateColumns: { xs: '1fr 1fr', md: '2fr 2fr 1.5fr 1.5fr auto' },
          }}
        >
          <FormTextField control={control} name={`contacts.${i}.name`} label="Contact name" size="small" />
          <FormTextField control={control} name={`contacts.${i}.email`} label="E-mail" size="small" />
          <FormTextField
            control={control}
            name={`contacts.${i}.role`}
            label="Role"
            size="small"
            helperText="Optional"
          />
          <FormTextField
            control={control}
            name={`contacts.${i}.phone`}
            label="Phone"
            size="small"
            helperText="Optional"
          />
          <IconButton
            aria-label={`Remove contact ${i + 1}`}
            onClick={() => remove(i)}
            sx={{ alignSelf: 'start' }}
          >
            <DeleteOutlined fontSize="small" />
          </IconButton>
        </Box>
      ))}
      <Box>
        <Button
          startIcon={<AddOutlined />}
          onClick={() => append({ ...EMPTY_CONTACT })}
          disabled={fields.length >= L.contacts}
        >
          Add contact
        </Button>
      </Box>
    </FormDialog>
  );
}
