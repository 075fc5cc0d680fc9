import Typography from '@mui/material/Typography';
import type { ResultForecast } from '@quietglass/shared';
import { formatSigned } from '../../../lib/format';

/**
 * The short yield forecast the compute queue runs on a Fit or Grow result: yield at the stated
 * thickness error and the spread of the worst margin it costs. Nothing for older results.
 */
export function ResultForecastLine({
  forecast,
  of,
}: {
  forecast: ResultForecast | null | undefined;
  /** What was forecast, when not obvious (e.g. "the final step, 9 layers"). */
  of?: string;
}) {
  if (!forecast) return null;
  const partial = forecast.trials < forecast.requestedTrials ? ` of ${forecast.requestedTrials}` : '';
  return (
    <Typography variant="body2" role="status" aria-label="Forecast yield of the result">
      Forecast yield {(forecast.yieldFraction * 100).toFixed(1)} %{of ? ` (${of})` : ''} at{' '}
      {forecast.relativePercent} % (1σ) thickness error per layer, {forecast.trials}
      {partial} trials · worst margin median {formatSigned(forecast.medianWorstMargin)}, 5th percentile{' '}
      {formatSigned(forecast.p5WorstMargin)} percentage points. Run a Yield forecast of the accepted version
      for systematic and index errors.
    </Typography>
  );
}
