import {
  BadRequestException,
  ConflictException,
  Inject,
  Injectable,
  NotFoundException,
} from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { LOGO_MAX_BYTES, type LogoType, type ShopSettingsView } from '@quietglass/shared/shop';
import { DEFAULT_TARGET_MARGIN_PERCENT } from '@quietglass/shared/optimise/fit';
import { appConfig, type AppConfig } from '../config/configuration.js';
import { AuditService } from '../audit/audit.service.js';
import type { User } from '../users/user.entity.js';
import type { ShopLogoInput, ShopNameInput, ShopTargetMarginInput } from '@quietglass/shared/schemas/shop';
import { embeds, imageSize, LOGO_MAX_PIXELS } from './logo-image.js';
import { ShopSettings } from './shop-settings.entity.js';

/** What document headers print: the shop's name and, when uploaded, its logo. */
export interface DocumentHeader {
  shopName: string;
  logo: Buffer | null;
}

const ROW = 1;
const BASE64 = /^[A-Za-z0-9+/]+={0,2}$/;

/**
 * The shop's settings. Until an admin saves them the name is SHOP_NAME from the configuration and
 * there is no logo.
 */
@Injectable()
export class ShopSettingsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @Inject(appConfig.KEY) private readonly config: AppConfig,
    private readonly audit: AuditService,
  ) {}

  private row(): Promise<ShopSettings | null> {
    return this.db.getRepository(ShopSettings).findOneBy({ id: ROW });
  }

  async get(): Promise<ShopSettingsView> {
    const row = await this.row();
    const bytes = row?.logoType
      ? (
          await this.db.query<[{ n: number }]>(
            'SELECT octet_length(logo) AS n FROM shop_settings WHERE id = $1',
            [ROW],
          )
        )[0].n
      : 0;
    return {
      shopName: row?.shopName ?? this.config.shopName,
      logo: row?.logoType ? { contentType: row.logoType, bytes: Number(bytes) } : null,
      targetMarginPercent: row?.targetMarginPercent ?? DEFAULT_TARGET_MARGIN_PERCENT,
      version: row?.version ?? 0,
      updatedAt: row?.updatedAt.toISOString() ?? null,
    };
  }

  async logo(): Promise<{ data: Buffer; contentType: LogoType }> {
    const row = await this.db
      .getRepository(ShopSettings)
      .createQueryBuilder('s')
      .addSelect('s.logo')
      .where('s.id = :id', { id: ROW })
      .getOne();
    if (!row?.logo || !row.logoType) throw new NotFoundException('No shop logo has been uploaded');
    return { data: row.logo, contentType: row.logoType };
  }

  /** Name and logo for a PDF header. */
  async header(): Promise<DocumentHeader> {
    const view = await this.get();
    return { shopName: view.shopName, logo: view.logo ? (await this.logo()).data : null };
  }

  async saveName(dto: ShopNameInput, user: User): Promise<ShopSettingsView> {
    const before = await this.get();
    await this.write(dto.version, { shopName: dto.shopName }, user, {
      action: 'renamed',
      summary: `shop name changed from "${before.shopName}" to "${dto.shopName}"`,
      details: { before: before.shopName, after: dto.shopName },
    });
    return this.get();
  }

  /** The target margin Fit to mask and Grow layers design in when a request names none. */
  async targetMarginPercent(): Promise<number> {
    return (await this.row())?.targetMarginPercent ?? DEFAULT_TARGET_MARGIN_PERCENT;
  }

  async saveTargetMargin(dto: ShopTargetMarginInput, user: User): Promise<ShopSettingsView> {
    const before = await this.get();
    await this.write(dto.version, { targetMarginPercent: dto.targetMarginPercent }, user, {
      action: 'target margin changed',
      summary: `default target margin changed from ${before.targetMarginPercent} to ${dto.targetMarginPercent} percentage points`,
      details: { before: before.targetMarginPercent, after: dto.targetMarginPercent },
    });
    return this.get();
  }

  /** A PNG or JPEG within the size limits, checked by its own bytes rather than the declared type. */
  async saveLogo(dto: ShopLogoInput, user: User): Promise<ShopSettingsView> {
    if (!BASE64.test(dto.dataBase64) || dto.dataBase64.length % 4 !== 0) {
      throw new BadRequestException({ message: ['dataBase64: not valid base64'] });
    }
    const data = Buffer.from(dto.dataBase64, 'base64');
    if (data.length > LOGO_MAX_BYTES) {
      throw new BadRequestException({ message: [`the logo must be at most ${LOGO_MAX_BYTES / 1024} KB`] });
    }
    const size = imageSize(data, dto.contentType);
    const kind = dto.contentType === 'image/png' ? 'PNG' : 'JPEG';
    if (!size) throw new BadRequestException({ message: [`dataBase64: the file is not a ${kind} image`] });
    if (size.width < 1 || size.height < 1 || size.width > LOGO_MAX_PIXELS || size.height > LOGO_MAX_PIXELS) {
      throw new BadRequestException({
        message: [`the logo is ${size.width} × ${size.height} px; each side must be 1–${LOGO_MAX_PIXELS} px`],
      });
    }
    if (!(await embeds(data))) {
      throw new BadRequestException({ message: [`dataBase64: the ${kind} image cannot be read`] });
    }
    await this.write(dto.version, { logo: data, logoType: dto.contentType }, user, {
      action: 'logo uploaded',
      summary: `shop logo uploaded (${kind}, ${size.width} × ${size.height} px, ${data.length} bytes)`,
      details: { contentType: dto.contentType, bytes: data.length, ...size },
    });
    return this.get();
  }

  async removeLogo(version: number, user: User): Promise<ShopSettingsView> {
    if (!(await this.get()).logo) throw new NotFoundException('No shop logo has been uploaded');
    await this.write(version, { logo: null, logoType: null }, user, {
      action: 'logo removed',
      summary: 'shop logo removed',
    });
    return this.get();
  }

  /** One locked write of the single row, with its audit entry, in one transaction. */
  private async write(
    version: number,
    set: {
      shopName?: string;
      logo?: Buffer | null;
      logoType?: LogoType | null;
      targetMarginPercent?: number;
    },
    user: User,
    entry: { action: string; summary: string; details?: Record<string, unknown> },
  ): Promise<void> {
    await this.db.transaction(async (tx) => {
      const rows =
        version === 0
          ? await tx.query<unknown[]>(
              `INSERT INTO shop_settings
                 (id, shop_name, logo, logo_type, target_margin_percent, version, updated_at)
               VALUES ($1, $2, $3, $4, $5, 1, now()) ON CONFLICT (id) DO NOTHING RETURNING version`,
              [
                ROW,
                set.shopName ?? this.config.shopName,
                set.logo ?? null,
                set.logoType ?? null,
                set.targetMarginPercent ?? null,
              ],
            )
          : (
              await tx.query<[unknown[], number]>(
                `UPDATE shop_settings SET
                   shop_name = CASE WHEN $3::boolean THEN $4 ELSE shop_name END,
                   logo = CASE WHEN $5::boolean THEN $6::bytea ELSE logo END,
                   logo_type = CASE WHEN $5::boolean THEN $7 ELSE logo_type END,
                   target_margin_percent =
                     CASE WHEN $8::boolean THEN $9::double precision ELSE target_margin_percent END,
                   version = version + 1, updated_at = now()
                 WHERE id = $1 AND version = $2 RETURNING version`,
                [
                  ROW,
                  version,
                  set.shopName !== undefined,
                  set.shopName ?? null,
                  set.logo !== undefined,
                  set.logo ?? null,
                  set.logoType ?? null,
                  set.targetMarginPercent !== undefined,
                  set.targetMarginPercent ?? null,
                ],
              )
            )[0];
      if (rows.length !== 1) {
        const now = await this.get();
        throw new ConflictException(
          `The shop settings were changed by someone else (now version ${now.version}); reload them and apply your edit again`,
        );
      }
      await this.audit.record(tx, { actor: user, entity: 'shop-settings', entityId: ROW, ...entry });
    });
  }
}
