import { CalibrationModule } from '../calibration/calibration.module.js';
import { Module } from '@nestjs/common';
import { ChambersModule } from '../chambers/chambers.module.js';
import { DesignsModule } from '../designs/designs.module.js';
import { MaterialsModule } from '../materials/materials.module.js';
import { ShopSettingsModule } from '../shop-settings/shop-settings.module.js';
import { RecipesController } from './recipes.controller.js';
import { RunSheetService } from './run-sheet.service.js';

/** Released recipes and their run sheets: reads designs, chambers, materials and the shop's settings through their services. */
@Module({
  imports: [DesignsModule, ChambersModule, MaterialsModule, CalibrationModule, ShopSettingsModule],
  controllers: [RecipesController],
  providers: [RunSheetService],
})
export class RecipesModule {}
