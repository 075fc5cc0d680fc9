import AddOutlined from '@mui/icons-material/AddOutlined';
import Button from '@mui/material/Button';
import { useQuery } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { getDesignQueryOptions } from '../../features/designs/api/get-design';
import { useDesigns } from '../../features/designs/api/get-designs';
import { NewReportDialog } from '../../features/reports/components/new-report-dialog';
import { ReportsGrid } from '../../features/reports/components/reports-grid';
import { useSpecMasks } from '../../features/spec-masks/api/get-spec-masks';
import { isDesigner } from '../../lib/roles';

export function ReportsRoute() {
  const user = useSignedInUser();
  const navigate = useNavigate();
  const designs = useDesigns();
  const masks = useSpecMasks();
  const [creating, setCreating] = useState(false);
  const [chosenDesignId, setChosenDesignId] = useState<number | null>(null);
  const chosenDesign = useQuery({
    ...getDesignQueryOptions(chosenDesignId ?? 0),
    enabled: chosenDesignId !== null,
  });
  const designName = useCallback(
    (id: number) => designs.data?.find((d) => d.id === id)?.name,
    [designs.data],
  );
  const maskName = useCallback(
    (id: number) => {
      const mask = masks.data?.find((m) => m.id === id);
      return mask && `${mask.name} rev ${mask.revision}`;
    },
    [masks.data],
  );

  return (
    <>
      <PageHeader
        title="Compliance reports"
        description="PDF reports for customers: an approved design version checked against their spec mask."
        actions={
          <Button
            variant="contained"
            startIcon={<AddOutlined />}
            disabled={!designs.data || !masks.data}
            onClick={() => setCreating(true)}
          >
            New compliance report
          </Button>
        }
      />
      <ReportsGrid designName={designName} maskName={maskName} />
      {creating && designs.data && masks.data && (
        <NewReportDialog
          open
          onClose={() => setCreating(false)}
          onCreated={(report) => void navigate(`/reports/${report.id}`)}
          designs={designs.data}
          masks={masks.data}
          versions={chosenDesign.data?.id === chosenDesignId ? chosenDesign.data?.versions : undefined}
          onDesignChange={setChosenDesignId}
          allowMeasured={isDesigner(user.role)}
        />
      )}
    </>
  );
}
