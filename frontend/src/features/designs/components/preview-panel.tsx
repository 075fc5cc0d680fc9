import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import MenuItem from '@mui/material/MenuItem';
import Paper from '@mui/material/Paper';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import {
  COLOUR_END_NM,
  COLOUR_START_NM,
  type DesignVersionContent,
  type LimitBand,
  type NamedModel,
  plotRangeForMask,
  type Polarisation,
} from '@quietglass/shared';
import { useMemo, useState } from 'react';
import { Plot, type PlotData, type PlotLayout } from '../../../components/plot';
import { parseNumberInput, parseNumberList } from '../../../lib/format';
import { rememberedKey, useRemembered } from '../../../lib/remembered';
import { swatchHex } from '../../../lib/srgb';
import type { PreviewResult } from '../../../lib/preview/compute-preview';
import { usePreviewComputer } from '../../../lib/preview/preview-context';
import {
  DEFAULT_PREVIEW_OPTIONS,
  previewRequestFor,
  type PreviewOptions,
} from '../../../lib/preview/preview-request';
import { usePreview } from '../preview/use-preview';
import { MaskBadge } from './mask-badge';
import { maskShapes } from '../../../components/mask-plot-layout';

const POLARISATION_LABELS: Record<Polarisation, string> = { s: 's', p: 'p', avg: 'Average' };
const MAX_PREVIEW_ANGLES = 6;

interface OptionFields {
  fromNm: string;
  toNm: string;
  angles: string;
  polarisation: Polarisation;
}

function checkedOptions(fields: OptionFields): { options: PreviewOptions | null; problem: string | null } {
  const fromNm = parseNumberInput(fields.fromNm);
  const toNm = parseNumberInput(fields.toNm);
  const angles = parseNumberList(fields.angles);
  if (fromNm === null || !(fromNm > 0)) return { options: null, problem: 'From must be a wavelength > 0 nm' };
  if (toNm === null || !(toNm > fromNm))
    return { options: null, problem: 'To must be a wavelength above From' };
  if (!angles || angles.length === 0 || angles.some((a) => !(a >= 0 && a < 90)))
    return { options: null, problem: 'Angles must be a comma list of degrees from 0 to below 90' };
  if (angles.length > MAX_PREVIEW_ANGLES)
    return { options: null, problem: `At most ${MAX_PREVIEW_ANGLES} angles` };
  return {
    options: {
      ...DEFAULT_PREVIEW_OPTIONS,
      fromNm,
      toNm,
      anglesDeg: angles,
      polarisation: fields.polarisation,
    },
    problem: null,
  };
}

/** Traces and layout of the preview plot: R (and T on the right axis) with the mask's forbidden regions. */
export function previewFigure(
  result: PreviewResult,
  maskBands: readonly LimitBand[] | null,
  polarisation: Polarisation,
  showT: boolean,
): { data: PlotData[]; layout: PlotLayout } {
  const bands = maskBands ?? [];
  const withT = showT || bands.some((b) => b.quantity === 'T');
  let maxR = 0;
  for (const curve of result.curves) for (const r of curve.R) maxR = Math.max(maxR, 100 * r);
  const maxBoundR = Math.max(
    0,
    ...bands
      .filter((b) => b.quantity === 'R')
      .map((b) => b.max_percent ?? b.min_percent ?? b.target_percent ?? 0),
  );
  const topR = Math.min(100, Math.max(1, maxR * 1.1, maxBoundR * 2));
  const data: PlotData[] = [];
  for (const curve of result.curves) {
    data.push({
      type: 'scatter',
      mode: 'lines',
      name: `R ${curve.angleDeg}° ${polarisation}`,
      x: result.wavelengthsNm,
      y: curve.R.map((v) => 100 * v),
    });
    if (withT)
      data.push({
        type: 'scatter',
        mode: 'lines',
        name: `T ${curve.angleDeg}° ${polarisation}`,
        x: result.wavelengthsNm,
        y: curve.T.map((v) => 100 * v),
        yaxis: 'y2',
        line: { dash: 'dot' },
      });
  }
  const layout: PlotLayout = {
    xaxis: { title: { text: 'Wavelength (nm)' } },
    yaxis: { title: { text: 'R (%)' }, range: [0, topR] },
    shapes: maskShapes(bands, { topR, topT: 100, tAxis: 'y2' }),
  };
  if (withT) layout.yaxis2 = { title: { text: 'T (%)' }, overlaying: 'y', side: 'right', range: [0, 100] };
  return { data, layout };
}

/** Materials of the stack whose valid range does not cover the plotted range and the colour range. */
function materialsOutOfRange(
  content: DesignVersionContent,
  materials: ReadonlyMap<number, NamedModel>,
  options: PreviewOptions,
): string[] {
  const from = Math.min(options.fromNm, COLOUR_START_NM);
  const to = Math.max(options.toNm, COLOUR_END_NM);
  const ids = new Set([
    content.incidentMaterialId,
    content.substrateMaterialId,
    ...content.layers.map((l) => l.materialId),
  ]);
  return [...ids].flatMap((id) => {
    const material = materials.get(id);
    const range = material?.rangeNm;
    return material && range && (from < range.from || to > range.to)
      ? [`${material.name} (valid ${range.from}–${range.to} nm)`]
      : [];
  });
}

interface PreviewPanelProps {
  /** The design: the range the engineer sets is remembered for it. */
  designId: number;
  /** The content to preview; null while the grid or header has a problem (`waitingReason`). */
  content: DesignVersionContent | null;
  waitingReason: string | null;
  materials: ReadonlyMap<number, NamedModel>;
  maskBands: LimitBand[] | null;
  maskName: string | null;
}

/** The instant preview: R (and T) against wavelength as the grid changes, computed in a worker. */
/** The preview's fields for the range that covers the mask (plotRangeForMask). */
export function maskOptionFields(maskBands: readonly LimitBand[] | null): OptionFields {
  const range = plotRangeForMask(maskBands);
  return {
    fromNm: String(range.fromNm),
    toNm: String(range.toNm),
    angles: range.anglesDeg.join(', '),
    polarisation: maskBands?.[0]?.polarisation ?? 'avg',
  };
}

export function PreviewPanel({
  designId,
  content,
  waitingReason,
  materials,
  maskBands,
  maskName,
}: PreviewPanelProps) {
  const computer = usePreviewComputer();
  // Until the engineer sets a range, the preview follows the mask's bands and angles.
  const [chosen, remember, forget] = useRemembered<OptionFields>(rememberedKey('preview-range', designId));
  const fields = useMemo(() => chosen ?? maskOptionFields(maskBands), [chosen, maskBands]);
  const setFields = (update: (f: OptionFields) => OptionFields) => remember(update(fields));
  const [showT, setShowT] = useState(false);
  const { options, problem } = useMemo(() => checkedOptions(fields), [fields]);
  const built = useMemo(
    () => (content && options ? previewRequestFor('live', content, materials, maskBands, options) : null),
    [content, materials, maskBands, options],
  );
  const request = built?.ok ? built.request : null;
  const outOfRange = useMemo(
    () => (content && options ? materialsOutOfRange(content, materials, options) : []),
    [content, materials, options],
  );
  const preview = usePreview(computer, request);
  const result = preview.result;
  const figure = useMemo(
    () => (result ? previewFigure(result, maskBands, fields.polarisation, showT) : null),
    [result, maskBands, fields.polarisation, showT],
  );
  const set = (key: keyof OptionFields) => (event: { target: { value: string } }) =>
    setFields((f) => ({ ...f, [key]: event.target.value }));

  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label="Instant preview">
      <Box sx={{ display: 'flex', alignItems: 'baseline', gap: 2, mb: 1, flexWrap: 'wrap' }}>
        <Typography variant="h2" component="h2">
          Instant preview
        </Typography>
        <Typography variant="caption" color="text.secondary" aria-live="polite">
          {preview.pending ? 'Updating…' : result ? 'Up to date' : ''}
        </Typography>
      </Box>
      <Box sx={{ display: 'flex', gap: 1.5, flexWrap: 'wrap', mb: 1.5 }}>
        <TextField
          size="small"
          label="From (nm)"
          value={fields.fromNm}
          onChange={set('fromNm')}
          sx={{ width: 110 }}
        />
        <TextField
          size="small"
          label="To (nm)"
          value={fields.toNm}
          onChange={set('toNm')}
          sx={{ width: 110 }}
        />
        <TextField
          size="small"
          label="Angles (°)"
          value={fields.angles}
          onChange={set('angles')}
          sx={{ width: 130 }}
          placeholder="0, 15, 30"
        />
        <TextField
          size="small"
          select
          label="Polarisation"
          value={fields.polarisation}
          onChange={set('polarisation')}
          sx={{ width: 130 }}
        >
          {(Object.keys(POLARISATION_LABELS) as Polarisation[]).map((p) => (
            <MenuItem key={p} value={p}>
              {POLARISATION_LABELS[p]}
            </MenuItem>
          ))}
        </TextField>
        <FormControlLabel
          control={<Checkbox checked={showT} onChange={(e) => setShowT(e.target.checked)} />}
          label="Show T"
        />
        {chosen && (
          <Button size="small" onClick={forget} sx={{ alignSelf: 'center' }}>
            Range of the mask
          </Button>
        )}
      </Box>
      {problem && (
        <Alert severity="warning" sx={{ mb: 1 }}>
          {problem}
        </Alert>
      )}
      {waitingReason && (
        <Alert severity="info" sx={{ mb: 1 }}>
          The preview shows the last valid stack until this is fixed: {waitingReason}
        </Alert>
      )}
      {built && !built.ok && (
        <Alert severity="error" sx={{ mb: 1 }}>
          {built.error}
        </Alert>
      )}
      {outOfRange.length > 0 && (
        <Alert severity="warning" sx={{ mb: 1 }}>
          The preview and its colour (380–780 nm) reach beyond the data of {outOfRange.join('; ')}; the models
          are extrapolated there.
        </Alert>
      )}
      {preview.error && (
        <Alert severity="error" sx={{ mb: 1 }}>
          The preview could not be computed: {preview.error}
        </Alert>
      )}
      <MaskBadge result={result?.mask ?? null} maskName={maskName} error={result?.maskError ?? null} />
      {result?.colour && (
        <Box
          role="group"
          aria-label="Reflected colour"
          sx={{ display: 'flex', alignItems: 'center', gap: 1, mt: 1 }}
        >
          <Box
            aria-hidden
            title={`Hue of the reflected light (brightened): ${swatchHex(result.colour)}`}
            sx={{
              width: 28,
              height: 28,
              borderRadius: 1,
              border: 1,
              borderColor: 'divider',
              bgcolor: swatchHex(result.colour),
            }}
          />
          <Typography variant="body2">
            Rv {(100 * result.colour.Rv).toFixed(2)} % · L* {result.colour.L.toFixed(1)} a*{' '}
            {result.colour.a.toFixed(1)} b* {result.colour.b.toFixed(1)} (reflected, {result.colour.angleDeg}
            °, D65)
          </Typography>
        </Box>
      )}
      {result?.colourError && (
        <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
          No colour: {result.colourError}
        </Typography>
      )}
      {figure && <Plot title="Preview spectrum" data={figure.data} layout={figure.layout} height={360} />}
    </Paper>
  );
}
