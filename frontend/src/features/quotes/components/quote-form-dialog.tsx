import AddOutlined from '@mui/icons-material/AddOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import FormHelperText from '@mui/material/FormHelperText';
import IconButton from '@mui/material/IconButton';
import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  QUOTE_LIMITS,
  isApprovedForCustomers,
  isCustomerSpecification,
  type QuoteInput,
  type SpecMaskKind,
  type VersionStatus,
} from '@quietglass/shared';
import { useEffect } from 'react';
import { useFieldArray, useForm, useWatch } from 'react-hook-form';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { FormSelectField, NEW_CUSTOMER_OPTION, namedOptions } from '../../../components/form-select-field';
import { FormTextField } from '../../../components/form-text-field';
import { useCreateQuote } from '../api/create-quote';
import type { QuoteView } from '../api/get-quotes';
import { useUpdateQuote } from '../api/update-quote';
import { emptyQuoteValues, quoteFormSchema, quoteValues, type QuoteFormValues } from '../quote-form';

export interface QuoteCustomerChoice {
  id: number;
  name: string;
  contactEmail: string | null;
}

export interface QuoteDesignChoice {
  id: number;
  name: string;
  customer: { id: number };
  specMaskId: number | null;
}

export interface QuoteMaskChoice {
  id: number;
  name: string;
  revision: string;
  customer: { id: number };
  kind: SpecMaskKind;
}

interface QuoteFormDialogProps {
  open: boolean;
  /** The draft being edited; a new quote when null. */
  quote: QuoteView | null;
  onClose: () => void;
  onSaved: (quote: QuoteView) => void;
  customers: readonly QuoteCustomerChoice[];
  designs: readonly QuoteDesignChoice[];
  masks: readonly QuoteMaskChoice[];
  /** Versions of the chosen design; undefined while they load (or before a design is chosen). */
  versions: readonly { number: number; status: VersionStatus }[] | undefined;
  /** Told which design is chosen, so its versions can be fetched. */
  onDesignChange: (designId: number | null) => void;
  /** "New customer…" in the customer picker: shows the form, then `choose` selects the new one. */
  onNewCustomer?: (choose: (customer: { id: number; name: string }) => void) => void;
}

const twoColumns = { display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr' } } as const;

/** A quote for parts coated to an approved design version: prices per quantity break, lead time, validity. */
export function QuoteFormDialog({
  open,
  quote,
  onClose,
  onSaved,
  customers,
  designs,
  masks,
  versions,
  onDesignChange,
  onNewCustomer,
}: QuoteFormDialogProps) {
  const createQuote = useCreateQuote();
  const updateQuote = useUpdateQuote();
  const mutation = quote ? updateQuote : createQuote;
  const { control, handleSubmit, setValue, watch, formState } = useForm<QuoteFormValues, unknown, QuoteInput>(
    {
      defaultValues: quote ? quoteValues(quote) : emptyQuoteValues(),
      resolver: zodResolver(quoteFormSchema),
    },
  );
  const breaks = useFieldArray({ control, name: 'quantityBreaks' });
  const customerId = useWatch({ control, name: 'customerId' });
  const designId = useWatch({ control, name: 'designId' });
  const designsOfCustomer = designs.filter((d) => String(d.customer.id) === customerId);
  // A quote refers to the customer's own specification: internal design targets are not offered.
  const masksOfCustomer = masks.filter(
    (m) => String(m.customer.id) === customerId && isCustomerSpecification(m),
  );
  const quotable = (versions ?? []).filter((v) => isApprovedForCustomers(v.status));

  useEffect(() => onDesignChange(designId === '' ? null : Number(designId)), [designId, onDesignChange]);
  useEffect(() => {
    // A design and a mask belong to one customer: another customer clears them; another design
    // offers its own versions and its own mask first.
    const subscription = watch((values, { name }) => {
      if (name === 'customerId') {
        setValue('designId', '');
        setValue('versionNumber', '');
        setValue('specMaskId', '');
        const customer = customers.find((c) => String(c.id) === values.customerId);
        if (customer?.contactEmail && !values.contactEmail) setValue('contactEmail', customer.contactEmail);
      } else if (name === 'designId') {
        const design = designs.find((d) => String(d.id) === values.designId);
        setValue('versionNumber', '');
        const own = masks.find((m) => m.id === design?.specMaskId);
        setValue('specMaskId', own && isCustomerSpecification(own) ? String(own.id) : '');
      }
    });
    return () => subscription.unsubscribe();
  }, [customers, designs, masks, setValue, watch]);

  const close = () => {
    mutation.reset();
    onClose();
  };

  const onSubmit = handleSubmit((changes) => {
    const done = {
      onSuccess: (saved: QuoteView) => {
        close();
        onSaved(saved);
      },
    };
    if (quote) updateQuote.mutate({ id: quote.id, version: quote.version, changes }, done);
    else createQuote.mutate(changes, done);
  });

  const breaksError =
    formState.errors.quantityBreaks?.root?.message ?? formState.errors.quantityBreaks?.message;

  return (
    <FormDialog
      open={open}
      title={quote ? `Edit quote Q-${quote.id}` : 'New quote'}
      submitLabel={quote ? 'Save quote' : 'Create quote'}
      pending={mutation.isPending}
      onSubmit={onSubmit}
      onClose={close}
      maxWidth="md"
    >
      {mutation.error && <ErrorAlert error={mutation.error} title="The quote was not saved" />}
      <Box sx={{ ...twoColumns, mt: 1 }}>
        <FormSelectField
          control={control}
          name="customerId"
          label="Customer"
          placeholder="Choose…"
          options={namedOptions(customers)}
          createOption={
            onNewCustomer && {
              label: NEW_CUSTOMER_OPTION,
              onCreate: () =>
                onNewCustomer((c) => setValue('customerId', String(c.id), { shouldValidate: true })),
            }
          }
        />
        <FormTextField control={control} name="contactEmail" label="Contact e-mail" type="email" />
        <FormSelectField
          control={control}
          name="designId"
          label="Design"
          placeholder="Choose…"
          disabled={customerId === ''}
          helperText={
            customerId === '' ? 'Choose the customer first' : `${designsOfCustomer.length} of their designs`
          }
          options={namedOptions(designsOfCustomer)}
        />
        <FormSelectField
          control={control}
          name="versionNumber"
          label="Approved version"
          placeholder="Choose…"
          disabled={designId === ''}
          helperText={
            designId === ''
              ? 'Choose the design first'
              : versions === undefined
                ? 'Loading the versions…'
                : quotable.length === 0
                  ? 'This design has no approved or released version yet'
                  : 'Only approved and released versions can be quoted'
          }
          options={quotable.map((v) => ({
            value: String(v.number),
            label: `Version ${v.number} (${v.status})`,
          }))}
        />
        <FormSelectField
          control={control}
          name="specMaskId"
          label="Spec mask"
          placeholder="Choose…"
          disabled={customerId === ''}
          options={masksOfCustomer.map((m) => ({
            value: String(m.id),
            label: `${m.name} rev ${m.revision}`,
          }))}
        />
        <FormTextField control={control} name="partDescription" label="Part description" />
      </Box>

      <Box component="fieldset" sx={{ border: 0, p: 0, m: 0, display: 'grid', gap: 1 }}>
        <Typography component="legend" variant="subtitle2" sx={{ mb: 1 }}>
          Quantity breaks
        </Typography>
        {breaks.fields.map((field, index) => (
          <Box
            key={field.id}
            sx={{ display: 'grid', gap: 2, gridTemplateColumns: '1fr 1fr auto', alignItems: 'start' }}
          >
            <FormTextField
              control={control}
              name={`quantityBreaks.${index}.minQuantity`}
              label={`From quantity (break ${index + 1})`}
              size="small"
              inputMode="numeric"
            />
            <FormTextField
              control={control}
              name={`quantityBreaks.${index}.unitPrice`}
              label={`Unit price (break ${index + 1})`}
              size="small"
              inputMode="decimal"
            />
            <IconButton
              aria-label={`Remove break ${index + 1}`}
              disabled={breaks.fields.length <= 1}
              onClick={() => breaks.remove(index)}
            >
              <DeleteOutlined />
            </IconButton>
          </Box>
        ))}
        {breaksError && <FormHelperText error>{breaksError}</FormHelperText>}
        <Box>
          <Button
            startIcon={<AddOutlined />}
            disabled={breaks.fields.length >= QUOTE_LIMITS.breaks}
            onClick={() => breaks.append({ minQuantity: '', unitPrice: '' })}
          >
            Add quantity break
          </Button>
        </Box>
      </Box>

      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: 'repeat(3, 1fr)' } }}>
        <FormTextField control={control} name="currency" label="Currency" helperText="ISO 4217, e.g. EUR" />
        <FormTextField control={control} name="leadTimeDays" label="Lead time (days)" inputMode="numeric" />
        <FormTextField
          control={control}
          name="validUntil"
          label="Valid until"
          type="date"
          slotProps={{ inputLabel: { shrink: true } }}
        />
      </Box>
      <FormTextField control={control} name="terms" label="Terms" multiline minRows={2} />
    </FormDialog>
  );
}
