import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Tab from '@mui/material/Tab';
import Tabs from '@mui/material/Tabs';
import Typography from '@mui/material/Typography';
import { elementAt, type DesignVersionView, type LimitBand, type NamedModel } from '@quietglass/shared';
import { useMemo, useState, type ReactNode } from 'react';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { CALCULATION_POLL_MS, useCalculation } from '../api/get-calculation';
import { useLatestCalculations } from '../api/get-latest-calculations';
import {
  useSubmitOptimisation,
  type OptimisationInput,
  type OptimisationKind,
} from '../api/submit-optimisation';
import { fitResultOf, growResultOf, yieldForecastOf } from '../results';
import { FitForm } from './fit-form';
import { FitResultView } from './fit-result-view';
import { GrowForm } from './grow-form';
import { GrowResultView } from './grow-result-view';
import { RunStatus } from './run-status';
import type { VersionContext } from './version-context';
import { YieldForm } from './yield-form';
import { YieldResultView } from './yield-result-view';

const TABS: { kind: OptimisationKind; label: string; about: string }[] = [
  {
    kind: 'fit',
    label: 'Fit to mask',
    about:
      'Refines the thicknesses of the unlocked layers (Levenberg–Marquardt) until the stack meets the spec mask or stops improving.',
  },
  {
    kind: 'grow',
    label: 'Grow layers',
    about:
      'Adds thin layers of the allowed materials where they lower the merit most (needle method), refining all thicknesses after each step.',
  },
  {
    kind: 'yield',
    label: 'Yield forecast',
    about:
      'Runs the stack many times with random thickness (and index) errors (Monte Carlo) and counts how many runs meet the spec mask.',
  },
];

interface Run {
  id: number;
  reused: boolean;
}

/** The saved version the optimisations start from, as the page loads it. */
export interface LoadedVersion {
  data: DesignVersionView | undefined;
  isPending: boolean;
  isError: boolean;
  error: Error | null;
}

interface OptimisePanelProps {
  designId: number;
  versionNumber: number;
  /** Saved version `versionNumber` (the page reads it only for someone who may run optimisations). */
  version: LoadedVersion;
  /** The material library (a material's id, name and model). */
  library: readonly (NamedModel & { id: number })[];
  maskBands: LimitBand[] | null;
  /** Engineers and administrators run optimisations; for anyone else the panel is not shown. */
  canRun: boolean;
  /** Opens another version of the design (after a result was accepted as a new draft). */
  onVersionChange: (number: number) => void;
  /** Caches a new draft version and refreshes the design's version list; awaited before it opens. */
  storeVersion: (view: DesignVersionView) => Promise<void>;
  /** A calculation to show at first (opened from the compute queue): its tab opens with it. */
  openCalculationId?: number | null;
  pollMs?: number;
}

/** Fit to mask, Grow layers and Yield forecast of the saved version, on the compute queue. */
export function OptimisePanel({
  designId,
  versionNumber,
  version,
  library,
  maskBands,
  canRun,
  onVersionChange,
  storeVersion,
  openCalculationId = null,
  pollMs = CALCULATION_POLL_MS,
}: OptimisePanelProps) {
  const opened = useCalculation(canRun ? openCalculationId : null, pollMs);
  const openedKind = TABS.find((t) => t.kind === opened.data?.kind)?.kind ?? null;
  const [chosenTab, setTab] = useState<OptimisationKind | null>(null);
  const tab = chosenTab ?? openedKind ?? 'fit';
  const [runs, setRuns] = useState<Record<OptimisationKind, Run | null>>({
    fit: null,
    grow: null,
    yield: null,
  });

  // Until one is run here, each optimisation shows the version's latest completed result.
  const latest = useLatestCalculations(designId, versionNumber, canRun);
  const runOf = (kind: OptimisationKind): Run | null => {
    const stored = opened.data && openedKind === kind ? opened.data : latest.data?.[kind];
    return runs[kind] ?? (stored ? { id: stored.id, reused: false } : null);
  };

  const context = useMemo((): VersionContext | null => {
    if (!version.data) return null;
    const materials = new Map<number, NamedModel>(library.map((m) => [m.id, m]));
    for (const [id, m] of Object.entries(version.data.materialsSnapshot ?? {})) materials.set(Number(id), m);
    return {
      version: version.data,
      materials,
      idsByName: new Map(library.map((m) => [m.name, m.id])),
      maskBands,
    };
  }, [version.data, library, maskBands]);

  if (!canRun) return null;
  const current = TABS.find((t) => t.kind === tab) ?? elementAt(TABS, 0, 'the optimisation tabs');

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Optimise">
      <Typography variant="h2" component="h2" gutterBottom>
        Optimise
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
        Runs on saved version {versionNumber} against the design&apos;s spec mask, on the compute queue.
        Unsaved edits in the grid are not included.
      </Typography>
      {!maskBands && (
        <Alert severity="info" sx={{ mb: 1 }}>
          The design has no spec mask: the optimisations need one.
        </Alert>
      )}
      <Tabs
        value={tab}
        onChange={(_e, value: OptimisationKind) => setTab(value)}
        aria-label="Optimisations"
        sx={{ mb: 2 }}
      >
        {TABS.map((t) => (
          <Tab key={t.kind} value={t.kind} label={t.label} id={`optimise-tab-${t.kind}`} />
        ))}
      </Tabs>
      <Box role="tabpanel" aria-labelledby={`optimise-tab-${current.kind}`} sx={{ display: 'grid', gap: 2 }}>
        <Typography variant="body2">{current.about}</Typography>
        {version.isPending && <LoadingBlock label="Loading the version" />}
        {version.isError && <ErrorAlert error={version.error} title="The version could not be loaded" />}
        {context && (
          <OptimiseTab
            key={current.kind}
            kind={current.kind}
            name={current.label}
            designId={designId}
            versionNumber={versionNumber}
            run={runOf(current.kind)}
            onRun={(run) => setRuns((r) => ({ ...r, [current.kind]: run }))}
            pollMs={pollMs}
            form={(pending, submit) =>
              current.kind === 'fit' ? (
                <FitForm
                  pending={pending}
                  onRun={(body) => submit({ kind: 'fit', designId, versionNumber, body })}
                />
              ) : current.kind === 'grow' ? (
                <GrowForm
                  materials={library.filter(
                    (m) =>
                      m.id !== context.version.incidentMaterialId &&
                      m.id !== context.version.substrateMaterialId,
                  )}
                  initialMaterialIds={[...new Set(context.version.layers.map((l) => l.materialId))]}
                  layerCount={context.version.layers.length}
                  pending={pending}
                  onRun={(body) => submit({ kind: 'grow', designId, versionNumber, body })}
                />
              ) : (
                <YieldForm
                  pending={pending}
                  onRun={(body) => submit({ kind: 'yield', designId, versionNumber, body })}
                />
              )
            }
            context={context}
            storeVersion={storeVersion}
            onAccepted={onVersionChange}
          />
        )}
      </Box>
    </Paper>
  );
}

interface OptimiseTabProps {
  kind: OptimisationKind;
  name: string;
  designId: number;
  versionNumber: number;
  run: Run | null;
  onRun: (run: Run) => void;
  pollMs: number;
  form: (pending: boolean, submit: (input: OptimisationInput) => void) => ReactNode;
  context: VersionContext;
  storeVersion: (view: DesignVersionView) => Promise<void>;
  onAccepted: (versionNumber: number) => void;
}

/** One optimisation: its form, the refusal of the API if any, the run's status and its result. */
function OptimiseTab({
  kind,
  name,
  run,
  onRun,
  pollMs,
  form,
  context,
  storeVersion,
  onAccepted,
}: OptimiseTabProps) {
  const submit = useSubmitOptimisation();
  const calculation = useCalculation(run?.id ?? null, pollMs);
  const calc = calculation.data;
  const fit = calc?.status === 'completed' ? fitResultOf(calc) : null;
  const grow = calc?.status === 'completed' ? growResultOf(calc) : null;
  const forecast = calc?.status === 'completed' ? yieldForecastOf(calc) : null;

  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      {form(submit.isPending, (input) =>
        submit.mutate(input, { onSuccess: (answer) => onRun({ id: answer.id, reused: answer.reused }) }),
      )}
      {submit.error && <ErrorAlert error={submit.error} title={`${name} was not queued`} />}
      {calculation.isError && (
        <ErrorAlert error={calculation.error} title="The calculation could not be read" />
      )}
      {calc && (
        <RunStatus
          name={name}
          calculation={calc}
          meritAxis={kind === 'fit' ? 'Iteration' : kind === 'grow' ? 'Layer count' : null}
          reused={run?.reused ?? false}
        />
      )}
      {calc && fit && (
        <FitResultView
          key={calc.id}
          calculationId={calc.id}
          result={fit}
          context={context}
          storeVersion={storeVersion}
          onAccepted={onAccepted}
        />
      )}
      {calc && grow && (
        <GrowResultView
          key={calc.id}
          calculationId={calc.id}
          result={grow}
          context={context}
          storeVersion={storeVersion}
          onAccepted={onAccepted}
        />
      )}
      {forecast && <YieldResultView forecast={forecast} maskBands={context.maskBands} />}
    </Box>
  );
}
