import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import { DesignVersion } from './design-version.entity.js';
import { VersionEvent } from './version-event.entity.js';

/** Released recipes: the versions operators may build, read from the designs module's tables. */
@Injectable()
export class RecipesService {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

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
}
