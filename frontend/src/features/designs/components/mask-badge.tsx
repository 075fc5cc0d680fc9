import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import type { PreviewMaskResult } from '../../../lib/preview/compute-preview';
import { formatSigned } from '../../../lib/format';

interface MaskBadgeProps {
  result: PreviewMaskResult | null;
  /** The mask's name and revision, or null when the design has no spec mask. */
  maskName: string | null;
  error: string | null;
}

/** Pass or fail against the design's spec mask, with the worst margin and where it lies. */
export function MaskBadge({ result, maskName, error }: MaskBadgeProps) {
  let body;
  if (!maskName) body = <Typography variant="body2">No spec mask on this design</Typography>;
  else if (error)
    body = (
      <Typography variant="body2" color="error">
        The mask could not be evaluated: {error}
      </Typography>
    );
  else if (!result) body = <Typography variant="body2">Waiting for the preview…</Typography>;
  else {
    const at = result.worstAt;
    body = (
      <>
        <Chip
          label={result.pass ? 'Pass' : 'Fail'}
          color={result.pass ? 'success' : 'error'}
          size="small"
          sx={{ fontWeight: 600, minWidth: 56 }}
        />
        <Typography variant="body2">
          Worst margin {formatSigned(result.worstMargin)} percentage points at {at.wavelengthNm} nm,{' '}
          {at.angleDeg}° ({at.polarisation}): {at.valuePercent.toFixed(3)} %
        </Typography>
      </>
    );
  }
  return (
    <Box
      role="status"
      aria-label="Spec mask result"
      sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap' }}
    >
      {maskName && (
        <Typography variant="body2" color="text.secondary">
          {maskName}:
        </Typography>
      )}
      {body}
    </Box>
  );
}
