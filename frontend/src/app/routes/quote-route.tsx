import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useQuery } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import { Link as RouterLink, useParams } from 'react-router-dom';
import { ErrorAlert } from '../../components/error-alert';
import { LoadingBlock } from '../../components/loading-block';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { getCustomersQueryOptions } from '../../features/customers/api/get-customers';
import { useNewCustomerPicker } from '../../features/customers/components/use-new-customer-picker';
import { getDesignQueryOptions } from '../../features/designs/api/get-design';
import { getDesignsQueryOptions } from '../../features/designs/api/get-designs';
import { useAttachReports } from '../../features/quotes/api/attach-reports';
import { useQuote } from '../../features/quotes/api/get-quote';
import { AttachReportsDialog } from '../../features/quotes/components/attach-reports-dialog';
import { QuoteActions } from '../../features/quotes/components/quote-actions';
import { QuoteDetail } from '../../features/quotes/components/quote-detail';
import { QuoteFormDialog } from '../../features/quotes/components/quote-form-dialog';
import { canWriteQuotes } from '../../features/quotes/quote-form';
import { useReports } from '../../features/reports/api/get-reports';
import { NewReportDialog } from '../../features/reports/components/new-report-dialog';
import { useSpecMasks } from '../../features/spec-masks/api/get-spec-masks';
import { NotFoundRoute } from './not-found-route';

type OpenDialog = 'edit' | 'attach' | 'new-report' | null;

export function QuoteRoute() {
  const user = useSignedInUser();
  const canWrite = canWriteQuotes(user.role);
  const params = useParams();
  const quoteId = Number(params.id);
  const valid = Number.isInteger(quoteId) && quoteId > 0;
  const quote = useQuote(valid ? quoteId : 0);
  const [dialog, setDialog] = useState<OpenDialog>(null);
  const [chosenDesignId, setChosenDesignId] = useState<number | null>(null);

  const designId = quote.data?.designId ?? null;
  const design = useQuery({ ...getDesignQueryOptions(designId ?? 0), enabled: designId !== null });
  const masks = useSpecMasks();
  const reports = useReports({ designId: designId ?? undefined }, { enabled: designId !== null && canWrite });
  // What the edit form offers; fetched only for those who may write quotes.
  const customers = useQuery({ ...getCustomersQueryOptions(), enabled: canWrite });
  const newCustomer = useNewCustomerPicker();
  const designs = useQuery({ ...getDesignsQueryOptions(), enabled: canWrite });
  const chosenDesign = useQuery({
    ...getDesignQueryOptions(chosenDesignId ?? 0),
    enabled: chosenDesignId !== null,
  });
  const attach = useAttachReports();
  const maskLabel = useCallback(
    (id: number) => {
      const mask = masks.data?.find((m) => m.id === id);
      return mask ? `${mask.name} rev ${mask.revision}` : `spec mask ${id}`;
    },
    [masks.data],
  );

  if (!valid) return <NotFoundRoute />;
  if (quote.isPending) return <LoadingBlock label="Loading the quote" />;
  if (quote.isError) return <ErrorAlert error={quote.error} title="The quote could not be loaded" />;

  const q = quote.data;
  const designLabel = design.data?.name ?? `Design ${q.designId}`;
  const formReady = customers.data && designs.data && masks.data;

  return (
    <>
      <PageHeader
        title={`Quote Q-${q.id}`}
        description={`${q.customer.name} · ${q.partDescription}`}
        actions={
          <Button component={RouterLink} to="/quotes" variant="text">
            All quotes
          </Button>
        }
      />
      {canWrite && (
        <Box sx={{ mb: 3 }}>
          <QuoteActions
            quote={q}
            editReady={Boolean(formReady)}
            onEdit={() => setDialog('edit')}
            onAttach={() => setDialog('attach')}
          />
          {attach.error && (
            <ErrorAlert error={attach.error} title="The new report was not attached" sx={{ mt: 2 }} />
          )}
        </Box>
      )}
      <QuoteDetail quote={q} designLabel={designLabel} maskLabel={maskLabel(q.specMaskId)} />

      {dialog === 'edit' && customers.data && designs.data && masks.data && (
        <QuoteFormDialog
          key={q.version}
          open
          quote={q}
          onClose={() => setDialog(null)}
          onSaved={() => setDialog(null)}
          customers={customers.data}
          designs={designs.data}
          masks={masks.data}
          versions={chosenDesign.data?.id === chosenDesignId ? chosenDesign.data?.versions : undefined}
          onDesignChange={setChosenDesignId}
          onNewCustomer={newCustomer.open}
        />
      )}
      {newCustomer.dialog}
      {dialog === 'attach' && (
        <AttachReportsDialog
          open
          quote={q}
          reports={reports.data ?? []}
          maskLabel={maskLabel}
          onClose={() => setDialog(null)}
          onNewReport={() => setDialog('new-report')}
        />
      )}
      {dialog === 'new-report' && design.data && masks.data && (
        <NewReportDialog
          open
          onClose={() => setDialog(null)}
          onCreated={(report) => attach.mutate({ id: q.id, reportIds: [report.id] })}
          designs={[design.data]}
          masks={masks.data}
          versions={design.data.versions}
          onDesignChange={setChosenDesignId}
          preset={{ designId: q.designId, versionNumber: q.versionNumber, specMaskId: q.specMaskId }}
        />
      )}
    </>
  );
}
