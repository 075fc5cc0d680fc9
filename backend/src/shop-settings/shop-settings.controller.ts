import { Body, Controller, Delete, Get, Put, Query, ParseIntPipe, Res, StreamableFile } from '@nestjs/common';
import type { Response } from 'express';
import {
  shopLogoSchema,
  shopNameSchema,
  shopTargetMarginSchema,
  type ShopLogoInput,
  type ShopNameInput,
  type ShopTargetMarginInput,
} from '@quietglass/shared/schemas/shop';
import type { ShopSettingsView } from '@quietglass/shared/shop';
import { CurrentUser } from '../auth/current-user.decorator.js';
import { Roles } from '../auth/roles.decorator.js';
import { ZodBody } from '../common/zod-body.js';
import type { User } from '../users/user.entity.js';
import { ShopSettingsService } from './shop-settings.service.js';

/** Everyone signed in reads the shop's settings; only admins change them. */
@Controller('shop-settings')
export class ShopSettingsController {
  constructor(private readonly shop: ShopSettingsService) {}

  @Get()
  get(): Promise<ShopSettingsView> {
    return this.shop.get();
  }

  @Put()
  @Roles('admin')
  @ZodBody(shopNameSchema)
  saveName(@Body() dto: ShopNameInput, @CurrentUser() user: User): Promise<ShopSettingsView> {
    return this.shop.saveName(dto, user);
  }

  @Put('target-margin')
  @Roles('admin')
  @ZodBody(shopTargetMarginSchema)
  saveTargetMargin(@Body() dto: ShopTargetMarginInput, @CurrentUser() user: User): Promise<ShopSettingsView> {
    return this.shop.saveTargetMargin(dto, user);
  }

  @Get('logo')
  async logo(@Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { data, contentType } = await this.shop.logo();
    res.setHeader('Cache-Control', 'no-store');
    return new StreamableFile(data, { type: contentType });
  }

  @Put('logo')
  @Roles('admin')
  @ZodBody(shopLogoSchema)
  saveLogo(@Body() dto: ShopLogoInput, @CurrentUser() user: User): Promise<ShopSettingsView> {
    return this.shop.saveLogo(dto, user);
  }

  @Delete('logo')
  @Roles('admin')
  removeLogo(
    @Query('version', ParseIntPipe) version: number,
    @CurrentUser() user: User,
  ): Promise<ShopSettingsView> {
    return this.shop.removeLogo(version, user);
  }
}
