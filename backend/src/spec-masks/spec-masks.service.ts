import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import { validateSpecMask, type LimitBand } from '@quietglass/shared/optics/mask';
import { OpticsInputError } from '@quietglass/shared/optics/errors';
import { isUniqueViolation } from '../common/db-errors.js';
import { CustomersService } from '../customers/customers.service.js';
import type { ImportSpecMaskCsvDto, SpecMaskDto, UpdateSpecMaskDto } from './dto/spec-mask.dto.js';
import { parseMaskCsv } from './mask-csv.js';
import { SpecMaskRecord } from './spec-mask.entity.js';

@Injectable()
export class SpecMasksService {
  constructor(
    @InjectRepository(SpecMaskRecord) private readonly masks: Repository<SpecMaskRecord>,
    private readonly customers: CustomersService,
  ) {}

  list(customerId?: number): Promise<SpecMaskRecord[]> {
    return this.masks.find({
      where: customerId === undefined ? {} : { customer: { id: customerId } },
      order: { name: 'ASC', revision: 'ASC' },
    });
  }

  async get(id: number): Promise<SpecMaskRecord> {
    const mask = await this.masks.findOneBy({ id });
    if (!mask) throw new NotFoundException(`Spec mask ${id} does not exist`);
    return mask;
  }

  async create(dto: SpecMaskDto): Promise<SpecMaskRecord> {
    const bands = checkedBands(dto.bands);
    const customer = await this.customer(dto.customerId);
    return this.save(
      this.masks.create({ name: dto.name, customer, revision: dto.revision, bands, notes: dto.notes ?? '' }),
    );
  }

  async update(id: number, dto: UpdateSpecMaskDto): Promise<SpecMaskRecord> {
    const mask = await this.get(id);
    if (mask.version !== dto.version) throw stale(mask);
    const bands = checkedBands(dto.bands);
    const customer = await this.customer(dto.customerId);
    const result = await this.masks
      .createQueryBuilder()
      .update(SpecMaskRecord)
      .set({
        name: dto.name,
        customer,
        revision: dto.revision,
        bands,
        notes: dto.notes ?? mask.notes,
        version: () => 'version + 1',
      })
      .where('id = :id AND version = :version', { id, version: dto.version })
      .execute()
      .catch((err: unknown) => {
        throw isUniqueViolation(err) ? duplicate(dto) : err;
      });
    if (result.affected !== 1) throw stale(await this.get(id));
    return this.get(id);
  }

  /** A new mask from CSV; a bad row or band rejects the whole file. */
  async importCsv(dto: ImportSpecMaskCsvDto): Promise<SpecMaskRecord> {
    const parsed = parseMaskCsv(dto.csv);
    if (!parsed.ok) {
      throw new BadRequestException({
        message: parsed.problems.map((p) => (p.row > 0 ? `row ${p.row}: ${p.reason}` : p.reason)),
      });
    }
    // The CSV's data rows start on line 2: name the row, not the array index, in errors.
    try {
      validateSpecMask({ bands: parsed.bands });
    } catch (err) {
      if (err instanceof OpticsInputError) {
        const m = /^bands\[(\d+)\]\.?(.*)$/.exec(err.field);
        const where = m ? `row ${Number(m[1]) + 2}${m[2] ? ` ${m[2]}` : ''}` : err.field || 'mask';
        throw new BadRequestException({ message: [`${where}: ${err.problem}`] });
      }
      throw err;
    }
    return this.create({ ...dto, bands: parsed.bands });
  }

  private async customer(id: number) {
    return this.customers.get(id).catch(() => {
      throw new BadRequestException({ message: [`customerId: customer ${id} does not exist`] });
    });
  }

  private async save(mask: SpecMaskRecord): Promise<SpecMaskRecord> {
    try {
      return await this.masks.save(mask);
    } catch (err) {
      throw isUniqueViolation(err) ? duplicate(mask) : err;
    }
  }
}

/** The engine's validation: clear errors for NaN, from > to, contradicting overlaps. */
export function checkedBands(bands: unknown[]): LimitBand[] {
  try {
    return validateSpecMask({ bands }).bands;
  } catch (err) {
    if (err instanceof OpticsInputError) throw new BadRequestException({ message: [err.message] });
    throw err;
  }
}

function stale(mask: SpecMaskRecord): ConflictException {
  return new ConflictException(
    `Spec mask "${mask.name}" rev ${mask.revision} was changed by someone else (now version ${mask.version}); reload it and apply your edit again`,
  );
}

function duplicate(m: { name: string; revision: string }): ConflictException {
  return new ConflictException(`This customer already has a spec mask "${m.name}" rev ${m.revision}`);
}
