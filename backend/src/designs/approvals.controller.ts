import { Body, Controller, Get, Param, ParseIntPipe, Post } from '@nestjs/common';
import type { DesignVersionView, VersionEventView } from '@quietglass/shared/designs';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import type { User } from '../users/user.entity.js';
import { ApprovalsService, type Transition } from './approvals.service.js';
import {
  returnSchema,
  submitSchema,
  transitionSchema,
  type TransitionInput,
} from '@quietglass/shared/schemas/designs';
import { ZodBody } from '../common/zod-body.js';
import { toEventView } from './version-event.entity.js';

/** Submit, approve, return, release and retire versions; the design history. */
@Controller()
@Roles('admin', 'engineer')
export class ApprovalsController {
  constructor(private readonly approvals: ApprovalsService) {}

  @Post('designs/:id/versions/:number/submit')
  @ZodBody(submitSchema)
  submit(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) n: number,
    @Body() dto: TransitionInput,
    @CurrentUser() u: User,
  ) {
    return this.move(id, n, 'submit', u, dto);
  }

  @Post('designs/:id/versions/:number/approve')
  @ZodBody(transitionSchema)
  approve(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) n: number,
    @Body() dto: TransitionInput,
    @CurrentUser() u: User,
  ) {
    return this.move(id, n, 'approve', u, dto);
  }

  @Post('designs/:id/versions/:number/return')
  @ZodBody(returnSchema)
  giveBack(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) n: number,
    @Body() dto: TransitionInput,
    @CurrentUser() u: User,
  ) {
    return this.move(id, n, 'return', u, dto);
  }

  @Post('designs/:id/versions/:number/release')
  @ZodBody(transitionSchema)
  release(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) n: number,
    @Body() dto: TransitionInput,
    @CurrentUser() u: User,
  ) {
    return this.move(id, n, 'release', u, dto);
  }

  @Post('designs/:id/versions/:number/retire')
  @ZodBody(transitionSchema)
  retire(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) n: number,
    @Body() dto: TransitionInput,
    @CurrentUser() u: User,
  ) {
    return this.move(id, n, 'retire', u, dto);
  }

  @Get('designs/:id/history')
  @Roles('admin', 'engineer', 'sales')
  async history(@Param('id', ParseIntPipe) id: number): Promise<VersionEventView[]> {
    return (await this.approvals.history(id)).map(toEventView);
  }

  private move(
    id: number,
    n: number,
    action: Transition,
    user: User,
    dto: TransitionInput,
  ): Promise<DesignVersionView> {
    return this.approvals.transition(id, n, action, user, dto);
  }
}
