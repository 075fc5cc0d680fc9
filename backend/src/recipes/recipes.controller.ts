import { Controller, Get, Param, ParseIntPipe, Query, Res, StreamableFile } from '@nestjs/common';
import type { Response } from 'express';
import type { RecipeSummaryView, RecipeView } from '@quietglass/shared/recipes';
import type { RunSheetView } from '@quietglass/shared/runsheet';
import { runSheetQuerySchema, type RunSheetQuery } from '@quietglass/shared/schemas/run-sheet';
import { Roles } from '../auth/roles.decorator.js';
import { ZodQuery } from '../common/zod-body.js';
import { DesignsService, toVersionView } from '../designs/designs.service.js';
import { RecipesService } from '../designs/recipes.service.js';
import { RunSheetService } from './run-sheet.service.js';

/** Released recipes for the floor: the list, one recipe, and its run sheet on a chosen chamber. */
@Controller('recipes')
@Roles('admin', 'engineer', 'operator')
export class RecipesController {
  constructor(
    private readonly recipes: RecipesService,
    private readonly designs: DesignsService,
    private readonly runSheets: RunSheetService,
  ) {}

  @Get()
  async list(): Promise<RecipeSummaryView[]> {
    return (await this.recipes.releasedRecipes()).map(({ version: v, releasedBy }) => ({
      designId: v.designId,
      number: v.number,
      name: v.design.name,
      customer: v.design.customer.name,
      releasedAt: v.updatedAt.toISOString(),
      releasedBy,
    }));
  }

  @Get(':id/:number')
  async recipe(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) n: number,
  ): Promise<RecipeView> {
    const v = await this.recipes.releasedRecipe(id, n);
    return { ...toVersionView(v, await this.designs.editors(v)), name: v.design.name };
  }

  @Get(':id/:number/run-sheet')
  @ZodQuery(runSheetQuerySchema)
  runSheet(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Query() query: RunSheetQuery,
  ): Promise<RunSheetView> {
    return this.runSheets.build(id, number, query);
  }

  @Get(':id/:number/run-sheet.pdf')
  @ZodQuery(runSheetQuerySchema)
  async runSheetPdf(
    @Param('id', ParseIntPipe) id: number,
    @Param('number', ParseIntPipe) number: number,
    @Query() query: RunSheetQuery,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const sheet = await this.runSheets.build(id, number, query);
    res.setHeader('Content-Disposition', `attachment; filename="run-sheet-${id}-v${number}.pdf"`);
    return new StreamableFile(await this.runSheets.pdf(sheet), { type: 'application/pdf' });
  }
}
