import { useMemo } from 'react';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { ComputeQueueGrid } from '../../features/calculations/components/compute-queue-grid';
import { useDesigns } from '../../features/designs/api/get-designs';
import { isDesigner } from '../../lib/roles';

export function ComputeQueueRoute() {
  const user = useSignedInUser();
  const designs = useDesigns();
  const names = useMemo(() => new Map((designs.data ?? []).map((d) => [d.id, d.name])), [designs.data]);
  return (
    <>
      <PageHeader
        title="Compute queue"
        description="Full analyses waiting, running and done, newest first. The list refreshes while anything runs."
      />
      <ComputeQueueGrid designNames={names} canCancel={isDesigner(user.role)} />
    </>
  );
}
