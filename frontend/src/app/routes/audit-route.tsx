import { PageHeader } from '../../components/page-header';
import { AuditGrid } from '../../features/audit/components/audit-grid';
import { useDesigns } from '../../features/designs/api/get-designs';
import { useUsers } from '../../features/users/api/get-users';
import { useSearchParams } from 'react-router-dom';
import type { AuditFilter } from '../../features/audit/api/get-audit';

/** A whole number > 0 from the address, or undefined. */
function idParam(value: string | null): number | undefined {
  const n = Number(value);
  return value !== null && Number.isInteger(n) && n > 0 ? n : undefined;
}

export function AuditRoute() {
  const [search, setSearch] = useSearchParams();
  const designs = useDesigns();
  const users = useUsers();
  const filter: AuditFilter = {
    designId: idParam(search.get('designId')),
    actorId: idParam(search.get('actorId')),
  };
  return (
    <>
      <PageHeader
        title="Audit trail"
        description="Every step of every design version's lifecycle — submitted, approved, returned, released, retired — with who took it, when and why."
      />
      <AuditGrid
        filter={filter}
        onFilterChange={(next) => {
          const params = new URLSearchParams();
          if (next.designId !== undefined) params.set('designId', String(next.designId));
          if (next.actorId !== undefined) params.set('actorId', String(next.actorId));
          setSearch(params);
        }}
        designs={designs.data ?? []}
        people={users.data ?? []}
      />
    </>
  );
}
