import {
  BadRequestException,
  ConflictException,
  ForbiddenException,
  Injectable,
  NotFoundException,
} from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import type { DesignVersionView, VersionStatus } from '@quietglass/shared/designs';
import type { User } from '../users/user.entity.js';
import { DesignVersion } from './design-version.entity.js';
import { DesignsService, staleVersion, toVersionView } from './designs.service.js';
import { VersionEvent } from './version-event.entity.js';

export const TRANSITIONS = ['submit', 'approve', 'return', 'release', 'retire'] as const;
export type Transition = (typeof TRANSITIONS)[number];

/** Where each action may start and where it leads. */
const RULES: Record<Transition, { from: readonly VersionStatus[]; to: VersionStatus }> = {
  submit: { from: ['draft', 'returned'], to: 'submitted' },
  approve: { from: ['submitted'], to: 'approved' },
  return: { from: ['submitted'], to: 'returned' },
  release: { from: ['approved'], to: 'released' },
  retire: { from: ['released'], to: 'retired' },
};

/**
 * The version lifecycle: draft → submitted → approved (or returned with a comment, then edited and
 * submitted again) → released as a recipe → retired. Approval and return follow the four-eyes rule:
 * never by the version's author or by whoever submitted it. Every step is written to the audit trail
 * in the same transaction as the status change.
 */
@Injectable()
export class ApprovalsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly designs: DesignsService,
  ) {}

  async transition(
    designId: number,
    number: number,
    action: Transition,
    actor: User,
    options: { rowVersion?: number; comment?: string },
  ): Promise<DesignVersionView> {
    const rule = RULES[action];
    const version = await this.designs.findVersion(designId, number);
    const comment = options.comment?.trim() ?? '';
    if (!rule.from.includes(version.status)) {
      throw new ConflictException(
        `Version ${number} is ${version.status}; it can be ${pastTense(action)} only when ${rule.from.join(' or ')}`,
      );
    }
    const patch: Partial<DesignVersion> = { status: rule.to };
    if (action === 'submit') {
      if (options.rowVersion === undefined)
        throw new BadRequestException({ message: ['rowVersion is required to submit'] });
      if (options.rowVersion !== version.rowVersion) throw staleVersion(version);
      if (version.layers.length === 0)
        throw new BadRequestException('A version without layers cannot be submitted');
      const materials = await this.designs.checkMaterials(version);
      patch.materialsSnapshot = Object.fromEntries([...materials].map(([k, v]) => [String(k), v]));
    }
    if (action === 'approve' || action === 'return') {
      const submitter = await this.lastActor(designId, number, 'submitted');
      if (version.createdBy.id === actor.id || submitter === actor.id) {
        throw new ForbiddenException(
          `Four-eyes rule: another engineer must ${action === 'approve' ? 'approve' : 'return'} version ${number}; you wrote or submitted it`,
        );
      }
    }
    if (action === 'return' && comment === '') {
      throw new BadRequestException({
        message: ['comment is required when returning a version: say what to change'],
      });
    }
    await this.db.transaction(async (tx) => {
      const result = await tx
        .createQueryBuilder()
        .update(DesignVersion)
        .set({ ...patch, rowVersion: () => 'row_version + 1' })
        .where('id = :id AND status = :status', { id: version.id, status: version.status })
        .execute();
      if (result.affected !== 1)
        throw new ConflictException(`Version ${number} changed meanwhile; reload it`);
      await tx.getRepository(VersionEvent).insert({
        designId,
        versionNumber: number,
        fromStatus: version.status,
        toStatus: rule.to,
        actor,
        comment,
      });
    });
    return toVersionView(await this.designs.findVersion(designId, number));
  }

  history(designId: number): Promise<VersionEvent[]> {
    return this.db.getRepository(VersionEvent).find({ where: { designId }, order: { at: 'ASC', id: 'ASC' } });
  }

  audit(filter: { designId?: number; actorId?: number }): Promise<VersionEvent[]> {
    return this.db.getRepository(VersionEvent).find({
      where: {
        ...(filter.designId !== undefined ? { designId: filter.designId } : {}),
        ...(filter.actorId !== undefined ? { actor: { id: filter.actorId } } : {}),
      },
      order: { at: 'DESC', id: 'DESC' },
      take: 500,
    });
  }

  /** Released versions, what operators may build, each with who released it (from the audit trail). */
  async releasedRecipes(): Promise<{ version: DesignVersion; releasedBy: string | null }[]> {
    const versions = await this.db.getRepository(DesignVersion).find({
      where: { status: 'released' },
      relations: { design: true },
      order: { updatedAt: 'DESC' },
    });
    if (versions.length === 0) return [];
    const events = await this.db.getRepository(VersionEvent).find({
      where: { designId: In(versions.map((v) => v.designId)), toStatus: 'released' },
      order: { at: 'ASC', id: 'ASC' },
    });
    // The latest release event of each version wins (ordered oldest first, so later ones overwrite).
    const releasedBy = new Map(events.map((e) => [`${e.designId}:${e.versionNumber}`, e.actor.displayName]));
    return versions.map((version) => ({
      version,
      releasedBy: releasedBy.get(`${version.designId}:${version.number}`) ?? null,
    }));
  }

  /** A released version, or 404 — drafts and other statuses do not exist as recipes. */
  async releasedRecipe(designId: number, number: number): Promise<DesignVersion> {
    const version = await this.db
      .getRepository(DesignVersion)
      .findOne({ where: { designId, number, status: 'released' }, relations: { design: true } });
    if (!version) throw new NotFoundException(`No released recipe for design ${designId} version ${number}`);
    return version;
  }

  private async lastActor(designId: number, number: number, to: VersionStatus): Promise<number | null> {
    const event = await this.db.getRepository(VersionEvent).findOne({
      where: { designId, versionNumber: number, toStatus: to },
      order: { at: 'DESC', id: 'DESC' },
    });
    return event?.actor.id ?? null;
  }
}

function pastTense(action: Transition): string {
  return {
    submit: 'submitted',
    approve: 'approved',
    return: 'returned',
    release: 'released',
    retire: 'retired',
  }[action];
}
