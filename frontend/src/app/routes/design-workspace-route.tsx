import { specMaskLabel } from '@quietglass/shared';
import Button from '@mui/material/Button';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useParams, useSearchParams, Link as RouterLink } from 'react-router-dom';
import { ErrorAlert } from '../../components/error-alert';
import { LoadingBlock } from '../../components/loading-block';
import { PageHeader } from '../../components/page-header';
import { ApprovalPanel } from '../../features/approvals/components/approval-panel';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { AnalysisPanel } from '../../features/calculations/components/analysis-panel';
import { useDesign } from '../../features/designs/api/get-design';
import { storeDesignVersion, useDesignVersion } from '../../features/designs/api/get-design-version';
import { DesignDetailsDialog } from '../../features/designs/components/design-details-dialog';
import { DesignWorkspace } from '../../features/designs/components/design-workspace';
import { useMaterials } from '../../features/materials/api/get-materials';
import { OptimisePanel } from '../../features/calculations/components/optimise-panel';
import { useSpecMask } from '../../features/spec-masks/api/get-spec-mask';
import { useSpecMasks } from '../../features/spec-masks/api/get-spec-masks';
import { isDesigner } from '../../lib/roles';
import { NotFoundRoute } from './not-found-route';

/** The version asked for in the address if the design has it, else its latest. */
function shownVersion(versions: readonly { number: number }[], asked: string | null): number {
  const number = Number(asked);
  return versions.some((v) => v.number === number) ? number : Math.max(...versions.map((v) => v.number));
}

export function DesignWorkspaceRoute() {
  const user = useSignedInUser();
  const canEdit = isDesigner(user.role);
  const params = useParams();
  const designId = Number(params.id);
  const valid = Number.isInteger(designId) && designId > 0;
  const design = useDesign(valid ? designId : 0);
  const materials = useMaterials();
  const mask = useSpecMask(design.data?.specMaskId ?? null);
  const [editingDetails, setEditingDetails] = useState(false);
  const queryClient = useQueryClient();
  const customerMasks = useSpecMasks(
    { customerId: design.data?.customer.id },
    { enabled: canEdit && editingDetails && design.data !== undefined },
  );
  const [search, setSearch] = useSearchParams();
  // The workspace reads the same query: the optimisations' start version costs no second request.
  const optimiseVersion = useDesignVersion(
    designId,
    canEdit && design.data ? shownVersion(design.data.versions, search.get('version')) : null,
  );

  if (!valid) return <NotFoundRoute />;
  if (design.isPending || materials.isPending) return <LoadingBlock label="Loading the design" />;
  if (design.isError) return <ErrorAlert error={design.error} title="The design could not be loaded" />;
  if (materials.isError)
    return <ErrorAlert error={materials.error} title="The materials could not be loaded" />;

  const versionNumber = shownVersion(design.data.versions, search.get('version'));
  // A compute-queue link names the tab and the calculation to open.
  const openCalculationId = Number(search.get('calculation')) || null;
  const maskName =
    design.data.specMaskId === null ? null : mask.data ? specMaskLabel(mask.data) : 'Spec mask';

  return (
    <>
      <PageHeader
        title={design.data.name}
        description={`${design.data.customer.name} · ${maskName ?? 'no spec mask'}`}
        actions={
          <>
            {canEdit && (
              <Button variant="outlined" onClick={() => setEditingDetails(true)}>
                Design details…
              </Button>
            )}
            <Button component={RouterLink} to="/designs" variant="text">
              All designs
            </Button>
          </>
        }
      />
      {canEdit && (
        <DesignDetailsDialog
          open={editingDetails}
          design={design.data}
          specMasks={customerMasks.data ?? []}
          onClose={() => setEditingDetails(false)}
        />
      )}
      {mask.isError && (
        <ErrorAlert error={mask.error} title="The spec mask could not be loaded" sx={{ mb: 2 }} />
      )}
      <DesignWorkspace
        design={design.data}
        versionNumber={versionNumber}
        onVersionChange={(number) => setSearch({ version: String(number) })}
        library={materials.data}
        maskBands={mask.data?.bands ?? null}
        maskName={maskName}
        canEdit={canEdit}
        initialTab={search.get('tab')}
        approval={(version, onTransitioned) => (
          <ApprovalPanel
            key={version.number}
            version={version}
            userId={user.id}
            canAct={canEdit}
            onTransitioned={onTransitioned}
          />
        )}
        panels={[
          {
            key: 'analysis',
            label: 'Full analysis',
            content: (
              <AnalysisPanel
                key={versionNumber}
                designId={design.data.id}
                versionNumber={versionNumber}
                canSubmit={canEdit}
                maskBands={mask.data?.bands ?? null}
                openCalculationId={search.get('tab') === 'analysis' ? openCalculationId : null}
              />
            ),
          },
          ...(canEdit
            ? [
                {
                  key: 'optimise',
                  label: 'Optimise',
                  content: (
                    <OptimisePanel
                      key={`optimise-${versionNumber}`}
                      designId={design.data.id}
                      versionNumber={versionNumber}
                      library={materials.data}
                      maskBands={mask.data?.bands ?? null}
                      version={optimiseVersion}
                      canRun={canEdit}
                      onVersionChange={(number) => setSearch({ version: String(number) })}
                      storeVersion={(view) => storeDesignVersion(queryClient, view)}
                      openCalculationId={search.get('tab') === 'optimise' ? openCalculationId : null}
                    />
                  ),
                },
              ]
            : []),
        ]}
      />
    </>
  );
}
