import { BadRequestException, Controller, Get, Header, Query } from '@nestjs/common';
import type { AuditEventView, AuditFilter } from '@quietglass/shared/audit';
import { Roles } from '../auth/roles.decorator.js';
import { toAuditEventView } from './audit-event.entity.js';
import { AuditService } from './audit.service.js';
import { AuditQueryDto } from './dto/audit-query.dto.js';

/** The audit trail for admins: filter by record, person and date; export as CSV. */
@Controller('audit')
@Roles('admin')
export class AuditController {
  constructor(private readonly audit: AuditService) {}

  @Get()
  async list(@Query() query: AuditQueryDto): Promise<AuditEventView[]> {
    return (await this.audit.find(filter(query))).map(toAuditEventView);
  }

  @Get('export.csv')
  @Header('Content-Type', 'text/csv; charset=utf-8')
  @Header('Content-Disposition', 'attachment; filename="audit-trail.csv"')
  export(@Query() query: AuditQueryDto): Promise<string> {
    return this.audit.csv(filter(query));
  }
}

function filter(q: AuditQueryDto): AuditFilter {
  if (q.designId !== undefined && q.entity !== undefined && q.entity !== 'design') {
    throw new BadRequestException({ message: ['designId: use either designId or entity, not both'] });
  }
  if (q.from !== undefined && q.to !== undefined && q.from > q.to) {
    throw new BadRequestException({ message: [`from (${q.from}) must not be after to (${q.to})`] });
  }
  return {
    entity: q.designId !== undefined ? 'design' : q.entity,
    entityId: q.designId ?? q.entityId,
    actorId: q.actorId,
    from: q.from,
    to: q.to,
  };
}
