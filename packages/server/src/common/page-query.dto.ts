import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsInt, IsOptional, Max, Min } from 'class-validator';
import { stacked } from './stacked';

/** An optional whole-number query parameter from 1 to `max` (query strings arrive as text). */
export const PageParam = (max: number) =>
  stacked(
    IsOptional(),
    Type(() => Number),
    IsInt({ message: 'must be a whole number' }),
    Min(1),
    Max(max),
  );

/** `page` and `pageSize` of every paged list (pages of at most 100 rows). */
export class PageQueryDto {
  @ApiPropertyOptional({ type: Number, minimum: 1, default: 1 })
  @PageParam(100000)
  page = 1;

  @ApiPropertyOptional({ type: Number, minimum: 1, maximum: 100, default: 20 })
  @PageParam(100)
  pageSize = 20;
}
