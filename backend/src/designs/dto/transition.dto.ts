import { IsInt, IsOptional, IsString, MaxLength, Min } from 'class-validator';

export class TransitionDto {
  /** Required to submit: the rowVersion the engineer reviewed, so what is submitted is what they saw. */
  @IsOptional()
  @IsInt()
  @Min(1)
  rowVersion?: number;

  /** Required to return a version; optional otherwise. */
  @IsOptional()
  @IsString()
  @MaxLength(4000)
  comment?: string;
}
