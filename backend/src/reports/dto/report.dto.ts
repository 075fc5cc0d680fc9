import { IsBoolean, IsInt, IsOptional } from 'class-validator';

export class CreateReportDto {
  @IsInt({ message: 'designId must be a design id' })
  designId: number;

  @IsInt({ message: 'versionNumber must be a version number' })
  versionNumber: number;

  /** Defaults to the design's own spec mask. */
  @IsOptional()
  @IsInt({ message: 'specMaskId must be a spec mask id' })
  specMaskId?: number;

  /** Shops often do not disclose the design: hide the layer table. */
  @IsOptional()
  @IsBoolean()
  hideLayers?: boolean;

  /** Report a run's measured spectrum instead of the designed one. */
  @IsOptional()
  @IsInt()
  runId?: number;

  @IsOptional()
  @IsInt()
  spectrumId?: number;
}
