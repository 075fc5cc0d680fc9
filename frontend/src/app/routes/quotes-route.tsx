import AddOutlined from '@mui/icons-material/AddOutlined';
import Button from '@mui/material/Button';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { ErrorAlert } from '../../components/error-alert';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { getCustomersQueryOptions } from '../../features/customers/api/get-customers';
import { useNewCustomerPicker } from '../../features/customers/components/use-new-customer-picker';
import { getDesignQueryOptions } from '../../features/designs/api/get-design';
import { getDesignsQueryOptions } from '../../features/designs/api/get-designs';
import { canWriteQuotes } from '../../features/quotes/quote-form';
import { QuoteFormDialog } from '../../features/quotes/components/quote-form-dialog';
import { QuotesGrid } from '../../features/quotes/components/quotes-grid';
import { useSpecMasks } from '../../features/spec-masks/api/get-spec-masks';

export function QuotesRoute() {
  const user = useSignedInUser();
  const canWrite = canWriteQuotes(user.role);
  const navigate = useNavigate();
  const [creating, setCreating] = useState(false);
  // What the "New quote" form offers; fetched only for those who may write quotes.
  const customers = useQuery({ ...getCustomersQueryOptions(), enabled: canWrite });
  const newCustomer = useNewCustomerPicker();
  const designs = useQuery({ ...getDesignsQueryOptions(), enabled: canWrite });
  const masks = useSpecMasks({}, { enabled: canWrite });
  const [chosenDesignId, setChosenDesignId] = useState<number | null>(null);
  const chosenDesign = useQuery({
    ...getDesignQueryOptions(chosenDesignId ?? 0),
    enabled: chosenDesignId !== null,
  });
  const choices = canWrite && customers.data && designs.data && masks.data;
  const choiceError = canWrite && (customers.error ?? designs.error ?? masks.error);

  return (
    <>
      <PageHeader
        title="Quotes"
        description="Prices for parts coated to an approved design version, sent to the customer with their compliance reports."
        actions={
          canWrite && (
            <Button
              variant="contained"
              startIcon={<AddOutlined />}
              disabled={!choices}
              onClick={() => setCreating(true)}
            >
              New quote
            </Button>
          )
        }
      />
      {choiceError && (
        <ErrorAlert error={choiceError} title="The quote form could not be prepared" sx={{ mb: 2 }} />
      )}
      <QuotesGrid />
      {creating && customers.data && designs.data && masks.data && (
        <QuoteFormDialog
          open
          quote={null}
          onClose={() => setCreating(false)}
          onSaved={(quote) => void navigate(`/quotes/${quote.id}`)}
          customers={customers.data}
          designs={designs.data}
          masks={masks.data}
          versions={chosenDesign.data?.id === chosenDesignId ? chosenDesign.data?.versions : undefined}
          onDesignChange={setChosenDesignId}
          onNewCustomer={newCustomer.open}
        />
      )}
      {newCustomer.dialog}
    </>
  );
}
