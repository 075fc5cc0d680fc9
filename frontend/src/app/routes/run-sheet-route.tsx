import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import PrintOutlined from '@mui/icons-material/PrintOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { Link as RouterLink, useParams, useSearchParams } from 'react-router-dom';
import { ErrorAlert } from '../../components/error-alert';
import { LoadingBlock } from '../../components/loading-block';
import { PageHeader } from '../../components/page-header';
import { useChambers } from '../../features/chambers/api/get-chambers';
import { useRecipe } from '../../features/recipes/api/get-recipe';
import {
  runSheetPdfUrl,
  useRunSheet,
  type RunSheetJobParams,
  type RunSheetParams,
} from '../../features/recipes/api/get-run-sheet';
import { RunSheetControls } from '../../features/recipes/components/run-sheet-controls';
import { RunSheetDocument } from '../../features/recipes/components/run-sheet-document';
import { RunSheetJobFields } from '../../features/recipes/components/run-sheet-job-fields';
import { RunSheetPrintStyles } from '../../features/recipes/components/run-sheet-print-styles';
import { NotFoundRoute } from './not-found-route';

function positiveNumber(text: string | null | undefined): number | null {
  const value = Number(text);
  return text && Number.isFinite(value) && value > 0 ? value : null;
}

const JOB_KEYS = ['part', 'quantity', 'sides', 'substrateThicknessMm'] as const;

/** The run's part, quantity, sides and substrate thickness as the address holds them. */
function jobFromSearch(search: URLSearchParams): RunSheetJobParams {
  const sides = search.get('sides');
  return {
    part: search.get('part') || null,
    quantity: positiveNumber(search.get('quantity')),
    sides: sides === 'front' || sides === 'both' ? sides : null,
    substrateThicknessMm: positiveNumber(search.get('substrateThicknessMm')),
  };
}

function withJob(search: URLSearchParams, job: RunSheetJobParams): URLSearchParams {
  const next = new URLSearchParams(search);
  for (const key of JOB_KEYS) {
    const value = job[key];
    if (value === null || value === '') next.delete(key);
    else next.set(key, String(value));
  }
  return next;
}

export function RunSheetRoute() {
  const params = useParams();
  const designId = positiveNumber(params.designId);
  const number = positiveNumber(params.number);
  const valid =
    designId !== null && number !== null && Number.isInteger(designId) && Number.isInteger(number);
  const [search, setSearch] = useSearchParams();
  const recipe = useRecipe(valid ? designId : 0, valid ? number : 0);
  const chambers = useChambers();

  const chamberId = positiveNumber(search.get('chamberId'));
  const chamber = chambers.data?.find((c) => c.id === chamberId) ?? null;
  const askedWavelength = positiveNumber(search.get('monitorWavelengthNm'));
  const monitorWavelengthNm =
    chamber && askedWavelength !== null && chamber.monitorWavelengthsNm.includes(askedWavelength)
      ? askedWavelength
      : (chamber?.monitorWavelengthsNm[0] ?? null);
  const job = jobFromSearch(search);
  const sheetParams: RunSheetParams | null =
    valid && chamber && recipe.data
      ? { designId, number, chamberId: chamber.id, monitorWavelengthNm, job }
      : null;
  const sheet = useRunSheet(sheetParams);

  if (!valid) return <NotFoundRoute />;
  if (recipe.isPending || chambers.isPending) return <LoadingBlock label="Loading the recipe" />;
  if (recipe.isError) return <ErrorAlert error={recipe.error} title="The recipe could not be loaded" />;
  if (chambers.isError) return <ErrorAlert error={chambers.error} title="The chambers could not be loaded" />;

  return (
    <>
      <RunSheetPrintStyles />
      <PageHeader
        title={`Run sheet: ${recipe.data.name}, version ${recipe.data.number}`}
        description={
          sheet.data
            ? `${sheet.data.recipe.customer} · ${sheet.data.chamber.name} · monitor at ${sheet.data.monitorWavelengthNm} nm`
            : 'Choose the chamber and monitor wavelength for this run.'
        }
        actions={
          <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap' }} data-print="hide">
            <Button
              variant="contained"
              startIcon={<PrintOutlined />}
              disabled={!sheet.data}
              onClick={() => window.print()}
            >
              Print
            </Button>
            {sheetParams && sheet.data ? (
              <Button variant="outlined" startIcon={<DownloadOutlined />} href={runSheetPdfUrl(sheetParams)}>
                Download PDF
              </Button>
            ) : (
              <Button variant="outlined" startIcon={<DownloadOutlined />} disabled>
                Download PDF
              </Button>
            )}
            <Button component={RouterLink} to={`/runs?recipe=${designId}:${number}`} variant="outlined">
              Start a run
            </Button>
            <Button component={RouterLink} to="/recipes" variant="text">
              All recipes
            </Button>
          </Box>
        }
      />
      <Box sx={{ display: 'grid', gap: 2 }}>
        <RunSheetControls
          chambers={chambers.data}
          chamberId={chamber?.id ?? null}
          monitorWavelengthNm={monitorWavelengthNm}
          onChange={(choice) => {
            const next = new URLSearchParams(search);
            next.delete('chamberId');
            next.delete('monitorWavelengthNm');
            if (choice.chamberId !== null) next.set('chamberId', String(choice.chamberId));
            if (choice.monitorWavelengthNm !== null)
              next.set('monitorWavelengthNm', String(choice.monitorWavelengthNm));
            setSearch(next, { replace: true });
          }}
        />
        {chamber && (
          <RunSheetJobFields
            job={job}
            designSides={sheet.data?.job.sides ?? null}
            designThicknessMm={sheet.data?.substrate.designThicknessMm ?? null}
            onChange={(next) => setSearch(withJob(search, next), { replace: true })}
          />
        )}
        {!chamber && chambers.data.length > 0 && (
          <Alert severity="info" data-print="hide">
            Choose a chamber: the monitor thicknesses and times depend on its tooling factors and rates.
          </Alert>
        )}
        {chambers.data.length === 0 && (
          <Alert severity="info">No chambers are set up yet; an engineer adds them under Chambers.</Alert>
        )}
        {sheetParams && sheet.isPending && <LoadingBlock label="Computing the run sheet" />}
        {sheet.isError && (
          <ErrorAlert error={sheet.error} title={`No run sheet for ${chamber?.name ?? 'this chamber'}`} />
        )}
        {sheet.data && !sheet.isError && <RunSheetDocument sheet={sheet.data} />}
      </Box>
    </>
  );
}
