import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { Role } from '@quietglass/shared';
import { useState, type ReactNode } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { PageHeader } from '../../../components/page-header';
import { useRun, type RunSpectrumView } from '../api/get-run';
import type { RecipeView, RunChamberView } from '../run-inputs';
import { DurabilityForm } from './durability-form';
import { depositionSteps, LayerReadingsForm } from './layer-readings-form';
import { RunRemarks } from './run-remarks';
import { SpectrumComparison } from './spectrum-comparison';
import { SpectrumUpload } from './spectrum-upload';

interface RunPageProps {
  runId: number;
  role: Role;
  /** The signed-in user: only the run's operator may change its readings and results. */
  userId: number;
  /** The recipe the run builds, as the page loads it once the run is known. */
  recipe: { data: RecipeView | undefined; isError: boolean; error: Error | null };
  /** The chambers, to name the run's (undefined while loading). */
  chambers: readonly RunChamberView[] | undefined;
  /** Run diagnosis of the shown spectrum, below its comparison; none when not given. */
  diagnosis?: (spectrum: RunSpectrumView) => ReactNode;
}

/** One chamber run: what was built, the readings, durability, measured spectra and (engineers) Run diagnosis. */
export function RunPage({ runId, role, userId, recipe, chambers, diagnosis }: RunPageProps) {
  const run = useRun(runId);
  const [chosenSpectrumId, setChosenSpectrumId] = useState<number | null>(null);

  if (run.isError) return <ErrorAlert error={run.error} title={`Run ${runId} could not be loaded`} />;
  if (!run.data) return <LoadingBlock label="Loading the run" />;
  const r = run.data;
  const canEdit = r.operator.id === userId;
  const canUpload = role !== 'sales';
  const chamber = chambers?.find((c) => c.id === r.chamberId)?.name ?? `Chamber ${r.chamberId}`;
  const recipeName = recipe.data
    ? `${recipe.data.name} v${r.versionNumber}`
    : `Design ${r.designId} v${r.versionNumber}`;
  const spectra = r.spectra;
  const spectrum = spectra.find((s) => s.id === chosenSpectrumId) ?? spectra[spectra.length - 1] ?? null;

  return (
    <>
      <PageHeader
        title={`Run ${r.lotNumber}`}
        description={
          <>
            <Link component={RouterLink} to={`/recipes/${r.designId}/${r.versionNumber}`}>
              {recipeName}
            </Link>{' '}
            · {chamber} · {r.runDate} · operator {r.operator.displayName}
          </>
        }
      />
      <Box sx={{ display: 'grid', gap: 2 }}>
        {!canEdit && (
          <Alert severity="info">
            This run was logged by {r.operator.displayName}; only they can change its readings, durability
            results and notes. Add a remark below instead.
          </Alert>
        )}
        {recipe.isError && (
          <ErrorAlert error={recipe.error} title="The recipe of this run could not be loaded" />
        )}
        {recipe.data && (
          <LayerReadingsForm
            key={`readings-${r.id}`}
            run={r}
            steps={depositionSteps(recipe.data)}
            canEdit={canEdit}
          />
        )}
        <DurabilityForm key={`durability-${r.id}`} run={r} canEdit={canEdit} />
        <RunRemarks key={`remarks-${r.id}`} run={r} />
        {canUpload && <SpectrumUpload runId={r.id} onUploaded={(s) => setChosenSpectrumId(s.id)} />}
        {spectra.length > 1 && spectrum && (
          <TextField
            select
            size="small"
            label="Spectrum shown"
            value={String(spectrum.id)}
            onChange={(e) => setChosenSpectrumId(Number(e.target.value))}
            slotProps={{ select: { native: true }, inputLabel: { shrink: true } }}
            sx={{ maxWidth: 420 }}
          >
            {spectra.map((s) => (
              <option key={s.id} value={s.id}>
                {`${s.filename} (${s.sample}, ${s.quantity} at ${s.angleDeg}°)`}
              </option>
            ))}
          </TextField>
        )}
        {spectrum ? (
          <>
            <SpectrumComparison key={spectrum.id} spectrum={spectrum} />
            {diagnosis?.(spectrum)}
          </>
        ) : (
          <Typography variant="body2" color="text.secondary">
            No spectrum has been uploaded for this run yet.
          </Typography>
        )}
      </Box>
    </>
  );
}
