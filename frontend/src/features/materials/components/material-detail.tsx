import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { PROVENANCE_KIND_LABELS, evaluateIndex, type MaterialModel } from '@quietglass/shared';
import { useMemo } from 'react';
import { ErrorAlert } from '../../../components/error-alert';
import { Plot } from '../../../components/plot';
import { apiUrl } from '../../../lib/api-client';
import { formatDateTime, formatFileSize } from '../../../lib/format';
import { materialSourceFilePath, useRetireMaterial } from '../api/retire-material';
import type { MaterialView } from '../api/get-materials';
import { useMaterialRevisions } from '../api/get-material-revisions';
import { MODEL_KIND_LABELS, describeModel } from '../material-form';

const PLOT_POINTS = 301;

/** n and k of a model over a range (nm), or the engine's error message. */
export function indexCurve(
  model: MaterialModel,
  range: { from: number; to: number },
  points = PLOT_POINTS,
): { wavelengthsNm: Float64Array; n: Float64Array; k: Float64Array } | { error: string } {
  const wavelengthsNm = new Float64Array(points);
  for (let i = 0; i < points; i++)
    wavelengthsNm[i] = range.from + ((range.to - range.from) * i) / (points - 1);
  const out = { n: new Float64Array(points), k: new Float64Array(points) };
  try {
    evaluateIndex(out, model, wavelengthsNm);
    return { wavelengthsNm, ...out };
  } catch (error) {
    return { error: error instanceof Error ? error.message : String(error) };
  }
}

function kTop(k: Float64Array): number {
  let max = 0;
  for (const v of k) max = Math.max(max, v);
  return max > 0 ? max * 1.2 : 0.01;
}

interface MaterialDetailProps {
  material: MaterialView;
  canEdit: boolean;
  onEdit: () => void;
}

/** One material: its model, provenance and a plot of n and k over its valid range. */
export function MaterialDetail({ material, canEdit, onEdit }: MaterialDetailProps) {
  const curve = useMemo(() => indexCurve(material.model, material.rangeNm), [material]);
  const retire = useRetireMaterial();
  const { provenance } = material;
  const held = 'clamp' in material.model && material.model.clamp === true;
  return (
    <Paper variant="outlined" sx={{ p: 2 }} component="section" aria-label={`Material ${material.name}`}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, mb: 1, flexWrap: 'wrap' }}>
        <Typography variant="h2" component="h2" sx={{ flexGrow: 1 }}>
          {material.name}
        </Typography>
        <Chip size="small" label={MODEL_KIND_LABELS[material.model.model]} />
        <Chip
          size="small"
          variant="outlined"
          color={provenance.kind === 'typical' ? 'warning' : 'default'}
          label={PROVENANCE_KIND_LABELS[provenance.kind]}
        />
        {material.retiredAt && <Chip size="small" color="default" label="retired" />}
        {canEdit && (
          <Button variant="outlined" size="small" onClick={onEdit}>
            Edit
          </Button>
        )}
        {canEdit && (
          <Button
            variant="outlined"
            size="small"
            disabled={retire.isPending}
            onClick={() =>
              retire.mutate({ id: material.id, version: material.version, retire: !material.retiredAt })
            }
          >
            {material.retiredAt ? 'Restore' : 'Retire'}
          </Button>
        )}
      </Box>
      {retire.error && <ErrorAlert error={retire.error} title="Not changed" />}
      {material.retiredAt && (
        <Alert severity="info" sx={{ mb: 1 }}>
          Retired {formatDateTime(material.retiredAt)}: no longer offered in pickers; the versions that use it
          keep it.
        </Alert>
      )}
      <Typography variant="body2">{describeModel(material.model)}</Typography>
      <Typography variant="body2" color="text.secondary">
        Valid {material.rangeNm.from}–{material.rangeNm.to} nm (
        {held ? 'end values held outside, with a warning' : 'refused outside'}) · revision {material.revision}{' '}
        · version {material.version}, changed {formatDateTime(material.updatedAt)}
      </Typography>
      <Typography variant="body2" sx={{ whiteSpace: 'pre-line' }} aria-label="Provenance">
        {PROVENANCE_KIND_LABELS[provenance.kind]}
        {provenance.kind === 'measured'
          ? ` on ${provenance.date ?? '—'}, run ${provenance.run || '—'}`
          : provenance.date
            ? ` (${provenance.date})`
            : ''}
        {provenance.source ? `: ${provenance.source}` : ''}
      </Typography>
      {material.sourceFile && (
        <Typography variant="body2">
          Original file:{' '}
          <a href={apiUrl(materialSourceFilePath(material.id))} download={material.sourceFile.fileName}>
            {material.sourceFile.fileName}
          </a>{' '}
          ({formatFileSize(material.sourceFile.sizeBytes)})
        </Typography>
      )}
      {material.provenance.notes && (
        <Typography variant="body2" color="text.secondary" sx={{ whiteSpace: 'pre-line' }}>
          {material.provenance.notes}
        </Typography>
      )}
      {'error' in curve ? (
        <Alert severity="error" sx={{ mt: 1 }}>
          The index could not be evaluated: {curve.error}
        </Alert>
      ) : (
        <Plot
          title={`n and k of ${material.name}`}
          data={[
            { type: 'scatter', mode: 'lines', name: 'n', x: curve.wavelengthsNm, y: curve.n },
            { type: 'scatter', mode: 'lines', name: 'k', x: curve.wavelengthsNm, y: curve.k, yaxis: 'y2' },
          ]}
          layout={{
            xaxis: { title: { text: 'Wavelength (nm)' } },
            yaxis: { title: { text: 'n' } },
            // A lossless material's k is 0 everywhere: keep its axis small rather than symmetric about 0.
            yaxis2: { title: { text: 'k' }, overlaying: 'y', side: 'right', range: [0, kTop(curve.k)] },
          }}
          height={300}
          pngFileName={`material-${material.name}-nk`}
        />
      )}
      {material.revision > 1 && <EarlierRevisions material={material} />}
    </Paper>
  );
}

/** What versions frozen before an edit were built from: each earlier revision's model and range. */
function EarlierRevisions({ material }: { material: MaterialView }) {
  const revisions = useMaterialRevisions(material.id, material.revision);
  return (
    <Box component="section" aria-label="Earlier revisions" sx={{ mt: 2 }}>
      <Typography variant="h3" component="h3" gutterBottom>
        Earlier revisions
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
        Versions submitted before an edit keep the revision they were built with.
      </Typography>
      {revisions.isError && (
        <ErrorAlert error={revisions.error} title="Earlier revisions could not be loaded" />
      )}
      {revisions.data?.map((r) => (
        <Typography key={r.revision} variant="body2">
          Revision {r.revision}: {r.name} · {describeModel(r.model)} · valid {r.rangeNm.from}–{r.rangeNm.to}{' '}
          nm · replaced {formatDateTime(r.supersededAt)}
          {r.supersededBy ? ` by ${r.supersededBy}` : ''}
        </Typography>
      ))}
    </Box>
  );
}
