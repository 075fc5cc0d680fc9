import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import type { DesignVersionView } from '@quietglass/shared';
import { ErrorAlert } from '../../../components/error-alert';
import { useAcceptCalculation } from '../api/accept-calculation';

interface AcceptButtonProps {
  calculationId: number;
  /** Grow layers: the chosen step. */
  step?: number;
  /** Called with the new draft's number once the design knows it. */
  /** Caches the new version and refreshes the design's version list before `onAccepted`. */
  storeVersion: (view: DesignVersionView) => Promise<void>;
  onAccepted: (versionNumber: number) => void;
}

/** Makes the result a new draft version and opens it. */
export function AcceptButton({ calculationId, step, storeVersion, onAccepted }: AcceptButtonProps) {
  const accept = useAcceptCalculation(storeVersion);
  return (
    <Box sx={{ display: 'grid', gap: 1 }}>
      <Box>
        <Button
          variant="contained"
          loading={accept.isPending}
          onClick={() =>
            accept.mutate(step === undefined ? { calculationId } : { calculationId, step }, {
              onSuccess: (view) => onAccepted(view.number),
            })
          }
        >
          Accept as new draft
        </Button>
      </Box>
      {accept.error && <ErrorAlert error={accept.error} title="The result was not accepted" />}
    </Box>
  );
}
