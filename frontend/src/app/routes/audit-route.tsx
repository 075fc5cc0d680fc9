import { AUDIT_ENTITIES, type AuditEntity } from '@quietglass/shared';
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { AuditGrid } from '../../features/audit/components/audit-grid';
import { auditQuery, type AuditFilter } from '../../features/audit/api/get-audit';
import { useDesigns } from '../../features/designs/api/get-designs';
import { useUsers } from '../../features/users/api/get-users';

/** A whole number > 0 from the address, or undefined. */
function idParam(value: string | null): number | undefined {
  const n = Number(value);
  return value !== null && Number.isInteger(n) && n > 0 ? n : undefined;
}

/** A YYYY-MM-DD date from the address, or undefined. */
function dateParam(value: string | null): string | undefined {
  return value !== null && /^\d{4}-\d{2}-\d{2}$/.test(value) ? value : undefined;
}

function entityParam(value: string | null): AuditEntity | undefined {
  return (AUDIT_ENTITIES as readonly string[]).includes(value ?? '') ? (value as AuditEntity) : undefined;
}

export function AuditRoute() {
  const [search, setSearch] = useSearchParams();
  const designs = useDesigns();
  const users = useUsers();
  // ?designId= (links from a design) is the same as ?entity=design&entityId=.
  const designId = idParam(search.get('designId'));
  const filter: AuditFilter = {
    entity: designId !== undefined ? 'design' : entityParam(search.get('entity')),
    entityId: designId ?? idParam(search.get('entityId')),
    actorId: idParam(search.get('actorId')),
    from: dateParam(search.get('from')),
    to: dateParam(search.get('to')),
  };
  return (
    <>
      <PageHeader
        title="Audit trail"
        description="Every recorded change — users, materials, spec masks, customers, stack designs and their versions, quotes, chamber runs and chambers — with who made it and when. Filter by record, person and date; export what you see as CSV."
      />
      <AuditGrid
        filter={filter}
        onFilterChange={(next) => setSearch(new URLSearchParams(auditQuery(next)))}
        designs={designs.data ?? []}
        people={users.data ?? []}
      />
    </>
  );
}
