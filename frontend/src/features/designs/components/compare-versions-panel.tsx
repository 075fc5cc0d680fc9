import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormGroup from '@mui/material/FormGroup';
import MenuItem from '@mui/material/MenuItem';
import Paper from '@mui/material/Paper';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import {
  elementAt,
  plotRangeForMask,
  type DesignVersionContent,
  type LimitBand,
  type NamedModel,
  type Polarisation,
} from '@quietglass/shared';
import { useQueries, useQuery } from '@tanstack/react-query';
import { useEffect, useMemo, useState } from 'react';
import { Plot, type PlotData } from '../../../components/plot';
import { parseNumberInput } from '../../../lib/format';
import { rememberedKey, useRemembered } from '../../../lib/remembered';
import { getDesignVersionQueryOptions } from '../api/get-design-version';
import { getDesignsQueryOptions } from '../api/get-designs';
import type { LibraryMaterial } from '../layers';
import type { PreviewRequest, PreviewResult } from '../../../lib/preview/compute-preview';
import { usePreviewComputer } from '../../../lib/preview/preview-context';
import { DEFAULT_PREVIEW_OPTIONS, previewRequestFor } from '../../../lib/preview/preview-request';
import { PREVIEW_DEBOUNCE_MS } from '../preview/use-preview';
import { maskPlotLayout } from '../../../components/mask-plot-layout';

/** Most curves on the compare plot. */
export const MAX_COMPARED = 4;
const CURRENT = 'current';

interface CompareVersionsPanelProps {
  designId: number;
  versions: readonly { number: number; status: string }[];
  /** The version open in the workspace, with its unsaved content (null while invalid). */
  current: { number: number; content: DesignVersionContent | null };
  library: readonly LibraryMaterial[];
  maskBands: LimitBand[] | null;
}

/** A saved version that can be compared: of this design or (latest version) of another one. */
interface Comparable {
  key: string;
  label: string;
  designId: number;
  number: number;
}

interface Compared {
  key: string;
  label: string;
  request: PreviewRequest | null;
  error: string | null;
}

/** Compare's own wavelength range and angle, as typed. */
interface CompareRange {
  fromNm: string;
  toNm: string;
  angle: string;
}

/** The mask's range (plotRangeForMask) at its first angle. */
function maskCompareRange(maskBands: readonly LimitBand[] | null): CompareRange {
  const range = plotRangeForMask(maskBands);
  return { fromNm: String(range.fromNm), toNm: String(range.toNm), angle: String(range.anglesDeg[0] ?? 0) };
}

/** Only what the panel reads of each query, so the combined list keeps its identity between renders. */
function dataAndErrors<T>(results: { data?: T; error: Error | null }[]) {
  return results.map(({ data, error }) => ({ data, error }));
}

function modelsOf(
  snapshot: Record<string, { name: string; model: NamedModel['model'] }> | null,
  library: readonly LibraryMaterial[],
): Map<number, NamedModel> {
  if (snapshot) return new Map(Object.entries(snapshot).map(([id, m]) => [Number(id), m]));
  return new Map(library.map((m) => [m.id, { name: m.name, model: m.model }]));
}

/**
 * Up to four spectra on one plot — the unsaved grid, versions of this design, the latest version
 * of other designs — each computed in the preview worker.
 */
export function CompareVersionsPanel({
  designId,
  versions,
  current,
  library,
  maskBands,
}: CompareVersionsPanelProps) {
  const computer = usePreviewComputer();
  const [checked, setChecked] = useState<string[]>([]);
  const [others, setOthers] = useState<Comparable[]>([]);
  const [choosingDesign, setChoosingDesign] = useState(false);
  // Compare keeps its own range and angle, remembered per design; until set, the mask's range.
  const [chosenRange, rememberRange, forgetRange] = useRemembered<CompareRange>(
    rememberedKey('compare-range', designId),
  );
  const range = useMemo(() => chosenRange ?? maskCompareRange(maskBands), [chosenRange, maskBands]);
  const setRange = (key: keyof CompareRange) => (event: { target: { value: string } }) =>
    rememberRange({ ...range, [key]: event.target.value });
  const angleText = range.angle;
  const [polarisation, setPolarisation] = useState<Polarisation>(maskBands?.[0]?.polarisation ?? 'avg');
  const [results, setResults] = useState<Record<string, PreviewResult | string>>({});
  const angle = parseNumberInput(angleText);
  const angleOk = angle !== null && angle >= 0 && angle < 90;
  const fromNm = parseNumberInput(range.fromNm);
  const toNm = parseNumberInput(range.toNm);
  const fromOk = fromNm !== null && fromNm > 0;
  const toOk = toNm !== null && fromNm !== null && toNm > fromNm;
  // The list of designs is fetched only when another design is to be added.
  const designs = useQuery({ ...getDesignsQueryOptions(), enabled: choosingDesign });

  const comparables = useMemo<Comparable[]>(
    () => [
      ...versions.map((v) => ({
        key: `${designId}:${v.number}`,
        label: `Version ${v.number} (${v.status})`,
        designId,
        number: v.number,
      })),
      ...others,
    ],
    [versions, designId, others],
  );
  const saved = useMemo(
    () => checked.flatMap((key) => comparables.filter((c) => c.key === key)),
    [checked, comparables],
  );
  const loaded = useQueries({
    queries: saved.map((c) => getDesignVersionQueryOptions(c.designId, c.number)),
    combine: dataAndErrors,
  });

  const compared = useMemo<Compared[]>(() => {
    if (!angleOk || !fromOk || !toOk) return [];
    const options = { ...DEFAULT_PREVIEW_OPTIONS, fromNm, toNm, anglesDeg: [angle], polarisation };
    const build = (
      key: string,
      label: string,
      content: DesignVersionContent,
      models: Map<number, NamedModel>,
    ) => {
      const built = previewRequestFor(`compare-${key}`, content, models, null, options);
      return { key, label, request: built.ok ? built.request : null, error: built.ok ? null : built.error };
    };
    const items: Compared[] = [];
    if (checked.includes(CURRENT)) {
      items.push(
        current.content
          ? build(CURRENT, 'Current grid', current.content, modelsOf(null, library))
          : { key: CURRENT, label: 'Current grid', request: null, error: 'the grid has a problem' },
      );
    }
    saved.forEach((c, i) => {
      const query = loaded[i];
      if (!query?.data) {
        items.push({
          key: c.key,
          label: c.label,
          request: null,
          error: query?.error ? query.error.message : null,
        });
        return;
      }
      items.push(build(c.key, c.label, query.data, modelsOf(query.data.materialsSnapshot, library)));
    });
    return items;
  }, [
    checked,
    current.content,
    library,
    angle,
    angleOk,
    fromNm,
    fromOk,
    toNm,
    toOk,
    polarisation,
    loaded,
    saved,
  ]);

  useEffect(() => {
    let live = true;
    const timer = setTimeout(() => {
      for (const item of compared) {
        if (!item.request) continue;
        computer.compute(item.request).then(
          (result) => live && setResults((r) => ({ ...r, [item.key]: result })),
          (error: unknown) => live && setResults((r) => ({ ...r, [item.key]: String(error) })),
        );
      }
    }, PREVIEW_DEBOUNCE_MS);
    return () => {
      live = false;
      clearTimeout(timer);
    };
  }, [compared, computer]);

  const toggle = (key: string) =>
    setChecked((list) => (list.includes(key) ? list.filter((k) => k !== key) : [...list, key]));
  const entries = [
    { key: CURRENT, label: `Current grid (version ${current.number}, with unsaved edits)` },
    ...comparables.map((c) => ({ key: c.key, label: c.label })),
  ];
  const full = checked.length >= MAX_COMPARED;

  const addDesign = (id: number) => {
    const design = designs.data?.find((d) => d.id === id);
    if (!design) return;
    const key = `${design.id}:${design.latestVersion.number}`;
    if (!comparables.some((c) => c.key === key)) {
      setOthers((list) => [
        ...list,
        {
          key,
          label: `${design.name}, version ${design.latestVersion.number}`,
          designId: design.id,
          number: design.latestVersion.number,
        },
      ]);
    }
    if (!full) setChecked((list) => (list.includes(key) ? list : [...list, key]));
    setChoosingDesign(false);
  };

  let top = 1;
  const data: PlotData[] = compared.flatMap((item) => {
    const result = results[item.key];
    if (!result || typeof result === 'string') return [];
    const percent = elementAt(result.curves, 0, 'the compared curves').R.map((v) => 100 * v);
    for (const v of percent) top = Math.max(top, v * 1.1);
    return [{ type: 'scatter', mode: 'lines', name: item.label, x: result.wavelengthsNm, y: percent }];
  });
  const problems = compared.flatMap((item) => {
    const result = results[item.key];
    const error = item.error ?? (typeof result === 'string' ? result : null);
    return error ? [`${item.label}: ${error}`] : [];
  });

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Compare versions">
      <Typography variant="h2" component="h2" sx={{ mb: 1 }}>
        Compare
      </Typography>
      <Box sx={{ display: 'flex', gap: 3, flexWrap: 'wrap', alignItems: 'flex-start' }}>
        <FormGroup role="group" aria-label="Versions to compare">
          {entries.map((entry) => (
            <FormControlLabel
              key={entry.key}
              label={entry.label}
              control={
                <Checkbox
                  size="small"
                  checked={checked.includes(entry.key)}
                  disabled={!checked.includes(entry.key) && full}
                  onChange={() => toggle(entry.key)}
                />
              }
            />
          ))}
          <Typography variant="caption" color="text.secondary">
            Up to {MAX_COMPARED} at once.
          </Typography>
          {choosingDesign ? (
            <TextField
              select
              size="small"
              label="Another design"
              value=""
              onChange={(e) => addDesign(Number(e.target.value))}
              disabled={!designs.data}
              helperText={designs.isError ? designs.error.message : 'Its latest version is added'}
              sx={{ mt: 1, minWidth: 260 }}
            >
              {(designs.data ?? [])
                .filter((d) => d.id !== designId)
                .map((d) => (
                  <MenuItem key={d.id} value={String(d.id)}>
                    {d.name} ({d.customer.name})
                  </MenuItem>
                ))}
            </TextField>
          ) : (
            <Button
              size="small"
              sx={{ alignSelf: 'flex-start', mt: 1 }}
              onClick={() => setChoosingDesign(true)}
            >
              Compare with another design…
            </Button>
          )}
        </FormGroup>
        <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap' }}>
          <TextField
            size="small"
            label="From (nm)"
            value={range.fromNm}
            onChange={setRange('fromNm')}
            error={!fromOk}
            helperText={fromOk ? ' ' : 'A wavelength > 0 nm'}
            sx={{ width: 110 }}
          />
          <TextField
            size="small"
            label="To (nm)"
            value={range.toNm}
            onChange={setRange('toNm')}
            error={!toOk}
            helperText={toOk ? ' ' : 'Above From'}
            sx={{ width: 110 }}
          />
          <TextField
            size="small"
            label="Angle (°)"
            value={angleText}
            onChange={setRange('angle')}
            error={!angleOk}
            helperText={angleOk ? ' ' : 'From 0 to below 90'}
            sx={{ width: 110 }}
          />
          <TextField
            size="small"
            select
            label="Polarisation"
            value={polarisation}
            onChange={(e) => setPolarisation(e.target.value as Polarisation)}
            sx={{ width: 130 }}
          >
            <MenuItem value="s">s</MenuItem>
            <MenuItem value="p">p</MenuItem>
            <MenuItem value="avg">Average</MenuItem>
          </TextField>
          {chosenRange && (
            <Button size="small" onClick={forgetRange} sx={{ alignSelf: 'flex-start', mt: 0.5 }}>
              Range of the mask
            </Button>
          )}
        </Box>
      </Box>
      {problems.length > 0 && (
        <Alert severity="warning" sx={{ mt: 1 }}>
          {problems.join('; ')}
        </Alert>
      )}
      {data.length > 0 && (
        <Plot
          title="Compared spectra"
          data={data}
          layout={maskPlotLayout(maskBands ?? [], 'R', Math.min(100, top))}
        />
      )}
    </Paper>
  );
}
