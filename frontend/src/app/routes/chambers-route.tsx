import AddOutlined from '@mui/icons-material/AddOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { ErrorAlert } from '../../components/error-alert';
import { LoadingBlock } from '../../components/loading-block';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { CalibrationPanel } from '../../features/calibration/components/calibration-panel';
import { useChambers, type ChamberView } from '../../features/chambers/api/get-chambers';
import { ChamberFormDialog } from '../../features/chambers/components/chamber-form-dialog';
import { ChambersList } from '../../features/chambers/components/chambers-list';
import { ProcessSettingsDialog } from '../../features/chambers/components/process-settings-dialog';
import { useMaterials } from '../../features/materials/api/get-materials';
import { isDesigner } from '../../lib/roles';

export function ChambersRoute() {
  const user = useSignedInUser();
  const canEdit = isDesigner(user.role);
  const chambers = useChambers();
  const materials = useMaterials();
  // undefined: no dialog; null: a new chamber.
  const [editing, setEditing] = useState<ChamberView | null | undefined>(undefined);
  const [processOf, setProcessOf] = useState<ChamberView | null>(null);

  return (
    <>
      <PageHeader
        title="Chambers"
        description="Coating chambers: tooling factor and default rate per material, and the optical monitor."
        actions={
          canEdit && (
            <Button
              variant="contained"
              startIcon={<AddOutlined />}
              disabled={!materials.data}
              onClick={() => setEditing(null)}
            >
              New chamber
            </Button>
          )
        }
      />
      {!canEdit && (
        <Alert severity="info" sx={{ mb: 2 }}>
          You can read the chamber settings; engineers and administrators change them.
        </Alert>
      )}
      {(chambers.isPending || materials.isPending) && <LoadingBlock label="Loading the chambers" />}
      {chambers.isError && <ErrorAlert error={chambers.error} title="The chambers could not be loaded" />}
      {materials.isError && <ErrorAlert error={materials.error} title="The materials could not be loaded" />}
      {chambers.data && materials.data && (
        <ChambersList
          chambers={chambers.data}
          materials={materials.data}
          onEdit={canEdit ? (c) => setEditing(c) : undefined}
          onProcessSettings={(c) => setProcessOf(c)}
        />
      )}
      {chambers.data && chambers.data.length > 0 && (
        <CalibrationPanel chambers={chambers.data} canDecide={canEdit} />
      )}
      {editing !== undefined && materials.data && (
        <ChamberFormDialog
          open
          key={editing?.id ?? 'new'}
          chamber={editing}
          materials={materials.data}
          onClose={() => setEditing(undefined)}
        />
      )}
      {processOf && materials.data && (
        <ProcessSettingsDialog
          key={processOf.id}
          chamber={processOf}
          materials={materials.data}
          readOnly={!canEdit}
          onClose={() => setProcessOf(null)}
        />
      )}
    </>
  );
}
