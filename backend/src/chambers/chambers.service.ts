import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, Repository } from 'typeorm';
import { isUniqueViolation } from '../common/db-errors.js';
import { Material } from '../materials/material.entity.js';
import { Chamber } from './chamber.entity.js';
import type { ChamberDto, UpdateChamberDto } from './dto/chamber.dto.js';

@Injectable()
export class ChambersService {
  constructor(
    @InjectRepository(Chamber) private readonly chambers: Repository<Chamber>,
    @InjectRepository(Material) private readonly materials: Repository<Material>,
  ) {}

  list(): Promise<Chamber[]> {
    return this.chambers.find({ order: { name: 'ASC' } });
  }

  async get(id: number): Promise<Chamber> {
    const chamber = await this.chambers.findOneBy({ id });
    if (!chamber) throw new NotFoundException(`Chamber ${id} does not exist`);
    return chamber;
  }

  async create(dto: ChamberDto): Promise<Chamber> {
    await this.check(dto);
    return this.save(this.chambers.create(fields(dto)));
  }

  async update(id: number, dto: UpdateChamberDto): Promise<Chamber> {
    const chamber = await this.get(id);
    if (chamber.version !== dto.version) {
      throw new ConflictException(
        `Chamber "${chamber.name}" was changed by someone else (now version ${chamber.version}); reload it and apply your edit again`,
      );
    }
    await this.check(dto);
    Object.assign(chamber, fields(dto));
    return this.save(chamber);
  }

  /** Materials must exist and appear once each. */
  private async check(dto: ChamberDto): Promise<void> {
    const ids = [dto.monitorChipMaterialId, ...dto.materials.map((m) => m.materialId)];
    const found = new Set((await this.materials.findBy({ id: In(ids) })).map((m) => m.id));
    const problems: string[] = [];
    if (!found.has(dto.monitorChipMaterialId)) {
      problems.push(`monitorChipMaterialId: material ${dto.monitorChipMaterialId} does not exist`);
    }
    const seen = new Set<number>();
    dto.materials.forEach((m, i) => {
      if (!found.has(m.materialId))
        problems.push(`materials[${i}].materialId: material ${m.materialId} does not exist`);
      if (seen.has(m.materialId))
        problems.push(`materials[${i}].materialId: material ${m.materialId} is listed twice`);
      seen.add(m.materialId);
    });
    if (problems.length > 0) throw new BadRequestException({ message: problems });
  }

  private async save(chamber: Chamber): Promise<Chamber> {
    try {
      return await this.chambers.save(chamber);
    } catch (err) {
      if (isUniqueViolation(err))
        throw new ConflictException(`A chamber named "${chamber.name}" already exists`);
      throw err;
    }
  }
}

function fields(dto: ChamberDto): Partial<Chamber> {
  return {
    name: dto.name,
    monitorWavelengthsNm: dto.monitorWavelengthsNm,
    monitorChipMaterialId: dto.monitorChipMaterialId,
    materials: dto.materials.map((m) => ({
      materialId: m.materialId,
      toolingFactor: m.toolingFactor,
      rateNmPerS: m.rateNmPerS,
    })),
    notes: dto.notes ?? '',
  };
}
