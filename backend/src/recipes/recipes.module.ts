import { CalibrationModule } from '../calibration/calibration.module.js';
import { Module } from '@nestjs/common';
import { ChambersModule } from '../chambers/chambers.module.js';
import { DesignsModule } from '../designs/designs.module.js';
import { MaterialsModule } from '../materials/materials.module.js';
import { RecipesController } from './recipes.controller.js';
import { RunSheetService } from './run-sheet.service.js';

/** Released recipes and their run sheets: reads designs, chambers and materials through their services. */
@Module({
  imports: [DesignsModule, ChambersModule, MaterialsModule, CalibrationModule],
  controllers: [RecipesController],
  providers: [RunSheetService],
})
export class RecipesModule {}
