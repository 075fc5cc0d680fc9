import { BadRequestException, ConflictException, ForbiddenException, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import type { DesignVersionView, VersionStatus } from '@quietglass/shared/designs';
import { AuditService } from '../audit/audit.service.js';
import { updateIfVersion } from '../common/optimistic-lock.js';
import { MaterialsService } from '../materials/materials.service.js';
import { SpecMasksService } from '../spec-masks/spec-masks.service.js';
import type { User } from '../users/user.entity.js';
import { DesignVersion } from './design-version.entity.js';
import { DesignsService } from './designs.service.js';
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
 * submitted again) → released as a recipe → retired. Approval, return and release follow the
 * four-eyes rule: never by the version's author or anyone who saved it, and approval or return never
 * by whoever submitted it. Every step is written to the version history and the audit trail in the
 * same transaction as the status change; refused approvals are recorded as well.
 */
@Injectable()
export class ApprovalsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly designs: DesignsService,
    private readonly audit: AuditService,
    private readonly materials: MaterialsService,
    private readonly masks: SpecMasksService,
  ) {}

  async transition(
    designId: number,
    number: number,
    action: Transition,
    actor: User,
    options: { rowVersion?: number; comment?: string },
  ): Promise<DesignVersionView> {
    const rule = RULES[action];
    // The route's schema has trimmed the comment, and asked for the row version to submit and a
    // comment to return.
    const comment = options.comment ?? '';
    try {
      await this.db.transaction(async (tx) => {
        // The row lock makes every check below and the status change one step: a save, another
        // submit or a concurrent approval waits for it and then finds the version changed.
        await tx.query('SELECT id FROM design_versions WHERE design_id = $1 AND number = $2 FOR UPDATE', [
          designId,
          number,
        ]);
        const version = await this.designs.findVersion(designId, number, tx);
        if (!rule.from.includes(version.status)) {
          throw new ConflictException(
            `Version ${number} is ${version.status}; it can be ${pastTense(action)} only when ${rule.from.join(' or ')}`,
          );
        }
        if (options.rowVersion !== undefined && options.rowVersion !== version.rowVersion)
          throw await this.designs.staleVersion(version, options.rowVersion);
        const patch: Partial<DesignVersion> = { status: rule.to };
        if (action === 'submit') {
          if (version.layers.length === 0)
            throw new BadRequestException('A version without layers cannot be submitted');
          // Frozen from the very content being submitted, in the same transaction.
          const materials = await this.designs.checkMaterials(version, tx, true);
          patch.materialsSnapshot = Object.fromEntries([...materials].map(([k, v]) => [String(k), v]));
          await this.materials.recordUses([...materials.keys()], { designId, number }, tx);
          const maskId = version.design?.specMaskId;
          if (maskId) await this.masks.markInUse(maskId, tx);
        }
        if (action === 'approve' || action === 'return' || action === 'release') {
          await this.fourEyes(tx, version, action, actor);
        }
        await updateIfVersion(
          tx,
          DesignVersion,
          {
            id: version.id,
            expectedVersion: version.rowVersion,
            set: patch,
            where: 'status = :status',
            params: { status: version.status },
          },
          () => new ConflictException(`Version ${number} changed meanwhile; reload it`),
        );
        await tx.getRepository(VersionEvent).insert({
          designId,
          versionNumber: number,
          fromStatus: version.status,
          toStatus: rule.to,
          actor,
          comment,
          kind: 'status',
        });
        await this.audit.record(tx, {
          actor,
          entity: 'design',
          entityId: designId,
          action: rule.to,
          summary: `version ${number}: ${version.status} → ${rule.to}${comment ? ` (${comment})` : ''}`,
          details: { versionNumber: number, from: version.status, to: rule.to, comment },
        });
      });
    } catch (err) {
      if (err instanceof FourEyesRefusal) {
        // A refused approval is on the record too, written on its own since the step rolled back.
        await this.db.transaction((tx) =>
          this.audit.record(tx, {
            actor,
            entity: 'design',
            entityId: designId,
            action: `${action} refused`,
            summary: `version ${number}: ${err.message}`,
            details: { versionNumber: number, action, reason: err.reason },
          }),
        );
      }
      throw err;
    }
    return this.designs.getVersion(designId, number);
  }

  /**
   * Four-eyes: nobody who wrote or saved a version may approve, return or release it, and whoever
   * submitted it may not approve or return it.
   */
  private async fourEyes(tx: EntityManager, version: DesignVersion, action: Transition, actor: User) {
    const verb = action === 'approve' ? 'approve' : action === 'return' ? 'return' : 'release';
    const submitter = await this.lastActor(tx, version.designId, version.number, 'submitted');
    const wroteOrSubmitted =
      version.createdBy.id === actor.id || (action !== 'release' && submitter === actor.id);
    if (wroteOrSubmitted) {
      throw new FourEyesRefusal(
        `Four-eyes rule: another engineer must ${verb} version ${version.number}; you wrote or submitted it`,
        version.createdBy.id === actor.id ? 'author' : 'submitter',
      );
    }
    const editors = await this.designs.editors(version, tx);
    if (editors.some((e) => e.id === actor.id)) {
      throw new FourEyesRefusal(
        `Four-eyes rule: another engineer must ${verb} version ${version.number}; you edited it`,
        'editor',
      );
    }
  }

  /** The latest approval of a version, or null when it was never approved. */
  lastApproval(designId: number, versionNumber: number): Promise<VersionEvent | null> {
    return this.db.getRepository(VersionEvent).findOne({
      where: { designId, versionNumber, toStatus: 'approved', kind: 'status' },
      order: { at: 'DESC', id: 'DESC' },
    });
  }

  history(designId: number): Promise<VersionEvent[]> {
    return this.db.getRepository(VersionEvent).find({ where: { designId }, order: { at: 'ASC', id: 'ASC' } });
  }

  private async lastActor(
    tx: EntityManager,
    designId: number,
    number: number,
    to: VersionStatus,
  ): Promise<number | null> {
    const event = await tx.getRepository(VersionEvent).findOne({
      where: { designId, versionNumber: number, toStatus: to, kind: 'status' },
      order: { at: 'DESC', id: 'DESC' },
    });
    return event?.actor.id ?? null;
  }
}

/** A four-eyes refusal: 403, and written to the audit trail. */
class FourEyesRefusal extends ForbiddenException {
  constructor(
    message: string,
    readonly reason: 'author' | 'submitter' | 'editor',
  ) {
    super(message);
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
