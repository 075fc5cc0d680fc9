import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useParams, useSearchParams, Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../components/error-alert';
import { LoadingBlock } from '../../components/loading-block';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { AnalysisPanel } from '../../features/calculations/components/analysis-panel';
import { useDesign } from '../../features/designs/api/get-design';
import { DesignWorkspace } from '../../features/designs/components/design-workspace';
import { useMaterials } from '../../features/materials/api/get-materials';
import { useSpecMask } from '../../features/spec-masks/api/get-spec-mask';
import { isDesigner } from '../../lib/roles';
import { NotFoundRoute } from './not-found-route';

export function DesignWorkspaceRoute() {
  const user = useSignedInUser();
  const canEdit = isDesigner(user.role);
  const params = useParams();
  const designId = Number(params.id);
  const valid = Number.isInteger(designId) && designId > 0;
  const [search, setSearch] = useSearchParams();
  const design = useDesign(valid ? designId : 0);
  const materials = useMaterials();
  const mask = useSpecMask(design.data?.specMaskId ?? null);

  if (!valid) return <NotFoundRoute />;
  if (design.isPending || materials.isPending) return <LoadingBlock label="Loading the design" />;
  if (design.isError) return <ErrorAlert error={design.error} title="The design could not be loaded" />;
  if (materials.isError)
    return <ErrorAlert error={materials.error} title="The materials could not be loaded" />;

  const latest = Math.max(...design.data.versions.map((v) => v.number));
  const asked = Number(search.get('version'));
  const versionNumber = design.data.versions.some((v) => v.number === asked) ? asked : latest;
  const maskName =
    design.data.specMaskId === null
      ? null
      : mask.data
        ? `${mask.data.name} rev ${mask.data.revision}`
        : 'Spec mask';

  return (
    <>
      <PageHeader
        title={design.data.name}
        description={`${design.data.customer.name} · ${maskName ?? 'no spec mask'}`}
        actions={
          <Button component={RouterLink} to="/designs" variant="text">
            All designs
          </Button>
        }
      />
      {mask.isError && (
        <ErrorAlert error={mask.error} title="The spec mask could not be loaded" sx={{ mb: 2 }} />
      )}
      <Box sx={{ display: 'grid', gap: 3 }}>
        <DesignWorkspace
          design={design.data}
          versionNumber={versionNumber}
          onVersionChange={(number) => setSearch({ version: String(number) })}
          library={materials.data}
          maskBands={mask.data?.bands ?? null}
          maskName={maskName}
          canEdit={canEdit}
        />
        <AnalysisPanel
          key={versionNumber}
          designId={design.data.id}
          versionNumber={versionNumber}
          canSubmit={canEdit}
        />
      </Box>
    </>
  );
}
