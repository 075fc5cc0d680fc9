import AddOutlined from '@mui/icons-material/AddOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormHelperText from '@mui/material/FormHelperText';
import Typography from '@mui/material/Typography';
import { useState, type FormEvent } from 'react';
import { ErrorAlert } from '../../../components/error-alert';
import { FormDialog } from '../../../components/form-dialog';
import { formatDateTime } from '../../../lib/format';
import { useAttachReports } from '../api/attach-reports';
import type { QuoteView } from '../api/get-quotes';

/** What the dialog needs to know of a compliance report. */
export interface AttachableReport {
  id: number;
  versionNumber: number;
  specMaskId: number;
  summary: { pass: boolean | null; source: string };
  createdAt: string;
}

interface AttachReportsDialogProps {
  open: boolean;
  quote: QuoteView;
  /** Reports of the quote's design; those of its version that are not yet attached are offered. */
  reports: readonly AttachableReport[];
  maskLabel: (specMaskId: number) => string;
  onClose: () => void;
  /** Make a new report of the quote's version and mask instead. */
  onNewReport: () => void;
}

function verdict(pass: boolean | null): string {
  return pass === null ? 'not evaluated' : pass ? 'PASS' : 'FAIL';
}

/** Chooses existing compliance reports of the quote's design version to send with it. */
export function AttachReportsDialog({
  open,
  quote,
  reports,
  maskLabel,
  onClose,
  onNewReport,
}: AttachReportsDialogProps) {
  const attach = useAttachReports();
  const [chosen, setChosen] = useState<ReadonlySet<number>>(new Set());
  const [noneChosen, setNoneChosen] = useState(false);
  const offered = reports.filter(
    (r) => r.versionNumber === quote.versionNumber && !quote.reportIds.includes(r.id),
  );

  const close = () => {
    attach.reset();
    onClose();
  };

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (chosen.size === 0) {
      setNoneChosen(true);
      return;
    }
    attach.mutate({ id: quote.id, reportIds: [...chosen] }, { onSuccess: close });
  };

  return (
    <FormDialog
      open={open}
      title="Attach compliance reports"
      submitLabel="Attach"
      pending={attach.isPending}
      onSubmit={onSubmit}
      onClose={close}
    >
      {attach.error && <ErrorAlert error={attach.error} title="The reports were not attached" />}
      <Typography variant="body2" color="text.secondary">
        Reports of version {quote.versionNumber} of the quoted design go out with the e-mail as PDFs.
      </Typography>
      {offered.length === 0 ? (
        <Typography>No other report of this version yet.</Typography>
      ) : (
        <Box role="group" aria-label="Reports to attach" sx={{ display: 'grid' }}>
          {offered.map((r) => (
            <FormControlLabel
              key={r.id}
              control={
                <Checkbox
                  checked={chosen.has(r.id)}
                  onChange={(e) => {
                    const next = new Set(chosen);
                    if (e.target.checked) next.add(r.id);
                    else next.delete(r.id);
                    setChosen(next);
                    setNoneChosen(false);
                  }}
                />
              }
              label={`R-${r.id}: ${maskLabel(r.specMaskId)}, ${r.summary.source}, ${verdict(r.summary.pass)} (${formatDateTime(r.createdAt)})`}
            />
          ))}
        </Box>
      )}
      {noneChosen && <FormHelperText error>Choose at least one report</FormHelperText>}
      <Box>
        <Button
          startIcon={<AddOutlined />}
          onClick={() => {
            close();
            onNewReport();
          }}
        >
          New report for this quote
        </Button>
      </Box>
    </FormDialog>
  );
}
